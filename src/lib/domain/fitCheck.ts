import {
	DEFAULT_CLEARANCE_MM,
	DEFAULT_PLUG_ALLOWANCE_MM,
	DIN_APERTURE_MM,
	DIN_UNIT_FACE_MM,
	ONE_AND_HALF_DIN_FACE_MM,
	type HeadUnitFitOptions,
	DEFAULT_TIGHT_MM,
	fitVerdict,
	headUnitFit,
	speakerFit,
	type Axis,
	type Box,
	type DepthFit,
	type FitResult,
	type FitVerdict,
	type Space,
	type SpeakerFitResult
} from './fit';
import { formatLength, type UnitSystem } from './units';
import type { DashSection, SeatSpace, SpeakerLocation } from './content/schema';
import { SEAT_NAMES } from './content/vocabulary';
import type { HeadUnit, Speaker } from './part';

// A part against the places a vehicle page records: every seat space, the dash, every speaker
// location. Shared by the fit service, the API and the counter screen (which runs it live).

export const VERDICT_WORDS: Readonly<Record<FitVerdict, string>> = {
	fits: 'Fits',
	tight: 'Tight',
	'no-fit': 'Does not fit',
	'not-measured': 'Not measured'
};
export const VERDICT_SYMBOLS: Readonly<Record<FitVerdict, string>> = { fits: '✓', tight: '!', 'no-fit': '✕', 'not-measured': '?' };

// An unmeasured place may still take the part; one that certainly does not ranks last.
const RANK: Readonly<Record<FitVerdict, number>> = { fits: 3, tight: 2, 'not-measured': 1, 'no-fit': 0 };

export const AXIS_NAMES: Readonly<Record<Axis, string>> = { l: 'length', w: 'width', h: 'height' };
const TOO: Readonly<Record<Axis, string>> = { l: 'too long', w: 'too wide', h: 'too tall' };

export interface SpaceFit {
	spaceId: string;
	seat: SeatSpace['seat'];
	space: Space;
	result: FitResult;
}

export interface SeatFitOptions {
	clearanceMm?: number;
	tightMm?: number;
}

export const spaceOf = (s: Pick<SeatSpace, 'lengthMm' | 'widthMm' | 'heightMm'>): Space => ({ l: s.lengthMm, w: s.widthMm, h: s.heightMm });

/** The box against every seat space the page records, in page order. */
export function seatSpaceFits(spaces: readonly SeatSpace[], box: Box, opts: SeatFitOptions = {}): SpaceFit[] {
	return spaces.map((s) => ({ spaceId: s.id, seat: s.seat, space: spaceOf(s), result: fitVerdict(box, spaceOf(s), opts) }));
}

// The smallest measured margin; a side nobody measured does not count.
const least = (margins: Record<string, number | null> | null): number => {
	const known = margins ? Object.values(margins).filter((m): m is number => m !== null) : [];
	return known.length ? Math.min(...known) : -Infinity;
};
const leastMargin = (r: FitResult): number => least(r.margins);

/** The seat with the best verdict, and on a tie the most room to spare. */
export function bestSpace(fits: readonly SpaceFit[]): SpaceFit | null {
	let best: SpaceFit | null = null;
	for (const f of fits) {
		if (
			!best ||
			RANK[f.result.verdict] > RANK[best.result.verdict] ||
			(RANK[f.result.verdict] === RANK[best.result.verdict] && leastMargin(f.result) > leastMargin(best.result))
		) {
			best = f;
		}
	}
	return best;
}

/** The space a person asked for, by entry id or seat name ("passenger"); otherwise the best one. */
export function pickSpace(fits: readonly SpaceFit[], wanted?: string | null): SpaceFit | null {
	if (wanted) {
		const hit = fits.find((f) => f.spaceId === wanted) ?? fits.find((f) => f.seat === wanted);
		if (hit) return hit;
	}
	return bestSpace(fits);
}

const seatPhrase = (seat: SeatSpace['seat']) => `under the ${SEAT_NAMES[seat].toLowerCase()} seat`;

/** The answer in words a customer can be told. */
export function seatFitReason(fit: SpaceFit, units: UnitSystem = 'metric', clearanceMm = DEFAULT_CLEARANCE_MM): string {
	const r = fit.result;
	const where = seatPhrase(fit.seat);
	const len = (mm: number) => formatLength(mm, units);
	if (r.verdict === 'not-measured') {
		const missing = (['l', 'w', 'h'] as const).filter((a) => fit.space[a] === null).map((a) => AXIS_NAMES[a]);
		return `The space ${where} is not measured yet (${missing.join(', ')} missing), so nobody can say.`;
	}
	const turned = r.rotated ? ' Turned a quarter on the floor, so its width runs along the seat.' : '';
	// The limiting side is always a measured one.
	const m = r.margins[r.limiting] as number;
	const allowance = clearanceMm > 0 ? ` after ${len(clearanceMm)} for cables and air` : '';
	const unmeasured = 'partial' in r ? ' The other sides are not measured yet.' : '';
	if (r.verdict === 'no-fit') return `Does not fit ${where}: ${len(-m)} ${TOO[r.limiting]}${allowance}.${turned}${unmeasured}`;
	if (r.verdict === 'tight') return `Goes in ${where}, but only ${len(m)} to spare in ${AXIS_NAMES[r.limiting]}${allowance}: check on the car.${turned}`;
	return `Fits ${where} with ${len(m)} to spare in ${AXIS_NAMES[r.limiting]}, the closest side${allowance}.${turned}`;
}

