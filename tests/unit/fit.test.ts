import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { unit } from 'mathjs';
import {
	DEFAULT_CLEARANCE_MM,
	DEFAULT_TIGHT_MM,
	DEFAULT_PLUG_ALLOWANCE_MM,
	DIN_APERTURE_MM,
	DIN_UNIT_FACE_MM,
	fitVerdict,
	headUnitFit,
	SeatSpaceIndex,
	speakerFit,
	type SeatSpaceRow
} from '../../src/lib/domain/fit';
import { boxAgainstSpaceSchema } from '../../src/lib/domain/fitRequest';

// Sample amplifier box and seat spaces (invented measurements).
const amp = { l: 300, w: 200, h: 50 };

describe('fitVerdict', () => {
	it('uses a 10 mm clearance and calls under 15 mm to spare tight', () => {
		// common practice clearance for cables and air; tight threshold is this product's choice
		expect(DEFAULT_CLEARANCE_MM).toBe(10);
		expect(DEFAULT_TIGHT_MM).toBe(15);
	});

	it('exact fit after clearance is tight with zero margins', () => {
		// by hand: 310 − (300 + 10) = 0 on every axis
		expect(fitVerdict(amp, { l: 310, w: 210, h: 60 })).toEqual({
			verdict: 'tight',
			rotated: false,
			margins: { l: 0, w: 0, h: 0 },
			limiting: 'l'
		});
	});

	it('exact fit with no clearance and no tight band fits', () => {
		expect(fitVerdict(amp, { l: 300, w: 200, h: 50 }, { clearanceMm: 0, tightMm: 0 }).verdict).toBe('fits');
	});

	it('1 mm over on one axis is no-fit, and names the axis', () => {
		// by hand: 59 − (50 + 10) = −1
		const r = fitVerdict(amp, { l: 400, w: 300, h: 59 });
		expect(r).toMatchObject({ verdict: 'no-fit', limiting: 'h', margins: { l: 90, w: 90, h: -1 } });
	});

	it('fits only when turned on the floor', () => {
		// by hand: straight 270 − 310 < 0; turned 270 − 210 = 60, 420 − 310 = 110, 100 − 60 = 40
		const r = fitVerdict(amp, { l: 270, w: 420, h: 100 });
		expect(r).toEqual({ verdict: 'fits', rotated: true, margins: { l: 60, w: 110, h: 40 }, limiting: 'h' });
	});

	it('turns the part when that leaves more room, keeps it straight on a tie', () => {
		// by hand: straight min(10, 140) = 10, turned min(110, 40) = 40
		expect(fitVerdict(amp, { l: 320, w: 350, h: 120 })).toMatchObject({ rotated: true, verdict: 'fits' });
		// both orientations give 20 mm
		expect(fitVerdict(amp, { l: 330, w: 330, h: 120 })).toMatchObject({ rotated: false, verdict: 'fits', limiting: 'l' });
	});

	it('is tight between 0 and 15 mm to spare and fits at 15', () => {
		// by hand: 324 − 310 = 14 limits (turning leaves 240 − 310 < 0)
		expect(fitVerdict(amp, { l: 324, w: 240, h: 200 })).toMatchObject({ verdict: 'tight', limiting: 'l', rotated: false });
		expect(fitVerdict(amp, { l: 325, w: 240, h: 200 }).verdict).toBe('fits');
		expect(fitVerdict(amp, { l: 324, w: 240, h: 200 }, { tightMm: 5 }).verdict).toBe('fits');
	});

	it('height never swaps with length or width', () => {
		// a flat space that would take the part on its side still does not fit
		expect(fitVerdict({ l: 300, w: 200, h: 150 }, { l: 400, w: 400, h: 100 }).verdict).toBe('no-fit');
	});

	it.each([
		{ l: null, w: 300, h: 100 },
		{ l: 400, w: null, h: 100 },
		{ l: 400, w: 300, h: null },
		{ l: 400, w: 300, h: NaN },
		{ l: null, w: null, h: null }
	])('says not measured for %j', (space) => {
		expect(fitVerdict(amp, space)).toEqual({ verdict: 'not-measured', rotated: false, margins: null, limiting: null });
	});

	it('a part measured in inches converts exactly', () => {
		// 12 × 8 × 2 in via mathjs = 304.8 × 203.2 × 50.8 mm; margins by hand against 329 × 230 × 80
		const box = { l: unit(12, 'inch').toNumber('mm'), w: unit(8, 'inch').toNumber('mm'), h: unit(2, 'inch').toNumber('mm') };
		const r = fitVerdict(box, { l: 329, w: 230, h: 80 });
		expect(r.verdict).toBe('tight');
		expect(r.margins?.l).toBeCloseTo(14.2, 9);
		expect(r.margins?.w).toBeCloseTo(16.8, 9);
		expect(r.margins?.h).toBeCloseTo(19.2, 9);
	});

	it.each([
		[{ ...amp, l: -5 }, { l: 400, w: 300, h: 100 }, /Part length must be more than 0 mm/],
		[{ ...amp, w: NaN }, { l: 400, w: 300, h: 100 }, /Part width must be a number of millimetres/],
		[{ ...amp, h: 6000 }, { l: 400, w: 300, h: 100 }, /Part height over 5000 mm looks like a typo/],
		[amp, { l: -400, w: 300, h: 100 }, /Space length must be more than 0 mm/],
		[amp, { l: 400, w: 30000, h: 100 }, /Space width over 5000 mm/]
	])('rejects absurd input with a readable message', (box, space, message) => {
		expect(() => fitVerdict(box, space)).toThrow(message);
	});

	it('rejects a negative clearance', () => {
		expect(() => fitVerdict(amp, { l: 400, w: 300, h: 100 }, { clearanceMm: -1 })).toThrow(/Clearance cannot be negative/);
	});

	it('gives the endpoint the same messages, at the same place', () => {
		const r = boxAgainstSpaceSchema.safeParse({ box: { l: 0, w: 200, h: 50 }, space: { l: 400, w: 300, h: null } });
		expect(r.success).toBe(false);
		expect(r.error?.issues.map((i) => i.message)).toEqual(['Part length must be more than 0 mm.']);
		expect(r.error?.issues.map((i) => i.path)).toEqual([['box', 'l']]);
	});

	it('does not care which way the part or the space was written down on the floor', () => {
		const dim = fc.integer({ min: 1, max: 1500 });
		fc.assert(
			fc.property(dim, dim, dim, dim, dim, dim, (bl, bw, bh, sl, sw, sh) => {
				const a = fitVerdict({ l: bl, w: bw, h: bh }, { l: sl, w: sw, h: sh });
				const b = fitVerdict({ l: bw, w: bl, h: bh }, { l: sl, w: sw, h: sh });
				const c = fitVerdict({ l: bl, w: bw, h: bh }, { l: sw, w: sl, h: sh });
				expect(b.verdict).toBe(a.verdict);
				expect(c.verdict).toBe(a.verdict);
				const least = (r: typeof a) => (r.margins ? Math.min(r.margins.l ?? NaN, r.margins.w ?? NaN, r.margins.h ?? NaN) : NaN);
				expect(least(b)).toBe(least(a));
				expect(least(c)).toBe(least(a));
			})
		);
	});

	it('never gets worse when the space grows', () => {
		const rank = { 'no-fit': 0, tight: 1, fits: 2, 'not-measured': -1 } as const;
		const dim = fc.integer({ min: 1, max: 1500 });
		fc.assert(
			fc.property(dim, dim, dim, dim, dim, dim, fc.integer({ min: 0, max: 500 }), (bl, bw, bh, sl, sw, sh, grow) => {
				const box = { l: bl, w: bw, h: bh };
				const before = fitVerdict(box, { l: sl, w: sw, h: sh });
				const after = fitVerdict(box, { l: sl + grow, w: sw, h: sh });
				expect(rank[after.verdict]).toBeGreaterThanOrEqual(rank[before.verdict]);
			})
		);
	});
});

