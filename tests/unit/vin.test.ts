import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
	checkDigit,
	CHECK_DIGIT_WEIGHTS,
	decodeVinBasics,
	MODEL_YEAR_CODES,
	modelYear,
	normalizeVin,
	vinProblem,
	wmi
} from '../../src/lib/domain/vin';

// 49 CFR 565.15 transliteration table and position weights, retyped from the regulation.
const CFR_VALUES: Record<string, number> = {
	A: 1, B: 2, C: 3, D: 4, E: 5, F: 6, G: 7, H: 8, J: 1, K: 2, L: 3, M: 4, N: 5,
	P: 7, R: 9, S: 2, T: 3, U: 4, V: 5, W: 6, X: 7, Y: 8, Z: 9
};
const CFR_WEIGHTS = [8, 7, 6, 5, 4, 3, 2, 10, 0, 9, 8, 7, 6, 5, 4, 3, 2];
const digitOf = (remainder: number) => (remainder === 10 ? 'X' : String(remainder));

// 49 CFR 565.15 model-year table: code → year in the 1980–2009 cycle (+30 for 2010–2039).
const CFR_YEARS: [string, number][] = [
	['A', 1980], ['B', 1981], ['C', 1982], ['D', 1983], ['E', 1984], ['F', 1985], ['G', 1986],
	['H', 1987], ['J', 1988], ['K', 1989], ['L', 1990], ['M', 1991], ['N', 1992], ['P', 1993],
	['R', 1994], ['S', 1995], ['T', 1996], ['V', 1997], ['W', 1998], ['X', 1999], ['Y', 2000],
	['1', 2001], ['2', 2002], ['3', 2003], ['4', 2004], ['5', 2005], ['6', 2006], ['7', 2007],
	['8', 2008], ['9', 2009]
];

const VIN_CHARS = '0123456789ABCDEFGHJKLMNPRSTUVWXYZ'.split('');
const vinArb = fc.array(fc.constantFrom(...VIN_CHARS), { minLength: 17, maxLength: 17 }).map((cs) => cs.join(''));

// Sample VIN body with a chosen position 7 and 10 (invented, not a real vehicle).
const sample = (pos7: string, pos10: string) => {
	const body = 'ZZZ00000000000001'.split('');
	body[6] = pos7;
	body[9] = pos10;
	return body.join('');
};

describe('normalizeVin and vinProblem', () => {
	it('upper-cases and drops spaces and dashes', () => {
		expect(normalizeVin(' 1m8-gdm9a xkp042788\t')).toBe('1M8GDM9AXKP042788');
	});

	it('accepts a well-formed VIN', () => {
		expect(vinProblem('1M8GDM9AXKP042788')).toBeNull();
	});

	it.each([
		['1M8GDM9AXKP04278', /17 characters; this one has 16/],
		['1M8GDM9AXKP0427888', /this one has 18/],
		['', /this one has 0/],
		['1M8GDM9AXKPO42788', /never uses the letters I, O or Q .*found O at position 12/],
		['IM8GDM9AXKP042788', /found I at position 1/],
		['1M8GDM9AXKP04278Q', /found Q at position 17/],
		['1M8GDM9AXKP04278*', /only digits and capital letters; found "\*" at position 17/],
		['1m8GDM9AXKP042788', /found "m" at position 2/]
	])('explains what is wrong with %j', (vin, message) => {
		expect(vinProblem(vin)).toMatch(message);
	});
});

