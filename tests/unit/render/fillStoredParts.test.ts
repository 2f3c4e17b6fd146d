import type { RequestEvent, ResolveOptions } from '@sveltejs/kit';
import zlib from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { fillStoredParts } from '../../../src/lib/server/render/vehicleBody';

const encode = (s: string) => new TextEncoder().encode(s);
const PAGE = '<main><div data-kp-fragment="quick-facts"></div><p>Ω · kept</p></main>';

type Options = { fragments?: Record<string, Uint8Array>; tag?: string; type?: string; status?: number; accept?: string };

/** Runs the handle over a stand-in render that answers `chunks` the way SvelteKit hands a page to its hooks. */
async function fill(chunks: string[], opts: Options = {}) {
	const request = new Request('http://shop.test/vehicles/a', { headers: opts.accept ? { 'accept-encoding': opts.accept } : {} });
	const event = { request, locals: { user: null, units: 'metric', fragments: opts.fragments, fragmentsTag: opts.tag ?? 't1' } } as unknown as RequestEvent;
	let handedOver = '';
	const resolve = async (_e: RequestEvent, options?: ResolveOptions) => {
		for (let i = 0; i < chunks.length; i++) handedOver += (await options?.transformPageChunk?.({ html: chunks[i], done: i === chunks.length - 1 })) ?? chunks[i];
		return new Response(handedOver, { status: opts.status ?? 200, headers: { 'content-type': opts.type ?? 'text/html', 'content-length': String(encode(handedOver).length), etag: '"e1"' } });
	};
	return { response: await fillStoredParts({ event, resolve }), handedOver: () => handedOver };
}

async function run(chunks: string[], opts: Options = {}) {
	const { response, handedOver } = await fill(chunks, opts);
	const bytes = Buffer.from(await response.arrayBuffer());
	return { response, bytes, text: bytes.toString('utf8'), handedOver: handedOver() };
}

describe('fillStoredParts', () => {
	it('fills the placeholders of a page rendered in one piece and keeps its status and headers', async () => {
		const { response, text, handedOver } = await run([PAGE], { fragments: { 'quick-facts': encode('<dl>DIN × 2</dl>') } });
		expect(text).toBe('<main><div data-kp-fragment="quick-facts"><dl>DIN × 2</dl></div><p>Ω · kept</p></main>');
		expect(response.status).toBe(200);
		expect(response.headers.get('content-type')).toBe('text/html');
		// The filled page's own length in bytes, not the markup's: the markup's alone would cut the page short.
		expect(response.headers.get('content-length')).toBe(String(encode(text).length));
		// SvelteKit was handed nothing to encode or hash again.
		expect(handedOver).toBe('');
	});

	it('compresses the filled page in the coding the reader asks for, with the compressed length', async () => {
		const fragments = { 'quick-facts': encode('<dl>DIN × 2</dl>'.repeat(50)) };
		const plain = await run([PAGE], { fragments });
		const brotli = await run([PAGE], { fragments, accept: 'gzip, deflate, br' });
		expect(brotli.response.headers.get('content-encoding')).toBe('br');
		expect(brotli.response.headers.get('vary')).toBe('Accept-Encoding');
		expect(brotli.response.headers.get('content-length')).toBe(String(brotli.bytes.length));
		expect(zlib.brotliDecompressSync(brotli.bytes).toString('utf8')).toBe(plain.text);
		const gzip = await run([PAGE], { fragments, accept: 'gzip' });
		expect(gzip.response.headers.get('content-encoding')).toBe('gzip');
		expect(zlib.gunzipSync(gzip.bytes).toString('utf8')).toBe(plain.text);
		expect(plain.response.headers.get('content-encoding')).toBeNull();
		// The same page in every coding carries the same tag, as the server's own compressor leaves it.
		expect(brotli.response.headers.get('etag')).toBe(plain.response.headers.get('etag'));
	});

	it('tags the filled page by its markup and by the stored parts it was filled with', async () => {
		const fragments = { 'quick-facts': encode('<dl>DIN × 2</dl>') };
		const etag = async (page: string, tag: string) => (await run([page], { fragments, tag })).response.headers.get('etag');
		const first = await etag(PAGE, 't1');
		expect(first).toMatch(/^"[A-Za-z0-9_-]{27}"$/);
		expect(await etag(PAGE, 't1')).toBe(first);
		// Other stored parts (another revision, unit system or build) or another reader's markup: another tag.
		expect(await etag(PAGE, 't2')).not.toBe(first);
		expect(await etag(PAGE.replace('kept', 'kept!'), 't1')).not.toBe(first);
	});

	it('gives every page bytes of its own, however many pages are filled before the first is sent', async () => {
		// The first has no placeholder left to fill (a page whose sections are all empty).
		const long = `<main><p>Ω ${'kept '.repeat(400)}</p></main>`;
		const fragments = { 'quick-facts': encode('<dl>DIN × 2</dl>') };
		const first = await fill([long], { fragments });
		const second = await fill([PAGE.replace('Ω', 'Ω Ω')], { fragments });
		expect(Buffer.from(await first.response.arrayBuffer()).toString('utf8')).toBe(long);
		expect(Buffer.from(await second.response.arrayBuffer()).toString('utf8')).toBe('<main><div data-kp-fragment="quick-facts"><dl>DIN × 2</dl></div><p>Ω Ω · kept</p></main>');
	});

	it('fills a page that came in several chunks from the response itself', async () => {
		const { text, response } = await run(['<main><div data-kp-fragment="quick-facts">', '</div></main>'], { fragments: { 'quick-facts': encode('<dl>kept</dl>') } });
		expect(text).toBe('<main><div data-kp-fragment="quick-facts"><dl>kept</dl></div></main>');
		expect(response.headers.get('content-length')).toBe(String(encode(text).length));
	});

	it('leaves a page without stored parts, and anything not HTML, as rendered', async () => {
		expect((await run([PAGE])).text).toBe(PAGE);
		const json = '{"a":"<div data-kp-fragment=\\"quick-facts\\"></div>"}';
		expect((await run([json], { type: 'application/json', fragments: { 'quick-facts': encode('x') } })).text).toBe(json);
	});
});
