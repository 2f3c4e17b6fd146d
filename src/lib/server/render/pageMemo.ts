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
	return `${url.pathname}${url.search}\n${encoding}\n${JSON.stringify([layout, page])}`;
}

/** The address (path and query) a key names. */
const addressOf = (key: string) => key.slice(0, key.indexOf('\n'));

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

/**
 * A size-bounded store of rendered pages, least recently used first out. Pages are kept from a reader's second
 * view of an address on: most pages a shop opens are read once in a while, and keeping each of those would only
 * push out the pages that are read again and leave large garbage behind.
 */
export class PageMemo {
	private entries = new Map<string, Entry>();
	private used = 0;
	// How many kept renders each address has, so a view of an address with none is told so at once.
	private addresses = new Map<string, number>();
	// Readers' addresses viewed lately (least recently viewed first out), so a second view is recognised.
	private viewed = new Set<string>();
	hits = 0;
	misses = 0;

	constructor(
		private readonly maxBytes: number,
		private readonly rememberedKeys = 50_000
	) {}

	/** Whether any reader's render of `address` (path and query, as in `memoKey`) is kept. */
	keepsAddress(address: string): boolean {
		return this.addresses.has(address);
	}

	/** Whether `view` was seen lately, without remembering it as seen now. */
	viewedLately(view: string): boolean {
		return this.viewed.has(view);
	}

	/** Whether `view` (a reader and an address) was seen lately; either way it is remembered as seen now. */
	seenBefore(view: string): boolean {
		const seen = this.viewed.delete(view);
		this.viewed.add(view);
		if (this.viewed.size > this.rememberedKeys) this.viewed.delete(this.viewed.values().next().value!);
		return seen;
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
		this.entries.delete(key);
		this.entries.set(key, entry);
		return entry;
	}

	set(key: string, entry: Entry): void {
		const cost = entry.body.byteLength + key.length * 2;
		if (cost > this.maxBytes) return;
		const previous = this.entries.get(key);
		if (previous) this.forget(key, previous);
		while (this.used + cost > this.maxBytes) {
			const [oldestKey, oldest] = this.entries.entries().next().value!;
			this.forget(oldestKey, oldest);
		}
		this.entries.set(key, entry);
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

/** Names a reader's view of an address in one encoding, for `seenBefore`. */
export function viewName(locals: Pick<App.Locals, 'user' | 'units'>, encoding: string, url: URL): string {
	return `${locals.user?.id}|${locals.units}|${encoding}|${url.pathname}${url.search}`;
}

/**
 * A handle that answers a GET of a memoised route from an earlier render when its data is unchanged.
 * `views` maps a route id to its view; `layout` is the root layout's data.
 */
export function reuseRenders(memo: PageMemo, layout: LayoutData, views: Record<string, MemoisedView>): Handle {
	return async ({ event, resolve }) => {
		const view = event.route.id ? views[event.route.id] : undefined;
		if (!view || event.request.method !== 'GET' || event.isDataRequest || !event.locals.user) return resolve(event);
		// A reader's first view of an address is rendered as usual, with no key built and nothing kept.
		const encoding = pageEncoding(event.request.headers.get('accept-encoding'));
		if (!memo.seenBefore(viewName(event.locals, encoding, event.url))) return resolve(event);
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
			!isPlainData(prepared)
		) {
			return response;
		}
		const body = new Uint8Array(await response.arrayBuffer());
		const headers = [...response.headers];
		memo.set(key, { body, headers });
		return new Response(body, { status: 200, headers });
	};
}