describe('checkDigit (49 CFR 565.15)', () => {
	it('1M8GDM9AXKP042788 has check digit X', () => {
		// the commonly cited worked example of the 49 CFR 565 check digit (from memory); by hand:
		// Σ value × weight = 351, 351 mod 11 = 10 → X
		expect(checkDigit('1M8GDM9AXKP042788')).toBe('X');
	});

	it('17 ones has check digit 1', () => {
		// by hand from the weights: Σ weights = 89, 89 mod 11 = 1
		expect(CFR_WEIGHTS.reduce((a, b) => a + b, 0) % 11).toBe(1);
		expect(checkDigit('11111111111111111')).toBe('1');
	});

	it('uses the regulation weights', () => {
		expect(CHECK_DIGIT_WEIGHTS).toEqual(CFR_WEIGHTS);
	});

	it.each(CFR_WEIGHTS.map((w, i) => [i + 1, w] as const).filter(([p]) => p !== 9))(
		'a 1 alone at position %s gives its weight %s mod 11',
		(position, weight) => {
			// 49 CFR 565.15 weights
			const vin = '0'.repeat(position - 1) + '1' + '0'.repeat(17 - position);
			expect(checkDigit(vin)).toBe(digitOf(weight % 11));
		}
	);

	it.each(Object.entries(CFR_VALUES))('letter %s transliterates to %s', (letter, value) => {
		// 49 CFR 565.15 transliteration; position 1 has weight 8
		expect(checkDigit(letter + '0'.repeat(16))).toBe(digitOf((8 * value) % 11));
	});

	it('matches a direct computation from the regulation tables for any VIN', () => {
		fc.assert(
			fc.property(vinArb, (vin) => {
				const sum = vin
					.split('')
					.reduce((acc, ch, i) => acc + (/\d/.test(ch) ? Number(ch) : CFR_VALUES[ch]) * CFR_WEIGHTS[i], 0);
				expect(checkDigit(vin)).toBe(digitOf(sum % 11));
			})
		);
	});

	it('ignores position 9 and catches any single changed character elsewhere', () => {
		// weights are non-zero mod 11 and values differ by 1–9, so the weighted sum must change
		const value = (ch: string) => (/\d/.test(ch) ? Number(ch) : CFR_VALUES[ch]);
		fc.assert(
			fc.property(vinArb, fc.integer({ min: 0, max: 16 }), fc.constantFrom(...VIN_CHARS), (vin, i, ch) => {
				const changed = vin.slice(0, i) + ch + vin.slice(i + 1);
				// the regulation's sum, worked directly: position 9 has weight 0
				const direct = (v: string) => digitOf(v.split('').reduce((sum, c, k) => sum + value(c) * CFR_WEIGHTS[k], 0) % 11);
				expect(checkDigit(changed)).toBe(direct(changed));
				expect(direct(changed) === direct(vin)).toBe(i === 8 || value(ch) === value(vin[i]));
			})
		);
	});

	it('refuses a malformed VIN with the same message', () => {
		expect(() => checkDigit('1M8GDM9AXKP04278')).toThrow(/17 characters/);
	});
});

describe('modelYear (49 CFR 565.15)', () => {
	it('has the 30 regulation codes in order', () => {
		expect(MODEL_YEAR_CODES.split('')).toEqual(CFR_YEARS.map(([c]) => c));
	});

	it.each(CFR_YEARS)('%s is %s with a digit at position 7 and 30 years later with a letter', (code, year) => {
		// 49 CFR 565.15 model-year table and the position-7 rule for light vehicles
		expect(modelYear(sample('5', code))).toBe(year);
		expect(modelYear(sample('P', code))).toBe(year + 30);
	});

	it.each([
		['A', '4', 1980],
		['A', 'C', 2010],
		['Y', '0', 2000],
		['Y', 'B', 2030],
		['1', '9', 2001],
		['1', 'Z', 2031],
		['9', 'A', 2039]
	])('code %s with %s at position 7 is %s', (code, pos7, year) => {
		// 49 CFR 565.15
		expect(modelYear(sample(pos7, code))).toBe(year);
	});

	it('the worked example is a 1989', () => {
		// position 10 K, position 7 is the digit 9 → 1989 cycle (49 CFR 565.15 table)
		expect(modelYear('1M8GDM9AXKP042788')).toBe(1989);
	});

	it.each(['U', 'Z', '0'])('%s at position 10 is not a year code', (code) => {
		// 49 CFR 565.15 does not use U, Z or 0 for the model year
		expect(modelYear(sample('5', code))).toBeNull();
	});
});

// The 49 CFR 565.15 check digit worked straight from the tables above (not the code under test).
const cfrCheckDigit = (vin: string) => digitOf(vin.split('').reduce((sum, ch, i) => sum + (/\d/.test(ch) ? Number(ch) : CFR_VALUES[ch]) * CFR_WEIGHTS[i], 0) % 11);
const withCheckDigit = (body: string) => body.slice(0, 8) + cfrCheckDigit(body) + body.slice(9);

