import { z } from 'zod';
import { CLEARANCE_MM, looksLikeATypo, MAX_DIMENSION_MM } from './sizeRules';

// The size limits of sizeRules.ts as rules for forms and endpoints.

/** A part's size in mm: more than 0, at most `max`. */
export const partSizeMm = (what: string, max = MAX_DIMENSION_MM) =>
	z
		.number({ error: `${what} must be a number of millimetres.` })
		.positive(`${what} must be more than 0 mm.`)
		.max(max, `${looksLikeATypo(what, `${max} mm`)}; sizes are in millimetres.`);

/** A clearance or tight threshold in mm, within CLEARANCE_MM. */
export const allowanceMm = (what: string) =>
	z
		.number({ error: `${what} must be a number of millimetres.` })
		.min(CLEARANCE_MM.min, `${what} cannot be negative.`)
		.max(CLEARANCE_MM.max, `${looksLikeATypo(what, `${CLEARANCE_MM.max} mm`)}.`);
