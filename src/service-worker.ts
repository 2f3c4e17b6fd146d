/// <reference types="@sveltejs/kit" />
/// <reference no-default-lib="true"/>
/// <reference lib="esnext" />
/// <reference lib="webworker" />
import { build, files, version } from '$service-worker';
import { companionsOf, dropsKeptCopy, editorAddress, isPhotoAddress, keptView, SHELF, shellFiles } from '$lib/domain/offlineShelf';
import { clearShelves, dropPage, isOnShelf, keepPage, keptCopy, worthKeeping } from '$lib/offline/shelf';
import { offlineNotice } from '$lib/offline/notice';

// Keeps the app's own files, the vehicle pages a person reads and the editors a writer opens, so a
// bay with no signal still shows them. Pages always come from the network first; a kept copy
// answers only when it fails.

const worker = self as unknown as ServiceWorkerGlobalScope;
const SHELL = `${SHELF.shellPrefix}${version}`;
const SHELL_FILES = new Set(shellFiles([...build, ...files]));
const IMMUTABLE = /^\/_app\/immutable\//;
const DATA_SUFFIX = '/__data.json';

worker.addEventListener('install', (event) => {
	event.waitUntil(
		caches
			.open(SHELL)
			.then((cache) => cache.addAll([...SHELL_FILES]))
			.then(() => worker.skipWaiting())
	);
});

worker.addEventListener('activate', (event) => {
	event.waitUntil(
		caches
			.keys()
			.then((names) => Promise.all(names.filter((n) => n.startsWith(SHELF.shellPrefix) && n !== SHELL).map((n) => caches.delete(n))))
			.then(() => worker.clients.claim())
	);
});

/** The app's own files: the shell first, then the network (and the shell keeps what it fetched). */
async function shellFile(request: Request): Promise<Response> {
	const cache = await caches.open(SHELL);
	const kept = await cache.match(request);
	if (kept) return kept;
	const response = await fetch(request);
	if (worthKeeping(response)) await cache.put(request, response.clone());
	return response;
}

/** Keeps a page just read (on the pinned shelf when it is pinned): `copy` is its answer, or null to fetch it. */
async function keepRead(address: string, kept: NonNullable<ReturnType<typeof keptView>>, copy: Response | null): Promise<void> {
	const pinned = await isOnShelf(SHELF.pinned, address);
	// A pinned page keeps its editor fresh only when the pin took one (the person may edit).
	const writer = pinned && (await isOnShelf(SHELF.pinned, editorAddress(kept.slug)));
	const companions = kept.view === 'page' ? companionsOf(kept.slug, pinned, writer) : [];
	await keepPage(pinned ? SHELF.pinned : SHELF.recent, address, copy, companions);
}

/** Pages that come to the phone whole when reached as data inside the app. */
const keptWhole = (view: string | undefined) => view === 'page' || view === 'edit';

async function page(event: FetchEvent, url: URL): Promise<Response> {
	const kept = keptView(url.pathname);
	try {
		const response = await fetch(event.request);
		if (kept && worthKeeping(response)) event.waitUntil(keepRead(url.pathname, kept, response.clone()).catch(() => {}));
		// Refused now (signed out, no longer allowed, gone): an older copy must not answer later.
		else if (kept && dropsKeptCopy(response.status)) event.waitUntil(dropCopies(url.pathname).catch(() => {}));
		return response;
	} catch {
		const copy = await keptCopy(url.pathname);
		return copy?.response ?? offlineNotice();
	}
}

const dropCopies = (address: string) => Promise.all([dropPage(SHELF.recent, [address]), dropPage(SHELF.pinned, [address])]);

async function photo(request: Request, url: URL): Promise<Response> {
	try {
		return await fetch(request);
	} catch {
		const copy = await keptCopy(url.pathname);
		if (copy) return copy.response;
		throw new Error('Photo not kept on this phone');
	}
}

worker.addEventListener('fetch', (event) => {
	const { request } = event;
	const url = new URL(request.url);
	if (url.origin !== worker.location.origin) return;
	if (request.method !== 'GET') {
		// Signing out leaves nothing that person read on the phone.
		if (request.method === 'POST' && url.pathname === '/signout') event.waitUntil(clearShelves());
		return;
	}
	if (SHELL_FILES.has(url.pathname) || IMMUTABLE.test(url.pathname)) event.respondWith(shellFile(request));
	else if (request.mode === 'navigate') event.respondWith(page(event, url));
	else if (isPhotoAddress(url.pathname)) event.respondWith(photo(request, url));
	else if (url.pathname.endsWith(DATA_SUFFIX)) {
		// A page or editor reached by a link inside the app arrives as data: the phone keeps the whole page beside it.
		const address = url.pathname.slice(0, -DATA_SUFFIX.length);
		const kept = keptView(address);
		if (kept && keptWhole(kept.view)) event.waitUntil(keepRead(address, kept, null).catch(() => {}));
	}
});
