import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { evaluate } from 'mathjs';
import {
	DEFAULT_CIRCUIT,
	eDecade,
	eValues,
	GUARD_COUNTS,
	ladderReading,
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

// The pull-up divider read by an ADC, stated independently of the code: V = Vref × R / (R + Rp) (voltage divider
// rule) and counts = V / Vref × (2^N − 1). Bands put every resistor at one end of its tolerance and the pull-up
// at the other. Idle lines sit in parallel with the pressed button (1/R = Σ 1/Rᵢ; an open line adds nothing).
type Circuit = { rp: number; bits: number; t: number };
const C5: Circuit = { rp: 4700, bits: 10, t: 0.05 };
const par = (rs: number[]) => {
	const closed = rs.filter((r) => Number.isFinite(r));
	return closed.length ? 1 / closed.reduce((s, r) => s + 1 / r, 0) : Infinity;
};
const code = (r: number, rp: number, bits: number) => (Number.isFinite(r) ? (r / (r + rp)) * (2 ** bits - 1) : 2 ** bits - 1);
const bandOf = (rs: number[], c: Circuit) => ({ low: code(par(rs.map((r) => r * (1 - c.t))), c.rp * (1 + c.t), c.bits), high: code(par(rs.map((r) => r * (1 + c.t))), c.rp * (1 - c.t), c.bits) });
// Readings of two lines on one input, idle lines open unless given, with the no-button reading; true when any
// two bands come within 2 counts (the guard, common practice).
function crowded(lines: number[][], c: Circuit, idle = Infinity): boolean {
	const bands = lines.flatMap((line, i) => line.map((r) => bandOf([r, ...lines.filter((_, j) => j !== i).map(() => idle)], c)));
	bands.push(bandOf(lines.map(() => idle), c));
	bands.sort((x, y) => x.low + x.high - (y.low + y.high));
	return bands.some((b, i) => bands.slice(i + 1).some((o) => o.low - b.high < 2));
}

describe('ladder readings (pull-up divider and ADC)', () => {
	it('states its common-practice defaults', () => {
		// common practice for a steering-control interface: 4.7 kΩ to 5 V, 10-bit ADC, ±5 % parts, open idle line
		expect(DEFAULT_CIRCUIT).toEqual({ pullUpOhms: 4700, vrefV: 5, adcBits: 10, tolerancePct: 5, idleOhms: null });
		expect(GUARD_COUNTS).toBe(2);
	});

	it('1 kΩ under a 4.7 kΩ pull-up at 5 V reads 0.877 V, 179.5 counts of 1023', () => {
		// voltage divider rule, evaluated by mathjs: 5 V × 1000 / 5700
		const v = evaluate('5 V * 1000 ohm / (1000 ohm + 4700 ohm)').toNumber('V');
		expect(v).toBeCloseTo(0.87719, 5);
		const r = ladderReading(1000, { ...DEFAULT_CIRCUIT });
		expect(r.volts).toBeCloseTo(v, 12);
		// ADC code scale: 0.87719 / 5 × 1023 = 179.47
		expect(r.counts).toBeCloseTo(179.47, 2);
		// an open line reads the full reference
		expect(ladderReading(Infinity, { ...DEFAULT_CIRCUIT })).toEqual({ volts: 5, counts: 1023 });
	});

	it('the same 10 % step is 2 counts at 100 Ω, 21 counts at 10 kΩ and 4 counts at 100 kΩ', () => {
		// by hand: 100/4800 × 1023 = 21.31, 110/4810 × 1023 = 23.40 (2.08 apart); 10k/14.7k × 1023 = 695.92, 11k/15.7k × 1023 = 716.75;
		// 100k/104.7k × 1023 = 977.08, 110k/114.7k × 1023 = 981.08
		const step = (r: number) => ladderReading(r * 1.1, { ...DEFAULT_CIRCUIT }).counts - ladderReading(r, { ...DEFAULT_CIRCUIT }).counts;
		expect(step(100)).toBeCloseTo(2.08, 2);
		expect(step(10_000)).toBeCloseTo(20.83, 2);
		expect(step(100_000)).toBeCloseTo(4.0, 2);
	});

	it('sorts readings by counts with the idle reading on top, and gives each a tolerance band', () => {
		const r = ladderReport([lineA]);
		expect(r.readings.map((x) => x.button)).toEqual(['Volume up', 'Volume down', 'Next', 'No button']);
		expect(r.idle).toMatchObject({ idle: true, counts: 1023 });
		// by hand at ±5 %: 950 / (950 + 4935) × 1023 = 165.14; 1050 / (1050 + 4465) × 1023 = 194.77
		expect(r.readings[0].band.low).toBeCloseTo(165.14, 2);
		expect(r.readings[0].band.high).toBeCloseTo(194.77, 2);
		expect(r.collides).toBe(false);
		// closest pair in counts: every gap against the independent statement above
		const bands = [1000, 2200, 4700].map((x) => bandOf([x], C5));
		const gaps = [bands[1].low - bands[0].high, bands[2].low - bands[1].high, 1023 - bands[2].high];
		expect(r.smallestGap?.counts).toBeCloseTo(Math.min(...gaps), 9);
	});

	it('finds the 1000 Ω / 1020 Ω collision between two lines', () => {
		const r = ladderReport([{ name: 'L1', buttons: [{ name: 'Vol +', ohms: 1000 }] }, { name: 'L2', buttons: [{ name: 'Mode', ohms: 1020 }] }]);
		expect(r.collides).toBe(true);
		expect(r.collisions.map(([a, b]) => [a.button, b.button])).toEqual([['Vol +', 'Mode']]);
	});

	it('a button too close to the idle line cannot be read', () => {
		// by hand: 4.7 MΩ at −5 % against 4.7 kΩ at +5 %: 4,465,000 / 4,469,935 × 1023 = 1021.87, within 2 counts of 1023
		const r = ladderReport([{ name: 'L1', buttons: [{ name: 'Far', ohms: 4_700_000 }] }]);
		expect(r.collisions.map(([a, b]) => [a.button, b.button])).toEqual([['Far', 'No button']]);
		// 1 MΩ at −5 %: 950,000 / 954,935 × 1023 = 1017.7, clear of the idle reading
		expect(ladderReport([{ name: 'L1', buttons: [{ name: 'Near', ohms: 1_000_000 }] }]).collides).toBe(false);
	});

	it('an idle line in parallel loads the other line’s readings', () => {
		// by hand: 1 kΩ ∥ 100 kΩ = 990.1 Ω; 990.1 / 5690.1 × 1023 = 178.0 counts; no button: 50 kΩ → 935.1 counts
		const r = ladderReport([lineA, { name: 'Line 2', buttons: [{ name: 'Mode', ohms: 1200 }] }], { idleOhms: 100_000 });
		const up = r.readings.find((x) => x.button === 'Volume up')!;
		expect(up.seenOhms).toBeCloseTo(990.099, 3);
		expect(up.counts).toBeCloseTo(178.0, 1);
		expect(r.idle.seenOhms).toBeCloseTo(50_000, 6);
		expect(r.idle.counts).toBeCloseTo(935.1, 1);
	});

	it('agrees with the independent divider statement on random ladders', () => {
		fc.assert(
			fc.property(fc.array(fc.integer({ min: 0, max: 2_000_000 }), { minLength: 1, maxLength: 5 }), fc.array(fc.integer({ min: 0, max: 2_000_000 }), { minLength: 0, maxLength: 5 }), fc.constantFrom(1, 2, 5, 10), (a, b, pct) => {
				const lines = [a, b].filter((l) => l.length).map((l, i) => ({ name: `L${i}`, buttons: l.map((o, j) => ({ name: `B${j}`, ohms: o })) }));
				const r = ladderReport(lines, { tolerancePct: pct });
				expect(r.collides).toBe(crowded(lines.map((l) => l.buttons.map((x) => x.ohms)), { rp: 4700, bits: 10, t: pct / 100 }));
			})
		);
	});

	it('refuses a bad circuit or a negative reading with a readable message', () => {
		expect(() => ladderReport([lineA], { tolerancePct: -1 })).toThrow(/Tolerance/);
		expect(() => ladderReport([lineA], { pullUpOhms: 0 })).toThrow(/pull-up/);
		expect(() => ladderReport([lineA], { adcBits: 3 })).toThrow(/ADC resolution/);
		expect(() => ladderReport([{ name: 'L', buttons: [{ name: 'X', ohms: -5 }] }])).toThrow(/Button "X" on L/);
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

	it('needs nothing when the lines are already apart', () => {
		// lineA and lineB: the closest readings 2100 / 2200 Ω are 5.8 counts apart at ±0.5 % (independent statement above)
		expect(crowded([[1000, 2200, 4700], [1200, 2100, 6800]], { ...C5, t: 0.005 })).toBe(false);
		expect(suggestSeparator(lineA, lineB, { tolerancePct: 0.5 }, 'E12')).toMatchObject({ ok: true, resistorOhms: 0, onLine: null });
	});

	it('two identical lines at ±5 % take the smallest E24 value that parts them', () => {
		const r = suggestSeparator(same('Line 1'), same('Line 2'), {}, 'E24');
		expect(r.ok).toBe(true);
		if (!r.ok) return;
		// independent search over IEC 60063 E24 values with the divider statement above
		const values = [0, 1, 2, 3, 4, 5, 6].flatMap((d) => IEC_E24.map((v) => Math.round(v * 10 ** d * 10) / 10));
		const expected = values.find((R) => !crowded([[1000, 2000], [1000 + R, 2000 + R]], C5));
		expect(r.resistorOhms).toBe(expected);
		expect(r.onLine).toBe('Line 2');
	});

	it('says when a line collides with itself', () => {
		const bad: ControlLine = { name: 'Line 9', buttons: [{ name: 'A', ohms: 1000 }, { name: 'B', ohms: 1010 }] };
		const r = suggestSeparator(bad, same('Line 2'), {}, 'E12');
		expect(r.ok).toBe(false);
		if (!r.ok) expect(r.reason).toMatch(/On Line 9, "A" and "B" already read too close together/);
	});

	it('suggests nothing outside the readable range', () => {
		// by hand: 1 MΩ and 1.1 MΩ overlap (high 1018.67 vs low 1018.19 counts); parting them needs one band above
		// 1020.7 counts, but it must also stay 2 counts below the open idle line's 1023: no value does both
		const r = suggestSeparator({ name: 'L1', buttons: [{ name: 'A', ohms: 1_000_000 }] }, { name: 'L2', buttons: [{ name: 'B', ohms: 1_100_000 }] }, {}, 'E24');
		expect(r.ok).toBe(false);
		if (!r.ok) expect(r.reason).toMatch(/within the readable range \(below the idle reading of 1023 counts\)/);
	});

	it('finds the smallest standard value that works, on either line', () => {
		const line = (name: string, ohms: number[]): ControlLine => ({ name, buttons: ohms.map((o, i) => ({ name: `${name}${i}`, ohms: o })) });
		const values = [0, 1, 2, 3, 4, 5, 6].flatMap((d) => IEC_E24.map((v) => Math.round(v * 10 ** d * 10) / 10));
		fc.assert(
			fc.property(fc.uniqueArray(fc.integer({ min: 50, max: 10000 }), { minLength: 1, maxLength: 3 }), fc.uniqueArray(fc.integer({ min: 50, max: 10000 }), { minLength: 1, maxLength: 3 }), fc.constantFrom(1, 2, 5), (a, b, pct) => {
				const c = { ...C5, t: pct / 100 };
				fc.pre(!crowded([a], c) && !crowded([b], c));
				const r = suggestSeparator(line('A', a), line('B', b), { tolerancePct: pct }, 'E24');
				// independent search over the published E24 values, 1 Ω … 9.1 MΩ (IEC 60063)
				const works = (R: number) => !crowded([a, b.map((x) => x + R)], c) || !crowded([b, a.map((x) => x + R)], c);
				const expected = !crowded([a, b], c) ? 0 : values.find(works);
				if (expected === undefined) expect(r.ok).toBe(false);
				else expect(r.ok && r.resistorOhms).toBe(expected);
			}),
			{ numRuns: 60 }
		);
	});
});
