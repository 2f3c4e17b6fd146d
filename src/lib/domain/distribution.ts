import { array, checkFigures, nullable, number, object, optional, orDefault, refine, text } from './figureRules';
import { ABYC_E11_CRITICAL_DROP_PCT, CABLE_MATERIAL, CONDUCTOR_TEMP, electricalBasis, NOMINAL_VOLTS, powerWire, type PowerWireResult } from './power';
import { MATERIAL_NAMES, type CableMaterial } from './wire';

// One power run feeding several amplifiers: a main cable from the battery to a distribution block,
// a fused branch from the block to each amplifier, and each amplifier's ground lead. With one
// amplifier there is no block: the main cable runs to the amplifier.

// A short ground lead to bare chassis metal beside the amplifier (common practice).
export const DEFAULT_GROUND_M = 0.5;
// The block sits beside the amplifiers, so a branch is a short lead (common practice).
export const DEFAULT_BRANCH_M = 0.5;
// Head-unit remote outputs are commonly rated about 0.3–0.5 A (common practice); the low end is
// taken, so a relay is advised before the output is overloaded.
export const HEAD_UNIT_REMOTE_A = 0.3;
// What one amplifier's remote input draws when its maker does not say: most draw far less, a few
// with a relay inside draw about this much (from memory).
export const AMP_REMOTE_INPUT_A = 0.1;
export const MAX_AMPLIFIERS = 8;

export type WireOk = Extract<PowerWireResult, { ok: true }>;

const amps = (label: string, max: number) =>
	number(`${label} must be a number of A.`, [(n) => n > 0, `${label} must be more than 0 A.`], [(n) => n <= max, `${label} over ${max.toLocaleString('en')} A looks like a typo.`]);
const metres = (label: string, min: 'zero' | 'above') =>
	number(
		`${label} must be a number of m.`,
		[(n) => n <= 30, `${label} over 30 m looks like a typo.`],
		min === 'zero' ? [(n) => n >= 0, `${label} cannot be negative.`] : [(n) => n > 0, `${label} must be more than 0 m.`]
	);

export const DISTRIBUTION_INPUT = refine(
	object({
		amps: array(
			object({
				label: optional(text(80, 'Keep an amplifier name under 80 characters.')),
				currentA: amps('Current', 1000),
				fuseA: optional(nullable(amps("The amplifier's own fuse rating", 1000))),
				remoteA: optional(nullable(amps('Remote input current', 5)))
			}),
			'List the amplifiers, each with its current.',
			[(n) => n >= 1, 'List at least one amplifier.'],
			[(n) => n <= MAX_AMPLIFIERS, `At most ${MAX_AMPLIFIERS} amplifiers on one run.`]
		),
		mainLengthM: metres('Main cable length', 'above'),
		branchLengthsM: orDefault(array(metres('Branch length', 'above'), undefined), []),
		groundLengthsM: orDefault(array(metres('Ground lead length', 'zero'), undefined), []),
		material: CABLE_MATERIAL,
		volts: orDefault(
			number('Supply voltage must be a number of V.', [(n) => n > 0, 'Supply voltage must be more than 0 V.'], [(n) => n <= 60, 'Supply voltage over 60 V looks like a typo.']),
			NOMINAL_VOLTS
		),
		maxDropPct: orDefault(
			number('Allowed drop must be a number of %.', [(n) => n > 0, 'Allowed drop must be more than 0 %.'], [(n) => n <= 100, 'Allowed drop cannot be more than 100 %.']),
			ABYC_E11_CRITICAL_DROP_PCT
		),
		tempC: CONDUCTOR_TEMP,
		headUnitRemoteA: orDefault(nullable(amps("The head unit's remote output rating", 5)), null)
	}),
	(v, refuse) => {
		for (const key of ['branchLengthsM', 'groundLengthsM'] as const) {
			const n = v[key].length;
			if (n !== 0 && n !== v.amps.length) refuse([key], `Give one length for each of the ${v.amps.length} amplifiers, or none (${n} given).`);
		}
	}
);
export interface DistributionInput {
	amps: { label?: string; currentA: number; fuseA?: number | null; remoteA?: number | null }[];
	mainLengthM: number;
	branchLengthsM?: number[];
	groundLengthsM?: number[];
	material?: CableMaterial;
	volts?: number;
	maxDropPct?: number;
	tempC?: number;
	headUnitRemoteA?: number | null;
}

