import { createHash } from 'node:crypto';
import type { Handle } from '@sveltejs/kit';
import { render } from 'svelte/server';
import SectionBody from '$lib/components/vehicle/SectionBody.svelte';
import SectionNotes from '$lib/components/vehicle/SectionNotes.svelte';
import QuickFacts from '$lib/components/vehicle/QuickFacts.svelte';
import { sectionIsEmpty } from '$lib/components/vehicle/display';
import { SECTION_KEYS, type SectionKey } from '$lib/domain/content/schema';
import type { UnitSystem } from '$lib/domain/units';
import type { StoredRevision } from '../services/revisions';
import { bytesBody, encodePage, pageEncoding } from './pageEncoding';

export type VehicleBody = {
	/** Per section: its figures and tables, its notes, and whether anything is recorded at all. */
	sections: Record<SectionKey, { html: string; notes: string; empty: boolean }>;
	quickFacts: string;
	quickFactsColumns: string;
};

export type Outline = Record<SectionKey, { empty: boolean; notes: boolean }>;

/** A body with its outline: the same for every reader of one content in one unit system. */
export type RenderedBody = { body: VehicleBody; outline: Outline };

/** Renders a revision's figures, tables, notes and quick facts in one unit system. */
export function renderBody(revision: Pick<StoredRevision, 'content' | 'rendered'>, units: UnitSystem): RenderedBody {
	const { content, rendered } = revision;
	const sections = {} as VehicleBody['sections'];
	for (const section of SECTION_KEYS) {
		const empty = sectionIsEmpty(content, section) && !rendered[section] && !content.photos.some((p) => p.section === section);
		const notes = rendered[section];
		sections[section] = {
			html: empty ? '' : render(SectionBody, { props: { section, content, units } }).body,
			notes: notes ? render(SectionNotes, { props: { html: notes } }).body : '',
			empty
		};
	}
	const body: VehicleBody = {
		sections,
		quickFacts: render(QuickFacts, { props: { content, units } }).body,
		quickFactsColumns: render(QuickFacts, { props: { content, units, columns: true } }).body
	};
	const outline = Object.fromEntries(SECTION_KEYS.map((k) => [k, { empty: sections[k].empty, notes: sections[k].notes !== '' }])) as Outline;
	return { body, outline };
}

/** The named placeholders of a full page view and the HTML that fills each. */
export function bodyFragments(body: VehicleBody): Record<string, string> {
	const fragments: Record<string, string> = { 'quick-facts': body.quickFacts, 'quick-facts-columns': body.quickFactsColumns };
	for (const k of SECTION_KEYS) {
		fragments[`section-${k}`] = body.sections[k].html;
		fragments[`notes-${k}`] = body.sections[k].notes;
	}
	return fragments;
}

/** The body again from its fragments (as stored) and its outline. */
export function bodyOf(fragments: Record<string, Uint8Array>, outline: Outline): VehicleBody {
	const text = (name: string) => Buffer.from(fragments[name] ?? []).toString('utf8');
	const sections = {} as VehicleBody['sections'];
	for (const k of SECTION_KEYS) sections[k] = { html: text(`section-${k}`), notes: text(`notes-${k}`), empty: outline[k].empty };
	return { sections, quickFacts: text('quick-facts'), quickFactsColumns: text('quick-facts-columns') };
}

/** Client navigations get the body as data; a full page view gets it spliced into the HTML by `fillStoredParts`. */
export function deliverBody(locals: App.Locals, { fragments, outline, tag }: { fragments: Record<string, Uint8Array>; outline: Outline; tag: string }, isDataRequest: boolean) {
	if (isDataRequest) return { outline, body: bodyOf(fragments, outline) };
	locals.fragments = fragments;
	locals.fragmentsTag = tag;
	return { outline, body: null };
}

const MARK = Buffer.from('<div data-kp-fragment="');
const QUOTE = 0x22;
const EMPTY_CLOSE = Buffer.from('"></div>');

/**
 * Fills the empty fragment placeholders of a rendered page with their stored HTML. Works on the encoded bytes:
 * the page's own markup is small, and joining the large stored parts into it as text would copy them twice more
 * (into a string, then out as UTF-8) on every first view.
 */
