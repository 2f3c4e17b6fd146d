import { number } from './figureRules';

// The ranges a typed size may take, written once for the forms, the endpoints and the calculators.
// A figure past its limit is read as a slip (a wrong unit, an extra digit), not as a real size.

/** A part's outside size: nothing a shop fits is longer than this. */
export const MAX_DIMENSION_MM = 5000;
/** A cable run from the battery (power wire, speaker wire, ground). */
export const MAX_RUN_M = 30;
/** Seat spaces, dash depth and similar measured on the vehicle; search filters read the same range. */
export const MAX_MEASURED_MM = 3000;

/** Clearance left free around a part for cables and air; common practice is about 10 mm. */
export const CLEARANCE_MM = { min: 0, max: 500 } as const;
export const DEFAULT_CLEARANCE_MM = 10;
/** Below this margin (after clearance) a fit is called tight: it goes in, but check on the car (a product choice). */
export const DEFAULT_TIGHT_MM = 15;

/** The one wording of "too big to be real". */
export const looksLikeATypo = (what: string, limit: string) => `${what} over ${limit} looks like a typo`;

/** A typed part size in mm, or why it cannot be one. */
export function partSizeProblem(mm: number, max = MAX_DIMENSION_MM): string | null {
	if (!(mm > 0)) return 'Must be more than 0.';
	if (mm > max) return `${looksLikeATypo('A size', `${max} mm`)}.`;
	return null;
}

/** Why a part size is refused: not a number, not above 0, past `max`. */
export const partSizeWords = (what: string, max = MAX_DIMENSION_MM) => ({
	type: `${what} must be a number of millimetres.`,
	low: `${what} must be more than 0 mm.`,
	high: `${looksLikeATypo(what, `${max} mm`)}; sizes are in millimetres.`
});

/** Why a clearance or tight threshold is refused: not a number, below CLEARANCE_MM.min, past its max. */
export const allowanceWords = (what: string) => ({
	type: `${what} must be a number of millimetres.`,
	low: `${what} cannot be negative.`,
	high: `${looksLikeATypo(what, `${CLEARANCE_MM.max} mm`)}.`
});

/** A part's size in mm: more than 0, at most `max`. */
export function partSize(what: string, max = MAX_DIMENSION_MM) {
	const words = partSizeWords(what, max);
	return number(words.type, [(n) => n > 0, words.low], [(n) => n <= max, words.high]);
}

/** A clearance or tight threshold in mm, within CLEARANCE_MM. */
export function allowance(what: string) {
	const words = allowanceWords(what);
	return number(words.type, [(n) => n >= CLEARANCE_MM.min, words.low], [(n) => n <= CLEARANCE_MM.max, words.high]);
}

/** How the clearance range reads beside a form field. */
export const CLEARANCE_RANGE_TEXT = `Clearance must be a number of mm from ${CLEARANCE_MM.min} to ${CLEARANCE_MM.max}.`;

/** A run length in metres, or why it cannot be one. */
export function runLengthProblem(m: number, label: string, allowZero = false): string | null {
	if (allowZero && !(m >= 0)) return `${label} must be 0 or more.`;
	if (!allowZero && !(m > 0)) return `${label} must be more than 0.`;
	if (m > MAX_RUN_M) return `${looksLikeATypo(label, `${MAX_RUN_M} m (98 ft)`)}.`;
	return null;
}
