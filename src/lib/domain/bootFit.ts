import { checkFigures, missingAsNull, object, optional } from './figureRules';
import { FIT_RESOLUTION_MM, margin, type FitVerdict } from './fit';
import { allowance, DEFAULT_CLEARANCE_MM, DEFAULT_TIGHT_MM, partSize } from './sizeRules';
import { formatLength, type UnitSystem } from './units';
import type { BootSection } from './content/schema';

// An enclosure into the boot: first through the load opening, then onto the floor with its
// clearance. Geometry is hand-worked: a box passes an opening when two of its sides fit the
// opening's width and height (carried square, never tilted, which is the conservative case), and
// a wedge box is checked at its bottom and top edges against a boot whose depth changes in a
// straight line from the floor to the shelf (both are linear in height, so the ends decide).

/** An enclosure's outside size in mm: depth at the bottom `l`, width `w`, height `h`; a wedge's depth at the top `lTop`. */
export interface EnclosureBox {
	l: number;
	w: number;
	h: number;
	lTop?: number | null;
}

/** The boot as recorded, null where nobody measured it. */
export interface BootSpace {
	/** Floor length, lip to seat back. */
	l: number | null;
	/** Depth at the height of the shelf or cover, where the seat back leans in. */
	lTop: number | null;
	w: number | null;
	/** Width between the wheel arches. */
	archW: number | null;
	h: number | null;
}

export interface LoadOpening {
	w: number | null;
	h: number | null;
}

export type BootAxis = 'l' | 'w' | 'h';
export type BootLimit = BootAxis | 'opening';

/** How the box goes through the opening: which two of its sides face the opening's width and height. */
export interface OpeningPass {
	through: boolean;
	/** Room left across the opening's width and height, in mm. */
	margins: { w: number; h: number };
	/** The box's sides facing the opening's width and height ('l', 'w' or 'h'). */
	across: BootAxis;
	up: BootAxis;
}

export interface EnclosureFit {
	verdict: FitVerdict;
	/** Null when the load opening is not measured. */
	throughOpening: boolean | null;
	opening: OpeningPass | null;
	/** Room left in the boot on each axis after the clearance; null where not measured. */
	margins: Record<BootAxis, number | null>;
	limiting: BootLimit | null;
	/** Turned a quarter on the floor, so its width runs front to back. */
	rotated: boolean;
	clearanceMm: number;
}

export const BOOT_CAUTION =
	'Secure the box to the floor or to the load anchors: a loose box is a hazard in a crash (common practice). Check under the floor for fuel and brake lines and wiring before drilling.';

const size = partSize;
/** A measured side: missing or NaN reads as not measured. */
export const measuredSide = (what: string) => missingAsNull(size(what));

export const ENCLOSURE_BOX = object({
	l: size('Box depth'),
	w: size('Box width'),
	h: size('Box height'),
	lTop: optional(measuredSide('Box depth at the top'))
});
const BOOT_SPACE = object({
	l: measuredSide('Boot floor length'),
	lTop: measuredSide('Boot depth at the top'),
	w: measuredSide('Boot floor width'),
	archW: measuredSide('Width between the wheel arches'),
	h: measuredSide('Boot height')
});
export const LOAD_OPENING = object({ w: measuredSide('Load opening width'), h: measuredSide('Load opening height') });
const OPTIONS = object({ clearanceMm: optional(allowance('Clearance')), tightMm: optional(allowance('Tight threshold')) });

/** The boot a page records, as the check reads it. */
export const bootSpaceOf = (b: Pick<BootSection, 'floorLengthMm' | 'depthTopMm' | 'floorWidthMm' | 'archWidthMm' | 'heightMm'>): BootSpace => ({
	l: b.floorLengthMm,
	lTop: b.depthTopMm,
	w: b.floorWidthMm,
	archW: b.archWidthMm,
	h: b.heightMm
});
export const loadOpeningOf = (b: Pick<BootSection, 'openingWidthMm' | 'openingHeightMm'>): LoadOpening => ({ w: b.openingWidthMm, h: b.openingHeightMm });

const AXES: readonly BootAxis[] = ['l', 'w', 'h'];

/** The best way through the opening, trying each pair of the box's sides both ways round (carried square). */
export function throughOpening(box: EnclosureBox, opening: { w: number; h: number }): OpeningPass {
	const side: Record<BootAxis, number> = { l: Math.max(box.l, box.lTop ?? box.l), w: box.w, h: box.h };
	let best: OpeningPass | null = null;
	for (const across of AXES) {
		for (const up of AXES) {
			if (across === up) continue;
			const margins = { w: margin(opening.w, side[across], 0), h: margin(opening.h, side[up], 0) };
			if (!best || Math.min(margins.w, margins.h) > Math.min(best.margins.w, best.margins.h)) {
				best = { through: margins.w >= 0 && margins.h >= 0, margins, across, up };
			}
		}
	}
	return best as OpeningPass;
}

