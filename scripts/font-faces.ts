// The reading faces a phone downloads first: each shipped face cut down to the characters Kickpanel's screens and
// notes use nearly always (printable ASCII and the measuring symbols), with kerning kept only where it pays for
// itself. The full Latin files stay declared before these, so a note with "é" still gets its letter from the
// same family; the browser fetches that file only when such a character is on the page.
import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, renameSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { Blob as HbBlob, Face as HbFace } from 'harfbuzzjs';
import subsetFont from 'subset-font';
import type { Plugin } from 'vite';

const ROOT = join(dirname(fileURLToPath(import.meta.url)), '..');
/** Where the cut faces and their @font-face rules are written (not kept in git: built from node_modules). */
export const FACES_DIR = join(ROOT, 'src/lib/fonts/core');

/** Printable ASCII and the symbols the app prints beside figures (units, tolerances, arrows, typographic quotes). */
export const CORE_TEXT =
	Array.from({ length: 95 }, (_, i) => String.fromCharCode(32 + i)).join('') + '·×÷±°µ²³½¼¾–—‘’“”…•′″‹›−→←↑↓↔≤≥≈√';

type Face = {
	family: string;
	file: string;
	source: string;
	weight: string;
	/** OpenType features kept; Merriweather's pair kerning alone is two thirds of its file, so its serif goes without. */
	features: string[];
	axes?: Record<string, { min: number; max: number }>;
};

export const FACES: Face[] = [
	{
		family: 'Merriweather',
		file: 'merriweather-core-400-normal.woff2',
		source: '@fontsource/merriweather/files/merriweather-latin-400-normal.woff2',
		weight: '400',
		features: ['liga', 'lnum', 'tnum']
	},
	{
		family: 'Merriweather',
		file: 'merriweather-core-700-normal.woff2',
		source: '@fontsource/merriweather/files/merriweather-latin-700-normal.woff2',
		weight: '700',
		features: ['liga', 'lnum', 'tnum']
	},
	{
		family: 'IBM Plex Sans Variable',
		file: 'ibm-plex-sans-core-wght-normal.woff2',
		source: '@fontsource-variable/ibm-plex-sans/files/ibm-plex-sans-latin-wght-normal.woff2',
		// The file keeps the weights screens use (regular to bold); the rule claims the same range as the full Latin
		// files so the browser treats them as one face split by character.
		weight: '100 700',
		features: ['kern', 'liga', 'lnum', 'tnum'],
		axes: { wght: { min: 400, max: 700 } }
	}
];

/** "U+0020-007E, U+00B0, …": code points folded into runs. */
export function unicodeRange(codePoints: Iterable<number>): string {
	const sorted = [...new Set(codePoints)].sort((a, b) => a - b);
	const runs: string[] = [];
	const hex = (n: number) => n.toString(16).toUpperCase().padStart(4, '0');
	for (let i = 0; i < sorted.length; ) {
		let j = i;
		while (j + 1 < sorted.length && sorted[j + 1] === sorted[j] + 1) j++;
		runs.push(sorted[i] === sorted[j] ? `U+${hex(sorted[i])}` : `U+${hex(sorted[i])}-${hex(sorted[j])}`);
		i = j + 1;
	}
	return runs.join(', ');
}

/** Cuts one face; the rule's range lists exactly the characters the cut file can draw, so nothing falls through a gap. */
export async function cutFace(face: Face, nodeModules: string, outDir = FACES_DIR): Promise<string> {
	const source = readFileSync(join(nodeModules, face.source));
	const options = { keepFeatures: face.features, noHinting: true, variationAxes: face.axes };
	const woff2 = await subsetFont(source, CORE_TEXT, { ...options, targetFormat: 'woff2' });
	const sfnt = await subsetFont(source, CORE_TEXT, { ...options, targetFormat: 'sfnt' });
	const drawn = new HbFace(new HbBlob(sfnt), 0).collectUnicodes();
	writeAtomically(join(outDir, face.file), woff2);
	return [
		'@font-face {',
		`\tfont-family: '${face.family}';`,
		'\tfont-style: normal;',
		'\tfont-display: swap;',
		`\tfont-weight: ${face.weight};`,
		`\tsrc: url('./${face.file}') format('woff2');`,
		`\tunicode-range: ${unicodeRange(drawn)};`,
		'}'
	].join('\n');
}

function writeAtomically(path: string, data: string | Uint8Array) {
	const temporary = `${path}.${process.pid}.tmp`;
	writeFileSync(temporary, data);
	renameSync(temporary, path);
}

/** Writes the cut faces and `faces.css` unless they are already there for the same inputs. */
export async function writeCoreFaces(nodeModules = join(ROOT, 'node_modules')): Promise<void> {
	const inputs = createHash('sha256').update(readFileSync(fileURLToPath(import.meta.url))).update(CORE_TEXT);
	for (const face of FACES) inputs.update(readFileSync(join(nodeModules, face.source)));
	const stamp = inputs.digest('hex');
	const stampFile = join(FACES_DIR, '.stamp');
	if (existsSync(stampFile) && readFileSync(stampFile, 'utf8') === stamp) return;
	mkdirSync(FACES_DIR, { recursive: true });
	const rules: string[] = [];
	for (const face of FACES) rules.push(await cutFace(face, nodeModules));
	const header = '/* Written by scripts/font-faces.ts at build time: the faces cut to the characters screens use. */';
	writeAtomically(join(FACES_DIR, 'faces.css'), `${header}\n${rules.join('\n')}\n`);
	writeAtomically(stampFile, stamp);
}

/** Vite plugin: cuts the faces before anything reads `app.css`. */
export function coreFaces(): Plugin {
	return { name: 'kickpanel-core-faces', buildStart: () => writeCoreFaces() };
}
