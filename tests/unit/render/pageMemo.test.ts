import { describe, expect, it, vi } from 'vitest';
import type { RequestEvent } from '@sveltejs/kit';
import { isPlainData, memoKey, PageMemo, reuseRenders, STALE_AFTER_MS, viewData } from '../../../src/lib/server/render/pageMemo';

const encoder = new TextEncoder();
const entry = (text: string) => ({ body: encoder.encode(text), headers: [['content-type', 'text/html']] as [string, string][] });

describe('PageMemo', () => {
	it('returns what was stored under the same key and counts hits and misses', () => {
		const memo = new PageMemo(10_000);
		expect(memo.get('a')).toBeUndefined();
		memo.set('a', entry('<p>a</p>'));
		expect(new TextDecoder().decode(memo.get('a')!.body)).toBe('<p>a</p>');
		expect({ hits: memo.hits, misses: memo.misses, size: memo.size }).toEqual({ hits: 1, misses: 1, size: 1 });
	});

	it('stays within its byte budget, dropping the least recently used page first', () => {
		// Each entry costs its body (100 bytes) plus its one-character key counted as two bytes.
		const memo = new PageMemo(3 * 102);
		for (const k of ['a', 'b', 'c']) memo.set(k, entry('x'.repeat(100)));
		memo.get('a'); // a is now the most recently used
		memo.set('d', entry('x'.repeat(100)));
		expect(memo.get('b')).toBeUndefined();
		expect(memo.get('a')).toBeDefined();
		expect(memo.get('c')).toBeDefined();
		expect(memo.get('d')).toBeDefined();
		expect(memo.bytes).toBeLessThanOrEqual(3 * 102);
	});

	it('replaces an entry stored again under its key without counting it twice', () => {
		const memo = new PageMemo(1_000);
		memo.set('a', entry('x'.repeat(100)));
		memo.set('a', entry('y'.repeat(100)));
		expect(memo.size).toBe(1);
		expect(memo.bytes).toBe(102);
	});

	it('counts the views of a reader’s address lately, and remembers only so many views', () => {
		const memo = new PageMemo(1_000, 2);
		expect(memo.noteView('a')).toBe(1);
		expect(memo.noteView('a')).toBe(2);
		expect(memo.viewedLately('a')).toBe(true);
		expect(memo.noteView('a')).toBe(3);
		expect(memo.noteView('b')).toBe(1);
		expect(memo.noteView('c')).toBe(1);
		// a was the least recently seen of three views with room for two: its next view counts as a first.
		expect(memo.viewedLately('a')).toBe(false);
		expect(memo.noteView('a')).toBe(1);
		expect(memo.noteView('c')).toBe(2);
	});

	it('keeps any render while there is room; once full, only one viewed more often than the oldest, or in place of a stale one', () => {
		let now = 0;
		// Room for two entries of 100 bytes with one-character keys.
		const memo = new PageMemo(2 * 102, 100, () => now);
		expect(memo.admits(2)).toBe(true);
		memo.set('a', entry('x'.repeat(100)), 2);
		memo.set('b', entry('x'.repeat(100)), 2);
		// Full: a render viewed twice does not push out a twice-viewed one, a thrice-viewed one does.
		expect(memo.admits(2)).toBe(false);
		expect(memo.admits(3)).toBe(true);
		// Each hit is a use: a, used three times now, is no longer the oldest; b (two uses) is.
		memo.get('a');
		expect(memo.admits(3)).toBe(true);
		memo.get('b');
		memo.get('b');
		expect(memo.admits(3)).toBe(false);
		expect(memo.admits(4)).toBe(true);
		// The oldest unused for longer than the stale limit gives way to any page viewed twice.
		now += STALE_AFTER_MS + 1;
		expect(memo.admits(2)).toBe(true);
	});

	it('knows which addresses have a kept render, by the address its keys begin with', () => {
		// Room for two entries: each costs its body (100 bytes) and its key (16 or 24 characters) at two bytes each.
		const memo = new PageMemo(300);
		const key = (path: string, data: string) => `${path}\nbr\n${data}`;
		memo.set(key('/vehicles/a', '1'), entry('x'.repeat(100)));
		memo.set(key('/vehicles/a', '2'), entry('x'.repeat(100)));
		expect(memo.keepsAddress('/vehicles/a')).toBe(true);
		expect(memo.keepsAddress('/vehicles/b')).toBe(false);
		// Both of a's renders pushed out: the address is forgotten with its last one.
		memo.set(key('/vehicles/b?saved=3', '1'), entry('x'.repeat(100)));
		expect(memo.keepsAddress('/vehicles/a')).toBe(true);
		memo.set(key('/vehicles/b?saved=3', '2'), entry('x'.repeat(100)));
		expect(memo.keepsAddress('/vehicles/a')).toBe(false);
		expect(memo.keepsAddress('/vehicles/b?saved=3')).toBe(true);
		expect(memo.keepsAddress('/vehicles/b')).toBe(false);
	});

	it('does not keep a page larger than the whole budget', () => {
		const memo = new PageMemo(50);
		memo.set('a', entry('x'.repeat(100)));
		expect(memo.size).toBe(0);
	});
});

