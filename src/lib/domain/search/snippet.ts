import type { BodyStyle, SectionKey } from '../content/vocabulary';
import { modelYears } from '../slug';
import { vehicleHeadline, type SearchSection } from './document';

/** A short passage showing why a page matched; `highlights` are [start, end) offsets into `text`. */
export type Snippet = { section: SectionKey; text: string; highlights: [number, number][] };

const escapeRegExp = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');

// Words arrive folded ("coupe"); the text keeps its accents ("Coupé"), so each letter also matches its accented forms.
const ACCENTED: Readonly<Record<string, string>> = {
	a: 'aàáâãäå',
	c: 'cç',
	e: 'eèéêë',
	i: 'iìíîï',
	n: 'nñ',
	o: 'oòóôõöø',
	u: 'uùúûü',
	y: 'yýÿ'
};
const letterPattern = (ch: string) => (ACCENTED[ch] ? `[${ACCENTED[ch]}]` : escapeRegExp(ch));
const WORD_CHAR = '[\\p{L}\\p{N}]';

const patterns = new Map<string, RegExp>();

/** A word as a pattern: at the start of a word of the text, a prefix counts ("gromm" marks "grommet"). */
function wordPattern(word: string): RegExp {
	let re = patterns.get(word);
	if (!re) {
		if (patterns.size > 500) patterns.clear();
		re = new RegExp(`(?<!${WORD_CHAR})${[...word].map(letterPattern).join('')}${WORD_CHAR}*`, 'giu');
		patterns.set(word, re);
	}
	return re;
}

type Hit = { start: number; end: number; word: number };

// ASCII plus typographic punctuation (dashes, quotes, ellipsis, middle dot): no letter outside a–z.
const BEYOND_ASCII_LETTERS = /[^\x00-\x7f\u00a0\u00b7\u2010-\u2015\u2018-\u201f\u2026]/;
const isWordCode = (c: number) => (c >= 48 && c <= 57) || (c >= 97 && c <= 122);

/** Where each word starts a word of the text (a prefix counts, so "gromm" marks "grommet"). */
function wordHits(text: string, words: string[]): Hit[] {
	const hits: Hit[] = [];
	if (!BEYOND_ASCII_LETTERS.test(text)) {
		// Most notes: lower-casing keeps every offset, so a plain scan replaces the regular expression.
		const lower = text.toLowerCase();
		words.forEach((w, i) => {
			for (let at = lower.indexOf(w); at >= 0; at = lower.indexOf(w, at + 1)) {
				if (at > 0 && isWordCode(lower.charCodeAt(at - 1))) continue;
				let end = at + w.length;
				while (end < lower.length && isWordCode(lower.charCodeAt(end))) end++;
				hits.push({ start: at, end, word: i });
			}
		});
	} else {
		words.forEach((w, i) => {
			for (const m of text.matchAll(wordPattern(w))) hits.push({ start: m.index, end: m.index + m[0].length, word: i });
		});
	}
	return hits.sort((a, b) => a.start - b.start);
}

/**
 * The passage that best shows why the words matched: the section with the most distinct words
 * (earlier sections win ties), cut to about `width` characters around the first hit.
 */
export function findSnippet(sections: SearchSection[], words: string[], width = 160): Snippet | null {
	if (!words.length) return null;
	let best: { section: SearchSection; hits: Hit[]; distinct: number } | null = null;
	for (const section of sections) {
		const hits = wordHits(section.text, words);
		if (!hits.length) continue;
		const distinct = new Set(hits.map((h) => h.word)).size;
		if (!best || distinct > best.distinct) best = { section, hits, distinct };
		if (distinct === words.length) break;
	}
	if (!best) return null;
	const text = best.section.text;
	const first = best.hits[0].start;
	let start = 0;
	if (text.length > width && first > width / 3) {
		// Begin about a third of the width before the first hit, at the start of a word.
		const space = text.indexOf(' ', first - Math.floor(width / 3));
		start = space >= 0 && space < first ? space + 1 : first;
	}
	let end = Math.min(text.length, start + width);
	if (end < text.length) {
		const space = text.lastIndexOf(' ', end);
		if (space > first) end = space;
	}
	const lead = start > 0 ? '… ' : '';
	const tail = end < text.length ? ' …' : '';
	const highlights: [number, number][] = best.hits
		.filter((h) => h.start >= start && h.end <= end)
		.map((h) => [h.start - start + lead.length, h.end - start + lead.length]);
	return { section: best.section.key, text: lead + text.slice(start, end) + tail, highlights };
}

/** A name match's line: the page's headline, with the matched words and the asked-for years marked. */
export function headlineSnippet(
	identity: { make: string; model: string; yearFrom: number; yearTo: number; body: BodyStyle; aliases: readonly string[] },
	named: string[],
	years: number[]
): Snippet {
	const headline = vehicleHeadline(identity);
	const found = named.length ? findSnippet([{ key: 'identity', text: headline }], named, 240) : null;
	const snippet: Snippet = found ?? { section: 'identity', text: headline, highlights: [] };
	if (years.length) {
		const range = modelYears(identity);
		const at = snippet.text.indexOf(range);
		if (at >= 0) snippet.highlights = [...snippet.highlights, [at, at + range.length] as [number, number]].sort((a, b) => a[0] - b[0]);
	}
	return snippet;
}

/** A filter-only match's line: each filtered figure the page records, marked ("Dash usable chassis depth: 150 mm"). */
export function figuresSnippet(figures: { label: string; mm: number }[], section: SectionKey): Snippet {
	const highlights: [number, number][] = [];
	let text = '';
	for (const f of figures) {
		if (text) text += ' · ';
		text += `${f.label}: `;
		const figure = `${Math.round(f.mm * 10) / 10} mm`;
		highlights.push([text.length, text.length + figure.length]);
		text += figure;
	}
	return { section, text, highlights };
}

/** Splits a snippet into plain and highlighted runs, for rendering without HTML strings. */
export function snippetParts(snippet: Pick<Snippet, 'text' | 'highlights'>): { text: string; hit: boolean }[] {
	const parts: { text: string; hit: boolean }[] = [];
	let at = 0;
	for (const [s, e] of snippet.highlights) {
		if (s < at) continue;
		if (s > at) parts.push({ text: snippet.text.slice(at, s), hit: false });
		parts.push({ text: snippet.text.slice(s, e), hit: true });
		at = e;
	}
	if (at < snippet.text.length) parts.push({ text: snippet.text.slice(at), hit: false });
	return parts;
}
