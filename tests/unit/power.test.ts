import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { evaluate } from 'mathjs';
import {
	ABYC_E11_CRITICAL_DROP_PCT,
	AMP_CLASS_EFFICIENCY,
	ampCurrent,
	CHARGING_VOLTS,
	powerWire,
	voltageDrop
} from '../../src/lib/domain/power';
import { CHASSIS_AMPACITY_A, STANDARD_FUSE_RATINGS_A } from '../../src/lib/domain/fuse';
import { awgAreaMm2, STOCKED_POWER_GAUGES } from '../../src/lib/domain/wire';

// Loop resistance from first principles, R = ρ L / A with IEC 60028 ρ = 1/58 Ω·mm²/m, in mathjs units.
const loopOhms = (awg: number, loopM: number, tempC = 20): number =>
	evaluate(`(1/58 ohm mm^2 / m) * ${loopM} m / (${awgAreaMm2(awg)} mm^2) * (1 + 0.00393 * (${tempC} - 20))`).toNumber(
		'ohm'
	);

describe('ampCurrent', () => {
	it('4 × 100 W class D at 14.4 V draws 34.7 A', () => {
		// I = P / (η V), evaluated by mathjs with units
		const expected = evaluate('(4 * 100 W) / (0.8 * 14.4 V)').toNumber('A');
		expect(expected).toBeCloseTo(34.722, 3);
		expect(ampCurrent({ rmsWattsPerChannel: 100, channels: 4, efficiency: 0.8, volts: 14.4 }).currentA).toBeCloseTo(
			expected,
			9
		);
	});

	it('1 × 500 W class AB at 13.8 V', () => {
		// I = P / (η V), mathjs
		const expected = evaluate('500 W / (0.55 * 13.8 V)').toNumber('A');
		expect(
			ampCurrent({ rmsWattsPerChannel: 500, channels: 1, efficiency: AMP_CLASS_EFFICIENCY.AB, volts: 13.8 }).currentA
		).toBeCloseTo(expected, 9);
	});

	it('matches P = V I for any amplifier', () => {
		fc.assert(
			fc.property(
				fc.double({ min: 1, max: 3000, noNaN: true }),
				fc.integer({ min: 1, max: 12 }),
				fc.double({ min: 0.2, max: 1, noNaN: true }),
				fc.double({ min: 9, max: 16, noNaN: true }),
				(w, ch, eff, v) => {
					// power balance: input power V·I times efficiency equals output power
					const { currentA } = ampCurrent({ rmsWattsPerChannel: w, channels: ch, efficiency: eff, volts: v });
					expect((currentA * v * eff) / (w * ch)).toBeCloseTo(1, 9);
				}
			)
		);
	});

	it('uses the usual class efficiencies and charging voltage', () => {
		// common practice: class AB about 0.5–0.6, class D about 0.8; charging about 14.4 V
		expect(AMP_CLASS_EFFICIENCY.AB).toBeGreaterThanOrEqual(0.5);
		expect(AMP_CLASS_EFFICIENCY.AB).toBeLessThanOrEqual(0.6);
		expect(AMP_CLASS_EFFICIENCY.D).toBeCloseTo(0.8, 2);
		expect(CHARGING_VOLTS).toBe(14.4);
	});

	it.each([
		[{ rmsWattsPerChannel: 100, channels: 0, efficiency: 0.8, volts: 14.4 }, /at least 1 channel/],
		[{ rmsWattsPerChannel: 100, channels: 2.5, efficiency: 0.8, volts: 14.4 }, /whole number/],
		[{ rmsWattsPerChannel: 100, channels: 2, efficiency: 1.5, volts: 14.4 }, /cannot be more than 1/],
		[{ rmsWattsPerChannel: 100, channels: 2, efficiency: 0, volts: 14.4 }, /Efficiency must be more than 0/],
		[{ rmsWattsPerChannel: -100, channels: 2, efficiency: 0.8, volts: 14.4 }, /RMS power per channel must be more than 0 W/],
		[{ rmsWattsPerChannel: 100, channels: 2, efficiency: 0.8, volts: NaN }, /Supply voltage must be a number of V/]
	])('rejects bad input with a readable message', (input, message) => {
		expect(() => ampCurrent(input)).toThrow(message);
	});
});