const known = (m: Record<BootAxis, number | null>): number[] => AXES.map((a) => m[a]).filter((x): x is number => x !== null);
const least = (m: Record<BootAxis, number | null>): number => Math.min(...known(m));

/** Room in the boot for the box standing upright, straight (its depth front to back) or turned a quarter. */
function seated(box: EnclosureBox, space: BootSpace, c: number, turned: boolean): Record<BootAxis, number | null> {
	const bottom = turned ? box.w : box.l;
	const top = turned ? box.w : (box.lTop ?? box.l);
	const across = turned ? Math.max(box.l, box.lTop ?? box.l) : box.w;
	// Boot depth at the height of the box's top edge: straight between floor and shelf (never above the shelf).
	let depthAtTop: number | null = space.l;
	if (space.lTop !== null) {
		if (space.l === null) depthAtTop = space.lTop;
		else if (space.h === null) depthAtTop = Math.min(space.l, space.lTop);
		// A top deeper than the floor earns no extra room: the wall between them is not measured.
		else depthAtTop = Math.min(space.l, space.l - ((space.l - space.lTop) * Math.min(box.h, space.h)) / space.h);
	}
	const l =
		space.l === null && depthAtTop === null
			? null
			: Math.min(space.l === null ? Infinity : margin(space.l, bottom, c), depthAtTop === null ? Infinity : margin(depthAtTop, top, c));
	const widths = [space.w, space.archW].filter((x): x is number => x !== null);
	return { l, w: widths.length ? margin(Math.min(...widths), across, c) : null, h: space.h === null ? null : margin(space.h, box.h, c) };
}

const limitOf = (m: Record<BootAxis, number | null>): BootAxis =>
	AXES.filter((a) => m[a] !== null).reduce((a, x) => ((m[x] as number) < (m[a] as number) ? x : a));

/**
 * An enclosure against a boot: through the load opening in its best orientation, then standing in
 * the space with the clearance on every side (turned a quarter on the floor when that is better).
 * A side nobody measured never hides one that already rules the box out.
 */
export function enclosureFit(
	box: EnclosureBox,
	space: BootSpace,
	opening: LoadOpening,
	opts: { clearanceMm?: number; tightMm?: number } = {}
): EnclosureFit {
	const options = checkFigures(OPTIONS, opts);
	return checkedEnclosureFit(
		checkFigures(ENCLOSURE_BOX, box),
		checkFigures(BOOT_SPACE, space),
		checkFigures(LOAD_OPENING, opening),
		options.clearanceMm ?? DEFAULT_CLEARANCE_MM,
		options.tightMm ?? DEFAULT_TIGHT_MM
	);
}

/** The same check on figures already read (the reverse scan reads each boot once, not per query). */
export function checkedEnclosureFit(b: EnclosureBox, s: BootSpace, o: LoadOpening, c: number, tightMm: number): EnclosureFit {
	const pass = o.w !== null && o.h !== null ? throughOpening(b, { w: o.w, h: o.h }) : null;
	const straight = seated(b, s, c, false);
	const turned = seated(b, s, c, true);
	const complete = known(straight).length === 3;
	const rotated = known(turned).length > 0 && least(turned) > least(straight);
	const margins = rotated ? turned : straight;
	const base = { throughOpening: pass ? pass.through : null, opening: pass, margins, rotated, clearanceMm: c };

	if (pass && !pass.through) return { ...base, verdict: 'no-fit', limiting: 'opening' };
	const measuredSides = known(margins);
	if (measuredSides.length && Math.min(...measuredSides) < 0) return { ...base, verdict: 'no-fit', limiting: limitOf(margins) };
	if (!complete || !pass) return { ...base, verdict: 'not-measured', limiting: null };

	const limiting = limitOf(margins);
	const openingLeast = Math.min(pass.margins.w, pass.margins.h);
	const worst = Math.min(margins[limiting] as number, openingLeast);
	const verdict = margin(worst, tightMm, 0) < 0 ? 'tight' : 'fits';
	return { ...base, verdict, limiting: openingLeast < (margins[limiting] as number) ? 'opening' : limiting };
}

const SIDE_WORDS: Readonly<Record<BootAxis, string>> = { l: 'depth', w: 'width', h: 'height' };
const TOO: Readonly<Record<BootAxis, string>> = { l: 'too deep', w: 'too wide', h: 'too tall' };

