import { z } from 'zod';
import { ENCLOSURE_BOX, LOAD_OPENING, measuredSide } from './bootFit';
import { object, optional } from './figureRules';
import { catalogueIdSchema, pageSlugSchema } from './fitRequest';
import { schemaOf } from './ruleSchema';
import { allowanceMm, partSizeMm } from './sizeInputs';

// What the enclosure endpoint and service may be asked, read with the boot check's own rules.

/** An enclosure's outside size in mm; `lTop` for a wedge. */
export const enclosureBoxSchema = schemaOf(ENCLOSURE_BOX);

/** POST /api/fit/enclosure with the figures typed: a box, a load opening and a boot space. */
export const enclosureAgainstSpaceSchema = z.object({
	box: enclosureBoxSchema,
	opening: schemaOf(LOAD_OPENING),
	space: schemaOf(
		object({
			l: measuredSide('Boot floor length'),
			w: measuredSide('Boot floor width'),
			h: measuredSide('Boot height'),
			lTop: optional(measuredSide('Boot depth at the top')),
			archW: optional(measuredSide('Width between the wheel arches'))
		})
	),
	marginMm: allowanceMm('Clearance').optional(),
	tightMm: allowanceMm('Tight threshold').optional()
});
export type EnclosureAgainstSpace = z.output<typeof enclosureAgainstSpaceSchema>;

/** A catalogue enclosure or a typed box against one vehicle page's boot. */
export const enclosureAgainstPageSchema = z
	.object({
		vehicle: pageSlugSchema,
		partId: catalogueIdSchema.optional(),
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
		z.object({ l: z.coerce.number().pipe(partSizeMm('Box depth')), w: z.coerce.number().pipe(partSizeMm('Box width')), h: z.coerce.number().pipe(partSizeMm('Box height')), lTop: z.coerce.number().pipe(partSizeMm('Box depth at the top')).optional() })
	],
	{ error: 'Give partId, or l, w and h (and lTop for a wedge) in millimetres.' }
);
