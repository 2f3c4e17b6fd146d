// Vehicle identification numbers: ISO 3779 worldwide, 49 CFR 565 for North America.

export const VIN_LENGTH = 17;

// 49 CFR 565.15: transliteration of letters for the check digit (digits keep their value).
const TRANSLITERATION: Readonly<Record<string, number>> = {
	A: 1, B: 2, C: 3, D: 4, E: 5, F: 6, G: 7, H: 8,
	J: 1, K: 2, L: 3, M: 4, N: 5, P: 7, R: 9,
	S: 2, T: 3, U: 4, V: 5, W: 6, X: 7, Y: 8, Z: 9
};
// 49 CFR 565.15: position weights; position 9 is the check digit itself.
export const CHECK_DIGIT_WEIGHTS: readonly number[] = [8, 7, 6, 5, 4, 3, 2, 10, 0, 9, 8, 7, 6, 5, 4, 3, 2];

// 49 CFR 565.15 model-year codes in order; the cycle repeats every 30 years.
export const MODEL_YEAR_CODES = 'ABCDEFGHJKLMNPRSTVWXY123456789';

export type VinRegion = 'north-america' | 'elsewhere';

export interface VinBasics {
	vin: string;
	valid: boolean;
	/** `applies` is false outside North America, where ISO 3779 leaves position 9 to the maker. */
	checkDigit: { expected: string; actual: string; applies: boolean } | null;
	modelYear: number | null;
	wmi: string | null;
	region: VinRegion | null;
	problem: string | null;
}

/**
 * ISO 3780 gives the first character by region; 1–5 is North America, where 49 CFR 565 makes
 * the check digit (position 9) and the model-year code (position 10) mandatory.
 */
export function vinRegion(vin: string): VinRegion {
	return /^[1-5]/.test(vin) ? 'north-america' : 'elsewhere';
}

/** Upper-case and drop the spaces and dashes people type or scanners add. */
export function normalizeVin(input: string): string {
	return input.toUpperCase().replace(/[\s-]+/g, '');
}

/** A sentence for a person when the VIN cannot be right as written, else null. */
export function vinProblem(vin: string): string | null {
	if (vin.length !== VIN_LENGTH) {
		return `A VIN has ${VIN_LENGTH} characters; this one has ${vin.length}.`;
	}
	for (let i = 0; i < vin.length; i++) {
		const ch = vin[i];
		if (ch === 'I' || ch === 'O' || ch === 'Q') {
			return `A VIN never uses the letters I, O or Q (they read like 1 and 0); found ${ch} at position ${i + 1}.`;
		}
		if (!/[0-9A-Z]/.test(ch)) {
			return `A VIN has only digits and capital letters; found "${ch}" at position ${i + 1}.`;
		}
	}
	return null;
}

function requireWellFormed(vin: string): void {
	const problem = vinProblem(vin);
	if (problem) throw new RangeError(problem);
}

/** Weighted sum of transliterated values mod 11; a remainder of 10 is written X. */
export function checkDigit(vin: string): string {
	requireWellFormed(vin);
	let sum = 0;
	for (let i = 0; i < VIN_LENGTH; i++) {
		const ch = vin[i];
		const value = ch >= '0' && ch <= '9' ? Number(ch) : TRANSLITERATION[ch];
		sum += value * CHECK_DIGIT_WEIGHTS[i];
	}
	const remainder = sum % 11;
	return remainder === 10 ? 'X' : String(remainder);
}

/**
 * Position 10 gives the year within a 30-year cycle. For passenger cars, MPVs and light trucks
 * (49 CFR 565.15), position 7 picks the cycle: a digit means 1980–2009, a letter 2010–2039.
 */
export function modelYear(vin: string): number | null {
	requireWellFormed(vin);
	const index = MODEL_YEAR_CODES.indexOf(vin[9]);
	if (index < 0) return null;
	const letterAt7 = vin[6] >= 'A' && vin[6] <= 'Z';
	return (letterAt7 ? 2010 : 1980) + index;
}

/** World manufacturer identifier: the first three characters. */
export function wmi(vin: string): string {
	requireWellFormed(vin);
	return vin.slice(0, 3);
}

/**
 * Checks what the VIN's region makes mandatory: outside North America a position 9 that is not
 * the check digit, or a position 10 that is not a year code, is the maker's choice, not a typo.
 * With the current year given, a model year more than one year ahead is flagged.
 */
export function decodeVinBasics(input: string, opts: { currentYear?: number } = {}): VinBasics {
	const vin = normalizeVin(input);
	const formatProblem = vinProblem(vin);
	if (formatProblem) {
		return { vin, valid: false, checkDigit: null, modelYear: null, wmi: null, region: null, problem: formatProblem };
	}
	const region = vinRegion(vin);
	const strict = region === 'north-america';
	const expected = checkDigit(vin);
	const actual = vin[8];
	const year = modelYear(vin);
	const ahead = opts.currentYear !== undefined && year !== null && year > opts.currentYear + 1;
	const problem =
		strict && expected !== actual
			? `Check digit (position 9) is ${actual} but the other characters give ${expected}; a character is probably mistyped.`
			: strict && year === null
				? `Position 10 (${vin[9]}) is not a model-year code.`
				: ahead
					? `Position 10 (${vin[9]}) gives model year ${year}, more than a year after ${opts.currentYear}; a character is probably mistyped.`
					: null;
	return { vin, valid: problem === null, checkDigit: { expected, actual, applies: strict }, modelYear: year, wmi: wmi(vin), region, problem };
}
