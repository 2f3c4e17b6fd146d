import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { evaluate } from 'mathjs';
import {
	awgAreaMm2,
	awgDiameterMm,
	awgWire,
	COPPER_RESISTIVITY_OHM_MM2_PER_M,
	COPPER_TEMP_COEFF_PER_C,
	copperOhmsPerKm,
	formatAwg,
	MAX_AWG,
	MIN_AWG,
	parseAwg,
	STOCKED_POWER_GAUGES
} from '../../src/lib/domain/wire';

const gauges = Array.from({ length: MAX_AWG - MIN_AWG + 1 }, (_, i) => MIN_AWG + i);
// Ω per km at 20 °C from the ASTM B258 diameter d = 0.127 mm × 92^((36 − n)/39) and IEC 60028 ρ = 1/58 Ω·mm²/m, in mathjs.
const r20PerKm = (n: number): number => evaluate(`(1/58 ohm mm^2 / m) * 1 km / (pi / 4 * (0.127 mm * 92 ^ ((36 - ${n}) / 39))^2)`).toNumber('ohm');

// The usual AWG reference table (nominal solid diameter mm, area mm², Ω/km at 20 °C for
// ρ = 1.724e-8 Ω·m), as published in the common AWG tables; values from memory, and the
// inch diameters 0.3249 / 0.2043 / 0.1019 in for 0 / 4 / 10 AWG agree with the table in the
// Handbook of Electronic Tables and Formulas for American Wire Gauge.
const PUBLISHED = [
	{ awg: -3, d: 11.684, area: 107, ohmsPerKm: 0.1608 },
	{ awg: 0, d: 8.251, area: 53.5, ohmsPerKm: 0.3224 },
	{ awg: 2, d: 6.544, area: 33.6, ohmsPerKm: 0.5127 },
	{ awg: 4, d: 5.189, area: 21.2, ohmsPerKm: 0.8152 },
	{ awg: 6, d: 4.115, area: 13.3, ohmsPerKm: 1.296 },
	{ awg: 8, d: 3.264, area: 8.37, ohmsPerKm: 2.061 },
	{ awg: 10, d: 2.588, area: 5.26, ohmsPerKm: 3.277 },
	{ awg: 12, d: 2.053, area: 3.31, ohmsPerKm: 5.211 },
	{ awg: 14, d: 1.628, area: 2.08, ohmsPerKm: 8.286 },
	{ awg: 16, d: 1.291, area: 1.31, ohmsPerKm: 13.17 },
	{ awg: 18, d: 1.024, area: 0.823, ohmsPerKm: 20.95 },
	{ awg: 24, d: 0.511, area: 0.205, ohmsPerKm: 84.22 },
	{ awg: 36, d: 0.127, area: 0.0127, ohmsPerKm: 1361 },
	{ awg: 40, d: 0.0799, area: 0.00501, ohmsPerKm: 3441 }
];

describe('AWG diameter (ASTM B258)', () => {
	it.each(gauges)('%s AWG matches the metric formula evaluated by mathjs', (n) => {
		// ASTM B258: d = 0.127 mm × 92^((36 − n)/39), evaluated with mathjs units
		const d = evaluate(`0.127 mm * 92 ^ ((36 - ${n}) / 39)`).toNumber('mm');
		expect(awgDiameterMm(n)).toBeCloseTo(d, 12);
	});

	it.each(gauges)('%s AWG matches the inch form of the formula', (n) => {
		// ASTM B258 inch form: d = 0.005 in × 92^((36 − n)/39), converted by mathjs
		const d = evaluate(`0.005 inch * 92 ^ ((36 - ${n}) / 39)`).toNumber('mm');
		expect(awgDiameterMm(n)).toBeCloseTo(d, 10);
	});

	it.each(PUBLISHED)('$awg AWG: diameter $d mm and area $area mm² as in the published table', ({ awg, d, area }) => {
		// published AWG table (see PUBLISHED)
		expect(Math.abs(awgDiameterMm(awg) - d)).toBeLessThan(0.0006);
		expect(Math.abs(awgAreaMm2(awg) / area - 1)).toBeLessThan(0.005);
	});

	it('has the defining points: 36 AWG is 0.005 in and 4/0 is 0.46 in', () => {
		// ASTM B258 anchors (mathjs for the inch conversion)
		expect(awgDiameterMm(36)).toBeCloseTo(evaluate('0.005 inch').toNumber('mm'), 12);
		expect(awgDiameterMm(-3)).toBeCloseTo(evaluate('0.46 inch').toNumber('mm'), 12);
	});

	it('halves in diameter every 6 gauges and in area about every 3', () => {
		// ratio implied by the ASTM B258 formula: 92^(6/39) ≈ 2.005 (common practice: "6 gauges halves")
		fc.assert(
			fc.property(fc.integer({ min: MIN_AWG, max: MAX_AWG - 6 }), (n) => {
				expect(awgDiameterMm(n) / awgDiameterMm(n + 6)).toBeCloseTo(evaluate('92 ^ (6 / 39)'), 12);
				expect(awgAreaMm2(n) / awgAreaMm2(n + 3)).toBeCloseTo(2, 1);
			})
		);
	});
});

