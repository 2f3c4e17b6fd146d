import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { evaluate, unit } from 'mathjs';
import {
	ABYC_COPPER_K,
	ABYC_E11_CRITICAL_DROP_PCT,
	abycCircularMils,
	AMP_CLASS_EFFICIENCY,
	ampCurrent,
	CHARGING_VOLTS,
	NOMINAL_VOLTS,
	powerWire,
	voltageDrop
} from '../../src/lib/domain/power';
import { STOCKED_POWER_GAUGES } from '../../src/lib/domain/wire';

// Loop resistance worked independently of the code: ASTM B258 diameter d = 0.127 mm × 92^((36 − n)/39),
// IEC 60028 resistivity 1/58 Ω·mm²/m at 20 °C and its 0.00393 /°C coefficient, evaluated by mathjs.
const loopOhms = (awg: number, loopM: number, tempC = 20): number =>
	evaluate(`(1/58 ohm mm^2 / m) * ${loopM} m / (pi / 4 * (0.127 mm * 92 ^ ((36 - ${awg}) / 39))^2) * (1 + 0.00393 * (${tempC} - 20))`).toNumber('ohm');
// Feet to metres by the international foot (0.3048 m exactly), through mathjs.
const ftToM = (ft: number): number => unit(ft, 'ft').toNumber('m');

describe('ampCurrent', () => {
	it('4 × 100 W class D draws 41.7 A at 12.0 V nominal, 34.7 A at 14.4 V running', () => {
		// by hand: 400 W / (0.8 × 12 V) = 41.67 A; 400 W / (0.8 × 14.4 V) = 34.72 A
		const r = ampCurrent({ rmsWattsPerChannel: 100, channels: 4, efficiency: 0.8 });
		expect(r.volts).toBe(12);
		expect(r.currentA).toBeCloseTo(41.667, 3);
		expect(r.runningCurrentA).toBeCloseTo(34.722, 3);
		expect(r.basis).toMatch(/12 V nominal/);
		expect(r.basis).toMatch(/14\.4 V with the engine running/);
	});

	it('1 × 500 W class AB at a stated 13.8 V', () => {
		// by hand: 500 W / (0.55 × 13.8 V) = 65.88 A
		const r = ampCurrent({ rmsWattsPerChannel: 500, channels: 1, efficiency: AMP_CLASS_EFFICIENCY.AB, volts: 13.8 });
		expect(r.currentA).toBeCloseTo(65.876, 3);
		expect(r.basis).toMatch(/13\.8 V as stated/);
	});

	it('matches P = V I for any amplifier', () => {
		fc.assert(
			fc.property(fc.double({ min: 1, max: 3000, noNaN: true }), fc.integer({ min: 1, max: 12 }), fc.double({ min: 0.2, max: 1, noNaN: true }), fc.double({ min: 9, max: 16, noNaN: true }), (w, ch, eff, v) => {
				// power balance (conservation of energy): input power V·I times efficiency equals output power
				const { currentA } = ampCurrent({ rmsWattsPerChannel: w, channels: ch, efficiency: eff, volts: v });
				expect((currentA * v * eff) / (w * ch)).toBeCloseTo(1, 9);
			})
		);
	});

	it('uses the usual class efficiencies, 12.0 V nominal and 14.4 V running', () => {
		// common practice: class AB about 0.5–0.6, class D about 0.8; charging about 14.4 V; ABYC E-11 tables at 12 V
		expect(AMP_CLASS_EFFICIENCY.AB).toBeGreaterThanOrEqual(0.5);
		expect(AMP_CLASS_EFFICIENCY.AB).toBeLessThanOrEqual(0.6);
		expect(AMP_CLASS_EFFICIENCY.D).toBeCloseTo(0.8, 2);
		expect(CHARGING_VOLTS).toBe(14.4);
		expect(NOMINAL_VOLTS).toBe(12);
	});

	it.each([
		[{ rmsWattsPerChannel: 100, channels: 0, efficiency: 0.8 }, /at least 1 channel/],
		[{ rmsWattsPerChannel: 100, channels: 2.5, efficiency: 0.8 }, /whole number/],
		[{ rmsWattsPerChannel: 100, channels: 2, efficiency: 1.5 }, /cannot be more than 1/],
		[{ rmsWattsPerChannel: 100, channels: 2, efficiency: 0 }, /Efficiency must be more than 0/],
		[{ rmsWattsPerChannel: -100, channels: 2, efficiency: 0.8 }, /RMS power per channel must be more than 0 W/],
		[{ rmsWattsPerChannel: 1e300, channels: 2, efficiency: 0.8 }, /looks like a typo/],
		[{ rmsWattsPerChannel: 100, channels: 2, efficiency: 0.8, volts: NaN }, /Supply voltage must be a number of V/]
	])('rejects bad input with a readable message', (input, message) => {
		expect(() => ampCurrent(input)).toThrow(message);
	});
});

