import { redirect, type Handle, type ServerInit } from '@sveltejs/kit';
import { AUTH_BASE_PATH, authHandle } from './auth';
import { readerOf } from '$lib/server/services/reader';
import { closeDb } from '$lib/server/db';
import { startApp } from '$lib/server/lifecycle';
import { fillStoredParts } from '$lib/server/render/vehicleBody';
import { renderMissingParts } from '$lib/server/render/readingPage';
import { PageMemo, reuseRenders, type MemoisedView } from '$lib/server/render/pageMemo';
import { KEPT_PAGES, keptPages } from '$lib/server/render/keptPages';
import { layoutData } from '$lib/server/views/layout';
import { vehiclePageData } from '$lib/server/views/vehiclePage';
import { config } from '$lib/server/config';
import { answerHeaders, bodyLimits, pageSecurityPolicy, securityHeaders } from '$lib/server/perimeter';
import { databaseDownSince } from '$lib/server/db/availability';
import { movedAddress } from '$lib/server/movedAddresses';
import { databaseGate, handleServerError } from '$lib/server/databaseGate';
import { observeRequests } from '$lib/server/observability/requests';
import { awaitsOwnWrite, freshReads } from '$lib/server/freshReads';
import { handleChain } from '$lib/server/handleChain';

export const init: ServerInit = async () => {
	await startApp();
	openKeptPagesDoor();
	void renderMissingParts().catch((err) => console.error('[kickpanel] stored page parts not rendered at start-up; pages render on first view', err));
	process.once('sveltekit:shutdown', () => {
		void closeDb();
	});
};

const PERIMETER = { https: config.origin.startsWith('https:') };

// Forms whose refusal, even signed out, comes back with what was typed.
const KEEPS_TYPED_WORK = /^\/vehicles\/[^/]+\/edit$/;

// Pages anyone may open without signing in; everything else needs an account.
const PUBLIC_PREFIXES = ['/signin', '/auth/', '/api/health', '/guide', '/favicon', '/manifest', '/_app/', '/reset', '/invite', '/setup/'];

const loadUser: Handle = async ({ event, resolve }) => {
	const { user, units } = await readerOf(event.cookies);
	event.locals.user = user;
	event.locals.units = units;
	const path = event.url.pathname;
	const isPublic = path === '/signin' || PUBLIC_PREFIXES.some((p) => path.startsWith(p));
	if (!event.locals.user && !isPublic) {
		if (path.startsWith('/api/')) {
			return new Response(JSON.stringify({ message: 'Sign in to use the API.' }), {
				status: 401,
				headers: { 'content-type': 'application/json' }
			});
		}
		if (event.request.method === 'GET') redirect(303, `/signin?next=${encodeURIComponent(path + event.url.search)}`);
		// The editor's own action answers a signed-out save with everything typed (it checks the role itself).
		if (!KEEPS_TYPED_WORK.test(path)) return new Response('Sign in to continue.', { status: 401 });
	}
	return resolve(event);
};

// Installers reopen the same page all day: a page whose data has not changed since its last render is
// sent again as it was rendered. Only the reading view of a vehicle page is worth it. Such repeat views are
// answered before SvelteKit when server.js finds the door (render/keptPages.ts); the handle answers the rest.
const keepsPages = config.pageMemoBytes > 0;
const memo = new PageMemo(config.pageMemoBytes);
const memoisedViews: Record<string, MemoisedView> = {
	// Slugs are lower-case letters, digits and hyphens (domain/slug.ts).
	'/vehicles/[slug]': {
		path: /^\/vehicles\/(?<slug>[a-z0-9-]+)$/,
		data: ({ locals, url, isDataRequest, params }) => vehiclePageData({ locals, url, isDataRequest, params: { slug: params.slug ?? '' } })
	}
};
const memoised: Handle = keepsPages ? reuseRenders(memo, layoutData, memoisedViews) : ({ event, resolve }) => resolve(event);

function openKeptPagesDoor() {
	if (!keepsPages) return;
	(globalThis as Record<symbol, unknown>)[KEPT_PAGES] = keptPages({
		memo,
		layout: layoutData,
		views: memoisedViews,
		reader: readerOf,
		headers: answerHeaders(PERIMETER),
		// While the database is marked down the gate answers; a reader waiting for their own write reads the primary.
		passBy: (cookies) => databaseDownSince() !== null || awaitsOwnWrite(cookies)
	});
}

// Auth.js answers its own endpoints under /auth/; everywhere else the session is read by loadUser, and the
// sign-in and sign-out actions call Auth.js themselves, so other requests skip its per-request set-up.
const AUTH_PREFIX = `${AUTH_BASE_PATH}/`;
const authEndpoints: Handle = ({ event, resolve }) => (event.url.pathname.startsWith(AUTH_PREFIX) ? authHandle({ event, resolve }) : resolve(event));

const moved: Handle = ({ event, resolve }) => {
	const to = movedAddress(event.url);
	return to ? new Response(null, { status: 308, headers: { location: to } }) : resolve(event);
};

export const handle = handleChain(observeRequests, securityHeaders(PERIMETER), moved, bodyLimits, databaseGate, freshReads, authEndpoints, loadUser, memoised, fillStoredParts, pageSecurityPolicy);

export const handleError = handleServerError;
