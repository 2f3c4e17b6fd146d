// Whole rendered pages, kept for repeat views.
//
// A page's HTML is a pure function of its address and of what its load functions return, so when a
// view's data is exactly the data of an earlier render, the bytes of that render are sent again
// instead of being rebuilt. The data is read through the same short-lived caches the loads use, so a
// reused page is never staler than a freshly rendered one would be: any change — a new revision, a
// trust mark, a watch, a role, the reader's units — changes the data, and so the key.
import type { Handle, RequestEvent } from '@sveltejs/kit';
import { bytesBody, pageEncoding } from './pageEncoding';

type Entry = { body: Uint8Array<ArrayBuffer>; headers: [string, string][] };
export type ViewPart = 'layout' | 'page';

/** A render's key: its address, the encoding its bytes were sent in, and its data. */
export function memoKey(url: URL, encoding: string, layout: unknown, page: unknown): string {
	return `${addressOfUrl(url)}\n${encoding}\n${JSON.stringify([layout, page])}`;
}

/** The address (path and query) a key names. */
const addressOf = (key: string) => key.slice(0, key.indexOf('\n'));

/** The address a key, a view name and `keepsAddress` speak of: path and query. */
const addressOfUrl = (url: URL) => `${url.pathname}${url.search}`;

/**
 * Whether JSON spells the value out in full. A Map, a Set or a class instance would stringify as `{}`,
 * so two different data could share a key: a render whose data holds one is not kept.
 */
export function isPlainData(value: unknown): boolean {
	if (value === null || value === undefined) return true;
	const type = typeof value;
	if (type === 'string' || type === 'number' || type === 'boolean') return true;
	if (type !== 'object') return false;
	if (value instanceof Date) return true;
	if (Array.isArray(value)) return value.every(isPlainData);
	const proto = Object.getPrototypeOf(value);
	if (proto !== Object.prototype && proto !== null) return false;
	return Object.values(value as object).every(isPlainData);
}

/** A kept render with how often it was viewed and when last. */
type Kept = Entry & { uses: number; lastUsed: number };

/** A kept render unused this long may be pushed out by any page viewed twice, however often it was used before. */
export const STALE_AFTER_MS = 10 * 60 * 1000;

/**
 * A size-bounded store of rendered pages, least recently used first out. Pages are kept from a reader's second
 * view of an address on: most pages a shop opens are read once in a while, and keeping each of those would only
 * push out the pages that are read again and leave large garbage behind. Once the store is full, a render takes
 * the place of the least recently used one only if it was viewed more often, or that one went unused a while:
 * a counter opening one car after another then leaves the pages installers keep reopening where they are,
 * instead of replacing every kept render with one nobody opens again.
 */
export class PageMemo {
	private entries = new Map<string, Kept>();
	private used = 0;
	// How many kept renders each address has, so a view of an address with none is told so at once.
	private addresses = new Map<string, number>();
	// Readers' addresses viewed lately and how often (least recently viewed first out).
	private viewed = new Map<string, number>();
	hits = 0;
	misses = 0;

	constructor(
		private readonly maxBytes: number,
		private readonly rememberedKeys = 50_000,
		private readonly now: () => number = Date.now
	) {}

	/** Whether any reader's render of `address` (path and query, as in `memoKey`) is kept. */
	keepsAddress(address: string): boolean {
		return this.addresses.has(address);
	}

	/** Whether `view` was seen lately, without remembering it as seen now. */
	viewedLately(view: string): boolean {
		return this.viewed.has(view);
	}

	/** Remembers a view of `view` (a reader and an address); how many times it was viewed lately, this one included. */
	noteView(view: string): number {
		const times = (this.viewed.get(view) ?? 0) + 1;
		this.viewed.delete(view);
		this.viewed.set(view, times);
		if (this.viewed.size > this.rememberedKeys) this.viewed.delete(this.viewed.keys().next().value!);
		return times;
	}

	/** Whether a render viewed `times` times would be kept now: while there is room, or in place of one viewed less or gone stale. */
	admits(times: number): boolean {
		const average = this.entries.size ? this.used / this.entries.size : 0;
		if (this.used + average <= this.maxBytes) return true;
		// Full, so there is an oldest.
		const oldest = this.entries.values().next().value!;
		return oldest.uses < times || this.now() - oldest.lastUsed > STALE_AFTER_MS;
	}

	get size() {
		return this.entries.size;
	}

	get bytes() {
		return this.used;
	}

	get(key: string): Entry | undefined {
		const entry = this.entries.get(key);
		if (!entry) {
			this.misses++;
			return undefined;
		}
		this.hits++;
		entry.uses++;
		entry.lastUsed = this.now();
		this.entries.delete(key);
		this.entries.set(key, entry);
		return entry;
	}

