import { describe, expect, it } from 'vitest';
import type { RequestEvent } from '@sveltejs/kit';
import { bodyLimitFor, bodyLimits, inlineScriptHashes, pageSecurityPolicy, pagePolicy, securityHeaders } from '../../src/lib/server/perimeter';

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

/** The hash source of `text` by the Web Crypto API, an implementation independent of the one under test. */
async function webCryptoSource(text: string): Promise<string> {
	const digest = await crypto.subtle.digest('SHA-256', new TextEncoder().encode(text));
	return `'sha256-${Buffer.from(digest).toString('base64')}'`;
}

describe('page security policy', () => {
	it('hashes an inline script as the CSP specification does', () => {
		// The Content Security Policy Level 3 specification's hash-source example: <script>alert('Hello, world.');</script>.
		expect(inlineScriptHashes("<script>alert('Hello, world.');</script>")).toEqual(["'sha256-qznLcsROx4GACP2dm0UCKCzCG+HiZ1guq6ZZDob/Tng='"]);
	});

	it('hashes every running inline script by its text as written, and nothing else', async () => {
		const start = '\n\t\t{ const name = "Tamsin · Ω"; start(name); }\n\t';
		const module = 'import("/_app/x.js")';
		const html = [
			'<head><script src="/_app/a.js"></script><script type="application/json" data-sveltekit-fetched>{"a":1}</script></head>',
			`<body><div><script>${start}</script></div>`,
			`<script type="module">${module}</script><script type="text/plain">not run</script><scripted>not a script</scripted></body>`
		].join('');
		// CSP Level 3 hashes the script element's text content as UTF-8, whitespace and all.
		expect(inlineScriptHashes(html)).toEqual([await webCryptoSource(start), await webCryptoSource(module)]);
		expect(inlineScriptHashes('<p>no scripts</p>')).toEqual([]);
	});

	it('lists the script hashes under script-src only, beside the fixed directives', () => {
		const policy = pagePolicy(["'sha256-abc='"]);
		expect(policy).toContain("script-src 'self' 'sha256-abc='");
		expect(policy).toContain("default-src 'self'");
		expect(policy).toContain("frame-ancestors 'none'");
		expect(policy).toContain("object-src 'none'");
		expect(policy.match(/sha256/g)).toHaveLength(1);
	});

	it('gives a rendered page its policy and leaves an answer that rendered no page alone', async () => {
		const page = '<html><script>go()</script></html>';
		const rendered = await pageSecurityPolicy({
			event: {} as RequestEvent,
			resolve: async (_event, options) => new Response(await options!.transformPageChunk!({ html: page, done: true }), { headers: { 'content-type': 'text/html' } })
		});
		expect(rendered.headers.get('content-security-policy')).toContain(`script-src 'self' ${await webCryptoSource('go()')}`);
		const endpoint = await pageSecurityPolicy({ event: {} as RequestEvent, resolve: async () => new Response('{}', { headers: { 'content-type': 'application/json' } }) });
		expect(endpoint.headers.get('content-security-policy')).toBeNull();
	});
});
