import { redirect, type Handle, type ServerInit } from '@sveltejs/kit';
import { AUTH_BASE_PATH, authHandle } from './auth';
import { sessionClaims } from '$lib/server/auth/session';
import { activeSessionUser } from '$lib/server/services/users';
import { closeDb } from '$lib/server/db';
import { startApp } from '$lib/server/lifecycle';
import { fillStoredParts } from '$lib/server/render/vehicleBody';
import { renderMissingParts } from '$lib/server/render/readingPage';
import { PageMemo, reuseRenders } from '$lib/server/render/pageMemo';
import { layoutData } from '$lib/server/views/layout';
import { vehiclePageData } from '$lib/server/views/vehiclePage';
import { config } from '$lib/server/config';
import { bodyLimits, pageSecurityPolicy, securityHeaders } from '$lib/server/perimeter';
import { movedAddress } from '$lib/server/movedAddresses';
import { databaseGate, handleServerError } from '$lib/server/databaseGate';
import { observeRequests } from '$lib/server/observability/requests';
import { freshReads } from '$lib/server/freshReads';
import { handleChain } from '$lib/server/handleChain';

export const init: ServerInit = async () => {
	await startApp();
	void renderMissingParts().catch((err) => console.error('[kickpanel] stored page parts not rendered at start-up; pages render on first view', err));
	process.once('sveltekit:shutdown', () => {
		void closeDb();
	});
};

// Forms whose refusal, even signed out, comes back with what was typed.
const KEEPS_TYPED_WORK = /^\/vehicles\/[^/]+\/edit$/;

// Pages anyone may open without signing in; everything else needs an account.
const PUBLIC_PREFIXES = ['/signin', '/auth/', '/api/health', '/guide', '/favicon', '/manifest', '/_app/', '/reset', '/invite', '/setup/'];

const loadUser: Handle = async ({ event, resolve }) => {
	const claims = await sessionClaims(event.cookies);
	event.locals.user = claims ? await activeSessionUser(claims.uid, claims.sv, claims.sid) : null;
	event.locals.units = event.locals.user?.units ?? (event.cookies.get('units') === 'imperial' ? 'imperial' : 'metric');
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
// sent again as it was rendered. Only the reading view of a vehicle page is worth it.
const memoised: Handle =
	config.pageMemoBytes > 0
		? reuseRenders(new PageMemo(config.pageMemoBytes), layoutData, {
				'/vehicles/[slug]': ({ locals, url, isDataRequest, params }) =>
					vehiclePageData({ locals, url, isDataRequest, params: { slug: params.slug ?? '' } })
			})
		: ({ event, resolve }) => resolve(event);

// Auth.js answers its own endpoints under /auth/; everywhere else the session is read by loadUser, and the
// sign-in and sign-out actions call Auth.js themselves, so other requests skip its per-request set-up.
const AUTH_PREFIX = `${AUTH_BASE_PATH}/`;
const authEndpoints: Handle = ({ event, resolve }) => (event.url.pathname.startsWith(AUTH_PREFIX) ? authHandle({ event, resolve }) : resolve(event));

const moved: Handle = ({ event, resolve }) => {
	const to = movedAddress(event.url);
	return to ? new Response(null, { status: 308, headers: { location: to } }) : resolve(event);
};

export const handle = handleChain(observeRequests, securityHeaders({ https: config.origin.startsWith('https:') }), moved, bodyLimits, databaseGate, freshReads, authEndpoints, loadUser, memoised, fillStoredParts, pageSecurityPolicy);

export const handleError = handleServerError;
