import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { findSnippet, snippetParts } from '../../../src/lib/domain/search/snippet';
import type { SearchSection } from '../../../src/lib/domain/search/document';

const sections: SearchSection[] = [
	{ key: 'power', text: 'Battery: engine bay. Route the cable under the factory loom clip.' },
	{ key: 'firewall', text: 'Factory grommet: driver side, above the pedal box. Avoid: brake lines. Tools: step drill, 19 mm grommet.' },
	{ key: 'seats', text: 'Occupant sensor connector clipped under the passenger seat front; leave it free.' }
];

const marked = (s: { text: string; highlights: [number, number][] }) => s.highlights.map(([a, b]) => s.text.slice(a, b));

describe('findSnippet', () => {
	it('cuts from the section with the word and marks every mention', () => {
		const s = findSnippet(sections, ['grommet'])!;
		expect(s.section).toBe('firewall');
		expect(marked(s)).toEqual(['grommet', 'grommet']);
	});

	it('marks a prefix as the whole word it begins', () => {
		expect(marked(findSnippet(sections, ['gromm'])!)).toEqual(['grommet', 'grommet']);
	});

	it('only counts the start of a word', () => {
		// "loom" is inside no other word here; "oom" must not match inside "loom"
		expect(findSnippet(sections, ['oom'])).toBeNull();
	});

	it('prefers the section that holds more of the words', () => {
		const s = findSnippet(sections, ['factory', 'pedal'])!;
		expect(s.section).toBe('firewall');
		expect(marked(s).map((w) => w.toLowerCase())).toEqual(['factory', 'pedal']);
	});

	it('matches the accented spelling of a folded word', () => {
		const s = findSnippet([{ key: 'identity', text: 'Halvik Corrin 1998–2004, coupé.' }], ['coupe'])!;
		expect(marked(s)).toEqual(['coupé']);
	});

	it('shortens long text around the first mention, with ellipses', () => {
		const long = `${'Filler words here. '.repeat(30)}The airbag loom runs beside the passage. ${'More filler text. '.repeat(30)}`;
		const s = findSnippet([{ key: 'removal', text: long }], ['airbag'], 120)!;
		expect(s.text.startsWith('… ')).toBe(true);
		expect(s.text.endsWith(' …')).toBe(true);
		expect(s.text.length).toBeLessThanOrEqual(120 + 4);
		expect(marked(s)).toEqual(['airbag']);
	});

	it('answers null when no section has the words', () => {
		expect(findSnippet(sections, ['subwoofer'])).toBeNull();
		expect(findSnippet(sections, [])).toBeNull();
	});

	it('always marks offsets that hold the words, and the parts rebuild the text', () => {
		const vocabulary = ['grommet', 'loom', 'seat', 'the', 'brake', 'cable'];
		fc.assert(
			fc.property(fc.array(fc.constantFrom(...vocabulary, 'filler', 'text.'), { minLength: 1, maxLength: 80 }), fc.constantFrom(...vocabulary), (words, query) => {
				const text = words.join(' ');
				const s = findSnippet([{ key: 'dash', text }], [query], 60);
				if (!words.includes(query)) return;
				expect(s).not.toBeNull();
				for (const w of marked(s!)) expect(w.toLowerCase().startsWith(query)).toBe(true);
				expect(snippetParts(s!).map((p) => p.text).join('')).toBe(s!.text);
			})
		);
	});
});

describe('snippetParts', () => {
	it('splits into plain and marked runs', () => {
		expect(snippetParts({ text: 'a grommet b', highlights: [[2, 9]] })).toEqual([
			{ text: 'a ', hit: false },
			{ text: 'grommet', hit: true },
			{ text: ' b', hit: false }
		]);
	});
});
