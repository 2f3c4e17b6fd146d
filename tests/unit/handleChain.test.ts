import { describe, expect, it } from 'vitest';
import type { Handle, RequestEvent, ResolveOptions } from '@sveltejs/kit';
import { handleChain } from '../../src/lib/server/handleChain';

// The expected orders are those SvelteKit documents for `sequence` (the JSDoc of `sequence` in
// @sveltejs/kit/src/exports/hooks/sequence.js and the "hooks" page of the SvelteKit docs): handles run
// outermost first, page chunks are transformed innermost first, and the first
// `filterSerializedResponseHeaders` / `preload` given wins.

type Seen = { log: string[]; options?: ResolveOptions };

function run(handle: Handle, event = { locals: {} } as unknown as RequestEvent) {
	const seen: Seen = { log: [] };
	const resolve = async (_event: RequestEvent, options?: ResolveOptions) => {
		seen.options = options;
		seen.log.push('resolve');
		const html = (await options?.transformPageChunk?.({ html: 'page', done: true })) ?? 'page';
		return new Response(html);
	};
	return Promise.resolve(handle({ event, resolve })).then(async (response) => ({ ...seen, body: await response.text() }));
}

const named = (name: string, log: string[], options?: ResolveOptions): Handle =>
	async ({ event, resolve }) => {
		log.push(`${name} before`);
		const response = await resolve(event, options);
		log.push(`${name} after`);
		return response;
	};

describe('handles one after another', () => {
	it('runs each handle around the next, outermost first, and ends in the framework', async () => {
		const log: string[] = [];
		const seen = await run(handleChain(named('first', log), named('second', log), named('third', log)));
		expect([...log.slice(0, 3), ...seen.log, ...log.slice(3)]).toEqual([
			'first before',
			'second before',
			'third before',
			'resolve',
			'third after',
			'second after',
			'first after'
		]);
	});

	it('transforms a page chunk with the innermost handle first', async () => {
		const log: string[] = [];
		const tag = (name: string) => ({ transformPageChunk: ({ html }: { html: string }) => `${name}(${html})` });
		const seen = await run(handleChain(named('first', log, tag('first')), named('plain', log), named('second', log, tag('second'))));
		expect(seen.body).toBe('first(second(page))');
	});

	it('passes a chunk on as empty when a transform answers nothing, as SvelteKit does', async () => {
		const log: string[] = [];
		const seen = await run(
			handleChain(named('outer', log, { transformPageChunk: ({ html }) => `[${html}]` }), named('inner', log, { transformPageChunk: () => undefined }))
		);
		expect(seen.body).toBe('[]');
	});

	it('awaits transforms that answer later', async () => {
		const log: string[] = [];
		const later = (suffix: string): ResolveOptions => ({ transformPageChunk: async ({ html }) => `${html}${suffix}` });
		const seen = await run(handleChain(named('outer', log, later('-outer')), named('inner', log, later('-inner'))));
		expect(seen.body).toBe('page-inner-outer');
	});

	it('keeps the outermost header filter and preload given', async () => {
		const log: string[] = [];
		const outerFilter = (name: string) => name === 'x-outer';
		const innerFilter = () => true;
		const outerPreload = () => false;
		const seen = await run(
			handleChain(
				named('outer', log, { filterSerializedResponseHeaders: outerFilter, preload: outerPreload }),
				named('middle', log),
				named('inner', log, { filterSerializedResponseHeaders: innerFilter, preload: () => true })
			)
		);
		expect(seen.options?.filterSerializedResponseHeaders).toBe(outerFilter);
		expect(seen.options?.preload).toBe(outerPreload);
	});

	it('takes an inner handle’s options when no outer handle gives any', async () => {
		const log: string[] = [];
		const filter = () => true;
		const seen = await run(handleChain(named('outer', log), named('inner', log, { filterSerializedResponseHeaders: filter })));
		expect(seen.options?.filterSerializedResponseHeaders).toBe(filter);
		expect(seen.options?.transformPageChunk).toBeUndefined();
	});

	it('hands each handle the event the previous one resolved with', async () => {
		const replaced = { locals: { who: 'replaced' } } as unknown as RequestEvent;
		let inner: RequestEvent | null = null;
		await run(
			handleChain(
				({ resolve }) => resolve(replaced),
				({ event, resolve }) => {
					inner = event;
					return resolve(event);
				}
			)
		);
		expect(inner).toBe(replaced);
	});

	it('answers without the framework when a handle does not resolve', async () => {
		const log: string[] = [];
		const seen = await run(handleChain(named('outer', log), () => new Response('early', { status: 401 }), named('never', log)));
		expect(seen.body).toBe('early');
		expect(seen.log).toEqual([]);
		expect(log).toEqual(['outer before', 'outer after']);
	});
});