describe('voltageDrop', () => {
	it('30 A over a 10 m loop of 10 AWG drops 0.98 V', () => {
		// Ohm's law with the published 10 AWG figure 3.277 Ω/km: 0.01 km × 3.277 × 30 A = 0.983 V
		const { resistanceOhms, dropV } = voltageDrop(30, 10, 10);
		expect(resistanceOhms).toBeCloseTo(0.03277, 4);
		expect(dropV).toBeCloseTo(0.983, 3);
		// mathjs: V = I R with R = ρ L / A
		expect(dropV).toBeCloseTo(evaluate(`30 A * ${loopOhms(10, 10)} ohm`).toNumber('V'), 9);
	});

	it('rises with conductor temperature per IEC 60028', () => {
		expect(voltageDrop(30, 10, 10, 60).dropV).toBeCloseTo(30 * loopOhms(10, 10, 60), 9);
		expect(voltageDrop(30, 10, 10, 60).dropV / voltageDrop(30, 10, 10).dropV).toBeCloseTo(1 + 0.00393 * 40, 9);
	});

	it('follows Ohm’s law for any stocked gauge, current and loop', () => {
		fc.assert(
			fc.property(
				fc.constantFrom(...STOCKED_POWER_GAUGES),
				fc.double({ min: 0, max: 300, noNaN: true }),
				fc.double({ min: 0, max: 20, noNaN: true }),
				(awg, a, m) => {
					// Ohm's law, R from ρ L / A (mathjs)
					expect(voltageDrop(a, m, awg).dropV).toBeCloseTo(a * loopOhms(awg, m), 9);
				}
			)
		);
	});

	it('refuses negative current or length', () => {
		expect(() => voltageDrop(-1, 5, 10)).toThrow(/Current/);
		expect(() => voltageDrop(10, -5, 10)).toThrow(/Loop length/);
	});
});

