import zlib from 'node:zlib';
import { beforeAll, describe, expect, it } from 'vitest';
import { BASE, userFor } from './browser';
import { rawGet, type Raw } from './rawGet';
import { signInCookie } from '../../scripts/bench/lib';

// A reader's repeat views of an unchanged vehicle page are answered from the page memo before SvelteKit
// (src/lib/server/render/keptPages.ts). Whichever path answers, the reader gets the same page and headers.

// Headers that differ on every answer by their nature.
const PER_ANSWER = new Set(['date', 'x-request-id', 'connection', 'keep-alive']);
const lasting = (raw: Raw) => Object.fromEntries(Object.entries(raw.headers).filter(([name]) => !PER_ANSWER.has(name)));

let slug = '';

beforeAll(async () => {
	const viewer = userFor('viewer');
	const cookie = await signInCookie(BASE, viewer.email, viewer.password);
	const list = (await rawGet('/vehicles', { cookie, 'accept-encoding': 'identity' })).body.toString('utf8');
	slug = /href="\/vehicles\/([a-z0-9-]+)"/.exec(list)![1];
});

describe('repeat views of a kept page', () => {
	it('get the bytes and headers of the render that was kept, with a request id of their own', async () => {
		const viewer = userFor('viewer');
		const cookie = await signInCookie(BASE, viewer.email, viewer.password);
		const headers = { cookie, 'accept-encoding': 'br' };
		const first = await rawGet(`/vehicles/${slug}`, headers);
		// The second view is rendered and kept; the later ones are answered from it.
		const kept = await rawGet(`/vehicles/${slug}`, headers);
		const repeats = [await rawGet(`/vehicles/${slug}`, headers), await rawGet(`/vehicles/${slug}`, headers)];
		for (const raw of [first, kept, ...repeats]) expect(raw.status).toBe(200);
		for (const repeat of repeats) {
			expect(repeat.body.equals(kept.body)).toBe(true);
			expect(lasting(repeat)).toEqual(lasting(kept));
			expect(repeat.headers['x-request-id']).toMatch(/^[0-9a-f-]{36}$/);
		}
		expect(repeats[0].headers['x-request-id']).not.toBe(repeats[1].headers['x-request-id']);
		expect(kept.headers['content-encoding']).toBe('br');
		expect(zlib.brotliDecompressSync(repeats[0].body).toString('utf8')).toContain('<h1');
		for (const name of ['content-security-policy', 'x-frame-options', 'x-content-type-options', 'referrer-policy', 'permissions-policy', 'cross-origin-opener-policy']) {
			expect(repeats[0].headers[name]).toBeTruthy();
		}
		// A reader who holds the page already gets 304 and no body.
		const again = await rawGet(`/vehicles/${slug}`, { ...headers, 'if-none-match': kept.headers.etag! });
		expect(again.status).toBe(304);
		expect(again.body.length).toBe(0);
		expect(again.headers.etag).toBe(kept.headers.etag);
	});

	it('stop the moment the session is signed out: a copy of its cookie is sent to sign in', async () => {
		const viewer = userFor('viewer');
		const cookie = await signInCookie(BASE, viewer.email, viewer.password);
		for (let i = 0; i < 3; i++) expect((await rawGet(`/vehicles/${slug}`, { cookie, 'accept-encoding': 'gzip' })).status).toBe(200);
		const signedOut = await fetch(`${BASE}/signout`, {
			method: 'POST',
			redirect: 'manual',
			headers: { cookie, origin: BASE, 'content-type': 'application/x-www-form-urlencoded' },
			body: new URLSearchParams({ redirectTo: '/signin?signedout=1' })
		});
		expect(signedOut.status).toBeLessThan(400);
		const copy = await rawGet(`/vehicles/${slug}`, { cookie, 'accept-encoding': 'gzip' });
		expect(copy.status).toBe(303);
		expect(copy.headers.location).toMatch(/^\/signin\?next=/);
	});
});
