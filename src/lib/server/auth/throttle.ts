import type { RateLimiterRes } from 'rate-limiter-flexible';
import { config } from '../config';
import { SharedLimiter } from './sharedLimiter';

// Failed sign-ins are counted per account and per client address; either limit locks out for a while.
// The counts live in MariaDB, so a lockout holds on every app instance.
const perAccount = new SharedLimiter({
	keyPrefix: 'signin-account',
	points: config.auth.maxFailuresPerAccount,
	duration: config.auth.lockoutSeconds
});
const perAddress = new SharedLimiter({
	keyPrefix: 'signin-address',
	points: config.auth.maxFailuresPerAddress,
	duration: config.auth.lockoutSeconds
});

export type ThrottleState = { locked: false } | { locked: true; retryAfterSeconds: number };

export async function signInThrottle(email: string, address: string): Promise<ThrottleState> {
	const [account, client] = await Promise.all([perAccount.get(email), perAddress.get(address)]);
	const blocking = [account, client].filter(
		(r): r is RateLimiterRes => r !== null && r.remainingPoints <= 0 && r.consumedPoints >= 1
	);
	if (blocking.length === 0) return { locked: false };
	return { locked: true, retryAfterSeconds: Math.ceil(Math.max(...blocking.map((r) => r.msBeforeNext)) / 1000) };
}

export async function recordSignInFailure(email: string, address: string): Promise<void> {
	await Promise.all([perAccount.penalty(email, 1), perAddress.penalty(address, 1)]);
}

export async function clearSignInFailures(email: string): Promise<void> {
	await perAccount.delete(email);
}