// Decimal text from a whole count of thousandths, so the expected sums are exact integer arithmetic.
const decimal = (thousandths: number): number => Number(`${Math.floor(thousandths / 1000)}.${String(thousandths % 1000).padStart(3, '0')}`);
// Inch text to four places, converted by the international inch (1 in = 25.4 mm exactly, 1959 agreement).
const inches = (tenThousandths: number): number => unit(Number(`${Math.floor(tenThousandths / 10000)}.${String(tenThousandths % 10000).padStart(4, '0')}`), 'inch').toNumber('mm');

describe('fitVerdict on decimal figures', () => {
	it('a space exactly filled by part and clearance is tight, for any decimal millimetres', () => {
		// by hand: space = part + clearance exactly (summed as whole thousandths), so every margin is 0
		const um = fc.integer({ min: 1000, max: 1_500_000 });
		fc.assert(
			fc.property(um, um, um, fc.integer({ min: 0, max: 50_000 }), (l, w, h, c) => {
				const box = { l: decimal(l), w: decimal(w), h: decimal(h) };
				const space = { l: decimal(l + c), w: decimal(w + c), h: decimal(h + c) };
				const r = fitVerdict(box, space, { clearanceMm: decimal(c) });
				expect(r.verdict).toBe('tight');
				expect(Math.min(r.margins!.l!, r.margins!.w!, r.margins!.h!)).toBe(0);
			})
		);
	});

	it('one micrometre short is no fit, one micrometre over is tight', () => {
		// by hand: margins of −0.001 mm and +0.001 mm on the height
		const um = fc.integer({ min: 1000, max: 1_500_000 });
		fc.assert(
			fc.property(um, fc.integer({ min: 0, max: 50_000 }), (h, c) => {
				const box = { l: 100, w: 100, h: decimal(h) };
				const roomy = { l: 1000, w: 1000 };
				expect(fitVerdict(box, { ...roomy, h: decimal(h + c - 1) }, { clearanceMm: decimal(c) })).toMatchObject({ verdict: 'no-fit', limiting: 'h', margins: { h: -0.001 } });
				expect(fitVerdict(box, { ...roomy, h: decimal(h + c + 1) }, { clearanceMm: decimal(c) })).toMatchObject({ verdict: 'tight', limiting: 'h', margins: { h: 0.001 } });
			})
		);
	});

	it('inch figures with a ½ in clearance that exactly fill the space are tight', () => {
		// international inch (mathjs conversion); space = part + 0.5000 in, summed in whole ten-thousandths
		const tenth = fc.integer({ min: 10_000, max: 400_000 });
		fc.assert(
			fc.property(tenth, tenth, tenth, (l, w, h) => {
				const box = { l: inches(l), w: inches(w), h: inches(h) };
				const space = { l: inches(l + 5000), w: inches(w + 5000), h: inches(h + 5000) };
				const r = fitVerdict(box, space, { clearanceMm: inches(5000) });
				expect(r.verdict).toBe('tight');
			})
		);
	});

	it('a known case: 1.6 in tall part, 2.1 in space, ½ in clearance', () => {
		// by hand: 2.1 in − 1.6 in − 0.5 in = 0; in doubles 2.1 × 25.4 − (1.6 × 25.4 + 12.7) comes out just below 0
		expect(2.1 * 25.4 - (1.6 * 25.4 + 12.7)).toBeLessThan(0);
		const r = fitVerdict({ l: 100, w: 100, h: 1.6 * 25.4 }, { l: 500, w: 500, h: 2.1 * 25.4 }, { clearanceMm: 12.7 });
		expect(r).toMatchObject({ verdict: 'tight', margins: { h: 0 } });
	});
});

