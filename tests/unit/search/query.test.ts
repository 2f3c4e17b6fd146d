import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { parseSearchQuery, twoDigitYear, vinShape, YEAR_MAX, YEAR_MIN } from '../../../src/lib/domain/search/query';
import { searchWords, plainText, foldText } from '../../../src/lib/domain/search/words';
import { checkDigit } from '../../../src/lib/domain/vin';

describe('twoDigitYear', () => {
	it.each([
		[12, 2026, 2012],
		[9, 2026, 2009],
		[27, 2026, 2027],
		[95, 2026, 1995],
		[50, 2026, 1950],
		[12, 2099, 2012],
		[0, 2099, 2100]
	])('reads %s in %s as %s', (digits, reference, year) => {
		// common practice: a two-digit model year is the latest such year at most one year ahead
		expect(twoDigitYear(digits, reference)).toBe(year);
	});

	it('gives nothing before the years pages cover', () => {
		// 28 in 2026 would be 1928 by the same rule, before the 1950 the page schema starts at
		expect(twoDigitYear(28, 2026)).toBeNull();
		expect(twoDigitYear(49, 2026)).toBeNull();
	});

	it('always keeps the two digits and lands within the hundred years ending a year ahead', () => {
		fc.assert(
			fc.property(fc.integer({ min: 0, max: 99 }), fc.integer({ min: 1990, max: 2090 }), (digits, reference) => {
				const year = twoDigitYear(digits, reference);
				if (year === null) return;
				expect(year % 100).toBe(digits);
				expect(year).toBeLessThanOrEqual(reference + 1);
				expect(year).toBeGreaterThan(reference + 1 - 100);
				expect(year).toBeGreaterThanOrEqual(YEAR_MIN);
				expect(year).toBeLessThanOrEqual(YEAR_MAX);
			})
		);
	});
});

describe('parseSearchQuery', () => {
	it('takes a four-digit year out of the words', () => {
		expect(parseSearchQuery('2012 tarn', 2026)).toEqual({ words: ['tarn'], years: [2012], shortYears: [] });
	});

	it('reads a two-digit number as a possible year and keeps the digits in case no page has it', () => {
		expect(parseSearchQuery('tarn 12', 2026)).toEqual({ words: ['tarn'], years: [], shortYears: [{ word: '12', year: 2012 }] });
	});

	it('ignores a year still being typed at the end, but keeps it once the word is finished', () => {
		expect(parseSearchQuery('tarn 201', 2026).words).toEqual(['tarn']);
		expect(parseSearchQuery('tarn 2', 2026).words).toEqual(['tarn']);
		expect(parseSearchQuery('tarn 201 ', 2026).words).toEqual(['tarn', '201']);
		expect(parseSearchQuery('tarn 5', 2026).words).toEqual(['tarn', '5']);
	});

	it('folds case and accents and keeps sizes whole', () => {
		expect(parseSearchQuery('Coupé 6x9 SPEAKERS', 2026).words).toEqual(['coupe', '6x9', 'speakers']);
	});

	it('leaves four-digit numbers outside model years as words', () => {
		expect(parseSearchQuery('part 1234 3000', 2026)).toMatchObject({ words: ['part', '1234', '3000'], years: [] });
	});
});

describe('vinShape', () => {
	const vin = (body16: string) => body16.slice(0, 8) + checkDigit(body16.slice(0, 8) + '0' + body16.slice(8)) + body16.slice(8);

	it('recognises a pasted VIN, with or without spaces and dashes', () => {
		const v = vin('VD1TN5A7CX123456');
		expect(vinShape(v)).toEqual({ vin: v, problem: null });
		expect(vinShape(` ${v.slice(0, 3)} ${v.slice(3, 9)}-${v.slice(9)} `)).toEqual({ vin: v, problem: null });
		expect(vinShape(v.toLowerCase())).toEqual({ vin: v, problem: null });
	});

	it('keeps a near miss so the reason can be shown', () => {
		expect(vinShape('VD1TN5A79CX12345')?.problem).toMatch(/17 characters; this one has 16/);
		expect(vinShape('VD1TN5A79CXO23456')?.problem).toMatch(/never uses the letters I, O or Q/);
	});

	it('does not take words for a VIN', () => {
		expect(vinShape('brenmoor zennock')).toBeNull();
		expect(vinShape('veldra tarn 2012 rear')).toBeNull();
		expect(vinShape('occupant sensor mat')).toBeNull();
		expect(vinShape('2012')).toBeNull();
	});
});

describe('words', () => {
	it('splits on anything but letters and digits', () => {
		expect(searchWords('Blue/white wire, pin 4 — 6.5 in')).toEqual(['blue', 'white', 'wire', 'pin', '4', '6', '5', 'in']);
	});

	it('folds accents whatever the case', () => {
		expect(foldText('CÔTÉ Coupé')).toBe('cote coupe');
	});

	it('reads Markdown as the words a reader sees', () => {
		expect(plainText('> **Caution:** see [the guide](https://example.test/x) and `trim`\n\n- first step')).toBe(
			'Caution: see the guide and trim first step'
		);
		expect(plainText('plain  words\nonly')).toBe('plain words only');
	});
});
