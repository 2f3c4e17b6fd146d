import { checkFigures, missingAsNull, object, optional } from './figureRules';
import { allowance as allowanceRule, DEFAULT_CLEARANCE_MM, DEFAULT_TIGHT_MM, MAX_DIMENSION_MM, partSize } from './sizeRules';

export { DEFAULT_CLEARANCE_MM, DEFAULT_TIGHT_MM, MAX_DIMENSION_MM } from './sizeRules';

export type Axis = 'l' | 'w' | 'h';
export type FitVerdict = 'fits' | 'tight' | 'no-fit' | 'not-measured';

/** A part's outside size in mm. */
export interface Box {
	l: number;
	w: number;
	h: number;
}

/** A recorded space in mm; null (or NaN) where nobody has measured it yet. */
export interface Space {
	l: number | null;
	w: number | null;
	h: number | null;
}

export interface FitOptions {
	/** Taken off every axis for cables and air; common practice is about 10 mm. */
	clearanceMm?: number;
	/** Below this margin (after clearance) a fit is called tight: it goes in, but check on the car. */
	tightMm?: number;
}

export type FitResult =
	| { verdict: 'fits' | 'tight' | 'no-fit'; rotated: boolean; margins: Record<Axis, number>; limiting: Axis }
	/** An axis that is measured already rules the part out; the others are null. */
	| { verdict: 'no-fit'; rotated: false; margins: Record<Axis, number | null>; limiting: Axis; partial: true }
	| { verdict: 'not-measured'; rotated: false; margins: null; limiting: null };

const dimension = partSize;

/** A measured side: missing or NaN reads as not measured. */
const measured = (what: string) => missingAsNull(dimension(what));

const allowance = (what: string) => optional(allowanceRule(what));

/** A part's box in mm, as a seat check reads it. */
export const FIT_BOX = object({ l: dimension('Part length'), w: dimension('Part width'), h: dimension('Part height') });
/** A recorded space in mm; a side nobody measured is null. */
export const FIT_SPACE = object({ l: measured('Space length'), w: measured('Space width'), h: measured('Space height') });
const FIT_INPUT = object({
	box: FIT_BOX,
	space: FIT_SPACE,
	options: optional(object({ clearanceMm: allowance('Clearance'), tightMm: allowance('Tight threshold') }))
});


// Verdicts are decided on whole micrometres: binary floating point cannot hold most decimal
// millimetres or inch conversions exactly, so an exact fit would otherwise come out a few
// 1e-14 mm short. A margin is rounded to the micrometre before it is compared.
export const FIT_RESOLUTION_MM = 0.001;
const UM_PER_MM = 1000;

/** Room left on one axis, in mm, rounded to the whole micrometre (never −0). */
export const margin = (space: number, part: number, clearance: number): number => {
	const um = Math.round((space - (part + clearance)) * UM_PER_MM);
	return um === 0 ? 0 : um / UM_PER_MM;
};

// Seat spaces in the reverse-scan index are kept in single precision (about 3e-4 mm off below
// 5000 mm); the index is asked for a box this much smaller, so no seat whose own figures take the
// box is missed, and fitVerdict on the page's figures decides.
export const SEAT_INDEX_SLACK_MM = FIT_RESOLUTION_MM;

function verdictOf(minMargin: number, tightMm: number): 'fits' | 'tight' | 'no-fit' {
	return minMargin < 0 ? 'no-fit' : margin(minMargin, tightMm, 0) < 0 ? 'tight' : 'fits';
}

/** The verdict for the smallest room left before rounding, decided on whole micrometres as fitVerdict decides it. */
export const verdictForRoom = (room: number, tightMm: number): 'fits' | 'tight' | 'no-fit' => verdictOf(margin(room, 0, 0), tightMm);

/**
 * A part's box against a space: the part may turn on the floor (length and width swap), height
 * stays vertical. The orientation with the larger smallest margin is reported.
 */
