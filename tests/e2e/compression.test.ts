import zlib from 'node:zlib';
import { beforeAll, describe, expect, it } from 'vitest';
import { BASE, userFor } from './browser';
import { rawGet, type Raw } from './rawGet';
import { signInCookie } from '../../scripts/bench/lib';

// Answers are compressed only when the client says it can decode them (Accept-Encoding, RFC 9110 §12.5.3),
// name the coding they used (Content-Encoding, §8.4) and tell caches they vary by it (Vary, §12.5.5).
// gzip is RFC 1952, br RFC 7932; node:zlib decodes both.

const decode = (raw: Raw) => {
	const coding = raw.headers['content-encoding'];
	if (coding === 'gzip') return zlib.gunzipSync(raw.body).toString('utf8');
	if (coding === 'br') return zlib.brotliDecompressSync(raw.body).toString('utf8');
	return raw.body.toString('utf8');
};

let cookie = '';
let slug = '';

beforeAll(async () => {
	const viewer = userFor('viewer');
	cookie = await signInCookie(BASE, viewer.email, viewer.password);
	const list = decode(await rawGet('/vehicles', { cookie, 'accept-encoding': 'identity' }));
	slug = /href="\/vehicles\/([a-z0-9-]+)"/.exec(list)![1];
});

describe('compressed answers', () => {
	it('sends a vehicle page gzipped to a client that asks, the same page as unencoded, with every security header', async () => {
		const plain = await rawGet(`/vehicles/${slug}`, { cookie, 'accept-encoding': 'identity' });
		const gzipped = await rawGet(`/vehicles/${slug}`, { cookie, 'accept-encoding': 'gzip' });
		expect(plain.status).toBe(200);
		expect(gzipped.status).toBe(200);
		expect(plain.headers['content-encoding']).toBeUndefined();
		expect(gzipped.headers['content-encoding']).toBe('gzip');
		expect(gzipped.headers.vary).toMatch(/accept-encoding/i);
		expect(gzipped.body.length).toBeLessThan(plain.body.length / 2);
		expect(decode(gzipped)).toBe(plain.body.toString('utf8'));
		for (const name of ['content-security-policy', 'x-frame-options', 'x-content-type-options', 'referrer-policy', 'permissions-policy']) {
			expect(gzipped.headers[name]).toBe(plain.headers[name]);
		}
	});

	it('sends page data as brotli JSON that reads back the same', async () => {
		const path = `/vehicles/${slug}/__data.json`;
		const plain = await rawGet(path, { cookie, 'accept-encoding': 'identity' });
		const br = await rawGet(path, { cookie, 'accept-encoding': 'br' });
		expect(br.headers['content-type']).toMatch(/json/);
		expect(br.headers['content-encoding']).toBe('br');
		expect(JSON.parse(decode(br))).toEqual(JSON.parse(plain.body.toString('utf8')));
	});

	it('serves the hashed scripts precompressed and cached for good', async () => {
		const page = decode(await rawGet(`/vehicles/${slug}`, { cookie, 'accept-encoding': 'identity' }));
		const script = /\/_app\/immutable\/[^"]+\.js/.exec(page)![0];
		const plain = await rawGet(script, { 'accept-encoding': 'identity' });
		const br = await rawGet(script, { 'accept-encoding': 'br, gzip' });
		expect(br.headers['content-encoding']).toBe('br');
		expect(br.headers['cache-control']).toMatch(/immutable/);
		expect(br.headers['cache-control']).toMatch(/max-age=31536000/);
		expect(decode(br)).toBe(plain.body.toString('utf8'));
	});

	it('answers a repeat view of an unchanged page with 304 and no body', async () => {
		const first = await rawGet(`/vehicles/${slug}`, { cookie, 'accept-encoding': 'gzip' });
		const etag = first.headers.etag!;
		expect(etag).toBeTruthy();
		const again = await rawGet(`/vehicles/${slug}`, { cookie, 'accept-encoding': 'gzip', 'if-none-match': etag });
		expect(again.status).toBe(304);
		expect(again.body.length).toBe(0);
	});
});