describe('memoKey', () => {
	const url = new URL('http://shop.test/vehicles/a');
	it('differs when the address, the query, the encoding or any datum differs', () => {
		const base = memoKey(url, 'br', { user: { id: 1 } }, { watching: false });
		expect(memoKey(url, 'br', { user: { id: 1 } }, { watching: false })).toBe(base);
		expect(memoKey(new URL('http://shop.test/vehicles/b'), 'br', { user: { id: 1 } }, { watching: false })).not.toBe(base);
		expect(memoKey(new URL('http://shop.test/vehicles/a?marked=confirmed'), 'br', { user: { id: 1 } }, { watching: false })).not.toBe(base);
		expect(memoKey(url, 'gzip', { user: { id: 1 } }, { watching: false })).not.toBe(base);
		expect(memoKey(url, 'br', { user: { id: 2 } }, { watching: false })).not.toBe(base);
		expect(memoKey(url, 'br', { user: { id: 1 } }, { watching: true })).not.toBe(base);
	});
});

describe('isPlainData', () => {
	it('accepts what JSON spells out in full', () => {
		expect(isPlainData({ a: [1, 'two', null, true, { b: new Date(0) }], c: undefined })).toBe(true);
		expect(isPlainData(Object.create(null))).toBe(true);
	});
	it('refuses maps, sets, class instances and functions, which would stringify alike', () => {
		expect(isPlainData({ a: new Map([[1, 2]]) })).toBe(false);
		expect(isPlainData([new Set([1])])).toBe(false);
		expect(isPlainData({ a: new (class Row {})() })).toBe(false);
		expect(isPlainData({ a: () => 1 })).toBe(false);
	});
});

