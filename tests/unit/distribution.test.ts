import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { AMP_REMOTE_INPUT_A, distributionPlan, HEAD_UNIT_REMOTE_A, remoteTurnOn } from '../../src/lib/domain/distribution';
import { CHASSIS_AMPACITY_A } from '../../src/lib/domain/fuse';
import { powerWire } from '../../src/lib/domain/power';

describe('distribution plan', () => {
	it('one amplifier: the main cable runs to it, the same answer as the power-wire rule', () => {
		// by hand, ABYC E-11 at 12 V and 3 %: 4.8 m + 0.5 m = 17.39 ft; 10.75 × 60 × 17.39 / 0.36 = 31,155 cmil → 4 AWG (37,360);
		// fuse ≥ 1.25 × 60 = 75 A → 80 A (common practice; ISO 8820-3 maxi)
		const plan = distributionPlan({ amps: [{ currentA: 60 }], mainLengthM: 4.8, groundLengthsM: [0.5] });
		expect(plan.ok).toBe(true);
		if (!plan.ok) return;
		expect([plan.single, plan.main.awg, plan.main.fuseA, plan.branches]).toEqual([true, '4', 80, []]);
		expect(plan.grounds).toEqual([{ label: 'Amplifier 1', gauge: 4, awg: '4', lengthM: 0.5 }]);
		// Ohm's law: 4 AWG 0.8152 Ω/km (AWG table, from memory) × 5.3 m × 60 A = 0.259 V = 2.16 % of 12 V
		expect(plan.main.dropPct).toBeCloseTo(2.16, 2);
	});

	it('two amplifiers: main, branches and grounds, each fuse within its cable', () => {
		// by hand at 12 V, 3 %: 23.53 A (own 25 A fuse) and 47.35 A (own 60 A); main 2 m, branches 0.5 m, grounds 0.3 m.
		// Longest path 2.8 m; the main's share 2 / 2.8 × 3 % = 2.143 %, 0.2571 V.
		// Main: 10.75 × 70.88 × 6.562 ft / 0.2571 V = 19,446 cmil → 6 AWG (24,538); Ohm: 2 m of 13.30 mm² copper
		// = 0.002593 Ω × 70.88 A = 0.1838 V = 1.532 %. Fuse ≥ max(88.6 A, 25 + 60 A) → 100 A, within 6 AWG's 101 A (handbook).
		// Branches get 3 − 1.532 = 1.468 % (0.1762 V) over 0.8 m = 2.625 ft:
		//  23.53 A: 3,769 cmil → 12 AWG (5,833); fuse ≥ 29.4 A → 30 A, within 12 AWG's 41 A
		//  47.35 A: 7,585 cmil → 10 AWG (9,343); fuse ≥ 60 A, more than 10 AWG's 55 A → 8 AWG (73 A)
		const plan = distributionPlan({
			amps: [
				{ label: 'Mids', currentA: 23.53, fuseA: 25 },
				{ label: 'Sub', currentA: 47.35, fuseA: 60 }
			],
			mainLengthM: 2,
			branchLengthsM: [0.5, 0.5],
			groundLengthsM: [0.3, 0.3]
		});
		expect(plan.ok).toBe(true);
		if (!plan.ok) return;
		expect([plan.single, plan.main.awg, plan.main.fuseA]).toEqual([false, '6', 100]);
		expect(plan.main.dropPct).toBeCloseTo(1.532, 2);
		expect(plan.branches.map((b) => [b.label, b.wire.awg, b.wire.fuseA])).toEqual([
			['Mids', '12', 30],
			['Sub', '8', 60]
		]);
		expect(plan.branches[1].wire.upsized?.reason).toMatch(/10 AWG \(5\.26 mm²\) keeps the drop/);
		expect(plan.grounds.map((g) => g.awg)).toEqual(['12', '8']);
		expect(plan.commonGround.awg).toBe('6');
		for (const b of plan.branches) expect(b.pathDropPct).toBeLessThanOrEqual(3);
		expect(plan.basis).toMatch(/main cable takes 2\.14 % of the allowed drop/);
		expect(plan.assumptions).toEqual([]);
		expect(plan.gaps).toEqual([]);
	});

	it('keeps every path within the drop target and every fuse within its cable, for any set of amplifiers', () => {
		fc.assert(
			fc.property(
				fc.array(fc.record({ currentA: fc.double({ min: 1, max: 60, noNaN: true }), branch: fc.double({ min: 0.1, max: 2, noNaN: true }), ground: fc.double({ min: 0, max: 1, noNaN: true }) }), { minLength: 2, maxLength: 4 }),
				fc.double({ min: 0.5, max: 6, noNaN: true }),
				fc.constantFrom('copper' as const, 'cca' as const),
				(amps, main, material) => {
					const plan = distributionPlan({ amps: amps.map((a) => ({ currentA: a.currentA })), mainLengthM: main, branchLengthsM: amps.map((a) => a.branch), groundLengthsM: amps.map((a) => a.ground), material });
					if (!plan.ok) return;
					for (const b of plan.branches) {
						expect(b.pathDropPct).toBeLessThanOrEqual(3 + 1e-9);
						expect(b.wire.fuseA).toBeLessThanOrEqual(b.wire.ampacityA);
						expect(b.wire.material).toBe(material);
					}
					expect(plan.main.fuseA).toBeLessThanOrEqual(plan.main.ampacityA);
					// the main carries the sum, so its fuse is at least 125 % of it (common practice)
					expect(plan.main.fuseA).toBeGreaterThanOrEqual(1.25 * plan.currentA - 1e-9);
				}
			),
			{ numRuns: 200 }
		);
	});

	it('makes every cable at least as heavy in CCA as in copper', () => {
		const input = { amps: [{ currentA: 30 }, { currentA: 40 }], mainLengthM: 4, branchLengthsM: [0.6, 0.6], groundLengthsM: [0.4, 0.4] };
		const cu = distributionPlan(input);
		const cca = distributionPlan({ ...input, material: 'cca' });
		expect(cu.ok && cca.ok).toBe(true);
		if (!cu.ok || !cca.ok) return;
		expect(cca.main.gauge).toBeLessThanOrEqual(cu.main.gauge);
		cca.branches.forEach((b, i) => expect(b.wire.gauge).toBeLessThanOrEqual(cu.branches[i].wire.gauge));
		expect(cca.basis).toMatch(/copper-clad aluminium \(CCA\) throughout/);
	});

	it('assumes short branches and ground leads when none are given, and says so', () => {
		const plan = distributionPlan({ amps: [{ currentA: 20 }, { currentA: 20 }], mainLengthM: 3 });
		expect(plan.assumptions.join(' ')).toMatch(/Ground leads taken as 0\.5 m/);
		expect(plan.assumptions.join(' ')).toMatch(/Branches from the distribution block taken as 0\.5 m/);
		expect(plan.gaps.join(' ')).toMatch(/No fuse rating given for Amplifier 1, Amplifier 2/);
	});

	it('says which run cannot be made', () => {
		// 300 A is more than 1/0 AWG carries (245 A, handbook chassis table)
		const plan = distributionPlan({ amps: [{ currentA: 150 }, { currentA: 150 }], mainLengthM: 3 });
		expect(plan.ok).toBe(false);
		if (!plan.ok) expect(plan.reason).toMatch(/^Main cable: 300 A is more than the heaviest stocked cable/);
	});

	it('refuses bad input with a message a person understands', () => {
		expect(() => distributionPlan({ amps: [], mainLengthM: 3 })).toThrow(/at least one amplifier/);
		expect(() => distributionPlan({ amps: [{ currentA: 10 }, { currentA: 10 }], mainLengthM: 3, branchLengthsM: [1] })).toThrow(/one length for each of the 2 amplifiers, or none \(1 given\)/);
		expect(() => distributionPlan({ amps: [{ currentA: -1 }], mainLengthM: 3 })).toThrow(/Current must be more than 0 A/);
		expect(() => distributionPlan({ amps: [{ currentA: 10 }], mainLengthM: 0 })).toThrow(/Main cable length must be more than 0 m/);
	});

	it('agrees with the power-wire rule for one amplifier, whatever the run', () => {
		fc.assert(
			fc.property(fc.double({ min: 1, max: 200, noNaN: true }), fc.double({ min: 0.2, max: 10, noNaN: true }), fc.double({ min: 0, max: 2, noNaN: true }), (a, run, ground) => {
				const plan = distributionPlan({ amps: [{ currentA: a }], mainLengthM: run, groundLengthsM: [ground] });
				const wire = powerWire({ currentA: a, powerLengthM: run, groundLengthM: ground });
				expect(plan.ok).toBe(wire.ok);
				if (plan.ok && wire.ok) expect([plan.main.awg, plan.main.fuseA]).toEqual([wire.awg, wire.fuseA]);
			}),
			{ numRuns: 200 }
		);
	});
});