describe('voltageDrop', () => {
	it('30 A over a 10 m loop of 10 AWG drops 0.98 V', () => {
		// Ohm's law with the published 10 AWG figure 3.277 Ω/km (AWG table, from memory): 0.01 km × 3.277 × 30 A = 0.983 V
		const { resistanceOhms, dropV } = voltageDrop(30, 10, 10);
		expect(resistanceOhms).toBeCloseTo(0.03277, 4);
		expect(dropV).toBeCloseTo(0.983, 3);
	});

	it('rises with conductor temperature per IEC 60028', () => {
		// IEC 60028: R_t = R_20 (1 + 0.00393 (t − 20)), with R_20 from ASTM B258 and ρ = 1/58
		expect(voltageDrop(30, 10, 10, 60).dropV).toBeCloseTo(30 * loopOhms(10, 10, 60), 9);
	});

	it('follows Ohm’s law for any stocked gauge, current and loop', () => {
		fc.assert(
			fc.property(fc.constantFrom(...STOCKED_POWER_GAUGES), fc.double({ min: 0, max: 300, noNaN: true }), fc.double({ min: 0, max: 20, noNaN: true }), (awg, a, m) => {
				// Ohm's law, R from ASTM B258 and IEC 60028 (see loopOhms)
				expect(voltageDrop(a, m, awg).dropV).toBeCloseTo(a * loopOhms(awg, m), 9);
			})
		);
	});

	it('refuses negative current or length', () => {
		expect(() => voltageDrop(-1, 5, 10)).toThrow(/Current/);
		expect(() => voltageDrop(10, -5, 10)).toThrow(/Loop length/);
	});
});

describe('ABYC E-11 conductor formula', () => {
	it('uses K = 10.75 for copper', () => {
		// ABYC E-11: CM = K × I × L / E, K = 10.75 for copper
		expect(ABYC_COPPER_K).toBe(10.75);
	});

	it('the bilge-pump worked example: 10 A, 11 ft out and 10 ft back', () => {
		// Worked example reproduced with ABYC E-11's tables in a marine supplier's catalogue: 3 % → 10 AWG, 10 % → 16 AWG.
		// by hand: 10.75 × 10 × 21 / 0.36 = 6270.8 cmil; 10.75 × 10 × 21 / 1.2 = 1881.25 cmil
		expect(abycCircularMils(10, 21, 0.36)).toBeCloseTo(6270.83, 2);
		expect(abycCircularMils(10, 21, 1.2)).toBeCloseTo(1881.25, 2);
		const critical = powerWire({ currentA: 10, powerLengthM: ftToM(11), groundLengthM: ftToM(10) });
		expect(critical.ok && critical.awg).toBe('10');
		const general = powerWire({ currentA: 10, powerLengthM: ftToM(11), groundLengthM: ftToM(10), maxDropPct: 10 });
		expect(general.ok && general.awg).toBe('16');
	});

	// ABYC E-11 Table IX, "Conductors sized for 3 percent drop in voltage", 12 V (as reproduced by marine
	// suppliers): [amps, round-trip feet, gauge]. The reproduced 15 A / 60 ft cell (6 AWG) is left out: it asks
	// for the same 26,875 cmil as the 10 A / 90 ft cell, which the table gives as 4 AWG.
	it.each([
		[5, 10, '18'],
		[5, 15, '16'],
		[5, 20, '14'],
		[5, 25, '12'],
		[5, 30, '12'],
		[5, 40, '10'],
		[5, 70, '8'],
		[5, 100, '6'],
		[10, 10, '14'],
		[10, 15, '12'],
		[10, 20, '10'],
		[10, 30, '10'],
		[10, 40, '8'],
		[10, 50, '6'],
		[10, 80, '6'],
		[10, 90, '4'],
		[10, 130, '2'],
		[15, 10, '12'],
		[15, 15, '10'],
		[15, 25, '8'],
		[15, 40, '6'],
		[15, 70, '4'],
		[20, 10, '10'],
		[20, 20, '8'],
		[20, 25, '6'],
		[20, 50, '4'],
		[20, 100, '2'],
		[20, 140, '1/0'],
		[25, 10, '10'],
		[25, 15, '8'],
		[25, 20, '6'],
		[25, 40, '4'],
		[25, 50, '4'],
		[25, 60, '2'],
		[25, 110, '1/0']
	] as const)('%s A over %s ft round trip at 12 V, 3 %% → %s AWG (published table)', (amps, feet, gauge) => {
		const r = powerWire({ currentA: amps, powerLengthM: ftToM(feet), groundLengthM: 0 });
		expect(r.ok && r.awg).toBe(gauge);
	});

	it('at 14.4 V the same run would come out thinner, so 12.0 V is the default', () => {
		// by hand: 20 A, 25 ft: 12 V → 14,931 cmil (6 AWG, as the table); 14.4 V → 12,443 cmil (8 AWG's 14,810 is enough)
		const nominal = powerWire({ currentA: 20, powerLengthM: ftToM(25), groundLengthM: 0 });
		const running = powerWire({ currentA: 20, powerLengthM: ftToM(25), groundLengthM: 0, volts: 14.4 });
		expect([nominal.ok && nominal.awg, running.ok && running.awg]).toEqual(['6', '8']);
		expect(nominal.basis.volts).toBe(12);
		expect(nominal.basis.text).toMatch(/12 V nominal/);
	});

	it('a hot conductor can need the next gauge', () => {
		// 25 A over 50 ft: ABYC asks 37,326 cmil, 4 AWG's minimum is 37,360. Ohm's law on the published 4 AWG
		// figure 0.8152 Ω/km (AWG table, from memory): at 20 °C 25 A × 0.01524 km × 0.8152 = 0.311 V (2.6 %);
		// at 100 °C × (1 + 0.00393 × 80) = 0.408 V (3.4 %), over 3 %, so 2 AWG.
		const cool = powerWire({ currentA: 25, powerLengthM: ftToM(50), groundLengthM: 0 });
		const hot = powerWire({ currentA: 25, powerLengthM: ftToM(50), groundLengthM: 0, tempC: 100 });
		expect(cool.ok && [cool.awg, cool.dropPct.toFixed(1)]).toEqual(['4', '2.6']);
		expect(hot.ok && hot.awg).toBe('2');
		expect(hot.basis.text).toMatch(/100 °C conductor temperature/);
	});
});

