import { decode, encode } from '@auth/core/jwt';
import type { Cookies } from '@sveltejs/kit';
import { authSecret } from '../config';

export const SESSION_MAX_AGE_SECONDS = 12 * 60 * 60;
const COOKIE_NAMES = ['__Secure-authjs.session-token', 'authjs.session-token'];

/** Who a session cookie names (user id, session version), which sign-in it came from, and until when it holds. */
export type SessionClaims = { uid: number; sv: number; sid: string; exp: number };
const SESSION_ID = /^[0-9a-f-]{36}$/;
// Decrypting the session token is the costly part of a request; tokens are immutable, so cache them briefly.
const decoded = new Map<string, SessionClaims | null>();
const CACHE_LIMIT = 5_000;

async function claimsFor(cookieName: string, token: string): Promise<SessionClaims | null> {
	const key = cookieName + token;
	if (decoded.has(key)) return decoded.get(key)!;
	let claims: SessionClaims | null = null;
	try {
		const payload = await decode({ token, secret: authSecret(), salt: cookieName });
		// A session without its own id could not be ended by signing out, so it is not accepted.
		if (payload && typeof payload.uid === 'number' && typeof payload.exp === 'number' && typeof payload.sid === 'string' && SESSION_ID.test(payload.sid)) {
			claims = { uid: payload.uid, sv: typeof payload.sv === 'number' ? payload.sv : 1, sid: payload.sid, exp: payload.exp };
		}
	} catch {
		claims = null;
	}
	if (decoded.size >= CACHE_LIMIT) decoded.delete(decoded.keys().next().value!);
	decoded.set(key, claims);
	return claims;
}

/** The session cookie this request carries (secure name first), if any. */
function sessionCookie(cookies: Pick<Cookies, 'get'>): { name: string; token: string } | null {
	for (const name of COOKIE_NAMES) {
		const token = cookies.get(name);
		if (token) return { name, token };
	}
	return null;
}

/** The unexpired claims of this request's session cookie; the person behind them is read by the users service. */
export async function sessionClaims(cookies: Pick<Cookies, 'get'>): Promise<SessionClaims | null> {
	const cookie = sessionCookie(cookies);
	if (!cookie) return null;
	const claims = await claimsFor(cookie.name, cookie.token);
	if (!claims || claims.exp * 1000 < Date.now()) return null;
	return claims;
}

/**
 * After a password change ends every other session, keeps this device signed in: the same session,
 * re-issued with the account's new session version.
 */
export async function renewSession(cookies: Cookies, sessionVersion: number): Promise<boolean> {
	const cookie = sessionCookie(cookies);
	if (!cookie) return false;
	const { name, token } = cookie;
	const secret = authSecret();
	const payload = await decode({ token, secret, salt: name }).catch(() => null);
	if (!payload) return false;
	const renewed = await encode({ token: { ...payload, sv: sessionVersion }, secret, salt: name, maxAge: SESSION_MAX_AGE_SECONDS });
	cookies.set(name, renewed, { path: '/', httpOnly: true, sameSite: 'lax', secure: name.startsWith('__Secure-'), maxAge: SESSION_MAX_AGE_SECONDS });
	return true;
}