describe('powerWire', () => {
	it('picks 8 AWG and a 35 A fuse for 34.7 A over 5 m + 0.5 m ground at 14.4 V', () => {
		// by hand: budget 3 % × 14.4 V = 0.432 V; 0.432 V / 34.72 A / 5.5 m = 2.262 Ω/km allowed;
		// published table: 10 AWG 3.277 Ω/km (too much), 8 AWG 2.061 Ω/km (meets it, 73 A handbook ampacity)
		const { currentA } = ampCurrent({ rmsWattsPerChannel: 100, channels: 4, efficiency: 0.8, volts: 14.4 });
		const r = powerWire({ currentA, powerLengthM: 5, groundLengthM: 0.5, volts: 14.4 });
		expect(r.ok).toBe(true);
		if (!r.ok) return;
		expect(r.awg).toBe('8');
		expect(r.fuseA).toBe(35);
		expect(r.resistanceOhms).toBeCloseTo(loopOhms(8, 5.5), 9);
		expect(r.dropV).toBeCloseTo(currentA * loopOhms(8, 5.5), 9);
		expect(r.dropPct).toBeCloseTo((100 * currentA * loopOhms(8, 5.5)) / 14.4, 9);
		expect(r.dropPct).toBeLessThanOrEqual(3);
		const ten = r.candidates.find((c) => c.awg === '10');
		expect(ten?.meetsDrop).toBe(false);
		expect(ten?.dropPct).toBeCloseTo((100 * currentA * 0.0055 * 3.277) / 14.4, 2);
	});

	it('defaults to the ABYC E-11 3 % figure and lists every stocked gauge, thinnest first', () => {
		expect(ABYC_E11_CRITICAL_DROP_PCT).toBe(3);
		const r = powerWire({ currentA: 10, powerLengthM: 3, groundLengthM: 1, volts: 12 });
		expect(r.candidates.map((c) => c.gauge)).toEqual([18, 16, 14, 12, 10, 8, 6, 4, 2, 0]);
		const loose = powerWire({ currentA: 34.7, powerLengthM: 5, groundLengthM: 0.5, volts: 14.4, maxDropPct: 5 });
		expect(loose.ok && loose.awg).toBe('10');
	});

	it('skips a gauge whose drop is fine when no standard fuse fits it', () => {
		// 52 A on 10 AWG needs a 60 A fuse but 10 AWG carries 55 A (handbook table), so 8 AWG
		const r = powerWire({ currentA: 52, powerLengthM: 0.3, groundLengthM: 0.2, volts: 14.4 });
		const ten = r.candidates.find((c) => c.gauge === 10);
		expect(ten).toMatchObject({ meetsDrop: true, carriesCurrent: true, fuseA: null });
		expect(r.ok && [r.awg, r.fuseA]).toEqual(['8', 60]);
	});

	it('says clearly when even the heaviest stocked cable drops too much', () => {
		// by hand: 100 A × 30 m × 0.3224 Ω/km (1/0, published table) = 0.97 V = 6.7 % of 14.4 V
		const r = powerWire({ currentA: 100, powerLengthM: 29, groundLengthM: 1, volts: 14.4 });
		expect(r.ok).toBe(false);
		if (r.ok) return;
		expect(r.reason).toMatch(/Even 1\/0 AWG drops 6\.7 % over a 30 m loop, above the 3 % target/);
		expect(r.candidates).toHaveLength(10);
	});

	it('says clearly when the current is beyond the heaviest stocked cable', () => {
		const r = powerWire({ currentA: 300, powerLengthM: 1, groundLengthM: 0.3, volts: 14.4 });
		expect(r.ok).toBe(false);
		if (!r.ok) expect(r.reason).toMatch(/300 A is more than the heaviest stocked cable \(1\/0 AWG, 245 A\)/);
	});

	it.each([
		[{ currentA: 0, powerLengthM: 5, groundLengthM: 1, volts: 14.4 }, /Current must be more than 0 A/],
		[{ currentA: 10, powerLengthM: -5, groundLengthM: 1, volts: 14.4 }, /Power run length must be more than 0 m/],
		[{ currentA: 10, powerLengthM: 5, groundLengthM: -1, volts: 14.4 }, /Ground lead length cannot be negative/],
		[{ currentA: 10, powerLengthM: 5, groundLengthM: 1, volts: 14.4, maxDropPct: 0 }, /Allowed voltage drop must be more than 0/],
		[{ currentA: 10, powerLengthM: 5, groundLengthM: 1, volts: 14.4, tempC: 400 }, /above 150 °C/]
	])('rejects bad input with a readable message', (input, message) => {
		expect(() => powerWire(input)).toThrow(message);
	});

	it('always returns the thinnest stocked gauge meeting drop, ampacity and a standard fuse', () => {
		fc.assert(
			fc.property(
				fc.double({ min: 1, max: 260, noNaN: true }),
				fc.double({ min: 0.5, max: 8, noNaN: true }),
				fc.double({ min: 0, max: 2, noNaN: true }),
				fc.constantFrom(12, 13.8, 14.4),
				fc.constantFrom(2, 3, 5),
				(currentA, powerLengthM, groundLengthM, volts, maxDropPct) => {
					const loop = powerLengthM + groundLengthM;
					// independent check: Ohm's law drop, handbook ampacity, a standard rating between draw and ampacity
					const acceptable = (g: number) =>
						(100 * currentA * loopOhms(g, loop)) / volts <= maxDropPct + 1e-9 &&
						currentA <= CHASSIS_AMPACITY_A[g] &&
						STANDARD_FUSE_RATINGS_A.some((f) => f >= currentA && f <= CHASSIS_AMPACITY_A[g]);
					const thinnestFirst = [...STOCKED_POWER_GAUGES].sort((a, b) => b - a);
					const expected = thinnestFirst.find(acceptable);
					const r = powerWire({ currentA, powerLengthM, groundLengthM, volts, maxDropPct });
					if (expected === undefined) expect(r.ok).toBe(false);
					else expect(r.ok && r.gauge).toBe(expected);
				}
			)
		);
	});
});
