import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
	BLADE_FUSE_RATINGS_A,
	BOLT_DOWN_FUSE_RATINGS_A,
	CHASSIS_AMPACITY_A,
	FUSE_CAUTIONS,
	FUSE_HEADROOM,
	MAIN_FUSE_MAX_DISTANCE_MM,
	mainFuse,
	STANDARD_FUSE_RATINGS_A,
	wireAmpacityA
} from '../../src/lib/domain/fuse';
import { STOCKED_POWER_GAUGES } from '../../src/lib/domain/wire';

describe('fuse ratings', () => {
	it('lists the ISO 8820-3 blade ratings up to the maxi type', () => {
		// ISO 8820-3 blade fuse ratings (from memory): regular/mini 1–40 A, maxi on to 120 A
		expect(BLADE_FUSE_RATINGS_A).toEqual([1, 2, 3, 4, 5, 7.5, 10, 15, 20, 25, 30, 35, 40, 50, 60, 70, 80, 100, 120]);
	});

	it('lists the usual bolt-down ratings above the blade range', () => {
		// common practice
		expect(BOLT_DOWN_FUSE_RATINGS_A).toEqual([125, 150, 175, 200, 225, 250, 300, 350, 400, 500]);
	});

	it('combines both, strictly ascending', () => {
		STANDARD_FUSE_RATINGS_A.slice(1).forEach((r, i) => expect(r).toBeGreaterThan(STANDARD_FUSE_RATINGS_A[i]));
	});

	it('asks for 125 % of the continuous draw', () => {
		// common practice: a fuse rated about 125 % of its continuous load
		expect(FUSE_HEADROOM).toBe(1.25);
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
		// [draw A, own fuses A, AWG, fuse A or null, kind]; by hand: need = max(1.25 × draw, own fuses),
		// next rating up (ISO 8820-3 blade, then bolt-down), at most the chassis ampacity (handbook table)
		[0.4, null, 18, 1, 'blade'],
		[7, null, 18, 10, 'blade'],
		[16, null, 18, null, null],
		[32, null, 10, 40, 'blade'],
		[34.7, null, 8, 50, 'blade'],
		[41.67, null, 8, 60, 'blade'],
		[41.67, 80, 6, 80, 'blade'],
		[41.67, 80, 8, null, null],
		[100, null, 2, 125, 'bolt-down'],
		[150, null, 0, 200, 'bolt-down'],
		[200, null, 0, null, null]
	] as const)('%s A (own fuses %s A) on %s AWG → %s A', (drawA, own, awg, fuseA, kind) => {
		const r = mainFuse(drawA, awg, own);
		if (fuseA === null) expect(r.ok).toBe(false);
		else expect(r).toMatchObject({ ok: true, fuseA, kind });
	});

	it('is never below 34.7 A × 1.25: the old 35 A answer had no headroom', () => {
		// by hand: 1.25 × 34.7 = 43.4 A → 50 A
		expect(mainFuse(34.7, 8)).toMatchObject({ ok: true, fuseA: 50, neededA: 43.375 });
	});

	it('says so when the rating needed is more than the wire carries', () => {
		// 10 AWG 55 A (handbook table); 45 A × 1.25 = 56.25 A needs a 60 A fuse
		const r = mainFuse(45, 10);
		expect(r.ok).toBe(false);
		if (!r.ok) expect(r.reason).toMatch(/The fuse needs 60 A, more than 10 AWG can carry \(55 A\)/);
	});

	it('states its basis', () => {
		const r = mainFuse(41.67, 8, 50);
		expect(r.ok && r.basis).toMatch(/^60 A blade fuse: at least 125 % of the 41\.7 A continuous draw \(52\.1 A, common practice\) and at least the amplifiers' own 50 A of fuses/);
	});

	it('refuses a draw that is not a positive number', () => {
		expect(() => mainFuse(0, 10)).toThrow(/above 0/);
		expect(() => mainFuse(-5, 10)).toThrow(/above 0/);
		expect(() => mainFuse(NaN, 10)).toThrow(/above 0/);
		expect(() => mainFuse(Infinity, 10)).toThrow(/above 0/);
	});

	// "Maximum amps for chassis wiring" (Handbook of Electronic Tables and Formulas for AWG; 1/0 from memory) and the
	// ISO 8820-3 blade ratings then common bolt-down ratings (from memory / common practice), retyped for the check.
	const HANDBOOK_A: Record<number, number> = { 0: 245, 2: 181, 4: 135, 6: 101, 8: 73, 10: 55, 12: 41, 14: 32, 16: 22, 18: 16 };
	const RATINGS = [1, 2, 3, 4, 5, 7.5, 10, 15, 20, 25, 30, 35, 40, 50, 60, 70, 80, 100, 120, 125, 150, 175, 200, 225, 250, 300, 350, 400, 500];

	it('always protects the wire, survives the load and respects the amplifiers’ fuses', () => {
		fc.assert(
			fc.property(fc.double({ min: 0.01, max: 400, noNaN: true }), fc.option(fc.integer({ min: 1, max: 300 }), { nil: null }), fc.constantFrom(...STOCKED_POWER_GAUGES), (drawA, own, awg) => {
				// common practice 125 % headroom; the fuse protects the cable; the amplifiers' own fuses are a floor
				const r = mainFuse(drawA, awg, own);
				const need = Math.max(drawA * 1.25, own ?? 0);
				const rating = RATINGS.find((x) => x >= need - 1e-9);
				if (!r.ok) {
					expect(rating === undefined || rating > HANDBOOK_A[awg]).toBe(true);
					return;
				}
				expect(r.fuseA).toBe(rating);
				expect(r.fuseA).toBeLessThanOrEqual(HANDBOOK_A[awg]);
			})
		);
	});
});

describe('cautions', () => {
	it('asks for the battery to be disconnected, the fuse near it with its source, and defers to the maker', () => {
		const text = FUSE_CAUTIONS.join(' ');
		expect(text).toMatch(/Disconnect the battery/);
		expect(text).toMatch(/45 cm \(18 in\)/);
		expect(text).toMatch(/ABYC E-11 asks for 7 in/);
		expect(text).toMatch(/vehicle maker's procedures, local codes and licensed practice/);
	});

	it('puts the fuse within about 18 in of the battery', () => {
		// common practice figure 18 in; international inch: 457.2 mm
		expect(Math.abs(MAIN_FUSE_MAX_DISTANCE_MM - 457.2)).toBeLessThan(1);
	});
});
