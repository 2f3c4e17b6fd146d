// While MariaDB is marked down, every request that would need it is answered at once with a 503 and a plain
// message, rather than waiting for a connection. Built assets and the health answer still come through.
import { logFailure } from './observability/log';
import type { Handle, HandleServerError } from '@sveltejs/kit';
import { DATABASE_DOWN_MESSAGE, databaseDownSince, noteDatabaseError } from './db/availability';

const PASS_THROUGH = ['/_app/', '/favicon', '/manifest', '/api/health', '/service-worker'];

function escapeHtml(s: string): string {
	return s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

export function unavailableResponse(request: Request, path: string): Response {
	const headers = { 'retry-after': '5', 'cache-control': 'no-store' };
	const wantsJson = path.startsWith('/api/') || (request.headers.get('accept') ?? '').includes('application/json');
	if (wantsJson) return Response.json({ message: DATABASE_DOWN_MESSAGE }, { status: 503, headers });
	const page = `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><title>Kickpanel · database not answering</title></head><body><main><h1>Kickpanel is waiting for its database</h1><p>${escapeHtml(DATABASE_DOWN_MESSAGE)}</p><p><a href="${escapeHtml(path)}">Try again</a></p></main></body></html>`;
	return new Response(page, { status: 503, headers: { ...headers, 'content-type': 'text/html; charset=utf-8' } });
}

export const databaseGate: Handle = async ({ event, resolve }) => {
	const path = event.url.pathname;
	if (databaseDownSince() !== null && !PASS_THROUGH.some((p) => path.startsWith(p))) return unavailableResponse(event.request, path);
	try {
		return await resolve(event);
	} catch (err) {
		// A hook before the page (the signed-in user's row) found the database gone.
		if (noteDatabaseError(err)) return unavailableResponse(event.request, path);
		throw err;
	}
};

/** Unexpected errors: a lost database gets its plain message (and marks it down); anything else is logged. */
export const handleServerError: HandleServerError = ({ error, status }) => {
	if (noteDatabaseError(error)) return { message: DATABASE_DOWN_MESSAGE };
	if (status >= 500) logFailure('unexpected error', error);
	return { message: status === 404 ? 'Not Found' : 'Something went wrong on our side. Try again; if it keeps happening, tell your admin.' };
};