describe('fitVerdict with sides not measured', () => {
	it('a measured height that rules the part out is no fit, whatever else is missing', () => {
		// by hand: 55 − (50 + 10) = −5
		const r = fitVerdict(amp, { l: null, w: null, h: 55 });
		expect(r).toMatchObject({ verdict: 'no-fit', limiting: 'h', margins: { l: null, w: null, h: -5 } });
	});

	it('a lone floor side is checked against the part turned either way', () => {
		// by hand: 250 takes the 200 mm side (250 − 210 = 40) when turned, so nothing is ruled out
		expect(fitVerdict(amp, { l: 250, w: null, h: null }).verdict).toBe('not-measured');
		// by hand: 205 takes neither side: best is 205 − 210 = −5
		expect(fitVerdict(amp, { l: 205, w: null, h: 100 })).toMatchObject({ verdict: 'no-fit', limiting: 'l', margins: { l: -5, h: 40 } });
	});

	it('both floor sides measured but no height: the better orientation decides', () => {
		// by hand: straight 250 − 310 < 0; turned 250 − 210 = 40 and 400 − 310 = 90, so only height is unknown
		expect(fitVerdict(amp, { l: 250, w: 400, h: null }).verdict).toBe('not-measured');
		// by hand: turned 190 − 210 = −20 is the better of straight −120 / turned −20
		expect(fitVerdict(amp, { l: 190, w: 400, h: null })).toMatchObject({ verdict: 'no-fit', limiting: 'l', margins: { l: -20, w: 90, h: null } });
	});

	it('a speaker hole too small is no fit even without a depth', () => {
		// by hand: 120 − 126 = −6
		expect(speakerFit({ cutoutMm: 126, mountingDepthMm: 60 }, { cutoutMm: 120, depthMm: null })).toMatchObject({ verdict: 'no-fit', limiting: 'cutout', margins: { cutout: -6, depth: null } });
		expect(speakerFit({ cutoutMm: 126, mountingDepthMm: 60 }, { cutoutMm: 130, depthMm: null }).verdict).toBe('not-measured');
	});
});