export interface RemoteTurnOn {
	totalA: number;
	ratingA: number;
	/** The rating was assumed, not typed. */
	ratingAssumed: boolean;
	relay: boolean;
	advice: string;
}

export interface BranchRun {
	label: string;
	currentA: number;
	lengthM: number;
	groundLengthM: number;
	wire: WireOk;
	/** Drop from the battery to this amplifier and back: main plus branch and ground. */
	pathDropPct: number;
}

export type DistributionPlan =
	| {
			ok: true;
			material: CableMaterial;
			currentA: number;
			/** True when one amplifier takes the main cable itself, with no block. */
			single: boolean;
			main: WireOk & { lengthM: number; groundLengthM: number };
			branches: BranchRun[];
			/** Ground lead per amplifier, the gauge of its own feed. */
			grounds: { label: string; gauge: number; awg: string; lengthM: number }[];
			/** One shared ground for all the amplifiers instead: the main cable's gauge. */
			commonGround: { gauge: number; awg: string };
			remote: RemoteTurnOn;
			basis: string;
			assumptions: string[];
			gaps: string[];
	  }
	| { ok: false; reason: string; assumptions: string[]; gaps: string[] };

/** Remote turn-on current summed against the head unit's output, with a relay past its rating. */
export function remoteTurnOn(inputsA: readonly (number | null | undefined)[], ratingA: number | null = null): RemoteTurnOn {
	const totalA = inputsA.reduce<number>((sum, a) => sum + (a ?? AMP_REMOTE_INPUT_A), 0);
	const rating = ratingA ?? HEAD_UNIT_REMOTE_A;
	const relay = totalA > rating + 1e-9;
	const assumedDraw = inputsA.some((a) => a == null) ? ` (${AMP_REMOTE_INPUT_A} A taken for each amplifier whose draw is not given, from memory)` : '';
	const ratingText = ratingA === null ? `${rating} A, assumed (head-unit remote outputs are commonly 0.3–0.5 A; common practice)` : `${rating} A`;
	const advice = relay
		? `The amplifiers' remote inputs draw about ${round2(totalA)} A${assumedDraw}, more than the head unit's remote output (${ratingText}): switch them through a relay, its coil on the head unit's remote lead.`
		: `The amplifiers' remote inputs draw about ${round2(totalA)} A${assumedDraw}, within the head unit's remote output (${ratingText}).`;
	return { totalA, ratingA: rating, ratingAssumed: ratingA === null, relay, advice };
}

/**
 * The main cable and fuse, a branch cable and fuse per amplifier, ground leads and the remote
 * turn-on. The allowed drop is shared along the longest path: the main cable gets its share by
 * length, and each branch with its ground lead the rest of the budget after the main's actual drop.
 * Every cable and fuse comes from the one power-wire rule, so each fuse is within its cable's ampacity.
 */
