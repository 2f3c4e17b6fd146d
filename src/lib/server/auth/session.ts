import { decode, encode } from '@auth/core/jwt';
import type { Cookies } from '@sveltejs/kit';
import { activeSessionUser } from '../services/users';
import type { SessionUser } from './guard';

export const SESSION_MAX_AGE_SECONDS = 12 * 60 * 60;
const COOKIE_NAMES = ['__Secure-authjs.session-token', 'authjs.session-token'];

type SessionClaims = { uid: number; sv: number; exp: number };
// Decrypting the session token is the costly part of a request; tokens are immutable, so cache them briefly.
const decoded = new Map<string, SessionClaims | null>();
const CACHE_LIMIT = 5_000;

async function claimsFor(cookieName: string, token: string): Promise<SessionClaims | null> {
	const key = cookieName + token;
	if (decoded.has(key)) return decoded.get(key)!;
	let claims: SessionClaims | null = null;
	try {
		const payload = await decode({ token, secret: process.env.AUTH_SECRET ?? '', salt: cookieName });
		if (payload && typeof payload.uid === 'number' && typeof payload.exp === 'number') {
			claims = { uid: payload.uid, sv: typeof payload.sv === 'number' ? payload.sv : 1, exp: payload.exp };
		}
	} catch {
		claims = null;
	}
	if (decoded.size >= CACHE_LIMIT) decoded.delete(decoded.keys().next().value!);
	decoded.set(key, claims);
	return claims;
}

/** The signed-in user, re-read from MariaDB on every request so role and status changes apply at once. */
export async function sessionUser(cookies: Cookies): Promise<SessionUser | null> {
	for (const name of COOKIE_NAMES) {
		const token = cookies.get(name);
		if (!token) continue;
		const claims = await claimsFor(name, token);
		if (!claims || claims.exp * 1000 < Date.now()) return null;
		return activeSessionUser(claims.uid, claims.sv);
	}
	return null;
}

/**
 * After a password change ends every other session, keeps this device signed in: the same session,
 * re-issued with the account's new session version.
 */
export async function renewSession(cookies: Cookies, sessionVersion: number): Promise<boolean> {
	const secret = process.env.AUTH_SECRET ?? '';
	for (const name of COOKIE_NAMES) {
		const token = cookies.get(name);
		if (!token) continue;
		const payload = await decode({ token, secret, salt: name }).catch(() => null);
		if (!payload) return false;
		const renewed = await encode({ token: { ...payload, sv: sessionVersion }, secret, salt: name, maxAge: SESSION_MAX_AGE_SECONDS });
		cookies.set(name, renewed, { path: '/', httpOnly: true, sameSite: 'lax', secure: name.startsWith('__Secure-'), maxAge: SESSION_MAX_AGE_SECONDS });
		return true;
	}
	return false;
}
