import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { closestName, FUZZY_MIN_LENGTH, withinOneEdit } from '../../../src/lib/domain/search/didYouMean';

/**
 * Reference: the optimal-string-alignment distance (Levenshtein's three edits plus Damerau's swap of two
 * neighbours), filled in as the usual dynamic-programming table.
 */
function alignmentDistance(a: string, b: string): number {
	const d = Array.from({ length: a.length + 1 }, (_, i) => Array.from({ length: b.length + 1 }, (_, j) => (i === 0 ? j : j === 0 ? i : 0)));
	for (let i = 1; i <= a.length; i++) {
		for (let j = 1; j <= b.length; j++) {
			const cost = a[i - 1] === b[j - 1] ? 0 : 1;
			d[i][j] = Math.min(d[i - 1][j] + 1, d[i][j - 1] + 1, d[i - 1][j - 1] + cost);
			if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) d[i][j] = Math.min(d[i][j], d[i - 2][j - 2] + 1);
		}
	}
	return d[a.length][b.length];
}

const word = fc.string({ unit: fc.constantFrom('a', 'b', 'c', 'r', 't'), minLength: 0, maxLength: 7 });

describe('withinOneEdit', () => {
	it('agrees with the dynamic-programming distance on any pair of words', () => {
		fc.assert(
			fc.property(word, word, (a, b) => {
				expect(withinOneEdit(a, b)).toBe(alignmentDistance(a, b) <= 1);
			}),
			{ numRuns: 3000 }
		);
	});

	it('agrees on the prefix form as well', () => {
		fc.assert(
			fc.property(word, word, (a, b) => {
				const n = Math.min(a.length, b.length);
				expect(withinOneEdit(a, b, n)).toBe(alignmentDistance(a, b.slice(0, n)) <= 1);
			})
		);
	});

	it.each([
		['tarn', 'tarn', true],
		['tarm', 'tarn', true], // substitution
		['trn', 'tarn', true], // deletion
		['taarn', 'tarn', true], // insertion
		['tran', 'tarn', true], // neighbours swapped
		['ntar', 'tarn', false], // a rotation is more than one edit
		['kitten', 'sitting', false] // the textbook pair at distance 3 (from memory)
	])('%s against %s is %s', (a, b, expected) => {
		expect(withinOneEdit(a, b)).toBe(expected);
		expect(alignmentDistance(a, b) <= 1).toBe(expected);
	});
});

describe('closestName', () => {
	const names = new Map([
		['tarn', 12],
		['tarnock', 3],
		['bristle', 8],
		['brister', 2],
		['sallow', 5],
		['tallow', 5],
		['gl', 40]
	]);

	it('corrects one slip in a name of four letters or more', () => {
		expect(closestName('tarm', names)).toBe('tarn');
		expect(closestName('brstle', names)).toBe('bristle');
		expect(closestName('bristel', names)).toBe('bristle');
	});

	it('leaves short words alone, where one letter makes another word', () => {
		expect(FUZZY_MIN_LENGTH).toBe(4);
		expect(closestName('trn', names)).toBeNull();
		expect(closestName('gk', names)).toBeNull();
	});

	it('leaves a known name and anything with digits alone', () => {
		expect(closestName('tarn', names)).toBeNull();
		expect(closestName('6x9s', names)).toBeNull();
	});

	it('prefers the name on more pages, then alphabetical order', () => {
		expect(closestName('bristxe', names)).toBe('bristle');
		// "ballow" is one letter from both; equal pages, so the earlier name
		expect(closestName('ballow', names)).toBe('sallow');
	});

	it('finishes the start of a longer name when a whole name does not fit', () => {
		// "tarmoc" is one letter from "tarnoc", the start of "tarnock", and far from every whole name
		expect(closestName('tarmoc', names)).toBe('tarnoc');
		// a whole name one letter longer still wins over the start of a name
		expect(closestName('tarnoc', names)).toBe('tarnock');
	});

	it('gives up when nothing is one slip away', () => {
		expect(closestName('qwerty', names)).toBeNull();
	});
});
