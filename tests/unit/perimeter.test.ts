import { describe, expect, it } from 'vitest';
import type { RequestEvent } from '@sveltejs/kit';
import { bodyLimitFor, bodyLimits, securityHeaders } from '../../src/lib/server/perimeter';

const KB = 1024;

function call(handle: typeof bodyLimits, request: Request) {
	let reached = false;
	const event = { request, url: new URL(request.url) } as unknown as RequestEvent;
	const resolve = async () => {
		reached = true;
		return new Response('ok');
	};
	return Promise.resolve(handle({ event, resolve })).then((response) => ({ response, reached }));
}

describe('body limits by route', () => {
	it.each([
		['/vehicles/veldra-tarn/photos', null],
		['/api/vehicles/veldra-tarn/photos', null],
		['/auth/callback/credentials', 16 * KB],
		['/signin', 16 * KB],
		['/reset/abc', 16 * KB],
		['/vehicles/veldra-tarn/edit', 2048 * KB],
		['/vehicles/new', 2048 * KB],
		['/api/vehicles/veldra-tarn', 2048 * KB],
		['/calc/ladder', 256 * KB],
		['/parts/new', 256 * KB]
	])('%s takes at most %s bytes', (path, bytes) => {
		expect(bodyLimitFor(path)).toBe(bytes);
	});

	it('refuses a declared length over the limit without reading the body', async () => {
		const { response, reached } = await call(
			bodyLimits,
			new Request('http://shop.test/signin', { method: 'POST', headers: { 'content-length': String(16 * KB + 1) }, body: 'x' })
		);
		expect(reached).toBe(false);
		expect(response.status).toBe(413);
	});

	it('lets a post at the limit through, and GETs always', async () => {
		const body = 'x'.repeat(16 * KB);
		expect((await call(bodyLimits, new Request('http://shop.test/signin', { method: 'POST', headers: { 'content-length': String(body.length) }, body }))).reached).toBe(true);
		expect((await call(bodyLimits, new Request('http://shop.test/signin'))).reached).toBe(true);
	});

	it('answers an API path in JSON and a streamed body of unknown length with 411', async () => {
		const stream = new ReadableStream({ start: (c) => (c.enqueue(new TextEncoder().encode('{}')), c.close()) });
		const { response, reached } = await call(
			bodyLimits,
			new Request('http://shop.test/api/markdown', { method: 'POST', body: stream, duplex: 'half' } as RequestInit)
		);
		expect(reached).toBe(false);
		expect(response.status).toBe(411);
		expect(await response.json()).toHaveProperty('message');
	});
});

describe('security headers', () => {
	it('adds HSTS only behind HTTPS and never overrides a header a route set', async () => {
		const plain = await call(securityHeaders({ https: false }), new Request('http://shop.test/'));
		expect(plain.response.headers.get('strict-transport-security')).toBeNull();
		expect(plain.response.headers.get('x-frame-options')).toBe('DENY');
		const secure = await call(securityHeaders({ https: true }), new Request('https://shop.test/'));
		// RFC 6797 section 6.1: max-age in seconds; one year is the usual floor for preload lists (common practice).
		expect(secure.response.headers.get('strict-transport-security')).toBe('max-age=31536000; includeSubDomains');
	});
});
