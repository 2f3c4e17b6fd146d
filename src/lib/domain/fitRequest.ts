import { z } from 'zod';
import { FIT_BOX, FIT_SPACE } from './fit';
import { schemaOf } from './ruleSchema';
import { DEFAULT_CLEARANCE_MM, DEFAULT_TIGHT_MM } from './sizeRules';
import { allowanceMm, partSizeMm } from './sizeInputs';

// What a fit question may ask, as the service and the endpoint read it.

export const boxSchema = z.object(
	{ l: partSizeMm('Part length'), w: partSizeMm('Part width'), h: partSizeMm('Part height') },
	{ error: 'The box needs a length, width and height in millimetres: { l, w, h }.' }
);

/** Clearance and tight threshold for the reverse scan ("which vehicles does this fit"). */
export const reverseOptionsSchema = z.object({
	clearanceMm: allowanceMm('Clearance').default(DEFAULT_CLEARANCE_MM),
	tightMm: allowanceMm('A tight threshold').default(DEFAULT_TIGHT_MM)
});
export type ReverseOptions = z.input<typeof reverseOptionsSchema>;

/** Which vehicle page a request is about, by its slug. */
export const pageSlugSchema = z.string({ error: 'Say which vehicle page (its slug).' }).trim().min(1, 'Say which vehicle page (its slug).').max(160);

/** A catalogue part by its number. */
export const catalogueIdSchema = z.number({ error: 'partId must be the number of a catalogue part.' }).int('partId must be a whole number.').positive('partId must be the number of a catalogue part.');

/** A catalogue part or a typed box against one vehicle page. */
export const vehicleFitSchema = z
	.object({
		vehicle: pageSlugSchema,
		partId: catalogueIdSchema.optional(),
		box: boxSchema.optional(),
		seat: z.string({ error: 'seat must be text, e.g. "passenger".' }).trim().max(64).optional(),
		location: z.string({ error: 'location must be a speaker location id.' }).trim().max(64).optional(),
		clearanceMm: allowanceMm('Clearance').optional()
	})
	.refine((v) => v.partId !== undefined || v.box !== undefined, { message: 'Give a catalogue part (partId) or a box ({ l, w, h } in mm).', path: ['partId'] });
export type VehicleFitRequest = z.input<typeof vehicleFitSchema>;

// ---- The endpoint's bodies and query ----

const marginMm = allowanceMm('marginMm').optional();

/** POST /api/fit with a typed space: a box against it, no vehicle page. */
export const boxAgainstSpaceSchema = z.object({
	box: schemaOf(FIT_BOX),
	space: schemaOf(FIT_SPACE),
	marginMm,
	tightMm: marginMm
});

/** POST /api/fit against a page; `marginMm` is the older name of `clearanceMm`. */
export const againstPageSchema = vehicleFitSchema.safeExtend({ marginMm });

/** GET /api/fit?partId=3 or ?l=300&w=200&h=50 (query text, so numbers are coerced). */
export const reverseQuerySchema = z.union([
	z.object({ partId: z.coerce.number({ error: 'partId must be a catalogue part number.' }).int().positive('partId must be a catalogue part number.') }),
	z.object({ l: z.coerce.number().pipe(partSizeMm('l')), w: z.coerce.number().pipe(partSizeMm('w')), h: z.coerce.number().pipe(partSizeMm('h')) })
]);
