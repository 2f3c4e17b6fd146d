import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { unit } from 'mathjs';
import {
	BLADE_FUSE_RATINGS_A,
	BOLT_DOWN_FUSE_RATINGS_A,
	CHASSIS_AMPACITY_A,
	FUSE_CAUTIONS,
	MAIN_FUSE_MAX_DISTANCE_MM,
	mainFuse,
	STANDARD_FUSE_RATINGS_A,
	wireAmpacityA
} from '../../src/lib/domain/fuse';
import { STOCKED_POWER_GAUGES } from '../../src/lib/domain/wire';

describe('fuse ratings', () => {
	it('lists the ISO 8820-3 blade ratings', () => {
		// ISO 8820-3 blade fuse ratings (from memory)
		expect(BLADE_FUSE_RATINGS_A).toEqual([1, 2, 3, 4, 5, 7.5, 10, 15, 20, 25, 30, 35, 40]);
	});

	it('lists the usual bolt-down ratings above the blade range', () => {
		// common practice
		expect(BOLT_DOWN_FUSE_RATINGS_A).toEqual([50, 60, 70, 80, 100, 125, 150, 175, 200, 225, 250, 300]);
		expect(Math.min(...BOLT_DOWN_FUSE_RATINGS_A)).toBeGreaterThan(Math.max(...BLADE_FUSE_RATINGS_A));
	});

	it('combines both, strictly ascending', () => {
		expect(STANDARD_FUSE_RATINGS_A).toHaveLength(25);
		STANDARD_FUSE_RATINGS_A.slice(1).forEach((r, i) => expect(r).toBeGreaterThan(STANDARD_FUSE_RATINGS_A[i]));
	});
});

describe('wire ampacity', () => {
	it.each([
		[2, 181],
		[4, 135],
		[6, 101],
		[8, 73],
		[10, 55],
		[12, 41],
		[14, 32],
		[16, 22],
		[18, 16],
		[20, 11]
	])('%s AWG carries %s A', (awg, amps) => {
		// "Maximum amps for chassis wiring", Handbook of Electronic Tables and Formulas for AWG
		expect(wireAmpacityA(awg)).toBe(amps);
	});

	it('1/0 carries 245 A', () => {
		// same handbook table, from memory
		expect(wireAmpacityA(0)).toBe(245);
	});

	it('never rises as the wire gets thinner', () => {
		const gauges = Object.keys(CHASSIS_AMPACITY_A)
			.map(Number)
			.sort((a, b) => a - b);
		expect(gauges[0]).toBe(-3);
		gauges.slice(1).forEach((g, i) => expect(CHASSIS_AMPACITY_A[g]).toBeLessThan(CHASSIS_AMPACITY_A[gauges[i]]));
	});

	it('covers every stocked power gauge', () => {
		for (const g of STOCKED_POWER_GAUGES) expect(wireAmpacityA(g)).toBeGreaterThan(0);
	});

	it('refuses a gauge it has no figure for', () => {
		expect(() => wireAmpacityA(30)).toThrow(/No ampacity on record for 30 AWG/);
	});
});

describe('mainFuse', () => {
	it.each([
		[0.4, 18, 1, 'blade'],
		[7, 18, 7.5, 'blade'],
		[16, 18, null, null],
		[38, 10, 40, 'blade'],
		[40, 10, 40, 'blade'],
		[41, 10, 50, 'bolt-down'],
		[34.7, 8, 35, 'blade'],
		[61, 8, 70, 'bolt-down'],
		[150, 0, 150, 'bolt-down'],
		[176, 2, null, null],
		[210, 0, 225, 'bolt-down']
	] as const)('%s A on %s AWG → fuse %s (null: none fits)', (drawA, awg, fuseA, kind) => {
		// rule: smallest standard rating ≥ draw and ≤ ampacity (ratings and chassis table above)
		const r = mainFuse(drawA, awg);
		if (fuseA === null) {
			expect(r.ok).toBe(false);
		} else {
			expect(r).toMatchObject({ ok: true, fuseA, kind });
		}
	});

	it('says so when the next standard rating is more than the wire carries', () => {
		// 10 AWG 55 A (handbook table); 52 A needs the next rating, 60 A
		const r = mainFuse(52, 10);
		expect(r.ok).toBe(false);
		if (!r.ok) {
			expect(r.ampacityA).toBe(55);
			expect(r.reason).toMatch(/next standard fuse above 52 A is 60 A, more than 10 AWG can carry \(55 A\)/);
		}
	});

	it('says so when the draw is more than the wire carries', () => {
		const r = mainFuse(250, 0);
		expect(r.ok).toBe(false);
		if (!r.ok) expect(r.reason).toMatch(/250 A is more than 1\/0 AWG can carry \(245 A\)/);
	});

	it('refuses a draw that is not a positive number', () => {
		expect(() => mainFuse(0, 10)).toThrow(/above 0/);
		expect(() => mainFuse(-5, 10)).toThrow(/above 0/);
		expect(() => mainFuse(NaN, 10)).toThrow(/above 0/);
		expect(() => mainFuse(Infinity, 10)).toThrow(/above 0/);
	});

	it('always protects the wire and covers the draw with the smallest rating', () => {
		fc.assert(
			fc.property(
				fc.double({ min: 0.01, max: 400, noNaN: true }),
				fc.constantFrom(...STOCKED_POWER_GAUGES),
				(drawA, awg) => {
					const r = mainFuse(drawA, awg);
					const ampacity = CHASSIS_AMPACITY_A[awg];
					const usable = STANDARD_FUSE_RATINGS_A.filter((x) => x >= drawA && x <= ampacity);
					if (r.ok) {
						expect(STANDARD_FUSE_RATINGS_A).toContain(r.fuseA);
						expect(r.fuseA).toBeGreaterThanOrEqual(drawA);
						expect(r.fuseA).toBeLessThanOrEqual(ampacity);
						expect(r.fuseA).toBe(Math.min(...usable));
					} else {
						expect(usable).toHaveLength(0);
					}
				}
			)
		);
	});
});

describe('cautions', () => {
	it('asks for the battery to be disconnected, the fuse near it, and defers to the maker', () => {
		const text = FUSE_CAUTIONS.join(' ');
		expect(text).toMatch(/Disconnect the battery/);
		expect(text).toMatch(/45 cm \(18 in\)/);
		expect(text).toMatch(/vehicle maker's procedures, local codes and licensed practice/);
	});

	it('puts the fuse within about 18 in of the battery', () => {
		// common practice figure 18 in, converted by mathjs: 457.2 mm, quoted as ~45 cm
		expect(Math.abs(MAIN_FUSE_MAX_DISTANCE_MM - unit(18, 'inch').toNumber('mm'))).toBeLessThan(10);
	});
});