	/** Keeps a render viewed `times` times. */
	set(key: string, entry: Entry, times = 1): void {
		const cost = entry.body.byteLength + key.length * 2;
		if (cost > this.maxBytes) return;
		const previous = this.entries.get(key);
		if (previous) this.forget(key, previous);
		while (this.used + cost > this.maxBytes) {
			const [oldestKey, oldest] = this.entries.entries().next().value!;
			this.forget(oldestKey, oldest);
		}
		this.entries.set(key, { ...entry, uses: times, lastUsed: this.now() });
		this.used += cost;
		const address = addressOf(key);
		this.addresses.set(address, (this.addresses.get(address) ?? 0) + 1);
	}

	private forget(key: string, entry: Entry) {
		this.entries.delete(key);
		this.used -= entry.body.byteLength + key.length * 2;
		const address = addressOf(key);
		const left = (this.addresses.get(address) ?? 1) - 1;
		if (left > 0) this.addresses.set(address, left);
		else this.addresses.delete(address);
	}
}

/**
 * A memoised route's load functions return their data through this: the data the memo handle already read for
 * its key when there is some (so a first view does not read it twice), else `read()`'s, recorded so the render
 * is stored under exactly that data.
 */
export async function viewData<T>(locals: App.Locals, part: ViewPart, read: () => Promise<T>): Promise<T> {
	const prepared = locals.viewData?.[part];
	if (prepared !== undefined) return prepared as T;
	const data = await read();
	(locals.viewData ??= {})[part] = data;
	return data;
}

/** The kept bytes as a response, not copied for every view. */
function replay(entry: Entry): Response {
	return new Response(bytesBody(entry.body), { status: 200, headers: entry.headers });
}

/** What a memoised view's data is read from: as much of a request event as its page load uses. */
export type ViewRequest = Pick<RequestEvent, 'locals' | 'url' | 'isDataRequest'> & { params: Partial<Record<string, string>> };

/**
 * A memoised route: the addresses it answers (its parameters as named groups, matching exactly what SvelteKit
 * routes to it) and the function its page load returns.
 */
export type MemoisedView = { path: RegExp; data: (request: ViewRequest) => Promise<unknown> };

/** The layout's data for a reader. */
export type LayoutData = (locals: App.Locals) => Promise<unknown>;

/** Names a reader's view of an address in one encoding, for `noteView`. */
export function viewName(locals: Pick<App.Locals, 'user' | 'units'>, encoding: string, url: URL): string {
	return `${locals.user?.id}|${locals.units}|${encoding}|${addressOfUrl(url)}`;
}

/**
 * A handle that answers a GET of a memoised route from an earlier render when its data is unchanged.
 * `views` maps a route id to its view; `layout` is the root layout's data.
 */
export function reuseRenders(memo: PageMemo, layout: LayoutData, views: Record<string, MemoisedView>): Handle {
	return async ({ event, resolve }) => {
		const view = event.route.id ? views[event.route.id] : undefined;
		if (!view || event.request.method !== 'GET' || event.isDataRequest || !event.locals.user) return resolve(event);
		// A reader's first view of an address is rendered as usual, with no key built and nothing kept; so is a
		// later one when no render of the address is kept and the memo would not keep this one.
		const encoding = pageEncoding(event.request.headers.get('accept-encoding'));
		const times = memo.noteView(viewName(event.locals, encoding, event.url));
		if (times === 1 || (!memo.keepsAddress(addressOfUrl(event.url)) && !memo.admits(times))) return resolve(event);
		let key: string;
		let prepared: { layout: unknown; page: unknown };
		try {
			prepared = { layout: await layout(event.locals), page: await view.data(event) };
			key = memoKey(event.url, encoding, prepared.layout, prepared.page);
		} catch {
			// A redirect, a 404 or a refusal: the normal render answers it properly.
			return resolve(event);
		}
		const hit = memo.get(key);
		if (hit) return replay(hit);

		// The render's load functions take this data instead of reading it again.
		event.locals.viewData = prepared;
		const response = await resolve(event);
		const seen = event.locals.viewData;
		if (
			response.status !== 200 ||
			seen !== prepared ||
			!response.headers.has('etag') || // streamed responses carry no ETag and are not kept
			response.headers.has('set-cookie') ||
			!response.headers.get('content-type')?.startsWith('text/html') ||
			!isPlainData(prepared) ||
			!memo.admits(times)
		) {
			return response;
		}
		const headers = [...response.headers];
		// A filled page's bytes are at hand, so its response goes out as it is; any other is read to be kept.
		const filled = event.locals.filledPage;
		if (filled) {
			memo.set(key, { body: filled, headers }, times);
			return response;
		}
		const body = new Uint8Array(await response.arrayBuffer());
		memo.set(key, { body, headers }, times);
		return new Response(body, { status: 200, headers });
	};
}