describe('remote turn-on', () => {
	it('sums the inputs and advises a relay past the head unit output', () => {
		// assumed 0.3 A output (common practice: 0.3–0.5 A); 4 × 0.1 A = 0.4 A > 0.3 A → relay
		expect(HEAD_UNIT_REMOTE_A).toBe(0.3);
		expect(AMP_REMOTE_INPUT_A).toBe(0.1);
		const four = remoteTurnOn([null, null, null, null]);
		expect(four).toMatchObject({ totalA: expect.closeTo(0.4, 9), ratingA: 0.3, ratingAssumed: true, relay: true });
		expect(four.advice).toMatch(/relay/);
		expect(four.advice).toMatch(/assumed \(head-unit remote outputs are commonly 0\.3–0\.5 A; common practice\)/);
		// 2 × 0.1 A = 0.2 A ≤ 0.3 A → no relay
		expect(remoteTurnOn([null, null]).relay).toBe(false);
		// typed: 0.25 + 0.3 = 0.55 A against a stated 0.5 A → relay; against 1 A → none
		expect(remoteTurnOn([0.25, 0.3], 0.5)).toMatchObject({ relay: true, ratingAssumed: false });
		expect(remoteTurnOn([0.25, 0.3], 1).relay).toBe(false);
	});

	it('never advises against a relay once the sum passes the rating', () => {
		fc.assert(
			fc.property(fc.array(fc.double({ min: 0.001, max: 1, noNaN: true }), { minLength: 1, maxLength: 8 }), fc.double({ min: 0.05, max: 2, noNaN: true }), (inputs, rating) => {
				const r = remoteTurnOn(inputs, rating);
				const sum = inputs.reduce((s, x) => s + x, 0);
				expect(r.relay).toBe(sum > rating + 1e-9);
			})
		);
	});
});

// The chassis table the plan leans on, for the figures quoted above (Handbook of Electronic Tables and Formulas for AWG).
it('uses the handbook chassis ampacities quoted in the worked cases', () => {
	expect([CHASSIS_AMPACITY_A[6], CHASSIS_AMPACITY_A[8], CHASSIS_AMPACITY_A[10], CHASSIS_AMPACITY_A[12]]).toEqual([101, 73, 55, 41]);
});
