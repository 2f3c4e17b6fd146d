// Read-your-writes with a replica: a person who saved gets a cookie with the primary's log position at that
// moment; while the replica has not applied that far, their requests read from the primary. Nobody sees an
// older page than the one they saved, whichever app server answers them.
import type { Cookies, Handle } from '@sveltejs/kit';
import { config } from './config';
import { db } from './db';
import { isGtidPosition, primaryPosition, readingFromPrimary, replicaReached } from './db/readRouting';

export const WRITTEN_COOKIE = 'kp-written';
const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/** Whether this reader saved lately enough that their reads may have to wait for the replica. */
export function awaitsOwnWrite(cookies: Pick<Cookies, 'get'>): boolean {
	return !!config.db.replica && cookies.get(WRITTEN_COOKIE) !== undefined;
}

export const freshReads: Handle = async ({ event, resolve }) => {
	if (!config.db.replica) return resolve(event);
	const written = event.cookies.get(WRITTEN_COOKIE);
	const behind = written !== undefined && isGtidPosition(written) && !(await replicaReached(db(), written));
	const response = behind ? await readingFromPrimary(() => resolve(event)) : await resolve(event);
	if (!SAFE_METHODS.has(event.request.method) && response.status < 400) {
		const position = await primaryPosition(db()).catch(() => '');
		if (isGtidPosition(position)) {
			try {
				response.headers.append('set-cookie', `${WRITTEN_COOKIE}=${position}; Path=/; Max-Age=600; HttpOnly; SameSite=Lax`);
			} catch {
				// A response with fixed headers: the next read simply takes the replica's word.
			}
		}
	}
	return response;
};
