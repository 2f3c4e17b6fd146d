import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { evaluate } from 'mathjs';
import {
	ALUMINIUM_RESISTIVITY_OHM_MM2_PER_M,
	awgWire,
	conductorOhmsPerKm,
	formatMm2,
	gaugeLabel,
	materialBasis,
	resistivityOhmMm2PerM,
	STOCKED_POWER_GAUGES
} from '../../src/lib/domain/wire';
import { CHASSIS_AMPACITY_A, mainFuse, wireAmpacityA } from '../../src/lib/domain/fuse';
import { abycCircularMils, powerWire, voltageDrop } from '../../src/lib/domain/power';

describe('cable material', () => {
	it('takes copper at 1/58 Ω·mm²/m (IEC 60028) and CCA at 62.9 % of its conductivity (ASTM B566, 10 % class minimum)', () => {
		expect(resistivityOhmMm2PerM('copper')).toBeCloseTo(0.017241, 6);
		// by hand: 0.017241 / 0.629 = 0.027410 Ω·mm²/m
		expect(resistivityOhmMm2PerM('cca')).toBeCloseTo(0.02741, 5);
	});

	it('puts CCA between copper and hard-drawn aluminium (IEC 60889: 0.028264 Ω·mm²/m)', () => {
		expect(ALUMINIUM_RESISTIVITY_OHM_MM2_PER_M).toBe(0.028264);
		expect(resistivityOhmMm2PerM('cca')).toBeGreaterThan(resistivityOhmMm2PerM('copper'));
		expect(resistivityOhmMm2PerM('cca')).toBeLessThan(ALUMINIUM_RESISTIVITY_OHM_MM2_PER_M);
	});

	it.each([
		// A CCA maker's data sheet (ASTM B566 wire) gives Ω per 1000 ft at 20 °C for its 10 % CCA: 14 AWG 3.91, 18 AWG 9.90.
		// Typical wire beats the 62.9 % minimum, so the sheet's figure must be a little higher (safe side), within 4 %.
		[14, 3.91],
		[18, 9.9]
	])('%i AWG CCA is no lower than the published figure of %s Ω per 1000 ft, and close to it', (awg, perKft) => {
		const ours = (awgWire(awg, 20, 'cca').ohmsPerKm * 0.3048);
		expect(ours).toBeGreaterThanOrEqual(perKft);
		expect(ours / perKft).toBeLessThan(1.04);
	});

	it('scales every gauge by the conductivity share, checked in mathjs', () => {
		for (const n of STOCKED_POWER_GAUGES) {
			// R = ρ / A with ρ = (1/58) / 0.629 Ω·mm²/m and A from the ASTM B258 diameter
			const expected = evaluate(`(1/58 / 0.629) * (1 ohm mm^2 / m) * 1 km / (pi / 4 * (0.127 mm * 92 ^ ((36 - ${n}) / 39))^2)`).toNumber('ohm');
			expect(awgWire(n, 20, 'cca').ohmsPerKm).toBeCloseTo(expected, 6);
		}
	});

	it("warms the CCA core with aluminium's coefficient (IEC 60889: 0.00403 per °C)", () => {
		// by hand: 4 AWG CCA at 20 °C = 0.027410 / 21.15 × 1000 = 1.2960 Ω/km; at 60 °C × (1 + 0.00403 × 40) = 1.5049 Ω/km
		expect(conductorOhmsPerKm(21.1506, 20, 'cca')).toBeCloseTo(1.296, 3);
		expect(conductorOhmsPerKm(21.1506, 60, 'cca')).toBeCloseTo(1.5049, 3);
	});

	it('derates CCA ampacity to √0.629 of copper, rounded down (equal heating per metre, common practice)', () => {
		// by hand: 4 AWG 135 A × 0.7931 = 107.07 → 107 A; 8 AWG 73 × 0.7931 = 57.9 → 57 A; 1/0 245 × 0.7931 = 194.3 → 194 A
		expect(wireAmpacityA(4, 'cca')).toBe(107);
		expect(wireAmpacityA(8, 'cca')).toBe(57);
		expect(wireAmpacityA(0, 'cca')).toBe(194);
		for (const g of Object.keys(CHASSIS_AMPACITY_A).map(Number)) expect(wireAmpacityA(g, 'cca')).toBeLessThan(wireAmpacityA(g, 'copper'));
	});

	it("refuses a fuse the CCA cable cannot carry that copper could", () => {
		// 8 AWG: copper 73 A, CCA 57 A (above); a 48 A draw needs ≥ 60 A of fuse
		expect(mainFuse(48, 8, null, 'copper')).toMatchObject({ ok: true, fuseA: 60 });
		const cca = mainFuse(48, 8, null, 'cca');
		expect(cca.ok).toBe(false);
		if (!cca.ok) expect(cca.reason).toMatch(/8 AWG CCA can carry \(57 A\)/);
	});

	it('asks ABYC E-11 for more area in CCA: K = 10.75 / 0.629 = 17.09', () => {
		// by hand: 10 A over 20 ft at 0.36 V: copper 10.75 × 10 × 20 / 0.36 = 5,972 cmil; CCA 17.09 × 200 / 0.36 = 9,495 cmil
		expect(abycCircularMils(10, 20, 0.36)).toBeCloseTo(5972.2, 1);
		expect(abycCircularMils(10, 20, 0.36, 'cca')).toBeCloseTo(9494.8, 1);
	});

	it('drops more volts over a CCA loop by the conductivity share, for any run', () => {
		fc.assert(
			fc.property(fc.double({ min: 1, max: 200, noNaN: true }), fc.double({ min: 0.1, max: 20, noNaN: true }), fc.constantFrom(...STOCKED_POWER_GAUGES), (a, m, g) => {
				const cu = voltageDrop(a, m, g, 20, 'copper').dropV;
				const cca = voltageDrop(a, m, g, 20, 'cca').dropV;
				expect(cca / cu).toBeCloseTo(1 / 0.629, 9);
			})
		);
	});

	it('sizes a heavier CCA cable for the same run and says so in the basis', () => {
		// by hand, 60 A over 4.8 m + 0.5 m at 12 V, 3 %: copper 31,155 cmil → 4 AWG (37,360);
		// CCA 31,155 / 0.629 = 49,531 cmil → 2 AWG (62,450); fuse 80 A within 2 AWG CCA's 181 × 0.793 = 143 A
		const cu = powerWire({ currentA: 60, powerLengthM: 4.8, groundLengthM: 0.5 });
		const cca = powerWire({ currentA: 60, powerLengthM: 4.8, groundLengthM: 0.5, material: 'cca' });
		expect(cu.ok && [cu.awg, cu.fuseA, cu.material]).toEqual(['4', 80, 'copper']);
		expect(cca.ok && [cca.awg, cca.fuseA, cca.material, cca.ampacityA]).toEqual(['2', 80, 'cca', 143]);
		expect(cca.basis.text).toMatch(/copper-clad aluminium \(CCA\).*62\.9 %.*ASTM B566/);
		expect(cca.basis.text).toMatch(/common practice/);
		expect(cu.basis.text).toMatch(/copper \(OFC\), IEC 60028/);
		expect(materialBasis('copper')).toMatch(/1\/58/);
	});

	it('refuses an unknown material with a readable message', () => {
		expect(() => powerWire({ currentA: 10, powerLengthM: 1, groundLengthM: 0.5, material: 'silver' as 'cca' })).toThrow(/copper or cca/);
	});
});

describe('gauge with its area', () => {
	it.each([
		// ASTM B258 areas (circular mils × 0.0005067 mm²): 4/0 211,600 → 107 mm²; 1/0 105,600 → 53.5; 4 41,740 → 21.2;
		// 8 16,510 → 8.37; 10 10,380 → 5.26; 18 1,624 → 0.823
		[-3, '4/0 AWG (107 mm²)'],
		[0, '1/0 AWG (53.5 mm²)'],
		[4, '4 AWG (21.2 mm²)'],
		[8, '8 AWG (8.37 mm²)'],
		[10, '10 AWG (5.26 mm²)'],
		[18, '18 AWG (0.823 mm²)']
	])('writes %i as %s', (n, text) => {
		expect(gaugeLabel(n)).toBe(text);
	});

	it('keeps three significant figures without exponents', () => {
		expect(formatMm2(0.00501)).toBe('0.00501');
		expect(formatMm2(107.22)).toBe('107');
		expect(formatMm2(13.296)).toBe('13.3');
	});
});
