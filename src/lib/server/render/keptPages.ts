// Repeat views answered at the server's door.
//
// A kept page (see pageMemo.ts) is sent again only when the reader's data is exactly the data it was rendered
// from. Checking that takes the same cached reads as any view; going through SvelteKit to do it — a web Request
// built from the socket, the router, the handle chain, a web Response read back out — costs several times more.
// So `server.js` asks here first: a GET of a memoised address by a signed-in reader whose data matches a kept
// render is answered with its bytes and the headers every answer carries; anything else (a first view, changed
// data, no session, a database marked down, a reader waiting for their own write) goes to SvelteKit as before.
import type { IncomingHttpHeaders } from 'node:http';
import type { Cookies } from '@sveltejs/kit';
import { parse as parseCookies } from 'cookie';
import type { Reader } from '../services/reader';
import { withRequestId } from '../observability/log';
import { noteAnswer, requestIdFor } from '../observability/requests';
import { pageEncoding } from './pageEncoding';
import { memoKey, viewName, type LayoutData, type MemoisedView, type PageMemo } from './pageMemo';

/** As much of Node's IncomingMessage as the door reads. */
export type DoorRequest = { method?: string; url?: string; headers: IncomingHttpHeaders };
export type DoorAnswer = { status: 200 | 304; headers: [name: string, value: string][]; body: Uint8Array | null };
export type KeptPages = (request: DoorRequest) => Promise<DoorAnswer | null>;

/** Where `server.js` finds the door once the app has started. */
export const KEPT_PAGES = Symbol.for('kickpanel.keptPages');

// Only the path and query of an address count; the origin is never read.
const ANY_ORIGIN = 'http://kickpanel.invalid';

// What a 304 keeps of the page's headers, as SvelteKit's own answer to a matching If-None-Match (RFC 9110 §15.4.5).
const NOT_MODIFIED_KEEPS = new Set(['etag', 'cache-control', 'content-location', 'date', 'expires', 'vary']);

const one = (value: string | string[] | undefined) => (Array.isArray(value) ? value[0] : value) ?? null;

/** A 304 when the reader holds these bytes already (their If-None-Match names the kept ETag, weak or strong). */
function notModified(headers: [string, string][], ifNoneMatch: string | null): DoorAnswer | null {
	if (!ifNoneMatch) return null;
	const etag = headers.find(([name]) => name === 'etag')?.[1];
	const asked = ifNoneMatch.startsWith('W/"') ? ifNoneMatch.slice(2) : ifNoneMatch;
	if (!etag || asked !== etag) return null;
	return { status: 304, headers: headers.filter(([name]) => NOT_MODIFIED_KEEPS.has(name)), body: null };
}

export function keptPages(options: {
	memo: PageMemo;
	layout: LayoutData;
	views: Record<string, MemoisedView>;
	/** Who the cookies name; the same reading as every request's. */
	reader: (cookies: Pick<Cookies, 'get'>) => Promise<Reader>;
	/** The headers every answer carries (perimeter.ts). */
	headers: [string, string][];
	/** Whether this request must go through SvelteKit all the same. */
	passBy: (cookies: Pick<Cookies, 'get'>) => boolean;
}): KeptPages {
	const { memo, layout, views, reader, headers, passBy } = options;
	const routes = Object.entries(views);
	return async (request) => {
		const started = performance.now();
		if (request.method !== 'GET' || !request.url?.startsWith('/')) return null;
		// Most first views stop here: no reader's render of this address is kept. (The address as sent; one
		// the URL parser would spell otherwise is left to SvelteKit.)
		if (!memo.keepsAddress(request.url)) return null;
		const url = new URL(request.url, ANY_ORIGIN);
		const found = routes.map(([route, view]) => ({ route, view, match: view.path.exec(url.pathname) })).find((r) => r.match);
		if (!found) return null;
		const { route, view } = found;
		const params = { ...found.match!.groups };
		try {
			const jar = parseCookies(one(request.headers.cookie) ?? '');
			const cookies = { get: (name: string) => jar[name] };
			if (passBy(cookies)) return null;
			const locals = (await reader(cookies)) as App.Locals;
			if (!locals.user) return null;
			const encoding = pageEncoding(one(request.headers['accept-encoding']));
			// A first view goes on to SvelteKit without its data being read here.
			const seen = viewName(locals, encoding, url);
			if (!memo.viewedLately(seen)) return null;
			const key = memoKey(url, encoding, await layout(locals), await view.data({ locals, url, params, isDataRequest: false }));
			const entry = memo.get(key);
			if (!entry) return null;
			memo.noteView(seen);
			const requestId = requestIdFor(one(request.headers['x-request-id']));
			const answer = notModified(entry.headers, one(request.headers['if-none-match'])) ?? {
				status: 200,
				headers: [...entry.headers, ...headers, ['x-request-id', requestId]],
				body: entry.body
			};
			withRequestId(requestId, () => noteAnswer({ method: 'GET', route, status: answer.status, seconds: (performance.now() - started) / 1000 }));
			return answer;
		} catch {
			// A redirect, a 404, a refusal or a failed read: SvelteKit answers it properly.
			return null;
		}
	};
}