describe('headUnitFit', () => {
	it('uses the ISO 7736 unit face and dash aperture', () => {
		// ISO 7736 as widely quoted: unit face 180 × 50 / 180 × 100 mm, aperture 182 × 53 / 182 × 103 mm
		expect(DIN_UNIT_FACE_MM).toEqual({ 1: { w: 180, h: 50 }, 2: { w: 180, h: 100 } });
		expect(DIN_APERTURE_MM).toEqual({ 1: { w: 182, h: 53 }, 2: { w: 182, h: 103 } });
		// the usual American description "7 × 2 in" for single DIN is within 3 mm (from memory; mathjs)
		expect(Math.abs(DIN_UNIT_FACE_MM[1].w - unit(7, 'inch').toNumber('mm'))).toBeLessThan(3);
		// plugs and an adapter behind the chassis: about 50 mm (common practice)
		expect(DEFAULT_PLUG_ALLOWANCE_MM).toBe(50);
	});

	it.each([
		// dinSize, chassis depth, opening, dash depth → verdict, needsKit, depth margin (by hand: depth − chassis − 50 for plugs)
		[1, 160, 'single-din', 240, 'fits', false, 30],
		[1, 160, 'single-din', 220, 'tight', false, 10],
		[1, 160, 'single-din', 210, 'tight', false, 0],
		[1, 160, 'single-din', 209, 'no-fit', false, -1],
		[2, 165, 'double-din', 240, 'fits', false, 25],
		[1, 160, 'double-din', 240, 'fits', true, 30],
		[2, 165, 'oversize', 240, 'fits', true, 25],
		[1, 160, 'oversize', 215, 'tight', true, 5]
	] as const)('%s-DIN %s mm deep in %s %s mm deep → %s', (dinSize, chassisDepthMm, opening, depthMm, verdict, needsKit, margin) => {
		const r = headUnitFit({ dinSize, chassisDepthMm }, { opening, depthMm });
		expect(r).toMatchObject({ verdict, needsKit, depthMarginMm: margin, plugAllowanceMm: 50 });
	});

	it('the plug allowance is its own stated figure', () => {
		// by hand: 200 − 160 − 30 = 10 → tight; the reason names the allowance
		const r = headUnitFit({ dinSize: 1, chassisDepthMm: 160 }, { opening: 'single-din', depthMm: 200 }, { plugAllowanceMm: 30 });
		expect(r).toMatchObject({ verdict: 'tight', depthMarginMm: 10, plugAllowanceMm: 30 });
		expect(r.reason).toMatch(/after 30 mm for plugs and adapters/);
	});

	it.each([
		// recorded opening w × h → verdict, needsKit (ISO 7736 face 180 × 50 / 180 × 100, aperture 182 × 53 / 182 × 103)
		[1, 182, 53, 'fits', false],
		[1, 180, 50, 'fits', false],
		[1, 179, 53, 'no-fit', false],
		[1, 182, 78, 'fits', true], // a 1.5-DIN opening: a pocket fills the rest
		[2, 182, 78, 'no-fit', false],
		[2, 182, 103, 'fits', false],
		[2, 200, 120, 'fits', true]
	] as const)('%s-DIN unit in a recorded %s × %s mm opening → %s', (dinSize, w, h, verdict, needsKit) => {
		const r = headUnitFit({ dinSize, chassisDepthMm: 150 }, { opening: 'oversize', depthMm: 300, openingMm: { w, h } });
		expect(r).toMatchObject({ verdict, needsKit });
	});

	it('a recorded opening smaller than the face says so', () => {
		const r = headUnitFit({ dinSize: 2, chassisDepthMm: 150 }, { opening: 'double-din', depthMm: 300, openingMm: { w: 182, h: 78 } });
		expect(r.reason).toMatch(/recorded opening \(182 × 78 mm\) is smaller than the face of a double-DIN unit \(face 180 × 100 mm, aperture 182 × 103 mm\)/);
	});

	it('refuses a double-DIN unit in a single-DIN opening', () => {
		const r = headUnitFit({ dinSize: 2, chassisDepthMm: 160 }, { opening: 'single-din', depthMm: 250 });
		expect(r.verdict).toBe('no-fit');
		expect(r.reason).toMatch(/double-DIN unit \(face 180 × 100 mm, aperture 182 × 103 mm\) does not go into a single-DIN opening \(182 × 53 mm\)/);
	});

	it('sends an integrated dash to a vehicle-specific kit', () => {
		const r = headUnitFit({ dinSize: 1, chassisDepthMm: 160 }, { opening: 'integrated', depthMm: 250 });
		expect(r).toMatchObject({ verdict: 'no-fit', needsKit: true });
		expect(r.reason).toMatch(/vehicle-specific dash kit/);
	});

	it('says not measured when the dash depth is unknown', () => {
		const r = headUnitFit({ dinSize: 1, chassisDepthMm: 160 }, { opening: 'double-din', depthMm: null });
		expect(r).toMatchObject({ verdict: 'not-measured', needsKit: true, depthMarginMm: null });
	});

	it('explains a unit that is too deep', () => {
		// by hand: 205 − 160 − 50 = −5
		const r = headUnitFit({ dinSize: 1, chassisDepthMm: 160 }, { opening: 'single-din', depthMm: 205 });
		expect(r.reason).toMatch(/5 mm too deep/);
	});

	it.each([
		// 1.5-DIN opening with no measured size: by hand, depth − chassis − 50 for plugs
		[1, 150, 230, 'fits', true, 30], // a single-DIN unit goes in with a pocket filling the rest
		[1, 150, 195, 'no-fit', true, -5]
	] as const)('%s-DIN unit %s mm deep in a 1.5-DIN opening %s mm deep → %s', (dinSize, chassisDepthMm, depthMm, verdict, needsKit, margin) => {
		expect(headUnitFit({ dinSize, chassisDepthMm }, { opening: '1.5-din', depthMm })).toMatchObject({ verdict, needsKit, depthMarginMm: margin });
	});

	it('refuses a double-DIN unit in a 1.5-DIN opening unless a measured opening takes its face', () => {
		// double-DIN face 100 mm high (ISO 7736) against 1.5-DIN units about 75 mm high (from memory)
		const r = headUnitFit({ dinSize: 2, chassisDepthMm: 150 }, { opening: '1.5-din', depthMm: 300 });
		expect(r.verdict).toBe('no-fit');
		expect(r.reason).toMatch(/taller than a 1\.5-DIN opening/);
		// a measured 182 × 101 mm opening holds the 180 × 100 mm face (by hand: 2 mm and 1 mm to spare)
		expect(headUnitFit({ dinSize: 2, chassisDepthMm: 150 }, { opening: '1.5-din', depthMm: 300, openingMm: { w: 182, h: 101 } }).verdict).toBe('fits');
	});

	it('a kit opening needs the kit and its recorded size before the face can be judged', () => {
		// no size: the face cannot be judged; 260 − 150 − 50 = 60 mm of depth to spare (by hand)
		expect(headUnitFit({ dinSize: 2, chassisDepthMm: 150 }, { opening: 'kit', depthMm: 260 })).toMatchObject({ verdict: 'not-measured', needsKit: true, depthMarginMm: 60 });
		expect(headUnitFit({ dinSize: 2, chassisDepthMm: 150 }, { opening: 'kit', depthMm: null })).toMatchObject({ verdict: 'not-measured', needsKit: true, depthMarginMm: null });
		// too deep rules it out whatever the kit: 190 − 150 − 50 = −10 (by hand)
		expect(headUnitFit({ dinSize: 2, chassisDepthMm: 150 }, { opening: 'kit', depthMm: 190 })).toMatchObject({ verdict: 'no-fit', depthMarginMm: -10 });
		// the opening the kit leaves, measured at the double-DIN aperture 182 × 103 (ISO 7736): fits, kit still needed
		expect(headUnitFit({ dinSize: 2, chassisDepthMm: 150 }, { opening: 'kit', depthMm: 260, openingMm: { w: 182, h: 103 } })).toMatchObject({ verdict: 'fits', needsKit: true });
	});

	it('rejects absurd sizes', () => {
		expect(() => headUnitFit({ dinSize: 1, chassisDepthMm: -1 }, { opening: 'single-din', depthMm: 100 })).toThrow(/Chassis depth must be more than 0 mm/);
		expect(() => headUnitFit({ dinSize: 3 as 1, chassisDepthMm: 150 }, { opening: 'single-din', depthMm: 100 })).toThrow(/single DIN \(1\) or double DIN \(2\)/);
	});
});