export function fitVerdict(box: Box, space: Space, opts: FitOptions = {}): FitResult {
	const input = checkFigures(FIT_INPUT, { box, space, options: opts });
	const { l, w, h } = input.space;
	const c = input.options?.clearanceMm ?? DEFAULT_CLEARANCE_MM;
	const tightMm = input.options?.tightMm ?? DEFAULT_TIGHT_MM;
	const b = input.box;
	if (l === null || w === null || h === null) return partialFit(b, { l, w, h }, c);
	const straight = { l: margin(l, b.l, c), w: margin(w, b.w, c), h: margin(h, b.h, c) };
	const turned = { l: margin(l, b.w, c), w: margin(w, b.l, c), h: straight.h };
	const rotated = smallest(turned) > smallest(straight);
	const margins = rotated ? turned : straight;
	const limiting = (['l', 'w', 'h'] as const).reduce((a, x) => (margins[x] < margins[a] ? x : a));
	return { verdict: verdictOf(margins[limiting], tightMm), rotated, margins, limiting };
}

const smallest = (m: Record<Axis, number>): number => Math.min(m.l, m.w, m.h);

/**
 * Some sides not measured: the part is still ruled out when a measured side cannot take it in
 * either orientation (a lone floor side is checked against the part's shorter floor side).
 */
function partialFit(b: Box, s: Space, c: number): FitResult {
	const floor = (side: number | null, other: number | null, along: number, across: number): number | null => {
		if (side === null) return null;
		if (other !== null) return margin(side, along, c);
		return Math.max(margin(side, along, c), margin(side, across, c));
	};
	const margins: Record<Axis, number | null> = {
		l: floor(s.l, s.w, b.l, b.w),
		w: floor(s.w, s.l, b.w, b.l),
		h: s.h === null ? null : margin(s.h, b.h, c)
	};
	// With both floor sides measured and height missing, the better orientation decides.
	if (s.l !== null && s.w !== null) {
		const straight = Math.min(margin(s.l, b.l, c), margin(s.w, b.w, c));
		const turned = Math.min(margin(s.l, b.w, c), margin(s.w, b.l, c));
		if (turned > straight) {
			margins.l = margin(s.l, b.w, c);
			margins.w = margin(s.w, b.l, c);
		}
	}
	const short = (['l', 'w', 'h'] as const).filter((a) => margins[a] !== null && (margins[a] as number) < 0);
	if (short.length === 0) return { verdict: 'not-measured', rotated: false, margins: null, limiting: null };
	const limiting = short.reduce((a, x) => ((margins[x] as number) < (margins[a] as number) ? x : a));
	return { verdict: 'no-fit', rotated: false, margins, limiting, partial: true };
}

// ISO 7736 as widely quoted (the standard's own text was not at hand): a unit's face is
// 180 × 50 mm (double DIN 180 × 100 mm) and the dash aperture it goes into 182 × 53 mm
// (double DIN 182 × 103 mm).
export const DIN_UNIT_FACE_MM = { 1: { w: 180, h: 50 }, 2: { w: 180, h: 100 } } as const;
export const DIN_APERTURE_MM = { 1: { w: 182, h: 53 }, 2: { w: 182, h: 103 } } as const;
// Room behind the chassis for the harness plugs, the aerial lead and an interface adapter
// (common practice); its own figure, apart from the clearance a seat check allows.
export const DEFAULT_PLUG_ALLOWANCE_MM = 50;
// An opening this much larger than the aperture the unit needs shows a gap: a trim kit or pocket hides it (common practice).
export const TRIM_KIT_OVER_MM = 3;

export type DinSize = 1 | 2;
// A 1.5-DIN opening has no ISO 7736 size; its units are commonly 180 × 75 mm at the face (from memory).
export const ONE_AND_HALF_DIN_FACE_MM = { w: 180, h: 75 } as const;

export type DashOpening = 'single-din' | '1.5-din' | 'double-din' | 'oversize' | 'kit' | 'integrated';

export interface DepthFit {
	verdict: FitVerdict;
	/** Depth left behind the chassis after the plug allowance; null if not measured or no opening. */
	depthMarginMm: number | null;
	/** A dash kit, pocket or trim ring is needed around the unit. */
	needsKit: boolean;
	/** The plug and adapter allowance the depth was checked with. */
	plugAllowanceMm: number;
	reason: string;
}

export interface HeadUnitFitOptions {
	plugAllowanceMm?: number;
	tightMm?: number;
}

