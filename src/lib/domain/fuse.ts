import { formatAwg } from './wire';

// Blade fuse ratings of ISO 8820-3 (list from memory).
export const BLADE_FUSE_RATINGS_A: readonly number[] = [1, 2, 3, 4, 5, 7.5, 10, 15, 20, 25, 30, 35, 40];
// Bolt-down fuse ratings commonly stocked for main power feeds (common practice, not from a standard).
export const BOLT_DOWN_FUSE_RATINGS_A: readonly number[] = [
	50, 60, 70, 80, 100, 125, 150, 175, 200, 225, 250, 300
];
export const STANDARD_FUSE_RATINGS_A: readonly number[] = [
	...BLADE_FUSE_RATINGS_A,
	...BOLT_DOWN_FUSE_RATINGS_A
];

// "Maximum amps for chassis wiring" from the Handbook of Electronic Tables and Formulas for
// American Wire Gauge: one conductor in free air. Entries for 1 AWG and larger are from memory.
// Wire bundled in a loom or in a hot engine bay carries less.
export const CHASSIS_AMPACITY_A: Readonly<Record<number, number>> = {
	[-3]: 380,
	[-2]: 328,
	[-1]: 283,
	0: 245,
	1: 211,
	2: 181,
	3: 158,
	4: 135,
	5: 118,
	6: 101,
	7: 89,
	8: 73,
	9: 64,
	10: 55,
	11: 47,
	12: 41,
	13: 35,
	14: 32,
	15: 28,
	16: 22,
	17: 19,
	18: 16,
	19: 14,
	20: 11,
	21: 9,
	22: 7
};

// Common practice: the main fuse sits within about 45 cm (18 in) of the battery terminal.
export const MAIN_FUSE_MAX_DISTANCE_MM = 450;

export const FUSE_CAUTIONS: readonly string[] = [
	'Disconnect the battery before working on power wiring.',
	'Fuse the power cable close to the battery: common practice is within about 45 cm (18 in) of the terminal.',
	'The fuse protects the cable, so never fit a larger fuse than the cable can carry.',
	"Follow the vehicle maker's procedures, local codes and licensed practice."
];

export function wireAmpacityA(awg: number): number {
	const amps = CHASSIS_AMPACITY_A[awg];
	if (amps === undefined) {
		throw new RangeError(`No ampacity on record for ${formatAwg(awg)} AWG (table covers 4/0 to 22).`);
	}
	return amps;
}

export type MainFuseResult =
	| { ok: true; fuseA: number; kind: 'blade' | 'bolt-down'; ampacityA: number }
	| { ok: false; reason: string; ampacityA: number };

/** Smallest standard rating that covers the draw without exceeding what the wire can carry. */
export function mainFuse(drawA: number, awg: number): MainFuseResult {
	if (!(drawA > 0) || !Number.isFinite(drawA)) {
		throw new RangeError('Current draw must be a number of amps above 0.');
	}
	const ampacityA = wireAmpacityA(awg);
	const gauge = formatAwg(awg);
	if (drawA > ampacityA) {
		return {
			ok: false,
			ampacityA,
			reason: `${fmtA(drawA)} is more than ${gauge} AWG can carry (${ampacityA} A); use a heavier cable.`
		};
	}
	const fuseA = STANDARD_FUSE_RATINGS_A.find((r) => r >= drawA);
	if (fuseA === undefined || fuseA > ampacityA) {
		return {
			ok: false,
			ampacityA,
			reason:
				fuseA === undefined
					? `No standard fuse rating reaches ${fmtA(drawA)}.`
					: `The next standard fuse above ${fmtA(drawA)} is ${fuseA} A, more than ${gauge} AWG can carry (${ampacityA} A); use a heavier cable.`
		};
	}
	return { ok: true, fuseA, kind: BLADE_FUSE_RATINGS_A.includes(fuseA) ? 'blade' : 'bolt-down', ampacityA };
}

const fmtA = (a: number): string => `${Math.round(a * 10) / 10} A`;