describe('powerWire', () => {
	it('4 × 100 W class D over 5 m + 0.5 m ground: 6 AWG and a 60 A fuse at 12 V', () => {
		// by hand: 41.67 A at 12 V; 5.5 m = 18.04 ft; 10.75 × 41.67 × 18.04 / 0.36 = 22,450 cmil → 6 AWG
		// (8 AWG's 14,810 is too little); fuse ≥ 1.25 × 41.67 = 52.1 A → 60 A (common practice, ISO 8820-3 maxi)
		const { currentA } = ampCurrent({ rmsWattsPerChannel: 100, channels: 4, efficiency: 0.8 });
		const r = powerWire({ currentA, powerLengthM: 5, groundLengthM: 0.5 });
		expect(r.ok).toBe(true);
		if (!r.ok) return;
		expect([r.awg, r.fuseA, r.upsized]).toEqual(['6', 60, null]);
		expect(r.basis.requiredCircularMils).toBeCloseTo(22450, -1);
		expect(r.dropV).toBeCloseTo(currentA * loopOhms(6, 5.5), 9);
		expect(r.fuseBasis).toMatch(/125 % of the 41\.7 A/);
	});

	it('defaults to the ABYC E-11 3 % figure and lists every stocked gauge, thinnest first', () => {
		expect(ABYC_E11_CRITICAL_DROP_PCT).toBe(3);
		const r = powerWire({ currentA: 10, powerLengthM: 3, groundLengthM: 1 });
		expect(r.candidates.map((c) => c.gauge)).toEqual([18, 16, 14, 12, 10, 8, 6, 4, 2, 0]);
	});

	it('makes the cable heavier when the fuse the load needs is more than the thin cable carries, and says why', () => {
		// by hand: 45 A over 0.5 m (1.64 ft): 10.75 × 45 × 1.64 / 0.36 = 2,204 cmil → 16 AWG on drop alone;
		// fuse ≥ 1.25 × 45 = 56.25 → 60 A; chassis ampacity (handbook): 16 AWG 22 A, 10 AWG 55 A, 8 AWG 73 A → 8 AWG
		const r = powerWire({ currentA: 45, powerLengthM: 0.3, groundLengthM: 0.2 });
		expect(r.ok && [r.awg, r.fuseA]).toEqual(['8', 60]);
		// ASTM B258 areas: 16 AWG 2,583 cmil = 1.31 mm², 8 AWG 16,510 cmil = 8.37 mm²
		expect(r.ok && r.upsized?.reason).toMatch(/16 AWG \(1\.31 mm²\) keeps the drop within 3 %, but the 60 A fuse the load needs is more than it can carry \(22 A\), so the cable is 8 AWG \(8\.37 mm²\)/);
	});

	it("honours the amplifiers' own fuse rating", () => {
		// by hand: 30 A draw → 37.5 A → 40 A; with 2 × 40 A fuses on the amplifier → 80 A, so the cable must carry 80 A:
		// 8 AWG 73 A is too little, 6 AWG 101 A (handbook chassis table)
		const r = powerWire({ currentA: 30, powerLengthM: 1, groundLengthM: 0.3, ownFuseA: 80 });
		expect(r.ok && [r.awg, r.fuseA]).toEqual(['6', 80]);
	});

	it('says clearly when even the heaviest stocked cable drops too much', () => {
		// by hand: 100 A over 30 m = 98.4 ft: 10.75 × 100 × 98.4 / 0.36 = 293,800 cmil, beyond 1/0's 98,980
		const r = powerWire({ currentA: 100, powerLengthM: 29, groundLengthM: 1 });
		expect(r.ok).toBe(false);
		// ASTM B258: 1/0 AWG is 105,600 cmil = 53.5 mm²
		if (!r.ok) expect(r.reason).toMatch(/Even 1\/0 AWG \(53\.5 mm²\) drops more than the 3 % target over a 30 m loop/);
	});

	it('says clearly when the current is beyond the heaviest stocked cable', () => {
		const r = powerWire({ currentA: 300, powerLengthM: 1, groundLengthM: 0.3 });
		expect(r.ok).toBe(false);
		if (!r.ok) expect(r.reason).toMatch(/300 A is more than the heaviest stocked cable \(1\/0 AWG \(53\.5 mm²\), 245 A\)/);
	});

	it.each([
		[{ currentA: 0, powerLengthM: 5, groundLengthM: 1 }, /Current must be more than 0 A/],
		[{ currentA: 10, powerLengthM: -5, groundLengthM: 1 }, /Power run length must be more than 0 m/],
		[{ currentA: 10, powerLengthM: 5, groundLengthM: -1 }, /Ground lead length cannot be negative/],
		[{ currentA: 10, powerLengthM: 5, groundLengthM: 1, maxDropPct: 0 }, /Allowed voltage drop must be more than 0/],
		[{ currentA: 10, powerLengthM: 5, groundLengthM: 1, tempC: 400 }, /above 150 °C/],
		[{ currentA: 1e300, powerLengthM: 5, groundLengthM: 1 }, /looks like a typo/]
	])('rejects bad input with a readable message', (input, message) => {
		expect(() => powerWire(input)).toThrow(message);
	});

	it('the chosen cable always carries its fuse, and the fuse always covers 125 % of the draw', () => {
		fc.assert(
			fc.property(fc.double({ min: 1, max: 200, noNaN: true }), fc.double({ min: 0.5, max: 8, noNaN: true }), fc.double({ min: 0, max: 2, noNaN: true }), (currentA, powerLengthM, groundLengthM) => {
				// common practice: fuse ≥ 125 % of the continuous draw; the fuse protects the cable (fuse ≤ ampacity)
				const r = powerWire({ currentA, powerLengthM, groundLengthM });
				if (!r.ok) return;
				expect(r.fuseA).toBeGreaterThanOrEqual(1.25 * currentA - 1e-9);
				expect(r.fuseA).toBeLessThanOrEqual(r.ampacityA);
				// ABYC E-11: the chosen gauge has at least the formula's circular mils (ABYC minimum areas, from memory)
				const cm = (10.75 * currentA * unit(powerLengthM + groundLengthM, 'm').toNumber('ft')) / 0.36;
				const ABYC_MIN: Record<string, number> = { '1/0': 98_980, '2': 62_450, '4': 37_360, '6': 24_538, '8': 14_810, '10': 9_343, '12': 5_833, '14': 3_702, '16': 2_336, '18': 1_537 };
				expect(ABYC_MIN[r.awg]).toBeGreaterThanOrEqual(cm - 1e-6);
			})
		);
	});
});
