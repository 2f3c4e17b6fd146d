import { describe, expect, it, vi } from 'vitest';
import type { RequestEvent } from '@sveltejs/kit';
import { keptPages, type DoorRequest } from '../../../src/lib/server/render/keptPages';
import { PageMemo, reuseRenders, viewData, type MemoisedView } from '../../../src/lib/server/render/pageMemo';

const PERIMETER: [string, string][] = [['x-frame-options', 'DENY']];
const SESSION = 'authjs.session-token=t1';

/** A memo filled through the page memo's own handle, and the door that answers from it. */
function setup() {
	const state = { layout: { user: { id: 1 } } as unknown, page: { watching: false } as unknown, user: { id: 1, units: 'metric' } as { id: number; units: string } | null, passBy: false };
	const memo = new PageMemo(1_000_000);
	let reads = 0;
	const views: Record<string, MemoisedView> = {
		'/vehicles/[slug]': {
			path: /^\/vehicles\/(?<slug>[a-z0-9-]+)$/,
			data: async ({ params }) => {
				reads++;
				if (params.slug !== 'a') throw new Error('404');
				return state.page;
			}
		}
	};
	const layout = async () => state.layout;
	const handle = reuseRenders(memo, layout, views);
	let renders = 0;
	// A view rendered by SvelteKit: the memo's handle around a render of the current data.
	const render = async (encoding = 'identity') => {
		const event = {
			route: { id: '/vehicles/[slug]' },
			request: new Request('http://shop.test/vehicles/a', { headers: { 'accept-encoding': encoding } }),
			url: new URL('http://shop.test/vehicles/a'),
			params: { slug: 'a' },
			isDataRequest: false,
			locals: { user: state.user, units: 'metric' }
		} as unknown as RequestEvent;
		return handle({
			event,
			resolve: async (e) => {
				renders++;
				await viewData(e.locals, 'layout', layout);
				const page = await viewData(e.locals, 'page', () => views['/vehicles/[slug]'].data(e));
				return new Response(`<p>render ${renders} ${JSON.stringify(page)}</p>`, {
					headers: { 'content-type': 'text/html', etag: `"r${renders}"`, vary: 'Accept-Encoding', 'x-sveltekit-page': 'true' }
				});
			}
		});
	};
	const reader = vi.fn(async (cookies: { get(name: string): string | undefined }) => ({
		user: cookies.get('authjs.session-token') === 't1' ? (state.user as never) : null,
		units: 'metric' as const
	}));
	const door = keptPages({ memo, layout, views, reader, headers: PERIMETER, passBy: () => state.passBy });
	const ask = (over: Partial<DoorRequest> & { headers?: Record<string, string> } = {}) =>
		door({ method: 'GET', url: '/vehicles/a', ...over, headers: { cookie: SESSION, 'accept-encoding': 'identity', ...over.headers } });
	return { state, memo, render, ask, reader, renders: () => renders, reads: () => reads };
}

const text = (body: Uint8Array | null) => new TextDecoder().decode(body ?? new Uint8Array());

describe('kept pages at the door', () => {
	it('answers a repeat view with the kept bytes, the kept headers and those every answer carries', async () => {
		const t = setup();
		await t.render();
		const kept = await (await t.render()).text();
		expect(t.memo.size).toBe(1);
		const answer = await t.ask({ headers: { 'x-request-id': 'proxy-given-id-1' } });
		expect(answer?.status).toBe(200);
		expect(text(answer!.body)).toBe(kept);
		expect(Object.fromEntries(answer!.headers)).toMatchObject({
			'content-type': 'text/html',
			etag: '"r2"',
			'x-frame-options': 'DENY',
			'x-request-id': 'proxy-given-id-1'
		});
		expect(t.renders()).toBe(2);
	});

	it('answers 304 with only the validators when the reader holds the kept ETag, weak or strong', async () => {
		const t = setup();
		await t.render();
		await t.render();
		for (const etag of ['"r2"', 'W/"r2"']) {
			const answer = await t.ask({ headers: { 'if-none-match': etag } });
			expect(answer?.status).toBe(304);
			expect(answer!.body).toBeNull();
			// As SvelteKit's own 304: the ETag and the caching headers (RFC 9110 §15.4.5), nothing else.
			expect(Object.fromEntries(answer!.headers)).toEqual({ etag: '"r2"', vary: 'Accept-Encoding' });
		}
		expect((await t.ask({ headers: { 'if-none-match': '"r1"' } }))?.status).toBe(200);
	});

	it('leaves a first view to SvelteKit without reading its reader or its data', async () => {
		const t = setup();
		expect(await t.ask()).toBeNull();
		expect(t.reads()).toBe(0);
		expect(t.reader).not.toHaveBeenCalled();
		// Nor does asking count as a view: the framework's render is still the reader's first.
		await t.render();
		expect(t.memo.size).toBe(0);
	});

	it('leaves to SvelteKit a page whose data changed since it was kept', async () => {
		const t = setup();
		await t.render();
		await t.render();
		t.state.page = { watching: true };
		expect(await t.ask()).toBeNull();
	});

	it('leaves to SvelteKit other methods, other addresses, visitors with no session and requests it must pass by', async () => {
		const t = setup();
		await t.render();
		await t.render();
		expect(await t.ask({ method: 'POST' })).toBeNull();
		expect(await t.ask({ method: 'HEAD' })).toBeNull();
		expect(await t.ask({ url: '/vehicles/a/history' })).toBeNull();
		expect(await t.ask({ url: '/vehicles/A' })).toBeNull();
		expect(await t.ask({ url: '/vehicles/b' })).toBeNull();
		expect(await t.ask({ headers: { cookie: '' } })).toBeNull();
		expect(await t.ask({ headers: { cookie: 'authjs.session-token=ended' } })).toBeNull();
		t.state.passBy = true;
		expect(await t.ask()).toBeNull();
		t.state.passBy = false;
		expect((await t.ask())?.status).toBe(200);
	});

	it('never answers one encoding’s bytes to a reader asking for another', async () => {
		const t = setup();
		await t.render('identity');
		await t.render('identity');
		expect(await t.ask({ headers: { 'accept-encoding': 'br' } })).toBeNull();
	});

	it('leaves to SvelteKit a view whose data cannot be read (a 404, a failed read)', async () => {
		const t = setup();
		t.reader.mockRejectedValueOnce(new Error('database gone'));
		await t.render();
		await t.render();
		expect(await t.ask()).toBeNull();
		expect((await t.ask())?.status).toBe(200);
	});
});