/** The answer in words a customer can be told. */
export function enclosureFitReason(fit: EnclosureFit, units: UnitSystem = 'metric'): string {
	const len = (mm: number) => formatLength(mm, units);
	const after = fit.clearanceMm > 0 ? ` after ${len(fit.clearanceMm)} clearance` : '';
	const turned = fit.rotated ? ' Turned a quarter, so its width runs front to back.' : '';
	const way = fit.opening ? ` Carry it through the opening with its ${SIDE_WORDS[fit.opening.across]} across and its ${SIDE_WORDS[fit.opening.up]} upright.` : '';
	if (fit.limiting === 'opening' && fit.opening && !fit.opening.through) {
		const short = Math.min(fit.opening.margins.w, fit.opening.margins.h);
		return `Does not go through the load opening: ${len(-short)} too big whichever way it is carried square.`;
	}
	if (fit.verdict === 'no-fit' && fit.limiting && fit.limiting !== 'opening') {
		return `Does not fit in the boot: ${len(-(fit.margins[fit.limiting] as number))} ${TOO[fit.limiting]}${after}.${turned}`;
	}
	if (fit.verdict === 'not-measured') {
		const missing = fit.throughOpening === null ? ['the load opening'] : [];
		for (const a of AXES) if (fit.margins[a] === null) missing.push(`the ${SIDE_WORDS[a]}`);
		return `The boot is not fully measured (${missing.join(', ')} missing), so nobody can say yet.`;
	}
	const m = fit.limiting === 'opening' ? Math.min(fit.opening!.margins.w, fit.opening!.margins.h) : (fit.margins[fit.limiting as BootAxis] as number);
	const where = fit.limiting === 'opening' ? 'through the load opening' : `in ${SIDE_WORDS[fit.limiting as BootAxis]}${after}`;
	if (fit.verdict === 'tight') return `Goes in, but only ${len(m)} to spare ${where}: check on the car.${way}${turned}`;
	return `Fits in the boot with ${len(m)} to spare ${where}, the closest side.${way}${turned}`;
}

export interface BootMatches {
	/** Row numbers whose boot takes the box (fits or tight). */
	rows: Int32Array;
	/** 1 where that row's fit is tight. */
	tight: Uint8Array;
}

/**
 * Every recorded boot in typed columns, for "which vehicles take this box in the boot". The same
 * rule as enclosureFit on complete figures, worked without allocating per row: the best way through
 * an opening pairs the box's two shortest sides with the opening's shorter and longer side (a
 * larger side or the crossed pairing only leaves less room).
 */
export class BootSpaceIndex {
	readonly size: number;
	readonly l: Float64Array;
	readonly lTop: Float64Array;
	readonly w: Float64Array;
	readonly archW: Float64Array;
	readonly h: Float64Array;
	readonly ow: Float64Array;
	readonly oh: Float64Array;
	// Worked once per row when it is set, so a query is a few subtractions a row over one packed
	// array: per row the opening's shorter and longer side (NaN when any
	// figure a fit needs is missing, so the row never matches), the height, the floor depth
	// (NO_FLOOR_MM when only the top depth is measured), the depth at the top of the floor, how much
	// depth the seat back takes per millimetre of height, and the width across the floor (between
	// the arches when they are narrower).
	private readonly packed: Float64Array;
	private scratchRows = new Int32Array(0);
	private scratchTight = new Uint8Array(0);

	constructor(boots: readonly { space: BootSpace; opening: LoadOpening }[]) {
		const n = boots.length;
		this.size = n;
		this.l = new Float64Array(n);
		this.lTop = new Float64Array(n);
		this.w = new Float64Array(n);
		this.archW = new Float64Array(n);
		this.h = new Float64Array(n);
		this.ow = new Float64Array(n);
		this.oh = new Float64Array(n);
		this.packed = new Float64Array(n * STRIDE);
		boots.forEach((b, i) => this.set(i, b));
	}

	/** Overwrites one row (a page saved again). */
	set(row: number, b: { space: BootSpace; opening: LoadOpening }): void {
		const v = (x: number | null) => (x === null ? NaN : x);
		this.l[row] = v(b.space.l);
		this.lTop[row] = v(b.space.lTop);
		this.w[row] = v(b.space.w);
		this.archW[row] = v(b.space.archW);
		this.h[row] = v(b.space.h);
		this.ow[row] = v(b.opening.w);
		this.oh[row] = v(b.opening.h);
		const l = this.l[row];
		const lTop = this.lTop[row];
		const H = this.h[row];
		const wide = this.w[row];
		const arch = this.archW[row];
		const across = wide === wide ? (arch === arch && arch < wide ? arch : wide) : arch;
		const depth0 = l === l ? l : lTop;
		const usable = [this.ow[row], this.oh[row], H, across, depth0].every((x) => x === x);
		const p = this.packed;
		const at = row * STRIDE;
		p[at] = usable ? Math.min(this.ow[row], this.oh[row]) : NaN;
		p[at + 1] = usable ? Math.max(this.ow[row], this.oh[row]) : NaN;
		p[at + 2] = H;
		p[at + 3] = l === l ? l : NO_FLOOR_MM;
		p[at + 4] = depth0;
		// A seat back leaning in: the depth at height y is l − (l − lTop)·y/H (never more than l).
		p[at + 5] = l === l && lTop === lTop && l > lTop ? (l - lTop) / H : 0;
		p[at + 6] = across;
	}

