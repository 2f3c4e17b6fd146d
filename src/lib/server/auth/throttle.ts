import type { RateLimiterRes } from 'rate-limiter-flexible';
import { config } from '../config';
import { SharedLimiter } from './sharedLimiter';

// Password guesses are counted before the password is checked, in MariaDB, so a burst of parallel
// guesses gets no more tries than one at a time, and the limits hold on every app instance.
//  - one account from one client address: a short lockout after a few failures;
//  - one client address over all accounts: a lockout after many;
//  - one account from anywhere: never a lockout, only a growing wait between tries, so nobody can
//    lock a colleague out by guessing wrong on purpose, and a spread-out attack is slowed to a crawl;
//    an address the account signed in from lately skips that wait.

const perPair = new SharedLimiter({
	keyPrefix: 'signin-pair',
	points: config.auth.maxFailuresPerAccount,
	duration: config.auth.lockoutSeconds
});
const perAddress = new SharedLimiter({
	keyPrefix: 'signin-address',
	points: config.auth.maxFailuresPerAddress,
	duration: config.auth.lockoutSeconds
});
const perAccount = new SharedLimiter({
	keyPrefix: 'signin-account',
	points: Number.MAX_SAFE_INTEGER,
	duration: config.auth.lockoutSeconds
});
/** One row per account while it must wait; its window is the wait. */
const accountWait = new SharedLimiter({ keyPrefix: 'signin-wait', points: 1, duration: 1 });
/** Addresses an account signed in from lately: a person on their usual device never waits for an attacker. */
const KNOWN_DEVICE_SECONDS = 30 * 24 * 60 * 60;
const knownDevice = new SharedLimiter({ keyPrefix: 'signin-known', points: Number.MAX_SAFE_INTEGER, duration: KNOWN_DEVICE_SECONDS });

/** Tries on one account, from anywhere, before each further try must wait. */
export const ACCOUNT_FREE_TRIES = 2 * config.auth.maxFailuresPerAccount;
export const ACCOUNT_MAX_WAIT_SECONDS = 60;

/** Seconds to wait before try `n` on one account: 1, 2, 4 … up to a minute after the free tries. */
export function accountWaitSeconds(n: number): number {
	if (n <= ACCOUNT_FREE_TRIES) return 0;
	return Math.min(2 ** (n - ACCOUNT_FREE_TRIES - 1), ACCOUNT_MAX_WAIT_SECONDS);
}

export type ThrottleState = { locked: false } | { locked: true; retryAfterSeconds: number };

const locked = (res: RateLimiterRes): ThrottleState => ({ locked: true, retryAfterSeconds: Math.max(1, Math.ceil(res.msBeforeNext / 1000)) });

/**
 * Counts one password try for this account from this address and says whether it may go ahead.
 * Call it before checking the password; a try that succeeds is forgiven with `forgiveSignInTries`.
 */
export async function beginSignInAttempt(email: string, address: string): Promise<ThrottleState> {
	const [pair, client, account] = await Promise.all([
		perPair.penalty(`${email}|${address}`),
		perAddress.penalty(address),
		perAccount.penalty(email)
	]);
	if (pair.consumedPoints > config.auth.maxFailuresPerAccount) return locked(pair);
	if (client.consumedPoints > config.auth.maxFailuresPerAddress) return locked(client);
	const wait = accountWaitSeconds(account.consumedPoints);
	if (wait > 0 && !(await knownDevice.get(`${email}|${address}`))) {
		const gate = await accountWait.penalty(email, 1, wait);
		if (gate.consumedPoints > 1) return locked(gate);
	}
	return { locked: false };
}

/**
 * The right password: this try is given back, tries from this address on this account start again
 * and the address becomes known. Failures counted from anywhere else stay, so an attack in progress
 * is not given fresh tries by its victim signing in.
 */
export async function forgiveSignInTries(email: string, address: string): Promise<void> {
	const pair = `${email}|${address}`;
	await Promise.all([perPair.delete(pair), perAddress.reward(address), perAccount.reward(email), knownDevice.delete(pair)]);
	await knownDevice.penalty(pair);
}

/** A new password was set through a reset link: every try on the account starts again. */
export async function clearSignInFailures(email: string): Promise<void> {
	await Promise.all([perAccount.delete(email), accountWait.delete(email)]);
}

/** "40 seconds", "1 minute", "15 minutes": how long to wait, in words. */
export function waitWords(seconds: number): string {
	if (seconds < 60) return `${seconds} ${seconds === 1 ? 'second' : 'seconds'}`;
	const minutes = Math.ceil(seconds / 60);
	return `${minutes} ${minutes === 1 ? 'minute' : 'minutes'}`;
}
