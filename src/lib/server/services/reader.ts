import type { Cookies } from '@sveltejs/kit';
import type { SessionUser } from '../../domain/sessionUser';
import { activeSessionUser } from './users';
import { sessionClaims } from '../auth/session';

export type Reader = { user: SessionUser | null; units: 'metric' | 'imperial' };

/**
 * Who a request's cookies name — the person behind a live session of an active account, or nobody — and the
 * units they read in (their own setting, else the visitor's units cookie).
 */
export async function readerOf(cookies: Pick<Cookies, 'get'>): Promise<Reader> {
	const claims = await sessionClaims(cookies);
	const user = claims ? await activeSessionUser(claims.uid, claims.sv, claims.sid) : null;
	return { user, units: user?.units ?? (cookies.get('units') === 'imperial' ? 'imperial' : 'metric') };
}