/**
 * A head unit against the dash: the face against the opening (its recorded size when there is
 * one, otherwise the ISO 7736 aperture its type implies), then the depth behind the chassis
 * with room for the plugs.
 */
export function headUnitFit(
	unit: { dinSize: DinSize; chassisDepthMm: number },
	dash: { opening: DashOpening; depthMm: number | null; openingMm?: { w: number; h: number } | null },
	opts: HeadUnitFitOptions = {}
): DepthFit {
	if (unit.dinSize !== 1 && unit.dinSize !== 2) {
		throw new RangeError('A head unit is single DIN (1) or double DIN (2).');
	}
	const chassisDepth = checkFigures(dimension('Chassis depth'), unit.chassisDepthMm);
	const depth = checkFigures(measured('Dash depth'), dash.depthMm);
	const plugAllowanceMm = checkFigures(allowance('Plug allowance'), opts.plugAllowanceMm) ?? DEFAULT_PLUG_ALLOWANCE_MM;
	const opened = dash.openingMm ? { w: checkFigures(dimension('Opening width'), dash.openingMm.w), h: checkFigures(dimension('Opening height'), dash.openingMm.h) } : null;
	const size = DIN_UNIT_FACE_MM[unit.dinSize];
	const aperture = DIN_APERTURE_MM[unit.dinSize];
	const face = `${unit.dinSize === 1 ? 'single' : 'double'}-DIN unit (face ${size.w} × ${size.h} mm, aperture ${aperture.w} × ${aperture.h} mm)`;
	const base = { plugAllowanceMm };

	if (dash.opening === 'integrated' && !opened) {
		return {
			...base,
			verdict: 'no-fit',
			depthMarginMm: null,
			needsKit: true,
			reason: 'The factory unit is built into the dash; a vehicle-specific dash kit is needed before any DIN unit fits.'
		};
	}
	let needsKit: boolean;
	if (dash.opening === 'kit' && !opened) {
		// The kit's own aperture decides the face; only the depth can be judged without it.
		const what = `A kit opening: the dash kit sets the size, so record the opening it leaves to check the face of a ${face}.`;
		if (depth !== null) {
			const depthMarginMm = margin(depth, chassisDepth, plugAllowanceMm);
			if (depthMarginMm < 0) {
				const reason = `The chassis is ${Math.round(-depthMarginMm)} mm too deep for the dash (${plugAllowanceMm} mm for plugs and adapters behind it included).`;
				return { ...base, verdict: 'no-fit', depthMarginMm, needsKit: true, reason };
			}
			return { ...base, verdict: 'not-measured', depthMarginMm, needsKit: true, reason: `${what} The depth takes it.` };
		}
		return { ...base, verdict: 'not-measured', depthMarginMm: null, needsKit: true, reason: what };
	}
	if (opened) {
		// A recorded opening (1.5 DIN, oversize, or what a kit leaves) decides the face.
		if (margin(opened.w, size.w, 0) < 0 || margin(opened.h, size.h, 0) < 0) {
			const reason = `The recorded opening (${opened.w} × ${opened.h} mm) is smaller than the face of a ${face}.`;
			return { ...base, verdict: 'no-fit', depthMarginMm: null, needsKit: false, reason };
		}
		needsKit = dash.opening === 'kit' || margin(opened.w, aperture.w, TRIM_KIT_OVER_MM) > 0 || margin(opened.h, aperture.h, TRIM_KIT_OVER_MM) > 0;
	} else {
		if (dash.opening === 'single-din' && unit.dinSize === 2) {
			const reason = `A ${face} does not go into a single-DIN opening (${DIN_APERTURE_MM[1].w} × ${DIN_APERTURE_MM[1].h} mm).`;
			return { ...base, verdict: 'no-fit', depthMarginMm: null, needsKit: false, reason };
		}
		if (dash.opening === '1.5-din' && unit.dinSize === 2) {
			const reason = `A ${face} is taller than a 1.5-DIN opening (units about ${ONE_AND_HALF_DIN_FACE_MM.h} mm high); record the measured opening to be sure.`;
			return { ...base, verdict: 'no-fit', depthMarginMm: null, needsKit: false, reason };
		}
		// A smaller unit in a larger opening takes a pocket or trim kit (common practice).
		needsKit = dash.opening === 'oversize' || dash.opening === '1.5-din' || (dash.opening === 'double-din' && unit.dinSize === 1);
	}
	const kit = needsKit ? ' with a dash kit' : '';
	if (depth === null) {
		const reason = `The face fits${kit}; the dash depth is not measured yet.`;
		return { ...base, verdict: 'not-measured', depthMarginMm: null, needsKit, reason };
	}
	const depthMarginMm = margin(depth, chassisDepth, plugAllowanceMm);
	const verdict = verdictOf(depthMarginMm, opts.tightMm ?? DEFAULT_TIGHT_MM);
	const plugs = `${plugAllowanceMm} mm for plugs and adapters`;
	const reason =
		verdict === 'no-fit'
			? `The chassis is ${Math.round(-depthMarginMm)} mm too deep for the dash (${plugs} behind it included).`
			: `Fits${kit}, ${Math.round(depthMarginMm)} mm to spare behind the chassis after ${plugs}.`;
	return { ...base, verdict, depthMarginMm, needsKit, reason };
}

