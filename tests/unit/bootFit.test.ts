import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { unit } from 'mathjs';
import { BootSpaceIndex, enclosureFit, enclosureFitReason, throughOpening, type BootSpace } from '../../src/lib/domain/bootFit';
import { fitVerdict, type FitVerdict } from '../../src/lib/domain/fit';

// Boots and boxes are invented (sample figures); every expected margin is worked by hand beside it.
const RANK: Record<FitVerdict, number> = { 'no-fit': 0, 'not-measured': 1, tight: 2, fits: 3 };
const boot = (l: number | null, w: number | null, h: number | null, more: Partial<BootSpace> = {}): BootSpace => ({ l, w, h, lTop: null, archW: null, ...more });

describe('through the load opening', () => {
	it('tries every pair of sides both ways round and keeps the roomiest', () => {
		// box 600 × 400 × 350 in a 950 × 500 opening, by hand: l across / h up leaves 350 and 150,
		// w across / h up 550 and 150, l across / w up only 100: the best smallest margin is 150
		const pass = throughOpening({ l: 600, w: 400, h: 350 }, { w: 950, h: 500 });
		expect(pass).toMatchObject({ through: true, margins: { w: 350, h: 150 }, across: 'l', up: 'h' });
	});

	it('says how much too big the best way round still is', () => {
		// 600 × 400 × 350 against 380 × 340, by hand: w across / h up is short by 20 and 10, every other way more
		const r = enclosureFit({ l: 600, w: 400, h: 350 }, boot(900, 1000, 450), { w: 380, h: 340 });
		expect(r).toMatchObject({ verdict: 'no-fit', throughOpening: false, limiting: 'opening', opening: { margins: { w: -20, h: -10 } } });
		expect(enclosureFitReason(r)).toMatch(/Does not go through the load opening: 20 mm too big/);
	});

	it('carries a wedge by its deeper side', () => {
		// wedge 500 deep at the bottom, 300 at the top, 800 wide, 400 high, into a 450 × 420 opening, by hand:
		// its 500 depth fits neither way and the 800 width never, so it stays out; a square box 300 deep
		// goes 400 across and 300 up (50 and 120 to spare)
		expect(throughOpening({ l: 500, lTop: 300, w: 800, h: 400 }, { w: 450, h: 420 }).through).toBe(false);
		expect(throughOpening({ l: 300, w: 800, h: 400 }, { w: 450, h: 420 })).toMatchObject({ through: true, margins: { w: 50, h: 120 }, across: 'h', up: 'l' });
	});
});