describe('speakerFit', () => {
	it.each([
		// speaker cut-out, depth; location cut-out, depth → verdict, limiting, margins (by hand)
		[142, 55, 145, 60, 'tight', 'cutout', 3, 5],
		[142, 55, 150, 80, 'fits', 'cutout', 8, 25],
		[142, 55, 140, 80, 'no-fit', 'cutout', -2, 25],
		[142, 55, 150, 50, 'no-fit', 'depth', 8, -5],
		[142, 55, 142, 55, 'tight', 'cutout', 0, 0]
	] as const)('%s mm / %s mm deep in %s mm / %s mm → %s', (cut, depth, locCut, locDepth, verdict, limiting, mc, md) => {
		const r = speakerFit({ cutoutMm: cut, mountingDepthMm: depth }, { cutoutMm: locCut, depthMm: locDepth });
		expect(r).toMatchObject({ verdict, limiting, margins: { cutout: mc, depth: md }, needsAdapter: false });
	});

	it('flags an adapter ring when the hole is much bigger than the speaker needs', () => {
		expect(speakerFit({ cutoutMm: 120, mountingDepthMm: 45 }, { cutoutMm: 142, depthMm: 70 }).needsAdapter).toBe(true);
	});

	it('says not measured when the location is unknown', () => {
		expect(speakerFit({ cutoutMm: 120, mountingDepthMm: 45 }, { cutoutMm: 142, depthMm: null }).verdict).toBe('not-measured');
	});

	it('rejects absurd sizes', () => {
		expect(() => speakerFit({ cutoutMm: 0, mountingDepthMm: 45 }, { cutoutMm: 142, depthMm: 60 })).toThrow(/Speaker cut-out must be more than 0 mm/);
	});
});

