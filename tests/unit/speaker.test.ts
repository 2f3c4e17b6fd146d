import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { evaluate } from 'mathjs';
import {
	parallelImpedance,
	seriesImpedance,
	seriesParallelImpedance,
	speakerCablePlan
} from '../../src/lib/domain/speaker';

describe('speakerCablePlan', () => {
	it.each([
		// speakers, remote, cores → conductors, cables, spare (counted by hand, pairs kept together)
		[4, false, 4, 8, 2, 0],
		[4, true, 4, 9, 3, 3],
		[3, true, 4, 7, 2, 1],
		[2, true, 5, 5, 1, 0],
		[4, false, 2, 8, 4, 0],
		[1, true, 2, 3, 2, 1],
		[3, false, 3, 6, 3, 3],
		[6, true, 8, 13, 2, 3],
		[0, true, 4, 1, 1, 3],
		[0, false, 4, 0, 0, 0]
	])('%s speakers, remote %s, %s-core cable → %s conductors in %s cables, %s spare', (speakers, includeRemote, coresPerCable, conductors, cables, spareCores) => {
		expect(speakerCablePlan({ speakers, includeRemote, coresPerCable })).toMatchObject({
			conductors,
			cables,
			spareCores
		});
	});

	it('keeps each pair in one cable with the fewest cables', () => {
		fc.assert(
			fc.property(fc.integer({ min: 0, max: 12 }), fc.boolean(), fc.integer({ min: 2, max: 12 }), (speakers, remote, cores) => {
				const plan = speakerCablePlan({ speakers, includeRemote: remote, coresPerCable: cores });
				// two conductors a speaker, one for remote (common practice)
				expect(plan.conductors).toBe(2 * speakers + (remote ? 1 : 0));
				// brute force: fewest cables that hold every pair whole plus the remote core
				const fits = (n: number) => n * Math.floor(cores / 2) >= speakers && n * cores >= plan.conductors;
				let fewest = 0;
				while (!fits(fewest)) fewest++;
				expect(plan.cables).toBe(fewest);
				expect(plan.spareCores).toBe(plan.cables * cores - plan.conductors);
			})
		);
	});

	it('refuses counts a person could not mean', () => {
		expect(() => speakerCablePlan({ speakers: -1, includeRemote: false, coresPerCable: 4 })).toThrow(/Speaker count must be a whole number of at least 0/);
		expect(() => speakerCablePlan({ speakers: 2.5, includeRemote: false, coresPerCable: 4 })).toThrow(/Speaker count/);
		expect(() => speakerCablePlan({ speakers: 2, includeRemote: false, coresPerCable: 1 })).toThrow(/Cores per cable must be a whole number of at least 2/);
	});
});

describe('impedance', () => {
	it('adds in series and combines reciprocally in parallel', () => {
		// series sum and 1/Z = Σ 1/Zᵢ, evaluated by mathjs
		expect(seriesImpedance([4, 4])).toBe(8);
		expect(seriesImpedance([2, 4, 8])).toBe(14);
		expect(parallelImpedance([4, 4])).toBeCloseTo(2, 12);
		expect(parallelImpedance([4, 8])).toBeCloseTo(evaluate('1 / (1/4 + 1/8)'), 12);
		expect(parallelImpedance([2, 4, 8])).toBeCloseTo(evaluate('1 / (1/2 + 1/4 + 1/8)'), 12);
		expect(parallelImpedance([4, 4, 4, 4])).toBeCloseTo(1, 12);
	});

	it.each([
		// Z × n / m for identical speakers (series-parallel bank), by hand
		[4, 2, 2, 4],
		[2, 1, 4, 0.5],
		[8, 4, 1, 32],
		[4, 3, 2, 6]
	])('%s Ω: %s in series × %s parallel = %s Ω', (z, n, m, total) => {
		expect(seriesParallelImpedance(z, n, m)).toBeCloseTo(total, 12);
	});

	it('a bank equals parallel strings of series speakers', () => {
		fc.assert(
			fc.property(fc.constantFrom(1, 2, 4, 8, 16), fc.integer({ min: 1, max: 6 }), fc.integer({ min: 1, max: 6 }), (z, n, m) => {
				const string = seriesImpedance(Array(n).fill(z));
				expect(seriesParallelImpedance(z, n, m)).toBeCloseTo(parallelImpedance(Array(m).fill(string)), 9);
			})
		);
	});

	it('refuses an empty list or a non-positive impedance', () => {
		expect(() => seriesImpedance([])).toThrow(/at least one/);
		expect(() => parallelImpedance([4, 0])).toThrow(/more than 0 Ω/);
		expect(() => seriesParallelImpedance(4, 0, 2)).toThrow(/Speakers in series/);
		expect(() => seriesParallelImpedance(4, 2, 1.5)).toThrow(/Parallel strings/);
	});
});
