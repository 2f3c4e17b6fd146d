import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { unit } from 'mathjs';
import {
	formatLength,
	formatMetres,
	ftToM,
	inToMm,
	LengthInputError,
	mmToIn,
	mToFt,
	parseLength,
	readAmps,
	readOhms
} from '../../src/lib/domain/units';
import { lengthInputSchema } from '../../src/lib/domain/lengthInput';

// Reference conversions: mathjs units (international inch = 25.4 mm, foot = 0.3048 m).
const mathMm = (value: number, from: string) => unit(value, from).toNumber('mm');

describe('inch and foot conversions', () => {
	it.each([0, 1, 3.5, 6.5, 12, 25.4, 100])('%s in matches mathjs', (inches) => {
		// mathjs reference
		expect(inToMm(inches)).toBeCloseTo(mathMm(inches, 'inch'), 9);
	});

	it.each([1, 89, 95, 165, 1000])('%s mm to inches matches mathjs', (mm) => {
		// mathjs reference
		expect(mmToIn(mm)).toBeCloseTo(unit(mm, 'mm').toNumber('inch'), 9);
	});

	it('metres and feet match mathjs', () => {
		// mathjs reference
		expect(mToFt(4.5)).toBeCloseTo(unit(4.5, 'm').toNumber('ft'), 9);
		expect(ftToM(15)).toBeCloseTo(unit(15, 'ft').toNumber('m'), 9);
	});

	it('any inch length converts like mathjs and back', () => {
		fc.assert(
			fc.property(fc.double({ min: 0, max: 200, noNaN: true }), (inches) => {
				// mathjs reference, relative tolerance for float rounding
				expect(Math.abs(inToMm(inches) - mathMm(inches, 'inch'))).toBeLessThanOrEqual(1e-9 * (1 + inches));
				expect(mmToIn(inToMm(inches))).toBeCloseTo(inches, 9);
			})
		);
	});
});

describe('parseLength', () => {
	it.each([
		['89', 'mm', 89],
		['89 mm', 'in', 89],
		['89mm', 'in', 89],
		['  89  MM ', 'in', 89],
		['0.5 mm', 'mm', 0.5],
		['.5 mm', 'mm', 0.5],
		['0', 'mm', 0]
	] as const)('reads %j (default %s) as %s mm', (text, def, mm) => {
		expect(parseLength(text, def)).toBe(mm);
	});

	it.each([
		['3.5 in', 'mm', 3.5],
		['3.5in', 'mm', 3.5],
		['3.5 inch', 'mm', 3.5],
		['3.5 inches', 'mm', 3.5],
		['3.5"', 'mm', 3.5],
		['3.5 "', 'mm', 3.5],
		['3.5″', 'mm', 3.5],
		['3.5 IN', 'mm', 3.5],
		['3.5', 'in', 3.5],
		['89', 'in', 89],
		['3 1/2 in', 'mm', 3.5],
		['3 1/2"', 'mm', 3.5],
		['3-1/2"', 'mm', 3.5],
		['3 1/2', 'in', 3.5],
		['6 3/4 in', 'mm', 6.75],
		['1/2 in', 'mm', 0.5],
		['5/8"', 'mm', 0.625]
	] as const)('reads %j (default %s) as %s inches, like mathjs', (text, def, inches) => {
		// mathjs reference
		expect(parseLength(text, def)).toBeCloseTo(mathMm(inches, 'inch'), 9);
	});

	it.each([
		['9 cm', 9, 'cm'],
		['1.2 m', 1.2, 'm'],
		['2 ft', 2, 'ft'],
		["2'", 2, 'ft'],
		['1.5 feet', 1.5, 'ft']
	] as const)('reads %j like mathjs', (text, value, from) => {
		// mathjs reference
		expect(parseLength(text, 'mm')).toBeCloseTo(mathMm(value, from), 9);
	});

	it.each([
		['', /Enter a length/],
		['   ', /Enter a length/],
		['abc', /Could not read "abc"/],
		['3 in in', /Could not read/],
		['3.5.1 mm', /Could not read/],
		['-3 mm', /cannot be negative/],
		['3,5 in', /Use a point for decimals: 3\.5 in/],
		['1/0 in', /divides by zero/],
		['3 1/0"', /divides by zero/],
		['3.5 1/2 in', /Could not read/],
		['12 furlongs', /Could not read/]
	])('rejects %j with a readable message', (text, message) => {
		expect(() => parseLength(text, 'mm')).toThrow(LengthInputError);
		expect(() => parseLength(text, 'mm')).toThrow(message);
	});

	it('reads every whole-millimetre value it formats', () => {
		fc.assert(
			fc.property(fc.integer({ min: 0, max: 5000 }), (mm) => {
				expect(parseLength(formatLength(mm, 'metric'), 'in')).toBe(mm);
			})
		);
	});

	it('a form field gives millimetres or the same message', () => {
		const field = lengthInputSchema('mm');
		// mathjs reference
		expect(field.parse('3.5 in')).toBeCloseTo(mathMm(3.5, 'inch'), 9);
		const bad = field.safeParse('three');
		expect(bad.success).toBe(false);
		expect(bad.error?.issues[0].message).toMatch(/Could not read "three"/);
	});
});