describe('SeatSpaceIndex', () => {
	const rows: SeatSpaceRow[] = [
		{ vehicleIndex: 7, seat: 'driver', l: 310, w: 210, h: 60 },
		{ vehicleIndex: 7, seat: 'passenger', l: 270, w: 420, h: 100 },
		{ vehicleIndex: 8, seat: 'driver', l: 400, w: 300, h: 59 },
		{ vehicleIndex: 9, seat: 'rear', l: 500, w: null, h: 120 },
		{ vehicleIndex: 9, seat: 'passenger', l: 500, w: 400, h: 120 }
	];

	it('answers which seats take the part, with the same verdicts as fitVerdict', () => {
		const index = new SeatSpaceIndex(rows);
		const { rows: hits, tight } = index.query(amp);
		// verdicts from the fitVerdict cases above: tight, fits (turned), no-fit, not measured, fits
		expect(Array.from(hits)).toEqual([0, 1, 4]);
		expect(Array.from(tight)).toEqual([1, 0, 0]);
		expect(index.seat(1)).toBe('passenger');
		expect(index.vehicleIndex[4]).toBe(9);
		expect(index.space(3)).toEqual({ l: 500, w: null, h: 120 });
	});

	it('honours clearance and tight threshold', () => {
		const index = new SeatSpaceIndex(rows);
		expect(Array.from(index.query(amp, 0, 0).tight)).toEqual([0, 0, 0, 0]);
		expect(Array.from(index.query(amp, 0, 0).rows)).toEqual([0, 1, 2, 4]);
	});

	it('rejects absurd rows and boxes', () => {
		expect(() => new SeatSpaceIndex([{ vehicleIndex: 1, seat: 'driver', l: -3, w: 1, h: 1 }])).toThrow(/Row 0: space length/);
		expect(() => new SeatSpaceIndex(rows).query({ l: 0, w: 1, h: 1 })).toThrow(/Part length must be more than 0 mm/);
	});

	it('agrees with fitVerdict on random data', () => {
		const maybe = fc.oneof(
			{ weight: 8, arbitrary: fc.double({ min: 1, max: 3000, noNaN: true }) },
			{ weight: 1, arbitrary: fc.constant(null) }
		);
		const row = fc.record({ vehicleIndex: fc.nat(1000), seat: fc.constantFrom('driver', 'passenger', 'rear'), l: maybe, w: maybe, h: maybe });
		const dim = fc.double({ min: 1, max: 1500, noNaN: true });
		fc.assert(
			fc.property(
				fc.array(row, { maxLength: 60 }),
				fc.record({ l: dim, w: dim, h: dim }),
				fc.integer({ min: 0, max: 30 }),
				fc.integer({ min: 0, max: 30 }),
				(data, box, clearanceMm, tightMm) => {
					const index = new SeatSpaceIndex(data);
					const { rows: hits, tight } = index.query(box, clearanceMm, tightMm);
					const expected: number[] = [];
					const expectedTight: number[] = [];
					data.forEach((_, i) => {
						const v = fitVerdict(box, index.space(i), { clearanceMm, tightMm }).verdict;
						if (v === 'fits' || v === 'tight') {
							expected.push(i);
							expectedTight.push(v === 'tight' ? 1 : 0);
						}
					});
					expect(Array.from(hits)).toEqual(expected);
					expect(Array.from(tight)).toEqual(expectedTight);
				}
			),
			{ numRuns: 300 }
		);
	});

	it('decides a room at the tight threshold on whole micrometres, as fitVerdict does', () => {
		// by hand: 26.9995 mm kept in single precision is 26.99950027… mm; less a 1 mm box and 12 mm clearance
		// leaves 13.99950027… mm, which is 14.000 mm to the micrometre: at a 14 mm tight threshold that fits.
		const index = new SeatSpaceIndex([{ vehicleIndex: 0, seat: 'driver', l: 26.9995, w: 26.9995, h: 26.9995 }]);
		const found = index.query({ l: 1, w: 1, h: 1 }, 12, 14);
		expect(Array.from(found.rows)).toEqual([0]);
		expect(Array.from(found.tight)).toEqual([0]);
		expect(fitVerdict({ l: 1, w: 1, h: 1 }, index.space(0), { clearanceMm: 12, tightMm: 14 }).verdict).toBe('fits');
	});

	it('finds a seat that an inch-measured part exactly fills', () => {
		// by hand: 2.1 in − 1.6 in − 0.5 in clearance = 0 (international inch); single precision may store 53.34 a hair low
		const index = new SeatSpaceIndex([{ vehicleIndex: 0, seat: 'driver', l: 500, w: 500, h: 2.1 * 25.4 }]);
		const box = { l: 100, w: 100, h: 1.6 * 25.4 };
		expect(Array.from(index.query(box, 12.7).rows)).toEqual([0]);
		expect(fitVerdict(box, index.space(0), { clearanceMm: 12.7 }).verdict).not.toBe('no-fit');
	});
});
