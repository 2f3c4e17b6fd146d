import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { evaluate } from 'mathjs';
import {
	eDecade,
	eValues,
	ladderReport,
	nearestE,
	parallel,
	series,
	suggestSeparator,
	type ControlLine
} from '../../src/lib/domain/ladder';

// IEC 60063 published values, one decade.
const IEC_E12 = '1.0 1.2 1.5 1.8 2.2 2.7 3.3 3.9 4.7 5.6 6.8 8.2'.split(' ').map(Number);
const IEC_E24 = '1.0 1.1 1.2 1.3 1.5 1.6 1.8 2.0 2.2 2.4 2.7 3.0 3.3 3.6 3.9 4.3 4.7 5.1 5.6 6.2 6.8 7.5 8.2 9.1'
	.split(' ')
	.map(Number);

// Two tolerance bands [r(1−t), r(1+t)] overlap: an independent statement of a collision.
const overlap = (a: number, b: number, t: number) => a * (1 - t) <= b * (1 + t) && b * (1 - t) <= a * (1 + t);
const anyOverlap = (rs: number[], t: number) => rs.some((a, i) => rs.some((b, j) => i < j && overlap(a, b, t)));

// Sample lines (fictional vehicle, invented readings).
const lineA: ControlLine = {
	name: 'Line 1',
	buttons: [
		{ name: 'Volume up', ohms: 1000 },
		{ name: 'Volume down', ohms: 2200 },
		{ name: 'Next', ohms: 4700 }
	]
};
const lineB: ControlLine = {
	name: 'Line 2',
	buttons: [
		{ name: 'Mode', ohms: 1200 },
		{ name: 'Mute', ohms: 2100 },
		{ name: 'Previous', ohms: 6800 }
	]
};

describe('series and parallel', () => {
	it('combine resistors', () => {
		// series sum and 1/R = Σ 1/Rᵢ, evaluated by mathjs
		expect(series([100, 220, 470])).toBe(790);
		expect(series([])).toBe(0);
		expect(parallel([100, 100])).toBeCloseTo(50, 12);
		expect(parallel([1000, 2200, 4700])).toBeCloseTo(evaluate('1 / (1/1000 + 1/2200 + 1/4700)'), 9);
		expect(parallel([1000, 0])).toBe(0);
	});

	it('parallel is below the smallest branch, series above the largest', () => {
		fc.assert(
			fc.property(fc.array(fc.double({ min: 1, max: 1e6, noNaN: true }), { minLength: 1, maxLength: 6 }), (rs) => {
				expect(parallel(rs)).toBeLessThanOrEqual(Math.min(...rs) * (1 + 1e-12));
				expect(series(rs)).toBeGreaterThanOrEqual(Math.max(...rs));
			})
		);
	});

	it('refuses negative or missing values', () => {
		expect(() => series([100, -1])).toThrow(/0 Ω or more/);
		expect(() => parallel([])).toThrow(/at least one/);
		expect(() => parallel([NaN])).toThrow(/0 Ω or more/);
	});
});

