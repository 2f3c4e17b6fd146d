import { CCA_CONDUCTIVITY_SHARE, DEFAULT_MATERIAL, formatAwg, type CableMaterial } from './wire';

// ISO 8820-3 blade fuse ratings (from memory): the regular and mini types run 1 A to 40 A, the
// maxi type on up to 120 A.
export const BLADE_FUSE_RATINGS_A: readonly number[] = [1, 2, 3, 4, 5, 7.5, 10, 15, 20, 25, 30, 35, 40, 50, 60, 70, 80, 100, 120];
// Bolt-down (strip) fuse ratings stocked for main feeds above the blade range (common practice, not from a standard).
export const BOLT_DOWN_FUSE_RATINGS_A: readonly number[] = [125, 150, 175, 200, 225, 250, 300, 350, 400, 500];
export const STANDARD_FUSE_RATINGS_A: readonly number[] = [...BLADE_FUSE_RATINGS_A, ...BOLT_DOWN_FUSE_RATINGS_A];

// A fuse carrying its load continuously is rated about 125 % of that load, so it does not age
// and open in normal use (common practice).
export const FUSE_HEADROOM = 1.25;

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

// Where the main fuse goes. ABYC E-11 (from memory): within 7 in of the battery terminal; up to
// 40 in for a cable from a battery terminal, or 72 in from another source, when the cable is
// sheathed along its whole run. In cars the usual limit quoted is 18 in (common practice).
export const MAIN_FUSE_MAX_DISTANCE_MM = 457;
export const FUSE_DISTANCE_RULE =
	'Fit the main fuse as close to the battery as it will go, and no further than about 45 cm (18 in) along the cable (common practice). ABYC E-11 asks for 7 in (18 cm), or up to 40 in (1 m) from a battery terminal when the cable is sheathed along its whole run.';

export const FUSE_CAUTIONS: readonly string[] = [
	'Disconnect the battery (negative terminal first) before working on power wiring.',
	FUSE_DISTANCE_RULE,
	'The fuse protects the cable, so never fit a larger fuse than the cable can carry.',
	"Follow the vehicle maker's procedures, local codes and licensed practice."
];

// CCA of a gauge carries copper's current times √(its conductivity share), so that it heats no more per
// metre (I²R) than copper does: 0.79 for the ASTM B566 10 % class. No standard rates CCA for car
// power cable; this is common practice, rounded down to a whole amp.
export const CCA_AMPACITY_SHARE = Math.sqrt(CCA_CONDUCTIVITY_SHARE);

export function wireAmpacityA(awg: number, material: CableMaterial = DEFAULT_MATERIAL): number {
	const amps = CHASSIS_AMPACITY_A[awg];
	if (amps === undefined) {
		throw new RangeError(`No ampacity on record for ${formatAwg(awg)} AWG (table covers 4/0 to 22).`);
	}
	return material === 'cca' ? Math.floor(amps * CCA_AMPACITY_SHARE) : amps;
}

/** Where the ampacity figure comes from, for the basis beside an answer. */
export function ampacityBasis(material: CableMaterial): string {
	const table = 'chassis-wiring ampacity, one conductor in free air';
	return material === 'cca' ? `${table}, times ${CCA_AMPACITY_SHARE.toFixed(2)} for CCA so it heats no more than copper (common practice)` : table;
}

export const fuseKind = (ratingA: number): 'blade' | 'bolt-down' => (BLADE_FUSE_RATINGS_A.includes(ratingA) ? 'blade' : 'bolt-down');

/** What the fuse must be rated at least: the headroom over the continuous draw, and the amplifiers' own fuses. */
export function fuseNeededA(drawA: number, ownFuseA: number | null = null): number {
	if (!(drawA > 0) || !Number.isFinite(drawA)) throw new RangeError('Current draw must be a number of amps above 0.');
	if (ownFuseA !== null && !(ownFuseA > 0 && Number.isFinite(ownFuseA))) throw new RangeError("The amplifier's own fuse rating must be a number of amps above 0.");
	return Math.max(drawA * FUSE_HEADROOM, ownFuseA ?? 0);
}

/** Smallest standard rating at or above the need, or null when none reaches it. */
export const standardFuseAtLeast = (neededA: number): number | null => STANDARD_FUSE_RATINGS_A.find((r) => r >= neededA - 1e-9) ?? null;

export type MainFuseResult =
	| { ok: true; fuseA: number; kind: 'blade' | 'bolt-down'; ampacityA: number; neededA: number; basis: string }
	| { ok: false; reason: string; ampacityA: number; neededA: number; fuseA: number | null };

/** The basis in words: what the rating covers and why. */
export function fuseBasis(drawA: number, ownFuseA: number | null, fuseA: number): string {
	const own = ownFuseA ? ` and at least the amplifiers' own ${fmtA(ownFuseA)} of fuses` : '';
	return `${fuseA} A ${fuseKind(fuseA)} fuse: at least ${Math.round(FUSE_HEADROOM * 100)} % of the ${fmtA(drawA)} continuous draw (${fmtA(drawA * FUSE_HEADROOM)}, common practice)${own}, rounded up to a standard rating (ISO 8820-3 blade up to 120 A, then bolt-down).`;
}

/**
 * The fuse for a cable: rated at least the need (headroom and the amplifiers' own fuses), rounded
 * up to a standard rating, and never more than the cable can carry.
 */
export function mainFuse(drawA: number, awg: number, ownFuseA: number | null = null, material: CableMaterial = DEFAULT_MATERIAL): MainFuseResult {
	const neededA = fuseNeededA(drawA, ownFuseA);
	const ampacityA = wireAmpacityA(awg, material);
	const gauge = formatAwg(awg);
	const fuseA = standardFuseAtLeast(neededA);
	if (fuseA === null) {
		return { ok: false, ampacityA, neededA, fuseA, reason: `No standard fuse rating reaches ${fmtA(neededA)}; split the load over separate feeds.` };
	}
	if (fuseA > ampacityA) {
		return {
			ok: false,
			ampacityA,
			neededA,
			fuseA,
			reason: `The fuse needs ${fuseA} A, more than ${gauge} AWG${material === 'cca' ? ' CCA' : ''} can carry (${ampacityA} A); use a heavier cable.`
		};
	}
	return { ok: true, fuseA, kind: fuseKind(fuseA), ampacityA, neededA, basis: fuseBasis(drawA, ownFuseA, fuseA) };
}

const fmtA = (a: number): string => `${Math.round(a * 10) / 10} A`;