describe('reuseRenders', () => {
	type Fake = { layout: unknown; page: unknown };
	function setup(opts: { headers?: Record<string, string>; status?: number; streamed?: boolean; memoBytes?: number } = {}) {
		const state: Fake = { layout: { user: { id: 1 } }, page: { watching: false } };
		const memo = new PageMemo(opts.memoBytes ?? 1_000_000);
		let reads = 0;
		const readPage = async () => {
			reads++;
			if (state.page === 'missing') throw new Error('404');
			return state.page;
		};
		const handle = reuseRenders(memo, async () => state.layout, { '/vehicles/[slug]': { path: /^\/vehicles\/(?<slug>[a-z0-9-]+)$/, data: readPage } });
		let renders = 0;
		const call = async (over: Partial<RequestEvent> = {}) => {
			const event = {
				route: { id: '/vehicles/[slug]' },
				request: new Request('http://shop.test/vehicles/a'),
				url: new URL('http://shop.test/vehicles/a'),
				isDataRequest: false,
				locals: { user: { id: 1 }, units: 'metric' },
				...over
			} as unknown as RequestEvent;
			const resolve = vi.fn(async (e: RequestEvent) => {
				renders++;
				await viewData(e.locals, 'layout', async () => state.layout);
				// As SvelteKit does, a load that throws gets the error page.
				const page = await viewData(e.locals, 'page', readPage).catch(() => null);
				if (page === null) return new Response('<p>Not found</p>', { status: 404, headers: { 'content-type': 'text/html' } });
				const headers = new Headers({ 'content-type': 'text/html', etag: `"${renders}"`, ...opts.headers });
				// SvelteKit sends a streamed page without an ETag.
				if (opts.streamed) headers.delete('etag');
				return new Response(`<p>render ${renders} ${JSON.stringify(page)}</p>`, { status: opts.status ?? 200, headers });
			});
			const response = await handle({ event, resolve });
			return { text: await response.text(), status: response.status, etag: response.headers.get('etag') };
		};
		return { state, memo, call, renders: () => renders, reads: () => reads };
	}

	it('keeps a page from its second render and then sends the same bytes and headers while the data is unchanged', async () => {
		const t = setup();
		await t.call();
		expect(t.memo.size).toBe(0);
		const second = await t.call();
		const third = await t.call();
		const fourth = await t.call();
		expect(t.renders()).toBe(2);
		expect(third).toEqual(second);
		expect(fourth).toEqual(second);
	});

	it('keeps a render per encoding: a reader asking for another encoding never gets the other one’s bytes', async () => {
		const t = setup();
		const asking = (encoding: string) => ({ request: new Request('http://shop.test/vehicles/a', { headers: { 'accept-encoding': encoding } }) });
		await t.call(asking('br'));
		const brotli = await t.call(asking('br'));
		const gzip = await t.call(asking('gzip'));
		expect(gzip.text).not.toBe(brotli.text);
		expect(t.renders()).toBe(3);
		expect(await t.call(asking('gzip, br'))).toEqual(brotli);
		expect((await t.call(asking('gzip'))).text).not.toBe(brotli.text);
		expect(t.renders()).toBe(4);
	});

	it('reads a first view’s data once: the render takes what the memo read for its key', async () => {
		const t = setup();
		expect((await t.call()).text).toBe('<p>render 1 {"watching":false}</p>');
		expect(t.reads()).toBe(1);
		// Off the memo's path (a data request), the load reads for itself.
		await t.call({ isDataRequest: true });
		expect(t.reads()).toBe(2);
	});

	it('renders again as soon as any of the data changes, and keeps both', async () => {
		const t = setup();
		await t.call();
		await t.call();
		t.state.page = { watching: true };
		await t.call();
		expect((await t.call()).text).toContain('"watching":true');
		t.state.page = { watching: false };
		expect((await t.call()).text).toContain('"watching":false');
		// The first view, the second (kept), the changed data (kept at once: the address was seen): three renders.
		expect(t.renders()).toBe(3);
		expect(t.memo.size).toBe(2);
	});

	it('once full, keeps a page viewed more often than the oldest kept, and renders a twice-viewed one without building its key', async () => {
		// Room for one render (about 150 bytes with its key).
		const t = setup({ memoBytes: 200 });
		const at = (slug: string) => ({ request: new Request(`http://shop.test/vehicles/${slug}`), url: new URL(`http://shop.test/vehicles/${slug}`) });
		await t.call(at('a'));
		await t.call(at('a'));
		expect(t.memo.size).toBe(1);
		// b's second view: the memo is full of a page viewed as often, so b is rendered as a first view, its data read once.
		await t.call(at('b'));
		const [reads, misses] = [t.reads(), t.memo.misses];
		await t.call(at('b'));
		expect(t.reads()).toBe(reads + 1);
		// No key was built for it, so nothing was looked up.
		expect(t.memo.misses).toBe(misses);
		expect(t.memo.keepsAddress('/vehicles/a')).toBe(true);
		expect(t.memo.keepsAddress('/vehicles/b')).toBe(false);
		// Its third view outweighs a's two: b takes a's place, and its next view is answered from the memo.
		await t.call(at('b'));
		expect(t.memo.keepsAddress('/vehicles/b')).toBe(true);
		expect(t.memo.keepsAddress('/vehicles/a')).toBe(false);
		const renders = t.renders();
		await t.call(at('b'));
		expect(t.renders()).toBe(renders);
	});

	it('keys by reader: another user gets a render of their own', async () => {
		const t = setup();
		await t.call();
		await t.call();
		t.state.layout = { user: { id: 2 } };
		await t.call({ locals: { user: { id: 2 }, units: 'metric' } } as Partial<RequestEvent>);
		await t.call({ locals: { user: { id: 2 }, units: 'metric' } } as Partial<RequestEvent>);
		expect(t.renders()).toBe(4);
		expect(t.memo.size).toBe(2);
	});

	it('leaves alone other routes, data requests, other methods and visitors not signed in', async () => {
		const t = setup();
		await t.call({ route: { id: '/shop-log' } } as Partial<RequestEvent>);
		await t.call({ route: { id: '/shop-log' } } as Partial<RequestEvent>);
		await t.call({ isDataRequest: true });
		await t.call({ isDataRequest: true });
		await t.call({ request: new Request('http://shop.test/vehicles/a', { method: 'POST' }) });
		await t.call({ request: new Request('http://shop.test/vehicles/a', { method: 'POST' }) });
		await t.call({ locals: { user: null, units: 'metric' } } as Partial<RequestEvent>);
		await t.call({ locals: { user: null, units: 'metric' } } as Partial<RequestEvent>);
		expect(t.renders()).toBe(8);
		expect(t.memo.size).toBe(0);
	});

	it('lets the normal render answer when the view cannot be read (a 404, a redirect)', async () => {
		const t = setup();
		t.state.page = 'missing';
		await t.call();
		expect(t.renders()).toBe(1);
	});

	it('keeps no streamed page, no page that sets a cookie and no error page', async () => {
		for (const opts of [{ streamed: true }, { headers: { 'set-cookie': 'a=b' } }, { status: 404 }]) {
			const t = setup(opts);
			for (let i = 0; i < 3; i++) await t.call();
			expect(t.renders()).toBe(3);
		}
	});

	it('keeps no page whose data JSON cannot spell out', async () => {
		const t = setup();
		t.state.page = { flags: new Map([['a', 1]]) };
		for (let i = 0; i < 3; i++) await t.call();
		expect(t.renders()).toBe(3);
	});
});