describe('E-series (IEC 60063)', () => {
	it('E12 and E24 decades match the published lists', () => {
		// IEC 60063
		expect(eDecade('E12', 0)).toEqual(IEC_E12);
		expect(eDecade('E24', 0)).toEqual(IEC_E24);
	});

	it.each([-1, 1, 2, 3, 4, 5, 6])('decade %s is the published list scaled by 10^decade', (d) => {
		// IEC 60063 values × 10^d; exact for whole ohms
		expect(eDecade('E24', d)).toEqual(IEC_E24.map((v) => Number((v * 10 ** d).toPrecision(2))));
		expect(eDecade('E12', d)).toEqual(IEC_E12.map((v) => Number((v * 10 ** d).toPrecision(2))));
	});

	it('has exact common values', () => {
		expect(eDecade('E12', 3)).toContain(4700);
		expect(eDecade('E24', 3)).toContain(5100);
		expect(eDecade('E12', 2)).toContain(220);
		expect(eDecade('E24', -1)).toContain(0.47);
	});

	it('each value stays within 5 % of the ideal geometric step 10^(i/N)', () => {
		// IEC 60063 defines the series as rounded terms of the geometric series with ratio 10^(1/N)
		for (const [values, n] of [
			[IEC_E12, 12],
			[IEC_E24, 24]
		] as const) {
			values.forEach((v, i) => expect(Math.abs(v / 10 ** (i / n) - 1)).toBeLessThan(0.05));
		}
	});

	it('spans 1 Ω to 9.1 MΩ by default', () => {
		const e12 = eValues('E12');
		expect(e12).toHaveLength(84);
		expect(e12[0]).toBe(1);
		expect(e12[e12.length - 1]).toBe(8_200_000);
		expect(eValues('E24').at(-1)).toBe(9_100_000);
	});

	it.each([
		[4600, 'E12', 4700],
		[5000, 'E12', 4700],
		[5000, 'E24', 5100],
		[9600, 'E12', 10000],
		[9.6, 'E24', 10],
		[0.95, 'E12', 1],
		[1040, 'E24', 1000],
		[1050, 'E24', 1100],
		[3000, 'E12', 3300],
		[3000, 'E24', 3000]
	] as const)('nearest to %s Ω in %s is %s Ω', (value, name, expected) => {
		// by hand: smallest |log(value / candidate)| among the IEC 60063 values (1000–1100 midpoint is √(1000·1100) ≈ 1048.8)
		expect(nearestE(value, name)).toBe(expected);
	});

	it('nearestE is never beaten by another published value', () => {
		const all = (name: 'E12' | 'E24') =>
			[-1, 0, 1, 2, 3, 4, 5, 6, 7].flatMap((d) => (name === 'E12' ? IEC_E12 : IEC_E24).map((v) => v * 10 ** d));
		fc.assert(
			fc.property(fc.double({ min: 1, max: 1e6, noNaN: true }), fc.constantFrom('E12' as const, 'E24' as const), (value, name) => {
				const best = nearestE(value, name);
				const bestDistance = Math.abs(Math.log(best / value));
				for (const v of all(name)) expect(bestDistance).toBeLessThanOrEqual(Math.abs(Math.log(v / value)) + 1e-9);
			})
		);
	});

	it('refuses a non-positive value', () => {
		expect(() => nearestE(0, 'E12')).toThrow(/more than 0 Ω/);
	});
});

describe('ladderReport', () => {
	it('sorts readings, finds the closest pair and the collision at ±5 %', () => {
		const report = ladderReport([lineA, lineB], 5);
		expect(report.readings.map((r) => r.ohms)).toEqual([1000, 1200, 2100, 2200, 4700, 6800]);
		// by hand: closest pair 2200 / 2100 = 1.0476; bands 2100 × 1.05 = 2205 ≥ 2200 × 0.95 = 2090
		expect(report.smallestGap?.ratio).toBeCloseTo(2200 / 2100, 12);
		expect(report.smallestGap?.low.button).toBe('Mute');
		expect(report.collides).toBe(true);
		expect(report.collisions.map(([a, b]) => [a.button, b.button])).toEqual([['Mute', 'Volume down']]);
	});

	it('finds no collision at ±2 %', () => {
		// by hand: 2100 × 1.02 = 2142 < 2200 × 0.98 = 2156
		const report = ladderReport([lineA, lineB], 2);
		expect(report.collides).toBe(false);
		expect(report.collisions).toEqual([]);
	});

	it('treats equal readings as colliding at any tolerance, and a 0 Ω button only with another', () => {
		const twin: ControlLine = { name: 'Line 3', buttons: [{ name: 'Seek', ohms: 1000 }, { name: 'Short', ohms: 0 }] };
		const report = ladderReport([lineA, twin], 0);
		expect(report.smallestGap?.ratio).toBe(1);
		expect(report.collisions.map(([a, b]) => [a.ohms, b.ohms])).toEqual([[1000, 1000]]);
		const zeros = ladderReport([{ name: 'L', buttons: [{ name: 'a', ohms: 0 }, { name: 'b', ohms: 0 }, { name: 'c', ohms: 10 }] }], 50);
		expect(zeros.collisions).toHaveLength(1);
	});

	it('lists every overlapping pair, not only neighbours', () => {
		const crowded: ControlLine = { name: 'L', buttons: [1000, 1050, 1100].map((ohms, i) => ({ name: `b${i}`, ohms })) };
		// by hand at ±5 %: 1000·1.05 = 1050 ≥ 1100·0.95 = 1045, so all three pairs overlap
		expect(ladderReport([crowded], 5).collisions).toHaveLength(3);
	});

	it('agrees with a brute-force band check on random ladders', () => {
		fc.assert(
			fc.property(
				fc.array(fc.integer({ min: 0, max: 20000 }), { minLength: 2, maxLength: 10 }),
				fc.integer({ min: 0, max: 20 }),
				(ohms, pct) => {
					const t = pct / 100;
					const report = ladderReport([{ name: 'L', buttons: ohms.map((o, i) => ({ name: `b${i}`, ohms: o })) }], pct);
					const expected = ohms.flatMap((a, i) => ohms.filter((b, j) => j > i && overlap(a, b, t)));
					expect(report.collisions).toHaveLength(expected.length);
					expect(report.collides).toBe(anyOverlap(ohms, t));
					const sorted = [...ohms].sort((a, b) => a - b);
					const ratios = sorted.slice(1).map((b, i) => (b === sorted[i] ? 1 : b / sorted[i]));
					expect(report.smallestGap?.ratio).toBe(Math.min(...ratios));
				}
			)
		);
	});

	it('refuses a bad tolerance or a negative reading', () => {
		expect(() => ladderReport([lineA], -1)).toThrow(/Tolerance/);
		expect(() => ladderReport([lineA], 100)).toThrow(/Tolerance/);
		expect(() => ladderReport([{ name: 'L', buttons: [{ name: 'x', ohms: -5 }] }], 5)).toThrow(/Button "x" on L/);
	});
});

