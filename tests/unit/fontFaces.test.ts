import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Blob as HbBlob, Face as HbFace } from 'harfbuzzjs';
import subsetFont from 'subset-font';
import { afterAll, describe, expect, it } from 'vitest';
import { CORE_TEXT, cutFace, FACES, unicodeRange } from '../../scripts/font-faces';

const NODE_MODULES = join(import.meta.dirname, '../../node_modules');
const out = mkdtempSync(join(tmpdir(), 'kickpanel-faces-'));
afterAll(() => rmSync(out, { recursive: true, force: true }));

/** The characters a font file maps, read by HarfBuzz (WOFF2 is unpacked by a whole-font pass first). */
async function drawnBy(file: Buffer): Promise<Set<number>> {
	const sfnt = await subsetFont(file, '', { targetFormat: 'sfnt', keepAllGlyphs: true } as Parameters<typeof subsetFont>[2]);
	return new Set(new HbFace(new HbBlob(sfnt), 0).collectUnicodes());
}

describe('unicodeRange', () => {
	// Hand-worked: 0x20–0x22 is one run, 0xB0 alone, 0x2013–0x2014 a run.
	it('folds neighbouring code points into runs', () => {
		expect(unicodeRange([0x21, 0x20, 0x22, 0xb0, 0x2014, 0x2013, 0x20])).toBe('U+0020-0022, U+00B0, U+2013-2014');
	});
	it('writes single code points with four hex digits at least', () => {
		expect(unicodeRange([0x41])).toBe('U+0041');
		expect(unicodeRange([0x1f4cc])).toBe('U+1F4CC');
	});
});

describe('cut faces', () => {
	for (const face of FACES) {
		it(`${face.file} draws every core character its source draws, and its rule claims exactly those`, async () => {
			const rule = await cutFace(face, NODE_MODULES, out);
			const source = await drawnBy(readFileSync(join(NODE_MODULES, face.source)));
			const wanted = [...CORE_TEXT].map((c) => c.codePointAt(0)!).filter((cp) => source.has(cp));
			const cut = await drawnBy(readFileSync(join(out, face.file)));
			expect([...cut].sort((a, b) => a - b)).toEqual([...new Set(wanted)].sort((a, b) => a - b));
			// Every printable ASCII letter is in the cut (the reason for the cut face at all).
			for (let cp = 0x20; cp <= 0x7e; cp++) expect(cut.has(cp)).toBe(true);
			expect(rule).toContain(`unicode-range: ${unicodeRange(wanted)};`);
			expect(rule).toContain(`font-family: '${face.family}';`);
		}, 30_000);
	}
});