// A speaker frame overlaps its hole by only a few mm; a hole more than this much larger needs an adapter ring (common practice).
export const ADAPTER_RING_OVER_MM = 10;
// Under 5 mm to spare on cut-out or depth is called tight (a product choice, like DEFAULT_TIGHT_MM).
export const DEFAULT_SPEAKER_TIGHT_MM = 5;

export type SpeakerFitResult =
	| { verdict: 'fits' | 'tight' | 'no-fit'; margins: { cutout: number; depth: number }; limiting: 'cutout' | 'depth'; needsAdapter: boolean }
	/** The measured figure already rules the speaker out; the other one is null. */
	| { verdict: 'no-fit'; margins: { cutout: number | null; depth: number | null }; limiting: 'cutout' | 'depth'; needsAdapter: false; partial: true }
	| { verdict: 'not-measured'; margins: null; limiting: null; needsAdapter: false };

/** A speaker's cut-out and mounting depth against the largest cut-out and the depth a location allows. */
export function speakerFit(
	speaker: { cutoutMm: number; mountingDepthMm: number },
	location: { cutoutMm: number | null; depthMm: number | null },
	opts: { tightMm?: number } = {}
): SpeakerFitResult {
	const needCutout = checkFigures(dimension('Speaker cut-out'), speaker.cutoutMm);
	const needDepth = checkFigures(dimension('Speaker mounting depth'), speaker.mountingDepthMm);
	const cutout = checkFigures(measured('Location cut-out'), location.cutoutMm);
	const depth = checkFigures(measured('Location depth'), location.depthMm);
	if (cutout === null || depth === null) {
		// A measured figure that already rules the speaker out is not hidden by the missing one.
		const known = cutout !== null ? { cutout: margin(cutout, needCutout, 0) } : depth !== null ? { depth: margin(depth, needDepth, 0) } : {};
		const [axis, m] = (Object.entries(known)[0] ?? []) as ['cutout' | 'depth' | undefined, number | undefined];
		if (axis && m !== undefined && m < 0) {
			return { verdict: 'no-fit', margins: { cutout: known.cutout ?? null, depth: known.depth ?? null }, limiting: axis, needsAdapter: false, partial: true };
		}
		return { verdict: 'not-measured', margins: null, limiting: null, needsAdapter: false };
	}
	const margins = { cutout: margin(cutout, needCutout, 0), depth: margin(depth, needDepth, 0) };
	const limiting = margins.depth < margins.cutout ? 'depth' : 'cutout';
	return {
		verdict: verdictOf(margins[limiting], opts.tightMm ?? DEFAULT_SPEAKER_TIGHT_MM),
		margins,
		limiting,
		needsAdapter: margins.cutout > ADAPTER_RING_OVER_MM
	};
}

export interface SeatSpaceRow {
	vehicleIndex: number;
	seat: string;
	l: number | null;
	w: number | null;
	h: number | null;
}

export interface SeatSpaceMatches {
	/** Row numbers in the index whose space takes the part. */
	rows: Int32Array;
	/** 1 where that row's fit is tight, 0 where it fits with room to spare. */
	tight: Uint8Array;
}

