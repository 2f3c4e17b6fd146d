import { z } from 'zod';
import { allowanceWords, CLEARANCE_MM, MAX_DIMENSION_MM, partSizeWords } from './sizeRules';

// The size limits of sizeRules.ts, in its words, as rules for forms and endpoints.

/** A part's size in mm: more than 0, at most `max`. */
export const partSizeMm = (what: string, max = MAX_DIMENSION_MM) => {
	const words = partSizeWords(what, max);
	return z.number({ error: words.type }).positive(words.low).max(max, words.high);
};

/** A clearance or tight threshold in mm, within CLEARANCE_MM. */
export const allowanceMm = (what: string) => {
	const words = allowanceWords(what);
	return z.number({ error: words.type }).min(CLEARANCE_MM.min, words.low).max(CLEARANCE_MM.max, words.high);
};