describe('standing in the boot', () => {
	it('a rectangular box: margins on each side after the clearance', () => {
		// by hand, 10 mm clearance: depth 900 − 600 − 10 = 290; width min(1000, 950 between arches) − 400 − 10 = 540;
		// height 450 − 350 − 10 = 90; the opening leaves 150 at least, so height limits
		const r = enclosureFit({ l: 600, w: 400, h: 350 }, boot(900, 1000, 450, { archW: 950 }), { w: 950, h: 500 });
		expect(r).toMatchObject({ verdict: 'fits', throughOpening: true, rotated: false, limiting: 'h', margins: { l: 290, w: 540, h: 90 } });
		expect(enclosureFitReason(r)).toMatch(/Fits in the boot with 90 mm to spare in height after 10 mm clearance/);
	});

	it('a wedge box under a leaning seat back goes where a square box of the same depth does not', () => {
		// boot 700 deep at the floor and 450 at the 500 mm shelf: at the box's 400 mm top, 700 − 250 × 400 / 500 = 500 deep.
		// wedge 500 at the bottom, 300 at the top: depth 700 − 500 − 10 = 190 and 500 − 300 − 10 = 190;
		// width 900 between the arches − 800 − 10 = 90; height 500 − 400 − 10 = 90
		const space = boot(700, 1000, 500, { lTop: 450, archW: 900 });
		const opening = { w: 1000, h: 600 };
		const wedge = enclosureFit({ l: 500, lTop: 300, w: 800, h: 400 }, space, opening);
		expect(wedge).toMatchObject({ verdict: 'fits', rotated: false, margins: { l: 190, w: 90, h: 90 }, limiting: 'w' });
		// the same box square at the back: 500 − 500 − 10 = −10 at the top edge
		const square = enclosureFit({ l: 500, w: 800, h: 400 }, space, opening);
		expect(square).toMatchObject({ verdict: 'no-fit', limiting: 'l', margins: { l: -10 } });
		expect(enclosureFitReason(square)).toMatch(/10 mm too deep after 10 mm clearance/);
	});

	it('turns the box a quarter when that is the way it fits', () => {
		// box 400 deep, 800 wide in a boot 850 deep and 700 wide: straight, width 700 − 800 − 10 = −110;
		// turned, depth 850 − 800 − 10 = 40 and width 700 − 400 − 10 = 290 (by hand)
		const r = enclosureFit({ l: 400, w: 800, h: 300 }, boot(850, 700, 500), { w: 1000, h: 600 });
		expect(r).toMatchObject({ verdict: 'fits', rotated: true, margins: { l: 40, w: 290, h: 190 }, limiting: 'l' });
		expect(enclosureFitReason(r)).toMatch(/Turned a quarter/);
	});

	it('an exact fit in inches is tight, never no fit', () => {
		// a 12 in tall box (304.8 mm, mathjs) under a shelf at 12 in + 10 mm leaves exactly 0
		const h = unit(12, 'inch').toNumber('mm');
		const r = enclosureFit({ l: 400, w: 400, h }, boot(800, 1000, h + 10), { w: 1000, h: 600 });
		expect(r).toMatchObject({ verdict: 'tight', limiting: 'h', margins: { h: 0 } });
	});

	it('a side not measured never hides one that rules the box out', () => {
		// width 700 against 800 + 10 straight (−110) or 850 + 10 turned (−160), by hand
		const r = enclosureFit({ l: 850, w: 800, h: 300 }, boot(null, 700, null), { w: null, h: null });
		expect(r).toMatchObject({ verdict: 'no-fit', limiting: 'w', margins: { w: -110, l: null, h: null }, throughOpening: null });
		const open = enclosureFit({ l: 400, w: 300, h: 300 }, boot(900, null, 500), { w: 1000, h: 600 });
		expect(open.verdict).toBe('not-measured');
		expect(enclosureFitReason(open)).toMatch(/the width missing/);
		// a measured boot with the opening not measured cannot be called a fit either
		expect(enclosureFit({ l: 400, w: 300, h: 300 }, boot(900, 900, 500), { w: null, h: 600 }).verdict).toBe('not-measured');
	});

	it('refuses sizes that cannot be real', () => {
		expect(() => enclosureFit({ l: -1, w: 300, h: 300 }, boot(900, 900, 500), { w: 900, h: 600 })).toThrow(/Box depth must be more than 0 mm/);
		expect(() => enclosureFit({ l: 100, w: 300, h: 300 }, boot(900, 900, 500), { w: 900, h: 600 }, { clearanceMm: -2 })).toThrow(/Clearance cannot be negative/);
	});
});

describe('properties', () => {
	const dim = fc.integer({ min: 50, max: 1500 });
	const grow = fc.integer({ min: 0, max: 500 });
	const space = fc.record({ l: dim, lTop: dim, w: dim, archW: dim, h: dim });
	const box = fc.record({ l: dim, w: dim, h: dim, lTop: dim });

	it('a box never fits worse when the boot or its opening grows', () => {
		// common sense of geometry: more room on any side cannot take room away
		const keys = ['l', 'lTop', 'w', 'archW', 'h', 'ow', 'oh'] as const;
		fc.assert(
			fc.property(box, space, dim, dim, fc.constantFrom(...keys), grow, (b, s, ow, oh, key, d) => {
				const before = enclosureFit(b, s, { w: ow, h: oh });
				const bigger = { ...s };
				let o = { w: ow, h: oh };
				if (key === 'ow') o = { ...o, w: ow + d };
				else if (key === 'oh') o = { ...o, h: oh + d };
				else bigger[key] = s[key] + d;
				expect(RANK[enclosureFit(b, bigger, o).verdict]).toBeGreaterThanOrEqual(RANK[before.verdict]);
			})
		);
	});

	it('a wedge never fits worse than the square box around it', () => {
		// the wedge lies inside its bounding box (hand geometry)
		fc.assert(
			fc.property(box, space, dim, dim, (b, s, ow, oh) => {
				const deep = Math.max(b.l, b.lTop);
				const wedge = enclosureFit({ ...b, l: deep, lTop: Math.min(b.l, b.lTop) }, s, { w: ow, h: oh });
				const square = enclosureFit({ l: deep, w: b.w, h: b.h }, s, { w: ow, h: oh });
				expect(RANK[wedge.verdict]).toBeGreaterThanOrEqual(RANK[square.verdict]);
			})
		);
	});

	it('a square box in a square boot through a wide opening agrees with the seat-space check', () => {
		// two independent routes to the same geometry: the seat check turns the box on the floor the same way
		fc.assert(
			fc.property(fc.record({ l: dim, w: dim, h: dim }), fc.record({ l: dim, w: dim, h: dim }), (b, s) => {
				const r = enclosureFit(b, boot(s.l, s.w, s.h), { w: 5000, h: 5000 });
				expect(r.verdict).toBe(fitVerdict(b, s).verdict);
			})
		);
	});
});