describe('suggestSeparator', () => {
	const same = (name: string): ControlLine => ({
		name,
		buttons: [
			{ name: 'Up', ohms: 1000 },
			{ name: 'Down', ohms: 2000 }
		]
	});

	it.each([
		// by hand at ±4.5 %: band ratio 1.045/0.955 = 1.0942, so 2000 + R must exceed 2188.5 Ω
		['E24', 4.5, 200],
		['E12', 4.5, 220],
		// ±5 %: ratio 1.1053, 2000 + R > 2210.5 Ω
		['E24', 5, 220],
		// ±2 %: ratio 1.0408, 1000 + R > 1040.8 and 2000 + R > 2081.6 Ω
		['E12', 2, 82]
	] as const)('two identical lines in %s at ±%s %% need %s Ω', (name, pct, ohms) => {
		const r = suggestSeparator(same('Line 1'), same('Line 2'), pct, name);
		expect(r.ok).toBe(true);
		if (!r.ok) return;
		expect(r.resistorOhms).toBe(ohms);
		expect(r.onLine).toBe('Line 2');
		expect(r.report.readings.map((x) => x.ohms)).toEqual([1000, 1000 + ohms, 2000, 2000 + ohms].sort((a, b) => a - b));
	});

	it('needs nothing when the lines are already apart', () => {
		const r = suggestSeparator(lineA, lineB, 2, 'E12');
		expect(r).toMatchObject({ ok: true, resistorOhms: 0, onLine: null });
	});

	it('separates the sample lines at ±5 % with a standard value', () => {
		const r = suggestSeparator(lineA, lineB, 5, 'E12');
		expect(r.ok).toBe(true);
		if (!r.ok) return;
		expect(eValues('E12')).toContain(r.resistorOhms);
		expect(anyOverlap(r.report.readings.map((x) => x.ohms), 0.05)).toBe(false);
	});

	it('says when a line collides with itself', () => {
		const bad: ControlLine = { name: 'Line 9', buttons: [{ name: 'A', ohms: 1000 }, { name: 'B', ohms: 1010 }] };
		const r = suggestSeparator(bad, same('Line 2'), 5, 'E12');
		expect(r.ok).toBe(false);
		if (!r.ok) expect(r.reason).toMatch(/On Line 9, "A" and "B" already read too close together/);
	});

	it('finds the smallest standard value that works, on either line', () => {
		const line = (name: string, ohms: number[]): ControlLine => ({ name, buttons: ohms.map((o, i) => ({ name: `${name}${i}`, ohms: o })) });
		fc.assert(
			fc.property(
				fc.uniqueArray(fc.integer({ min: 50, max: 10000 }), { minLength: 1, maxLength: 3 }),
				fc.uniqueArray(fc.integer({ min: 50, max: 10000 }), { minLength: 1, maxLength: 3 }),
				fc.constantFrom(1, 2, 5),
				(a, b, pct) => {
					const t = pct / 100;
					fc.pre(!anyOverlap(a, t) && !anyOverlap(b, t));
					const r = suggestSeparator(line('A', a), line('B', b), pct, 'E24');
					// independent search over the published E24 values, 1 Ω … 9.1 MΩ
					const works = (R: number) =>
						!anyOverlap([...a, ...b.map((x) => x + R)], t) || !anyOverlap([...b, ...a.map((x) => x + R)], t);
					const values = [0, 1, 2, 3, 4, 5, 6].flatMap((d) => IEC_E24.map((v) => Math.round(v * 10 ** d * 10) / 10));
					const expected = !anyOverlap([...a, ...b], t) ? 0 : values.find(works);
					if (expected === undefined) expect(r.ok).toBe(false);
					else expect(r.ok && r.resistorOhms).toBe(expected);
				}
			)
		);
	});
});
