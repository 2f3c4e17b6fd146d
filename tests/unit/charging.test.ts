import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { chargingBudget, readBatteryVoltage } from '../../src/lib/domain/charging';
import { chargingInputSchema } from '../../src/lib/domain/calcSchemas';

// Invented vehicle figures (sample data).
describe('charging budget', () => {
	it('keeps up with room to spare', () => {
		// Hand-worked: 110 − (25 + 10) = 75 A at cruise; 70 − 35 = 35 A at idle.
		const b = chargingBudget({ alternatorA: 110, alternatorIdleA: 70, vehicleLoadA: 25, addedLoadA: 10 });
		expect(b).toMatchObject({ verdict: 'keeps-up', totalA: 35, headroomA: 75, idleHeadroomA: 35, upgrade: [] });
		expect(b.words).toBe('Keeps up: 75 A spare at cruise and 35 A at idle.');
	});

	it('short at idle only', () => {
		// Hand-worked: 110 − 65 = 45 A at cruise, 60 − 65 = −5 A at idle.
		const b = chargingBudget({ alternatorA: 110, alternatorIdleA: 60, vehicleLoadA: 25, addedLoadA: 40 });
		expect(b).toMatchObject({ verdict: 'short-at-idle', headroomA: 45, idleHeadroomA: -5 });
		expect(b.words).toMatch(/falls 5 A short at idle/);
	});

	it('short at cruise', () => {
		const b = chargingBudget({ alternatorA: 90, vehicleLoadA: 30, addedLoadA: 75 });
		expect(b).toMatchObject({ verdict: 'short', headroomA: -15, idleHeadroomA: null });
		expect(b.words).toMatch(/falls 15 A short even at cruise/);
	});

	it('tight under a tenth spare (common practice)', () => {
		// 100 − 92 = 8 A, under 10 % of 100 A.
		expect(chargingBudget({ alternatorA: 100, vehicleLoadA: 30, addedLoadA: 62 }).verdict).toBe('tight');
		expect(chargingBudget({ alternatorA: 100, vehicleLoadA: 30, addedLoadA: 60 }).verdict).toBe('keeps-up');
		// Idle: 65 − 65 = 0 A spare, under 10 % of 65 A, though cruise has 45 A.
		const idle = chargingBudget({ alternatorA: 110, alternatorIdleA: 65, vehicleLoadA: 25, addedLoadA: 40 });
		expect(idle).toMatchObject({ verdict: 'tight', headroomA: 45, idleHeadroomA: 0 });
		expect(idle.words).toMatch(/but only 0 A at idle/);
	});

	it('advises heavier charging cables from a fifth of the output, sized on the wire rules', () => {
		// 110 A: ABYC E-11, CM = 10.75 × 110 × 4.92 ft ÷ 0.36 V ≈ 16,160 over 1.5 m, met by 6 AWG; but the
		// Handbook of Electronic Tables chassis-wiring cells give 6 AWG 101 A and 4 AWG 135 A, so 4 AWG carries 110 A.
		const b = chargingBudget({ alternatorA: 110, vehicleLoadA: 25, addedLoadA: 22 });
		expect(b.upgrade.map((u) => [u.run, u.awg])).toEqual([
			['alternator-battery', '4'],
			['battery-body', '4'],
			['engine-body', '4']
		]);
		// Just under a fifth: no upgrade.
		expect(chargingBudget({ alternatorA: 110, vehicleLoadA: 25, addedLoadA: 21.9 }).upgrade).toEqual([]);
	});

	it('a 150 A alternator needs 2 AWG (chassis-wiring cell 181 A; 4 AWG 135 A is short)', () => {
		// Handbook of Electronic Tables and Formulas, chassis wiring: 2 AWG 181 A, 4 AWG 135 A.
		const b = chargingBudget({ alternatorA: 150, vehicleLoadA: 30, addedLoadA: 60 });
		expect(b.upgrade.every((u) => u.awg === '2')).toBe(true);
		expect(b.upgrade.every((u) => u.dropPct! < 3)).toBe(true);
	});

	it('sizes CCA charging cables heavier than copper and says so in the basis', () => {
		// Handbook of Electronic Tables and Formulas, chassis wiring: 4 AWG 135 A, 2 AWG 181 A. CCA carries
		// copper's current × √0.629 (ASTM B566 10 % class conductivity share; the square root is common practice):
		// 4 AWG 135 × 0.793 = 107 A < 110 A, 2 AWG 181 × 0.793 = 143 A ≥ 110 A — hand-worked.
		const b = chargingBudget({ alternatorA: 110, vehicleLoadA: 25, addedLoadA: 22, material: 'cca' });
		expect(b.upgrade.map((u) => [u.awg, u.material])).toEqual([
			['2', 'cca'],
			['2', 'cca'],
			['2', 'cca']
		]);
		expect(b.basis).toMatch(/copper-clad aluminium/);
		expect(chargingBudget({ alternatorA: 110, vehicleLoadA: 25, addedLoadA: 22 }).basis).toMatch(/copper \(OFC\)/);
	});

	it('says when no stocked cable carries the output', () => {
		// Chassis wiring 0 AWG carries 245 A, the heaviest stocked gauge.
		const b = chargingBudget({ alternatorA: 300, vehicleLoadA: 30, addedLoadA: 200 });
		expect(b.upgrade[0]).toMatchObject({ awg: null });
		expect(b.upgrade[0].reason).toMatch(/two cables side by side/);
	});

	it('prints the basis, resting and running voltage', () => {
		expect(chargingBudget({ alternatorA: 110, vehicleLoadA: 20, addedLoadA: 10 }).basis).toMatch(/12.6 V fully charged.*13.8–14.4 V \(common practice\)/);
	});

	it.each([
		[{ alternatorA: 0, vehicleLoadA: 1, addedLoadA: 1 }, "The alternator's output at cruise must be more than 0 A."],
		[{ alternatorA: 100, alternatorIdleA: 120, vehicleLoadA: 1, addedLoadA: 1 }, "The alternator's output at idle cannot be more than at cruise."],
		[{ alternatorA: 100, vehicleLoadA: -1, addedLoadA: 1 }, "The vehicle's own load cannot be negative."],
		[{ alternatorA: 100, vehicleLoadA: 10 }, 'The added load must be a number of amps.']
	])('refuses %j', (input, message) => {
		expect(chargingInputSchema.safeParse(input).error?.issues[0].message).toBe(message);
	});

	it('property: headroom plus draw is the alternator output; more load never improves the verdict', () => {
		const rank = { 'keeps-up': 0, tight: 1, 'short-at-idle': 2, short: 3 } as const;
		fc.assert(
			fc.property(
				fc.integer({ min: 40, max: 250 }),
				fc.integer({ min: 0, max: 100 }),
				fc.integer({ min: 0, max: 300 }),
				fc.integer({ min: 0, max: 100 }),
				(alt, idlePct, load, more) => {
					const idle = Math.round((alt * idlePct) / 100);
					const a = chargingBudget({ alternatorA: alt, alternatorIdleA: idle, vehicleLoadA: 20, addedLoadA: load });
					const b = chargingBudget({ alternatorA: alt, alternatorIdleA: idle, vehicleLoadA: 20, addedLoadA: load + more });
					expect(a.headroomA + a.totalA).toBeCloseTo(alt, 9);
					expect(rank[b.verdict]).toBeGreaterThanOrEqual(rank[a.verdict]);
				}
			)
		);
	});
});

describe('battery voltage', () => {
	// 12.6 V resting fully charged, 13.8–14.4 V running (common practice).
	it.each([
		[12.7, false, 'good'],
		[12.2, false, 'low'],
		[14.1, false, 'high'],
		[14.1, true, 'good'],
		[13.2, true, 'low'],
		[15.2, true, 'high']
	] as const)('%s V (running %s) reads %s', (v, running, state) => {
		expect(readBatteryVoltage(v, running).state).toBe(state);
	});
});
