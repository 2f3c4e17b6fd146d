import type { RequestEvent, ResolveOptions } from '@sveltejs/kit';
import { describe, expect, it } from 'vitest';
import { fillStoredParts } from '../../../src/lib/server/render/vehicleBody';

const encode = (s: string) => new TextEncoder().encode(s);
const PAGE = '<main><div data-kp-fragment="quick-facts"></div><p>Ω · kept</p></main>';

/** Runs the handle over a stand-in render that answers `chunks` the way SvelteKit hands a page to its hooks. */
async function run(chunks: string[], opts: { fragments?: Record<string, Uint8Array>; type?: string; status?: number } = {}) {
	const event = { locals: { user: null, units: 'metric', fragments: opts.fragments } } as unknown as RequestEvent;
	const resolve = async (_e: RequestEvent, options?: ResolveOptions) => {
		let html = '';
		for (let i = 0; i < chunks.length; i++) html += (await options?.transformPageChunk?.({ html: chunks[i], done: i === chunks.length - 1 })) ?? chunks[i];
		return new Response(html, { status: opts.status ?? 200, headers: { 'content-type': opts.type ?? 'text/html', 'content-length': String(encode(html).length), etag: '"e1"' } });
	};
	const response = await fillStoredParts({ event, resolve });
	return { response, text: await response.text() };
}

describe('fillStoredParts', () => {
	it('fills the placeholders of a page rendered in one piece and keeps its status and headers', async () => {
		const { response, text } = await run([PAGE], { fragments: { 'quick-facts': encode('<dl>DIN × 2</dl>') } });
		expect(text).toBe('<main><div data-kp-fragment="quick-facts"><dl>DIN × 2</dl></div><p>Ω · kept</p></main>');
		expect(response.headers.get('etag')).toBe('"e1"');
		// The length of the markup alone would cut the filled page short.
		expect(response.headers.get('content-length')).toBeNull();
	});

	it('fills a page that came in several chunks from the response itself', async () => {
		const { text } = await run(['<main><div data-kp-fragment="quick-facts">', '</div></main>'], { fragments: { 'quick-facts': encode('<dl>kept</dl>') } });
		expect(text).toBe('<main><div data-kp-fragment="quick-facts"><dl>kept</dl></div></main>');
	});

	it('leaves a page without stored parts, and anything not HTML, as rendered', async () => {
		expect((await run([PAGE])).text).toBe(PAGE);
		const json = '{"a":"<div data-kp-fragment=\\"quick-facts\\"></div>"}';
		expect((await run([json], { type: 'application/json', fragments: { 'quick-facts': encode('x') } })).text).toBe(json);
	});
});
