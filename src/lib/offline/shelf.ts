import { KEPT_AT_HEADER, newerCopy, photoAddresses, RECENT_ENTRIES, RECENT_PHOTOS, SHELF } from '../domain/offlineShelf';

// The phone's shelf of pages for reading without signal, in the Cache API: used by the service
// worker for pages (and editors) as they are opened and by the page itself for the ones pinned for the day.

type Shelf = typeof SHELF.recent | typeof SHELF.pinned;

/** Only a whole, same-site answer is worth keeping: no redirect (a sign-in wall), no error. */
export const worthKeeping = (response: Response) => response.ok && response.type === 'basic' && !response.redirected;

/** A copy of an answer stamped with the moment it was kept. */
async function stamped(response: Response, at: Date): Promise<Response> {
	const headers = new Headers(response.headers);
	headers.set(KEPT_AT_HEADER, at.toISOString());
	return new Response(await response.blob(), { status: response.status, statusText: response.statusText, headers });
}

/** Drops the oldest entries beyond `max` (a cache lists its keys in the order they were put). */
async function trim(cache: Cache, max: number): Promise<void> {
	const keys = await cache.keys();
	await Promise.all(keys.slice(0, Math.max(0, keys.length - max)).map((k) => cache.delete(k)));
}

async function fetchKeepable(address: string): Promise<Response | null> {
	try {
		const response = await fetch(address, { credentials: 'same-origin' });
		return worthKeeping(response) ? response : null;
	} catch {
		return null;
	}
}

/** Stores the photos a page shows (both renditions) that the phone does not hold yet. */
async function keepPhotos(html: string, cacheName: string, cap: number | null): Promise<void> {
	const cache = await caches.open(cacheName);
	for (const address of photoAddresses(html)) {
		if (await cache.match(address)) continue;
		const response = await fetchKeepable(address);
		if (response) await cache.put(address, response);
	}
	if (cap !== null) await trim(cache, cap);
}

/**
 * Keeps one page answer on a shelf, with its photos and companion views. `response` is the page
 * as just fetched (the service worker passes the one it is answering with), or null to fetch it.
 */
export async function keepPage(shelf: Shelf, address: string, response: Response | null, companions: string[] = []): Promise<boolean> {
	const page = response ?? (await fetchKeepable(address));
	if (!page || !worthKeeping(page)) return false;
	const at = new Date();
	const copy = await stamped(page, at);
	const html = await copy.clone().text();
	const cache = await caches.open(shelf);
	await cache.delete(address);
	await cache.put(address, copy);
	for (const extra of companions) {
		const answer = await fetchKeepable(extra);
		if (answer) {
			await cache.delete(extra);
			await cache.put(extra, await stamped(answer, at));
		}
	}
	if (shelf === SHELF.recent) {
		await trim(cache, RECENT_ENTRIES);
		await keepPhotos(html, SHELF.photos, RECENT_PHOTOS);
	} else {
		await keepPhotos(html, SHELF.pinned, null);
	}
	return true;
}

/** Takes a page, its companions and its photos off a shelf. */
export async function dropPage(shelf: Shelf, addresses: string[]): Promise<void> {
	const cache = await caches.open(shelf);
	for (const address of addresses) {
		const kept = await cache.match(address);
		if (kept && shelf === SHELF.pinned) {
			for (const photo of photoAddresses(await kept.text())) await cache.delete(photo);
		}
		await cache.delete(address);
	}
}

export type KeptCopy = { response: Response; keptAt: string | null };

/** The newest kept copy of an address on either shelf (or among the photos). */
export async function keptCopy(address: string): Promise<KeptCopy | undefined> {
	const found: KeptCopy[] = [];
	for (const name of [SHELF.pinned, SHELF.recent, SHELF.photos]) {
		const response = await (await caches.open(name)).match(address);
		if (response) found.push({ response, keptAt: response.headers.get(KEPT_AT_HEADER) });
	}
	return found.reduce<KeptCopy | undefined>((a, b) => newerCopy(a, b), undefined);
}

/** Whether an address sits on a shelf. */
export async function isOnShelf(shelf: Shelf, address: string): Promise<boolean> {
	return !!(await (await caches.open(shelf)).match(address));
}

/** Empties every shelf: on signing out, nothing a person read stays on the phone. */
export async function clearShelves(): Promise<void> {
	await Promise.all([SHELF.recent, SHELF.pinned, SHELF.photos].map((name) => caches.delete(name)));
}