/** Column store of every recorded seat space, for "which vehicles does this part fit". */
export class SeatSpaceIndex {
	readonly size: number;
	readonly vehicleIndex: Int32Array;
	readonly seatCode: Uint8Array;
	readonly seatNames: string[] = [];
	readonly l: Float32Array;
	readonly w: Float32Array;
	readonly h: Float32Array;
	private scratchRows = new Int32Array(0);
	private scratchTight = new Uint8Array(0);

	constructor(rows: readonly SeatSpaceRow[]) {
		const n = rows.length;
		this.size = n;
		this.vehicleIndex = new Int32Array(n);
		this.seatCode = new Uint8Array(n);
		this.l = new Float32Array(n);
		this.w = new Float32Array(n);
		this.h = new Float32Array(n);
		const codes = new Map<string, number>();
		rows.forEach((row, i) => {
			if (!Number.isInteger(row.vehicleIndex)) throw new RangeError(`Row ${i}: vehicle index must be a whole number.`);
			let code = codes.get(row.seat);
			if (code === undefined) {
				if (codes.size === 255) throw new RangeError('More than 255 seat names.');
				code = codes.size;
				codes.set(row.seat, code);
				this.seatNames.push(row.seat);
			}
			this.vehicleIndex[i] = row.vehicleIndex;
			this.seatCode[i] = code;
			this.l[i] = column(row.l, i, 'length');
			this.w[i] = column(row.w, i, 'width');
			this.h[i] = column(row.h, i, 'height');
		});
	}

	seat(row: number): string {
		return this.seatNames[this.seatCode[row]];
	}

	/** The space as stored (single precision), null where not measured. */
	space(row: number): Space {
		const v = (x: number) => (Number.isNaN(x) ? null : x);
		return { l: v(this.l[row]), w: v(this.w[row]), h: v(this.h[row]) };
	}

	/** Rows whose verdict for the box is fits or tight, in row order. Same rule as fitVerdict. */
	query(box: Box, clearanceMm = DEFAULT_CLEARANCE_MM, tightMm = DEFAULT_TIGHT_MM): SeatSpaceMatches {
		const b = checkFigures(FIT_BOX, box);
		checkFigures(allowance('Clearance'), clearanceMm);
		checkFigures(allowance('Tight threshold'), tightMm);
		const bl = b.l + clearanceMm;
		const bw = b.w + clearanceMm;
		const bh = b.h + clearanceMm;
		const { l, w, h, size } = this;
		// Scratch columns are reused between queries (a query runs to completion before the next starts).
		if (this.scratchRows.length < size) {
			this.scratchRows = new Int32Array(size);
			this.scratchTight = new Uint8Array(size);
		}
		const rows = this.scratchRows;
		const tight = this.scratchTight;
		let k = 0;
		// Ternaries instead of Math.min/max (about 1.5× faster here); they do not carry NaN, so a side
		// that was not measured (NaN) is excluded explicitly: NaN === NaN is false.
		for (let i = 0; i < size; i++) {
			const L = l[i];
			const W = w[i];
			const H = h[i] - bh;
			const straightL = L - bl;
			const straightW = W - bw;
			const turnedL = L - bw;
			const turnedW = W - bl;
			const straight = straightL < straightW ? straightL : straightW;
			const turned = turnedL < turnedW ? turnedL : turnedW;
			const floor = straight > turned ? straight : turned;
			const m = floor < H ? floor : H;
			// Rounding is monotonic, so rounding the smallest room gives fitVerdict's verdict on the stored figures.
			const verdict = verdictForRoom(m, tightMm);
			rows[k] = i;
			tight[k] = verdict === 'tight' ? 1 : 0;
			k += verdict !== 'no-fit' && m === m && L === L && W === W ? 1 : 0;
		}
		return { rows: rows.slice(0, k), tight: tight.slice(0, k) };
	}
}

function column(value: number | null, row: number, what: string): number {
	if (value === null || value === undefined || Number.isNaN(value)) return NaN;
	if (!(value > 0 && value <= MAX_DIMENSION_MM)) {
		throw new RangeError(`Row ${row}: space ${what} must be more than 0 and at most ${MAX_DIMENSION_MM} mm; got ${value}.`);
	}
	return value;
}
