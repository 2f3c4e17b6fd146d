import { hash } from 'node:crypto';
import type { Handle } from '@sveltejs/kit';

// What every answer carries and how large a request may be, before any route reads it, and the
// Content-Security-Policy of every page.

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
export function answerHeaders(options: { https: boolean }): [name: string, value: string][] {
	return [
		['x-content-type-options', 'nosniff'],
		['x-frame-options', 'DENY'],
		['referrer-policy', 'same-origin'],
		['permissions-policy', 'camera=(self), microphone=(), geolocation=(), payment=(), usb=(), interest-cohort=()'],
		['cross-origin-opener-policy', 'same-origin'],
		...(options.https ? ([['strict-transport-security', 'max-age=31536000; includeSubDomains']] as [string, string][]) : [])
	];
}

/** Gives every answer the headers above, unless it set its own. */
export function securityHeaders(options: { https: boolean }): Handle {
	const headers = answerHeaders(options);
	return async ({ event, resolve }) => {
		const response = await resolve(event);
		try {
			for (const [name, value] of headers) if (!response.headers.has(name)) response.headers.set(name, value);
		} catch {
			// A response with immutable headers (a fetched one passed through) goes out as it is.
		}
		return response;
	};
}

/** Where a page may load from and send to. Scripts are the app's own files and the inline scripts it rendered. */
const POLICY: Record<string, string[]> = {
	'default-src': ["'self'"],
	'script-src': ["'self'"],
	// Svelte's transitions and SVG figures set inline styles.
	'style-src': ["'self'", "'unsafe-inline'"],
	// Notes may show only the app's own photos.
	'img-src': ["'self'", 'data:', 'blob:'],
	'font-src': ["'self'"],
	'connect-src': ["'self'"],
	// The service worker that keeps pages for reading with no signal.
	'worker-src': ["'self'"],
	'manifest-src': ["'self'"],
	'object-src': ["'none'"],
	'base-uri': ["'self'"],
	'form-action': ["'self'"],
	'frame-ancestors': ["'none'"]
};

// A script tag's name, then the end of the tag or its attributes. (A pattern finds it several times faster
// than a plain string search does in a page of HTML.)
const SCRIPT_OPEN = /<script[\s/>]/g;
const SCRIPT_CLOSE = '</script>';
// A script element runs when it has no type or a JavaScript one; JSON data blocks are never run.
const RUNS = /^(?:text\/javascript|application\/javascript|module)$/i;

/** The CSP hash source of every inline script that runs in `html` ('sha256-…' of its text as written). */
export function inlineScriptHashes(html: string): string[] {
	const hashes: string[] = [];
	SCRIPT_OPEN.lastIndex = 0;
	for (let open = SCRIPT_OPEN.exec(html); open; open = SCRIPT_OPEN.exec(html)) {
		const tagEnd = html.indexOf('>', open.index);
		if (tagEnd === -1) break;
		const attributes = html.slice(open.index + '<script'.length, tagEnd);
		if (/\ssrc\s*=/i.test(attributes)) continue;
		const type = /\stype\s*=\s*["']?([^"'\s>]+)/i.exec(attributes)?.[1];
		if (type !== undefined && !RUNS.test(type)) continue;
		const end = html.indexOf(SCRIPT_CLOSE, tagEnd + 1);
		if (end === -1) break;
		hashes.push(`'sha256-${hash('sha256', html.slice(tagEnd + 1, end), 'base64')}'`);
		SCRIPT_OPEN.lastIndex = end;
	}
	return hashes;
}

/** The Content-Security-Policy header for a page whose inline scripts hash to `scriptHashes`. */
export function pagePolicy(scriptHashes: string[]): string {
	return Object.entries(POLICY)
		.map(([name, sources]) => [name, ...sources, ...(name === 'script-src' ? scriptHashes : [])].join(' '))
		.join('; ');
}

/**
 * Gives every page the policy above with the hashes of the inline scripts it rendered (SvelteKit's start-up
 * script and data). Runs innermost, so it reads the page as rendered; the hashes are taken with the runtime's
 * own SHA-256. A page streamed in chunks gets the hashes of what was rendered before its headers went out, as
 * SvelteKit's own hashing did.
 */
export const pageSecurityPolicy: Handle = async ({ event, resolve }) => {
	let rendered = false;
	const hashes: string[] = [];
	const response = await resolve(event, {
		transformPageChunk: ({ html }) => {
			rendered = true;
			hashes.push(...inlineScriptHashes(html));
			return html;
		}
	});
	if (!rendered) return response;
	try {
		response.headers.set('content-security-policy', pagePolicy(hashes));
	} catch {
		// A response with immutable headers goes out as it is.
	}
	return response;
};
