import type { Handle } from '@sveltejs/kit';

// What every answer carries and how large a request may be, before any route reads it.
// The Content-Security-Policy itself is SvelteKit's `csp` setting (svelte.config.js), which
// hashes the app's own inline scripts.

const KB = 1024;
const MB = 1024 * KB;

/** Bodies the app takes, by path; the first match wins. Photo uploads are bounded by BODY_SIZE_LIMIT. */
const BODY_LIMITS: readonly { test: RegExp; bytes: number | null }[] = [
	{ test: /^\/(?:api\/)?vehicles\/[^/]+\/photos\/?$/, bytes: null },
	{ test: /^\/auth\//, bytes: 16 * KB },
	{ test: /^\/(?:signin|signout|reset|invite|setup)(?:\/|$)/, bytes: 16 * KB },
	{ test: /^\/vehicles\/(?:new|[^/]+\/edit)\/?$/, bytes: 2 * MB },
	{ test: /^\/api\/(?:vehicles|markdown)(?:\/|$)/, bytes: 2 * MB },
	{ test: /./, bytes: 256 * KB }
];

const WITH_BODY = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

export function bodyLimitFor(path: string): number | null {
	for (const rule of BODY_LIMITS) if (rule.test.test(path)) return rule.bytes;
	return null;
}

function refuse(status: number, message: string, path: string): Response {
	const asJson = path.startsWith('/api/');
	return new Response(asJson ? JSON.stringify({ message }) : message, {
		status,
		headers: { 'content-type': asJson ? 'application/json' : 'text/plain; charset=utf-8' }
	});
}

const pretty = (bytes: number) => (bytes >= MB ? `${bytes / MB} MB` : `${bytes / KB} KB`);

/** Refuses an oversized body from its declared length, before anything reads it. */
export const bodyLimits: Handle = ({ event, resolve }) => {
	const { request, url } = event;
	if (!WITH_BODY.has(request.method)) return resolve(event);
	const limit = bodyLimitFor(url.pathname);
	if (limit === null) return resolve(event);
	const declared = request.headers.get('content-length');
	if (declared === null) {
		// A streamed body of unknown length: every browser form and fetch here sends its length.
		if (request.body === null) return resolve(event);
		return refuse(411, 'Send the request with a Content-Length header.', url.pathname);
	}
	const length = Number(declared);
	if (!Number.isSafeInteger(length) || length < 0) return refuse(400, 'The Content-Length header is not a number of bytes.', url.pathname);
	if (length > limit) return refuse(413, `This request is too large: at most ${pretty(limit)} is accepted here.`, url.pathname);
	return resolve(event);
};

/** Headers for every answer: no framing, no referrer sent to other sites, no device features by default. */
export function securityHeaders(options: { https: boolean }): Handle {
	return async ({ event, resolve }) => {
		const response = await resolve(event);
		const set = (name: string, value: string) => {
			if (!response.headers.has(name)) response.headers.set(name, value);
		};
		try {
			set('x-content-type-options', 'nosniff');
			set('x-frame-options', 'DENY');
			set('referrer-policy', 'same-origin');
			set('permissions-policy', 'camera=(self), microphone=(), geolocation=(), payment=(), usb=(), interest-cohort=()');
			set('cross-origin-opener-policy', 'same-origin');
			if (options.https) set('strict-transport-security', 'max-age=31536000; includeSubDomains');
		} catch {
			// A response with immutable headers (a fetched one passed through) goes out as it is.
		}
		return response;
	};
}
