// How a page's reader-independent parts are kept in `rendered_pages.parts`: one line of JSON with the small
// data (names, photos, outline, and each fragment's name and length in bytes), then the fragments' HTML one
// after another. A view reads the row as bytes and takes each fragment as a slice of them, so the tens of
// kilobytes of HTML are neither parsed out of JSON nor encoded again before they are sent.
import type { VehicleContent } from '../../domain/content/schema';
import { bodyFragments, type RenderedBody } from './vehicleBody';

/** What every reader of one content in one unit system is shown alike. */
export type ReadingParts = RenderedBody & {
	/** The header's names and years; the identity notes are in the body. */
	identity: Omit<VehicleContent['identity'], 'notes'>;
	photos: VehicleContent['photos'];
	/** The address these names give (a rename waiting for sign-off makes it differ from the page's own). */
	slug: string;
};

/**
 * The parts as a view uses them: the data as values, each fragment as UTF-8 bytes, and a tag naming them among
 * all stored parts (content, unit system, renderer), which a page's ETag takes instead of hashing the fragments.
 */
export type StoredParts = Omit<ReadingParts, 'body'> & { fragments: Record<string, Uint8Array>; tag: string };

type Head = Omit<ReadingParts, 'body'> & { fragments: [name: string, bytes: number][] };

const NEWLINE = 0x0a;

/** The stored form of rendered parts. JSON escapes every newline inside its strings, so the first one ends the head. */
export function packParts({ body, ...data }: ReadingParts): string {
	const fragments = Object.entries(bodyFragments(body));
	const head: Head = { ...data, fragments: fragments.map(([name, html]) => [name, Buffer.byteLength(html)]) };
	return `${JSON.stringify(head)}\n${fragments.map(([, html]) => html).join('')}`;
}

/** Reads the stored form back; the fragments are views into `stored`, not copies. */
export function unpackParts(stored: Uint8Array, tag: string): StoredParts {
	const bytes = Buffer.from(stored.buffer, stored.byteOffset, stored.byteLength);
	const headEnd = bytes.indexOf(NEWLINE);
	if (headEnd === -1) throw new Error('Stored page parts have no head line.');
	const head = JSON.parse(bytes.toString('utf8', 0, headEnd)) as Head;
	// Plain views (a Buffer's own slices cost several times as much to make) and named fields, not a rest copy.
	const fragments: Record<string, Uint8Array> = {};
	let at = headEnd + 1;
	for (const [name, length] of head.fragments) {
		fragments[name] = new Uint8Array(bytes.buffer, bytes.byteOffset + at, length);
		at += length;
	}
	if (at !== bytes.length) throw new Error('Stored page parts are not the length their head gives.');
	return { outline: head.outline, identity: head.identity, photos: head.photos, slug: head.slug, fragments, tag };
}