export interface LocationFit {
	locationId: string;
	location: string;
	result: SpeakerFitResult;
}

/** A speaker against every recorded speaker location. */
export function speakerLocationFits(locations: readonly Pick<SpeakerLocation, 'id' | 'location' | 'cutoutMm' | 'depthMm'>[], speaker: Pick<Speaker, 'cutoutMm' | 'mountingDepthMm'>, opts: { tightMm?: number } = {}): LocationFit[] {
	return locations.map((loc) => ({
		locationId: loc.id,
		location: loc.location || 'Unnamed location',
		result: speakerFit(speaker, { cutoutMm: loc.cutoutMm, depthMm: loc.depthMm }, opts)
	}));
}

export function pickLocation(fits: readonly LocationFit[], wanted?: string | null): LocationFit | null {
	if (wanted) {
		const hit = fits.find((f) => f.locationId === wanted);
		if (hit) return hit;
	}
	let best: LocationFit | null = null;
	for (const f of fits) {
		if (!best || RANK[f.result.verdict] > RANK[best.result.verdict] || (RANK[f.result.verdict] === RANK[best.result.verdict] && least(f.result.margins) > least(best.result.margins))) best = f;
	}
	return best;
}

export function speakerFitReason(fit: LocationFit, units: UnitSystem = 'metric'): string {
	const r = fit.result;
	const len = (mm: number) => formatLength(mm, units);
	const place = `the ${fit.location.toLowerCase()} location`;
	if (r.verdict === 'not-measured' || !r.margins || !r.limiting) return `The cut-out or depth of ${place} is not measured yet, so nobody can say.`;
	const adapter = r.needsAdapter ? ' The hole is much larger than the speaker needs: use an adapter ring.' : '';
	const what = r.limiting === 'depth' ? 'mounting depth' : 'cut-out';
	const m = r.margins[r.limiting] as number;
	if (r.verdict === 'no-fit') {
		return r.limiting === 'depth'
			? `Does not fit ${place}: ${len(-m)} too deep for the space behind it.${adapter}`
			: `Does not fit ${place}: the speaker needs a hole ${len(-m)} larger than it takes.${adapter}`;
	}
	if (r.verdict === 'tight') return `Goes into ${place}, with only ${len(m)} to spare on the ${what}: check on the car.${adapter}`;
	return `Fits ${place} with ${len(m)} to spare on the ${what}, the closest figure.${adapter}`;
}

/** A head unit against the dash opening and depth. A seat clearance passed along does not apply: depth has its own plug allowance. */
export type DashPlace = Pick<DashSection, 'opening' | 'depthMm'> & Partial<Pick<DashSection, 'openingWidthMm' | 'openingHeightMm'>>;

/** The opening's measured size, when both sides are recorded. */
export const recordedOpening = (dash: DashPlace): { w: number; h: number } | null =>
	dash.openingWidthMm && dash.openingHeightMm ? { w: dash.openingWidthMm, h: dash.openingHeightMm } : null;

/**
 * The opening a drawing shows when none was measured: the ISO 7736 aperture for single and double
 * DIN, a 1.5-DIN face plus the same 3 mm the aperture allows, and a size a little over double DIN
 * for an oversize opening (it has no standard size). Null where there is no DIN-like opening.
 */
export function nominalOpening(opening: NonNullable<DashSection['opening']>): { w: number; h: number } | null {
	if (opening === 'single-din') return DIN_APERTURE_MM[1];
	if (opening === 'double-din') return DIN_APERTURE_MM[2];
	if (opening === '1.5-din') return { w: DIN_APERTURE_MM[1].w, h: ONE_AND_HALF_DIN_FACE_MM.h + (DIN_APERTURE_MM[1].h - DIN_UNIT_FACE_MM[1].h) };
	if (opening === 'oversize') return { w: 200, h: 120 };
	return null;
}

export function dashFit(unit: Pick<HeadUnit, 'dinSize' | 'chassisDepthMm'>, dash: DashPlace, opts: HeadUnitFitOptions & { clearanceMm?: number } = {}): DepthFit {
	if (dash.opening === null) {
		return { verdict: 'not-measured', depthMarginMm: null, needsKit: false, plugAllowanceMm: opts.plugAllowanceMm ?? DEFAULT_PLUG_ALLOWANCE_MM, reason: 'The dash opening is not recorded yet, so nobody can say.' };
	}
	return headUnitFit(unit, { opening: dash.opening, depthMm: dash.depthMm, openingMm: recordedOpening(dash) }, { plugAllowanceMm: opts.plugAllowanceMm, tightMm: opts.tightMm });
}

export { DEFAULT_CLEARANCE_MM, DEFAULT_TIGHT_MM };