	query(box: EnclosureBox, clearanceMm = DEFAULT_CLEARANCE_MM, tightMm = DEFAULT_TIGHT_MM): BootMatches {
		const b = checkFigures(ENCLOSURE_BOX, box);
		checkFigures(OPTIONS, { clearanceMm, tightMm });
		const c = clearanceMm;
		const deep = Math.max(b.l, b.lTop ?? b.l);
		const top = b.lTop ?? b.l;
		const sides = [deep, b.w, b.h].sort((x, y) => x - y);
		const s1 = sides[0];
		const s2 = sides[1];
		// One scratch pair per index (queries run one at a time on the event loop); the answer is a copy.
		if (this.scratchRows.length < this.size) {
			this.scratchRows = new Int32Array(this.size);
			this.scratchTight = new Uint8Array(this.size);
		}
		const rows = this.scratchRows;
		const tight = this.scratchTight;
		const p = this.packed;
		const bh = b.h;
		const bl = b.l;
		const bw = b.w;
		const n = this.size;
		let k = 0;
		for (let i = 0, at = 0; i < n; i++, at += STRIDE) {
			// Branch-free minimum and maximum (see lo and hi): with figures in random order a
			// compare-and-branch per side mispredicts often enough to cost more than the arithmetic.
			// An unusable row has NaN opening sides, and NaN runs through to m, which fails the test.
			const gate = lo(lo(p[at] - s1, p[at + 1] - s2), p[at + 2] - bh - c);
			const floor = p[at + 3] - c;
			const up = p[at + 4] - p[at + 5] * bh - c;
			const room = p[at + 6] - c;
			const straight = lo(lo(floor - bl, up - top), room - bw);
			const turned = lo(lo(floor - bw, up - bw), room - deep);
			const m = lo(gate, hi(straight, turned));
			// enclosureFit rounds margins to the whole micrometre, so a box goes in when m ≥ −½ µm and
			// is tight below tightMm − ½ µm. Only a margin within rounding error of either line
			// (never a figure in whole or tenth millimetres) is passed to the full check.
			if (Math.abs(m - GOES_IN_MM) < ROUNDING_BAND_MM || Math.abs(m - (tightMm + GOES_IN_MM)) < ROUNDING_BAND_MM) {
				const verdict = this.verdictAt(i, b, c, tightMm);
				if (verdict !== 'fits' && verdict !== 'tight') continue;
				rows[k] = i;
				tight[k++] = verdict === 'tight' ? 1 : 0;
				continue;
			}
			// Written every row, kept by moving k on only when the box goes in (NaN never does).
			rows[k] = i;
			tight[k] = m < tightMm + GOES_IN_MM ? 1 : 0;
			k += m >= GOES_IN_MM ? 1 : 0;
		}
		return { rows: rows.slice(0, k), tight: tight.slice(0, k) };
	}

	/** One row's boot and opening, null where not measured. */
	boot(row: number): { space: BootSpace; opening: LoadOpening } {
		const v = (x: number) => (Number.isNaN(x) ? null : x);
		return {
			space: { l: v(this.l[row]), lTop: v(this.lTop[row]), w: v(this.w[row]), archW: v(this.archW[row]), h: v(this.h[row]) },
			opening: { w: v(this.ow[row]), h: v(this.oh[row]) }
		};
	}

	// On a margin within rounding error of a boundary the full check (whole micrometres) decides.
	private verdictAt(row: number, b: EnclosureBox, c: number, tightMm: number): FitVerdict {
		const { space, opening } = this.boot(row);
		return checkedEnclosureFit(b, space, opening, c, tightMm).verdict;
	}
}

const STRIDE = 8;
// Half a micrometre below zero: the line enclosureFit's rounded margins draw between going in and not.
const GOES_IN_MM = -FIT_RESOLUTION_MM / 2;
// Double-precision error of the packed arithmetic on boot figures, with a wide allowance.
const ROUNDING_BAND_MM = 1e-6;
// The floor depth when only the top depth is measured: longer than any boot, finite so lo and hi
// stay exact enough (far inside ROUNDING_BAND_MM) for millimetre figures.
const NO_FLOOR_MM = 1e7;

// min and max of two finite numbers (NaN in, NaN out) without a branch; the rounding error for
// millimetre figures is far inside ROUNDING_BAND_MM.
function lo(a: number, b: number): number {
	return (a + b - Math.abs(a - b)) * 0.5;
}
function hi(a: number, b: number): number {
	return (a + b + Math.abs(a - b)) * 0.5;
}