describe('wmi and decodeVinBasics', () => {
	it('reads the first three characters as the manufacturer identifier', () => {
		expect(wmi('1M8GDM9AXKP042788')).toBe('1M8');
	});

	it('decodes the worked example', () => {
		// 49 CFR 565 worked example: 1M8GDM9AXKP042788, check digit X, model year 1989
		expect(decodeVinBasics('1m8 gdm9a-xkp042788')).toEqual({
			vin: '1M8GDM9AXKP042788',
			valid: true,
			checkDigit: { expected: 'X', actual: 'X', applies: true },
			modelYear: 1989,
			wmi: '1M8',
			region: 'north-america',
			problem: null
		});
	});

	it('flags a mistyped character through the check digit in North America', () => {
		// by hand: the worked example sums to remainder 10 (X); the last character 8 → 9 adds 1 × weight 2, so remainder 1
		const r = decodeVinBasics('1M8GDM9AXKP042789');
		expect(r.valid).toBe(false);
		expect(r.checkDigit).toEqual({ expected: '1', actual: 'X', applies: true });
		expect(r.problem).toMatch(/Check digit \(position 9\) is X but the other characters give 1/);
	});

	it('reports a format problem without decoding', () => {
		const r = decodeVinBasics('1M8GDM9AXKP0427');
		expect(r).toMatchObject({ valid: false, checkDigit: null, modelYear: null, wmi: null });
		expect(r.problem).toMatch(/17 characters/);
	});

	it('reports a North American position-10 code that is not a year', () => {
		// 49 CFR 565.15: U is not among the 30 model-year codes
		const vin = withCheckDigit('1ZZ0005' + '00' + 'U' + '0000001');
		expect(decodeVinBasics(vin).problem).toMatch(/Position 10 \(U\) is not a model-year code/);
	});

	it('outside North America, a position 9 that is no check digit or a position 10 that is no year is not a typo', () => {
		// ISO 3779 leaves positions 9 and 10 to the maker outside North America; ISO 3780: W is a European region code
		const r = decodeVinBasics('WZZ0000' + '0Z' + 'U' + '0000001');
		expect(r).toMatchObject({ valid: true, region: 'elsewhere', problem: null, modelYear: null });
		expect(r.checkDigit?.applies).toBe(false);
		// ISO 3780: J is an Asian region code
		expect(decodeVinBasics('JZZ0000' + '0A' + 'Z' + '0000001').valid).toBe(true);
	});

	it('flags a model year more than one year ahead', () => {
		// 49 CFR 565.15: letter at position 7 → 2010–2039 cycle; code Y is 2030, code T is 2026
		const far = withCheckDigit('1ZZ000A' + '00' + 'Y' + '0000001');
		expect(decodeVinBasics(far, { currentYear: 2026 }).problem).toMatch(/gives model year 2030, more than a year after 2026/);
		const next = withCheckDigit('1ZZ000A' + '00' + 'V' + '0000001');
		// V is 2027: one year ahead is allowed
		expect(decodeVinBasics(next, { currentYear: 2026 })).toMatchObject({ valid: true, modelYear: 2027 });
		// the same rule outside North America
		expect(decodeVinBasics('WZZ000A' + '00' + 'Y' + '0000001', { currentYear: 2026 }).valid).toBe(false);
	});

	it('any North American VIN with its own check digit and a year code decodes as valid', () => {
		fc.assert(
			fc.property(fc.constantFrom('1', '2', '3', '4', '5'), vinArb, fc.constantFrom(...MODEL_YEAR_CODES.split('')), (first, raw, code) => {
				const vin = withCheckDigit(first + raw.slice(1, 9) + code + raw.slice(10));
				const r = decodeVinBasics(vin);
				expect(r.valid).toBe(true);
				expect(r.modelYear).toBe(CFR_YEARS.find(([c]) => c === code)![1] + (/[A-Z]/.test(vin[6]) ? 30 : 0));
			})
		);
	});

	it('any VIN from elsewhere with good characters is valid, whatever position 9 holds', () => {
		fc.assert(
			fc.property(fc.constantFrom(...'6789ABCDEFGHJKLMNPRSTUVWXYZ'.split('')), vinArb, (first, raw) => {
				// ISO 3779/3780: no mandatory check digit outside North America; no year given, so nothing is ahead
				expect(decodeVinBasics(first + raw.slice(1)).valid).toBe(true);
			})
		);
	});
});