export function spliceFragments(page: Uint8Array, fragments: Record<string, Uint8Array>): Buffer<ArrayBuffer> {
	const html = Buffer.from(page.buffer, page.byteOffset, page.byteLength);
	const pieces: Uint8Array[] = [];
	let from = 0;
	for (let at = html.indexOf(MARK); at !== -1; at = html.indexOf(MARK, from)) {
		const nameEnd = html.indexOf(QUOTE, at + MARK.length);
		if (nameEnd === -1) break;
		const name = html.toString('latin1', at + MARK.length, nameEnd);
		const close = nameEnd + 2; // past `">`
		const empty = html.compare(EMPTY_CLOSE, 0, EMPTY_CLOSE.length, nameEnd, nameEnd + EMPTY_CLOSE.length) === 0;
		const fill = empty && Object.hasOwn(fragments, name) ? fragments[name] : null;
		pieces.push(html.subarray(from, close));
		if (fill?.length) pieces.push(fill);
		from = close;
	}
	pieces.push(html.subarray(from));
	// Always a copy: the page may be a buffer the next page is encoded into.
	return Buffer.concat(pieces);
}

// The page markup is encoded into one buffer that every page reuses (it is spliced into the filled page at once,
// before any other request runs): a new buffer for each page's tens of kilobytes took twice as long.
let markupBytes = Buffer.allocUnsafeSlow(64 * 1024);

/** `markup` as UTF-8, valid until the next call. */
function encodedMarkup(markup: string): Buffer {
	// A UTF-16 code unit takes at most three bytes in UTF-8 (a surrogate pair, two units, four).
	if (markupBytes.length < markup.length * 3) markupBytes = Buffer.allocUnsafeSlow(markup.length * 3);
	return markupBytes.subarray(0, markupBytes.write(markup));
}

/**
 * The handle that fills a full page view's placeholders with the stored parts its load left in `locals.fragments`.
 * A page rendered in one piece is taken as SvelteKit hands it over and SvelteKit is given nothing to encode or
 * hash: the filled page is encoded once here, and its ETag is the page markup's digest with the stored parts'
 * tag (the fragments are named by their tag, so their tens of kilobytes are not hashed on every view). The
 * filled page is compressed here when the reader accepts it (see pageEncoding.ts). A page streamed in chunks is
 * read back out of its response instead.
 */
export const fillStoredParts: Handle = async ({ event, resolve }) => {
	let markup: string | null = null;
	let chunks = 0;
	const response = await resolve(event, {
		transformPageChunk: ({ html, done }) => {
			chunks++;
			if (done && chunks === 1 && event.locals.fragments) {
				markup = html;
				return '';
			}
			return html;
		}
	});
	const fragments = event.locals.fragments;
	if (!response.headers.get('content-type')?.startsWith('text/html')) {
		// Only a page's HTML goes through transformPageChunk; anything else taken there is given back whole all the same.
		return markup === null ? response : new Response(markup, { status: response.status, statusText: response.statusText, headers: response.headers });
	}
	if (!fragments || (markup === null && !response.body)) return response;
	// SvelteKit's response is set aside for the filled one, which takes its headers.
	const headers = response.headers;
	let page: Uint8Array;
	if (markup !== null) {
		page = encodedMarkup(markup);
		void response.body?.cancel();
		if (headers.has('etag')) headers.set('etag', `"${createHash('sha1').update(page).update(event.locals.fragmentsTag ?? '').digest('base64url')}"`);
	} else {
		page = new Uint8Array(await response.arrayBuffer());
	}
	const encoding = pageEncoding(event.request.headers.get('accept-encoding'));
	const filled = encodePage(spliceFragments(page, fragments), encoding);
	if (encoding !== 'identity') headers.set('content-encoding', encoding);
	headers.set('vary', 'Accept-Encoding');
	// With its length known the page goes out without chunked framing.
	headers.set('content-length', String(filled.byteLength));
	event.locals.filledPage = filled;
	return new Response(bytesBody(filled), { status: response.status, statusText: response.statusText, headers });
};