describe('copper resistance (IEC 60028)', () => {
	it('uses the annealed-copper resistivity 1/58 Ω·mm²/m ≈ 0.017241', () => {
		// IEC 60028
		expect(COPPER_RESISTIVITY_OHM_MM2_PER_M).toBeCloseTo(0.017241, 6);
		expect(COPPER_TEMP_COEFF_PER_C).toBe(0.00393);
	});

	it.each(PUBLISHED)('$awg AWG: $ohmsPerKm Ω/km at 20 °C as in the published table', ({ awg, ohmsPerKm }) => {
		// published AWG table (see PUBLISHED); the table's ρ 1.724e-8 differs from 1/58 by < 0.01 %
		expect(Math.abs(awgWire(awg).ohmsPerKm / ohmsPerKm - 1)).toBeLessThan(0.002);
	});

	it.each(gauges)('%s AWG: R = ρ L / A worked in mathjs units', (n) => {
		// R = ρ·L/A with IEC 60028 ρ and the ASTM B258 diameter, computed by mathjs with units
		expect(awgWire(n).ohmsPerKm).toBeCloseTo(r20PerKm(n), 9);
	});

	it('10 AWG: 3.277 Ω/km at 20 °C and 3.986 Ω/km at 75 °C', () => {
		// published AWG table for 20 °C; IEC 60028 R_t = R_20 (1 + 0.00393 (t − 20)) by hand: 3.2771 × 1.21615
		expect(awgWire(10).ohmsPerKm).toBeCloseTo(3.277, 3);
		expect(awgWire(10, 75).ohmsPerKm).toBeCloseTo(3.9855, 3);
	});

	it('temperature correction is linear in IEC 60028 form at any temperature', () => {
		fc.assert(
			fc.property(fc.integer({ min: MIN_AWG, max: MAX_AWG }), fc.double({ min: -40, max: 150, noNaN: true }), (n, t) => {
				// IEC 60028: R_t = R_20 (1 + 0.00393 (t − 20))
				const expected = evaluate(`r20 * (1 + 0.00393 * (t - 20))`, { r20: r20PerKm(n), t });
				expect(awgWire(n, t).ohmsPerKm).toBeCloseTo(expected, 9);
			})
		);
	});

	it('rejects a non-positive area or a missing temperature', () => {
		expect(() => copperOhmsPerKm(0)).toThrow(/area must be more than 0/);
		expect(() => copperOhmsPerKm(1, NaN)).toThrow(/temperature/);
	});
});

describe('gauge names', () => {
	it.each([
		['4', 4],
		['10', 10],
		['10 AWG', 10],
		['8 ga', 8],
		['18 gauge', 18],
		['40', 40],
		['0', 0],
		['1/0', 0],
		['00', -1],
		['2/0', -1],
		['000', -2],
		['3/0', -2],
		['0000', -3],
		['4/0', -3],
		[' 1/0 awg ', 0]
	] as const)('reads %j as %s', (text, n) => {
		// trade naming: n/0 ("aught") sizes count down from 0
		expect(parseAwg(text)).toBe(n);
	});

	it.each(['5/0', '00000', '41', '99', '-1', '1.5', 'abc', '', '1/2'])('rejects %j with a readable message', (text) => {
		expect(() => parseAwg(text)).toThrow(RangeError);
		expect(() => parseAwg(text)).toThrow(/wire gauge|AWG size/);
	});

	it.each([
		[-3, '4/0'],
		[-2, '3/0'],
		[-1, '2/0'],
		[0, '1/0'],
		[1, '1'],
		[10, '10'],
		[40, '40']
	])('formats %s as %s', (n, text) => {
		expect(formatAwg(n)).toBe(text);
	});

	it.each(gauges)('%s round-trips through its name', (n) => {
		expect(parseAwg(formatAwg(n))).toBe(n);
	});

	it('refuses gauges outside 4/0 … 40', () => {
		expect(() => formatAwg(-4)).toThrow(/4\/0 to 40/);
		expect(() => awgDiameterMm(41)).toThrow(/4\/0 to 40/);
		expect(() => awgWire(2.5)).toThrow(/whole AWG size/);
	});
});

describe('awgWire and stock list', () => {
	it('describes a wire', () => {
		const w = awgWire(4);
		expect(w.awg).toBe('4');
		// published AWG table: 4 AWG 5.189 mm, 21.2 mm², 0.8152 Ω/km
		expect(w.diameterMm).toBeCloseTo(5.189, 3);
		expect(w.areaMm2).toBeCloseTo(21.15, 2);
		expect(w.ohmsPerKm).toBeCloseTo(0.8152, 3);
		expect(awgWire(0).awg).toBe('1/0');
	});

	it('stocks the usual power and ground gauges', () => {
		// common practice
		expect(STOCKED_POWER_GAUGES).toEqual([0, 2, 4, 6, 8, 10, 12, 14, 16, 18]);
	});
});