export function distributionPlan(input: DistributionInput): DistributionPlan {
	const v = checkFigures(DISTRIBUTION_INPUT, input);
	const assumptions: string[] = [];
	const gaps: string[] = [];
	const n = v.amps.length;
	const labels = v.amps.map((a, i) => a.label || `Amplifier ${i + 1}`);
	const grounds = v.groundLengthsM.length ? v.groundLengthsM : v.amps.map(() => DEFAULT_GROUND_M);
	if (!v.groundLengthsM.length) assumptions.push(`Ground lead${n > 1 ? 's' : ''} taken as ${DEFAULT_GROUND_M} m, a short lead to bare chassis metal beside the amplifier (common practice); measure and type ${n > 1 ? 'them' : 'it'} if longer.`);
	const currentA = v.amps.reduce((sum, a) => sum + a.currentA, 0);
	const rated = v.amps.filter((a) => a.fuseA != null);
	const ownFuseA = rated.length ? rated.reduce((sum, a) => sum + (a.fuseA ?? 0), 0) : null;
	const unrated = labels.filter((_, i) => v.amps[i].fuseA == null);
	if (unrated.length) gaps.push(`No fuse rating given for ${unrated.join(', ')}: check the fuse on the amplifier, and never fit a main fuse smaller than it.`);
	const common = { volts: v.volts, tempC: v.tempC, material: v.material };
	const remote = remoteTurnOn(
		v.amps.map((a) => a.remoteA),
		v.headUnitRemoteA
	);
	const basis = `${electricalBasis(v.volts, { maxDropPct: v.maxDropPct, tempC: v.tempC, material: v.material })}; ${MATERIAL_NAMES[v.material]} throughout`;

	if (n === 1) {
		const lengthM = v.mainLengthM + (v.branchLengthsM[0] ?? 0);
		const wire = powerWire({ ...common, currentA, powerLengthM: lengthM, groundLengthM: grounds[0], maxDropPct: v.maxDropPct, ownFuseA });
		if (!wire.ok) return { ok: false, reason: wire.reason, assumptions, gaps };
		const ground = { label: labels[0], gauge: wire.gauge, awg: wire.awg, lengthM: grounds[0] };
		return { ok: true, material: v.material, currentA, single: true, main: { ...wire, lengthM, groundLengthM: grounds[0] }, branches: [], grounds: [ground], commonGround: { gauge: wire.gauge, awg: wire.awg }, remote, basis, assumptions, gaps };
	}

	const branchLengths = v.branchLengthsM.length ? v.branchLengthsM : v.amps.map(() => DEFAULT_BRANCH_M);
	if (!v.branchLengthsM.length) assumptions.push(`Branches from the distribution block taken as ${DEFAULT_BRANCH_M} m each, the block beside the amplifiers (common practice); type them if longer.`);
	const longestPath = Math.max(...branchLengths.map((b, i) => v.mainLengthM + b + grounds[i]));
	const mainBudget = (v.maxDropPct * v.mainLengthM) / longestPath;
	// The amplifiers ground to the body beside them, so the main cable's current comes back through the body.
	const main = powerWire({ ...common, currentA, powerLengthM: v.mainLengthM, groundLengthM: 0, maxDropPct: mainBudget, ownFuseA });
	if (!main.ok) return { ok: false, reason: `Main cable: ${main.reason}`, assumptions, gaps };
	const branchBudget = v.maxDropPct - main.dropPct;
	const branches: BranchRun[] = [];
	for (const [i, amp] of v.amps.entries()) {
		const wire = powerWire({ ...common, currentA: amp.currentA, powerLengthM: branchLengths[i], groundLengthM: grounds[i], maxDropPct: branchBudget, ownFuseA: amp.fuseA ?? null });
		if (!wire.ok) return { ok: false, reason: `Branch to ${labels[i]}: ${wire.reason}`, assumptions, gaps };
		branches.push({ label: labels[i], currentA: amp.currentA, lengthM: branchLengths[i], groundLengthM: grounds[i], wire, pathDropPct: main.dropPct + wire.dropPct });
	}
	return {
		ok: true,
		material: v.material,
		currentA,
		single: false,
		main: { ...main, lengthM: v.mainLengthM, groundLengthM: 0 },
		branches,
		grounds: branches.map((b) => ({ label: b.label, gauge: b.wire.gauge, awg: b.wire.awg, lengthM: b.groundLengthM })),
		commonGround: { gauge: main.gauge, awg: main.awg },
		remote,
		basis: `${basis}; the main cable takes ${round2(mainBudget)} % of the allowed drop (its share of the longest path by length), each branch and its ground lead the rest`,
		assumptions,
		gaps
	};
}

const round2 = (x: number): number => Math.round(x * 100) / 100;