describe('the boot index for the reverse question', () => {
	const figure = fc.option(fc.integer({ min: 50_000, max: 1_500_000 }).map((um) => um / 1000), { freq: 6 });
	const bootRow = fc.record({
		space: fc.record({ l: figure, lTop: figure, w: figure, archW: figure, h: figure }),
		opening: fc.record({ w: figure, h: figure })
	});
	const side = fc.integer({ min: 50_000, max: 1_200_000 }).map((um) => um / 1000);

	it('takes exactly the boots enclosureFit calls fits or tight, with the same tight flags', () => {
		// two routes to one rule: the column scan against the per-boot check, on random decimal figures with gaps
		fc.assert(
			fc.property(fc.array(bootRow, { maxLength: 40 }), side, side, side, fc.option(side), fc.integer({ min: 0, max: 30 }), (boots, l, w, h, lTop, c) => {
				const box = { l, w, h, lTop };
				const index = new BootSpaceIndex(boots);
				const got = index.query(box, c);
				const want = boots.map((b) => enclosureFit(box, b.space, b.opening, { clearanceMm: c }).verdict);
				const rows = want.flatMap((v, i) => (v === 'fits' || v === 'tight' ? [i] : []));
				expect(Array.from(got.rows)).toEqual(rows);
				expect(Array.from(got.tight)).toEqual(rows.map((i) => (want[i] === 'tight' ? 1 : 0)));
			})
		);
	});

	it('agrees with enclosureFit when margins land exactly on zero or on the tight line', () => {
		// two routes to one rule: whole-millimetre figures in a narrow band, so many margins are exactly 0 or exactly tightMm
		const mm = fc.option(fc.integer({ min: 300, max: 330 }), { freq: 8 });
		const row = fc.record({ space: fc.record({ l: mm, lTop: mm, w: mm, archW: mm, h: mm }), opening: fc.record({ w: mm, h: mm }) });
		const boxSide = fc.integer({ min: 280, max: 320 });
		fc.assert(
			fc.property(fc.array(row, { maxLength: 60 }), boxSide, boxSide, boxSide, fc.option(boxSide), fc.integer({ min: 0, max: 12 }), fc.integer({ min: 1, max: 12 }), (boots, l, w, h, lTop, c, t) => {
				const box = { l, w, h, lTop };
				const got = new BootSpaceIndex(boots).query(box, c, t);
				const want = boots.map((b) => enclosureFit(box, b.space, b.opening, { clearanceMm: c, tightMm: t }).verdict);
				const rows = want.flatMap((v, i) => (v === 'fits' || v === 'tight' ? [i] : []));
				expect(Array.from(got.rows)).toEqual(rows);
				expect(Array.from(got.tight)).toEqual(rows.map((i) => (want[i] === 'tight' ? 1 : 0)));
			}),
			{ numRuns: 300 }
		);
	});

	it('decides an exact fit at the micrometre like the single check', () => {
		// 304.8 mm box under a 314.8 mm shelf with 10 mm clearance: margin 0, tight (hand-worked)
		const index = new BootSpaceIndex([{ space: { l: 900, lTop: null, w: 1000, archW: null, h: 314.8 }, opening: { w: 1000, h: 600 } }]);
		expect(Array.from(index.query({ l: 400, w: 400, h: 304.8 }).tight)).toEqual([1]);
	});
});
