import { normalizeVin, vinProblem, VIN_LENGTH } from '../vin';
import { searchWords } from './words';

export const YEAR_MIN = 1950;
export const YEAR_MAX = 2100;

export type ParsedQuery = {
	/** Words to find, folded; numbers read as years are not among them. */
	words: string[];
	/** Four-digit model years typed ("2012"). */
	years: number[];
	/** Two-digit numbers read as model years ("12" → 2012), with the word as typed in case no page has that year. */
	shortYears: { word: string; year: number }[];
};

/**
 * A two-digit year as the latest year with those digits that is at most one year ahead of `referenceYear`
 * (common practice for two-digit model years); null when that falls before the years pages cover.
 */
export function twoDigitYear(digits: number, referenceYear: number): number | null {
	if (!Number.isInteger(digits) || digits < 0 || digits > 99) return null;
	const century = Math.floor((referenceYear + 1) / 100) * 100;
	let year = century + digits;
	if (year > referenceYear + 1) year -= 100;
	return year >= YEAR_MIN && year <= YEAR_MAX ? year : null;
}

/** True for 1–3 digits that could still grow into a model year as someone types ("2", "20", "201"). */
function couldBecomeYear(word: string): boolean {
	if (!/^\d{1,3}$/.test(word)) return false;
	const low = Number(word.padEnd(4, '0'));
	const high = Number(word.padEnd(4, '9'));
	return high >= YEAR_MIN && low <= YEAR_MAX;
}

export function parseSearchQuery(raw: string, referenceYear: number): ParsedQuery {
	const tokens = searchWords(raw);
	const endsMidWord = raw.length > 0 && !/\s$/.test(raw);
	const words: string[] = [];
	const years: number[] = [];
	const shortYears: { word: string; year: number }[] = [];
	tokens.forEach((token, i) => {
		if (/^\d{4}$/.test(token)) {
			const n = Number(token);
			if (n >= YEAR_MIN && n <= YEAR_MAX) {
				years.push(n);
				return;
			}
		}
		if (/^\d{2}$/.test(token)) {
			const year = twoDigitYear(Number(token), referenceYear);
			if (year !== null) {
				shortYears.push({ word: token, year });
				return;
			}
		}
		// A year half typed at the end of the box is not yet a word to look for.
		if (i === tokens.length - 1 && endsMidWord && couldBecomeYear(token)) return;
		words.push(token);
	});
	return { words, years, shortYears };
}

export type VinShape = { vin: string; problem: string | null };

/**
 * Whether what was typed is meant as a VIN: one code (or up to three groups, as printed on some labels)
 * of 15–19 letters and digits with at least three digits and three letters. Close misses are kept
 * so the reason can be shown ("this one has 16 characters").
 */
export function vinShape(raw: string): VinShape | null {
	const trimmed = raw.trim();
	if (!trimmed || trimmed.split(/[\s-]+/).length > 3) return null;
	const vin = normalizeVin(trimmed);
	if (!/^[A-Z0-9]+$/.test(vin)) return null;
	if (vin.length < VIN_LENGTH - 2 || vin.length > VIN_LENGTH + 2) return null;
	const digits = vin.replace(/[^0-9]/g, '').length;
	const letters = vin.length - digits;
	if (digits < 3 || letters < 3) return null;
	return { vin, problem: vinProblem(vin) };
}