describe('formatLength and formatMetres', () => {
	it('shows millimetres whole and inches to two places', () => {
		expect(formatLength(95, 'metric')).toBe('95 mm');
		expect(formatLength(94.6, 'metric')).toBe('95 mm');
		// by hand with the international inch: 95 / 25.4 = 3.7401… in
		expect(formatLength(95, 'imperial')).toBe('3.74 in');
		expect(formatLength(mathMm(3.5, 'inch'), 'imperial')).toBe('3.50 in');
		expect(formatLength(95, 'imperial', { decimals: 1 })).toBe('3.7 in');
		expect(formatLength(89.25, 'metric', { decimals: 1 })).toBe('89.3 mm');
	});

	it('shows negative margins and never "-0"', () => {
		expect(formatLength(-3, 'metric')).toBe('-3 mm');
		expect(formatLength(-0.2, 'metric')).toBe('0 mm');
		expect(formatLength(-0.001, 'imperial')).toBe('0.00 in');
	});

	it('shows a dash for a missing value', () => {
		expect(formatLength(null, 'metric')).toBe('—');
		expect(formatLength(undefined, 'imperial')).toBe('—');
		expect(formatLength(NaN, 'metric')).toBe('—');
		expect(formatLength(null, 'metric', { missing: 'not measured' })).toBe('not measured');
		expect(formatMetres(null, 'metric')).toBe('—');
	});

	it('shows run lengths in metres or feet', () => {
		expect(formatMetres(4.5, 'metric')).toBe('4.5 m');
		// by hand with the international foot: 4.5 / 0.3048 = 14.76 ft
		expect(formatMetres(4.5, 'imperial')).toBe('14.8 ft');
		expect(formatMetres(5.2, 'metric', { decimals: 2 })).toBe('5.20 m');
	});
});

describe('resistance input', () => {
	it.each([
		['680', 680],
		['680 Ω', 680],
		['2.2k', 2200],
		['2.2 kΩ', 2200],
		// IEC 60062 letter-and-digit code: the letter stands for the decimal point.
		['4k7', 4700],
		['2R2', 2.2],
		['1M', 1_000_000],
		['0', 0]
	])('%s reads as %d Ω', (text, ohms) => {
		expect(readOhms(text)).toBeCloseTo(ohms, 9);
	});

	it('explains a reading it cannot take', () => {
		expect(() => readOhms('loud', 'Resistance')).toThrow(/Resistance: could not read "loud" as ohms/);
	});

	// IEC 60062 writes milli as a lower-case "m" and mega as "M"; a small "m" is refused with that
	// explanation rather than read as a number.
	it.each(['2.2m', '2.2 mΩ', '4m7', '1 mohm'])('refuses %s and says to use a capital M for megaohms', (text) => {
		expect(() => readOhms(text, 'Vol +')).toThrow(/Vol \+: .*"m".*milli.*capital M.*2\.2M/);
	});

	it('reads 2.2M as 2.2 megaohms (IEC 60062 prefix M = 10^6)', () => {
		expect(readOhms('2.2M')).toBeCloseTo(2_200_000, 6);
		expect(readOhms('2M2')).toBeCloseTo(2_200_000, 6);
	});
});

describe('fuse input', () => {
	it.each([
		['10', 10],
		['7.5 A', 7.5],
		['.5a', 0.5]
	])('%s reads as %d A (the amp rating as printed on a blade fuse, from memory)', (text, amps) => {
		expect(readAmps(text)).toBe(amps);
	});

	it('explains a reading it cannot take', () => {
		expect(() => readAmps('ten', 'Fuse')).toThrow(/Fuse: could not read "ten" as amps/);
	});
});
