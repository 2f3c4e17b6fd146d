import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { vinPatternMatches, vinPatternSpecificity } from '../../../src/lib/domain/search/vinPattern';

// Reference: the same glob read by the JavaScript RegExp engine (`?` → one character, `*` → any run).
const asRegExp = (pattern: string) => new RegExp(`^${pattern.replace(/\*/g, '.*').replace(/\?/g, '.')}$`);

const VIN_CHARS = '0123456789ABCDEFGHJKLMNPRSTUVWXYZ'.split('');
const vin = fc.array(fc.constantFrom(...VIN_CHARS.slice(0, 6)), { minLength: 17, maxLength: 17 }).map((c) => c.join(''));
const pattern = fc.array(fc.constantFrom(...VIN_CHARS.slice(0, 6), '*', '?'), { minLength: 1, maxLength: 17 }).map((c) => c.join(''));

describe('vinPatternMatches', () => {
	it('reads patterns the way a glob does', () => {
		fc.assert(
			fc.property(pattern, vin, (p, v) => {
				expect(vinPatternMatches(p, v)).toBe(asRegExp(p).test(v));
			}),
			{ numRuns: 5000 }
		);
	});

	it('matches a pattern taken from the VIN itself', () => {
		fc.assert(
			fc.property(vin, fc.integer({ min: 1, max: 16 }), (v, n) => {
				expect(vinPatternMatches(`${v.slice(0, n)}*`, v)).toBe(true);
				expect(vinPatternMatches(v.slice(0, n).replace(/./g, '?') + v.slice(n), v)).toBe(true);
			})
		);
	});

	it.each([
		['VD1TN*', 'VD1TN5A78CX123456', true],
		['VD1TN*', 'VD1TS5A78CX123456', false],
		['VD1T?5*', 'VD1TS5A78CX123456', true],
		['*123456', 'VD1TS5A78CX123456', true],
		['VD1TN', 'VD1TN5A78CX123456', false], // no star: the whole VIN must be spelled out
		['vd1tn*', 'VD1TN5A78CX123456', true]
	])('%s against %s is %s', (p, v, expected) => {
		expect(vinPatternMatches(p, v)).toBe(expected);
	});
});

describe('vinPatternSpecificity', () => {
	it('counts the fixed characters', () => {
		expect(vinPatternSpecificity('VD1TN*')).toBe(5);
		expect(vinPatternSpecificity('VD1T?5*')).toBe(5);
		expect(vinPatternSpecificity('*')).toBe(0);
	});
});
