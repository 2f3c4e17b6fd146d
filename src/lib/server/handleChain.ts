import type { Handle, ResolveOptions } from '@sveltejs/kit';

type Transform = NonNullable<ResolveOptions['transformPageChunk']>;

/**
 * The handles one after another, each resolving into the next, as SvelteKit's `sequence` does: a page chunk is
 * transformed by the innermost handle's `transformPageChunk` first, and the outermost `filterSerializedResponseHeaders`
 * and `preload` given win. Unlike `sequence` it adds nothing per handle: `sequence` wraps every handle in a tracing
 * span, a copy of the event and a request-store scope, and passes every chunk through an async step per handle
 * whether it transforms it or not — a dozen promises per handle on every request, with tracing off. The event the
 * handles see is the one SvelteKit gave the outermost (so `getRequestEvent()` and `locals` are the same throughout).
 */
export function handleChain(...handles: Handle[]): Handle {
	return ({ event, resolve }) => {
		const step = (i: number, current: typeof event, outer: ResolveOptions | undefined): ReturnType<Handle> =>
			i === handles.length
				? resolve(current, outer)
				: handles[i]({ event: current, resolve: (next, own) => step(i + 1, next, joinOptions(own, outer)) });
		return step(0, event, undefined);
	};
}

/** The options an inner handle resolves with, joined with those its outer handles gave. */
export function joinOptions(inner: ResolveOptions | undefined, outer: ResolveOptions | undefined): ResolveOptions | undefined {
	if (!inner) return outer;
	if (!outer) return inner;
	return {
		transformPageChunk: joinTransforms(inner.transformPageChunk, outer.transformPageChunk),
		filterSerializedResponseHeaders: outer.filterSerializedResponseHeaders ?? inner.filterSerializedResponseHeaders,
		preload: outer.preload ?? inner.preload
	};
}

function joinTransforms(inner: Transform | undefined, outer: Transform | undefined): Transform | undefined {
	if (!inner || !outer) return inner ?? outer;
	return async ({ html, done }) => (await outer({ html: (await inner({ html, done })) ?? '', done })) ?? '';
}
