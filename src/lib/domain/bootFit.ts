import { z } from 'zod';
import { margin, type FitVerdict } from './fit';
import { parseInput } from './validate';
import { allowanceMm, DEFAULT_CLEARANCE_MM, DEFAULT_TIGHT_MM, partSizeMm } from './sizeRules';
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

const size = partSizeMm;
const measured = (what: string) =>
	z.preprocess((v) => (v === undefined || (typeof v === 'number' && Number.isNaN(v)) ? null : v), size(what).nullable());

export const enclosureBoxSchema = z.object({
	l: size('Box depth'),
	w: size('Box width'),
	h: size('Box height'),
	lTop: measured('Box depth at the top').optional()
});
const bootSpaceSchema = z.object({
	l: measured('Boot floor length'),
	lTop: measured('Boot depth at the top'),
	w: measured('Boot floor width'),
	archW: measured('Width between the wheel arches'),
	h: measured('Boot height')
});
const openingSchema = z.object({ w: measured('Load opening width'), h: measured('Load opening height') });
const optionsSchema = z.object({ clearanceMm: allowanceMm('Clearance').optional(), tightMm: allowanceMm('Tight threshold').optional() });

/** POST /api/fit/enclosure with the figures typed: a box, a load opening and a boot space. */
export const enclosureAgainstSpaceSchema = z.object({
	box: enclosureBoxSchema,
	opening: openingSchema,
	space: z.object({
		l: measured('Boot floor length'),
		w: measured('Boot floor width'),
		h: measured('Boot height'),
		lTop: measured('Boot depth at the top').optional(),
		archW: measured('Width between the wheel arches').optional()
	}),
	marginMm: allowanceMm('Clearance').optional(),
	tightMm: allowanceMm('Tight threshold').optional()
});
export type EnclosureAgainstSpace = z.output<typeof enclosureAgainstSpaceSchema>;

/** A catalogue enclosure or a typed box against one vehicle page's boot. */
export const enclosureAgainstPageSchema = z
	.object({
		vehicle: z.string({ error: 'Say which vehicle page (its slug).' }).trim().min(1, 'Say which vehicle page (its slug).').max(160),
		partId: z.number({ error: 'partId must be the number of a catalogue part.' }).int('partId must be a whole number.').positive('partId must be the number of a catalogue part.').optional(),
		box: enclosureBoxSchema.optional(),
		marginMm: allowanceMm('Clearance').optional(),
		tightMm: allowanceMm('Tight threshold').optional()
	})
	.refine((v) => (v.partId === undefined) !== (v.box === undefined), { error: 'Give either partId or box { l, w, h, lTop? }, not both.', path: ['box'] });
export type EnclosureAgainstPage = z.input<typeof enclosureAgainstPageSchema>;

/** The reverse question: a catalogue part or a typed box, with the clearance. */
export const bootReverseSchema = z.union(
	[
		z.object({ partId: z.coerce.number().int().positive() }),
		z.object({ l: z.coerce.number().pipe(size('Box depth')), w: z.coerce.number().pipe(size('Box width')), h: z.coerce.number().pipe(size('Box height')), lTop: z.coerce.number().pipe(size('Box depth at the top')).optional() })
	],
	{ error: 'Give partId, or l, w and h (and lTop for a wedge) in millimetres.' }
);

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
	const options = parseInput(optionsSchema, opts);
	return checkedEnclosureFit(
		parseInput(enclosureBoxSchema, box),
		parseInput(bootSpaceSchema, space),
		parseInput(openingSchema, opening),
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
	}

	query(box: EnclosureBox, clearanceMm = DEFAULT_CLEARANCE_MM, tightMm = DEFAULT_TIGHT_MM): BootMatches {
		const b = parseInput(enclosureBoxSchema, box);
		parseInput(optionsSchema, { clearanceMm, tightMm });
		const c = clearanceMm;
		const deep = Math.max(b.l, b.lTop ?? b.l);
		const top = b.lTop ?? b.l;
		const sides = [deep, b.w, b.h].sort((x, y) => x - y);
		const s1 = sides[0];
		const s2 = sides[1];
		const rows = new Int32Array(this.size);
		const tight = new Uint8Array(this.size);
		let k = 0;
		for (let i = 0; i < this.size; i++) {
			const ow = this.ow[i];
			const oh = this.oh[i];
			const o1 = ow < oh ? ow : oh;
			const o2 = ow < oh ? oh : ow;
			const opening = Math.min(o1 - s1, o2 - s2);
			const H = this.h[i];
			const wide = this.w[i];
			const arch = this.archW[i];
			const across = wide === wide ? (arch === arch && arch < wide ? arch : wide) : arch;
			const straight = Math.min(depthRoom(this.l[i], this.lTop[i], H, b.h, b.l, top, c), across - b.w - c);
			const turned = Math.min(depthRoom(this.l[i], this.lTop[i], H, b.h, b.w, b.w, c), across - deep - c);
			const m = Math.min(opening, straight > turned ? straight : turned, H - b.h - c);
			// NaN (a figure not measured) fails every comparison, so such a row never matches.
			if (m >= -FIT_SLACK_MM) {
				const exact = Math.abs(m) < FIT_SLACK_MM * 2 || Math.abs(m - tightMm) < FIT_SLACK_MM * 2;
				const verdict = exact ? this.verdictAt(i, b, c, tightMm) : m < tightMm ? 'tight' : 'fits';
				if (verdict === 'fits' || verdict === 'tight') {
					rows[k] = i;
					tight[k++] = verdict === 'tight' ? 1 : 0;
				}
			}
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

	// On a margin within a micrometre or two of a boundary the full check (whole micrometres) decides.
	private verdictAt(row: number, b: EnclosureBox, c: number, tightMm: number): FitVerdict {
		const { space, opening } = this.boot(row);
		return checkedEnclosureFit(b, space, opening, c, tightMm).verdict;
	}
}

const FIT_SLACK_MM = 0.001;

/** Depth room for a box side `bottom` deep at the floor and `top` deep at its top edge; NaN when no depth is measured. */
function depthRoom(l: number, lTop: number, H: number, boxH: number, bottom: number, top: number, c: number): number {
	let atTop = l;
	if (lTop === lTop) {
		if (l !== l) atTop = lTop;
		else if (H !== H) atTop = l < lTop ? l : lTop;
		else {
			const t = l - ((l - lTop) * (boxH < H ? boxH : H)) / H;
			atTop = l < t ? l : t;
		}
	}
	const floor = l === l ? l - bottom - c : Infinity;
	const up = atTop === atTop ? atTop - top - c : Infinity;
	const m = floor < up ? floor : up;
	return m === Infinity ? NaN : m;
}
