import { z } from 'zod';
import { AMP_CLASSES, PART_KIND_NAMES, PART_KINDS } from './partKinds';
import { partSizeMm } from './sizeInputs';

// The rule a catalogue part is saved by; the types of a stored part come from it.

const SKU = /^[A-Za-z0-9][A-Za-z0-9._/-]*$/;

const sku = z
	.string({ error: 'SKU must be text.' })
	.trim()
	.min(1, 'Give the part its SKU (the shop code on the box).')
	.max(60, 'Keep the SKU under 60 characters.')
	.regex(SKU, 'A SKU is letters and digits, with ".", "-", "_" or "/" between them.');

const name = z
	.string({ error: 'Name must be text.' })
	.trim()
	.min(1, 'Give the part a name a customer would recognise.')
	.max(160, 'Keep the name under 160 characters.');

const notes = z.string({ error: 'Notes must be text.' }).trim().max(2000, 'Keep the notes under 2000 characters.').default('');

const mm = partSizeMm;

const optionalMm = (what: string) => mm(what).nullable().default(null);

/** A rated power per channel at one load, as the maker prints it; empty when not rated there. */
const ratedWatts = (what: string) =>
	z
		.number({ error: `${what} must be a number of watts.` })
		.positive(`${what} must be more than 0 W.`)
		.max(10_000, `${what} over 10,000 W looks like a typo.`)
		.nullable()
		.default(null);

const ohms = (what: string, max: number) =>
	z
		.number({ error: `${what} must be a number of ohms.` })
		.positive(`${what} must be more than 0 Ω.`)
		.max(max, `${what} over ${max} Ω looks like a typo.`)
		.nullable()
		.default(null);

const common = {
	sku,
	name,
	notes
};

const amplifier = z.object({
	kind: z.literal('amplifier'),
	...common,
	lengthMm: mm('Length'),
	widthMm: mm('Width'),
	heightMm: mm('Height'),
	channels: z
		.number({ error: 'Channels must be a whole number.' })
		.int('Channels must be a whole number.')
		.min(1, 'An amplifier has at least 1 channel.')
		.max(16, 'More than 16 channels looks like a typo.'),
	rmsWattsPerChannel: z
		.number({ error: 'RMS power per channel must be a number of watts.' })
		.positive('RMS power per channel must be more than 0 W.')
		.max(10_000, 'RMS power over 10,000 W per channel looks like a typo.'),
	ampClass: z.enum(AMP_CLASSES, { error: 'Amplifier class must be A/B or D.' }),
	efficiency: z
		.number({ error: 'Efficiency must be a number between 0 and 1, for example 0.8.' })
		.gt(0, 'Efficiency must be more than 0.')
		.max(1, 'Efficiency cannot be more than 1 (100 %).')
		.nullable()
		.default(null),
	/** The amplifier's own fuses added up, as printed on it; the feed's fuse is never smaller. */
	fuseRatingA: z
		.number({ error: "The amplifier's fuse rating must be a number of amps." })
		.positive("The amplifier's fuse rating must be more than 0 A.")
		.max(500, 'An amplifier fuse rating over 500 A looks like a typo.')
		.nullable()
		.default(null),
	/** RMS watts per channel at each rated load, as printed by the maker. */
	rms4OhmW: ratedWatts('RMS per channel at 4 Ω'),
	rms2OhmW: ratedWatts('RMS per channel at 2 Ω'),
	rms1OhmW: ratedWatts('RMS per channel at 1 Ω'),
	/** The lowest load per channel the maker says the amplifier drives safely. */
	minLoadOhm: ohms('Minimum load', 16),
	bridgeable: z.boolean({ error: 'Bridgeable must be yes or no.' }).default(false),
	/** The maker's bridged RMS figure, rated into 4 Ω bridged. */
	bridgedRmsW: ratedWatts('Bridged RMS at 4 Ω')
});

const headUnit = z.object({
	kind: z.literal('head-unit'),
	...common,
	dinSize: z.union([z.literal(1), z.literal(2)], { error: 'DIN size must be 1 (single DIN) or 2 (double DIN).' }),
	chassisDepthMm: mm('Chassis depth', 500),
	lengthMm: optionalMm('Length'),
	widthMm: optionalMm('Width'),
	heightMm: optionalMm('Height')
});

const speaker = z.object({
	kind: z.literal('speaker'),
	...common,
	nominalSize: z.string({ error: 'Nominal size must be text.' }).trim().max(40, 'Keep the nominal size under 40 characters.').default(''),
	cutoutMm: mm('Cut-out diameter', 500),
	mountingDepthMm: mm('Mounting depth', 300),
	impedanceOhm: z
		.number({ error: 'Impedance must be a number of ohms.' })
		.positive('Impedance must be more than 0 Ω.')
		.max(32, 'Impedance over 32 Ω looks like a typo.')
		.nullable()
		.default(null),
	/** Single (1) or dual (2) voice coil; a dual-coil driver has two pairs of terminals. */
	voiceCoils: z
		.union([z.literal(1), z.literal(2)], { error: 'Voice coils must be 1 (single) or 2 (dual).' })
		.default(1),
	ohmsPerCoil: ohms('Impedance per voice coil', 32)
});

const enclosure = z.object({
	kind: z.literal('enclosure'),
	...common,
	lengthMm: mm('Length'),
	widthMm: mm('Width'),
	heightMm: mm('Height')
});

export const partInputSchema = z.discriminatedUnion('kind', [amplifier, headUnit, speaker, enclosure], {
	error: `Kind must be one of: ${PART_KINDS.map((k) => PART_KIND_NAMES[k]).join(', ')}.`
});
export type PartInput = z.input<typeof partInputSchema>;
export type PartData = z.output<typeof partInputSchema>;
export type Part = PartData & { id: number };
export type Amplifier = Extract<Part, { kind: 'amplifier' }>;
export type HeadUnit = Extract<Part, { kind: 'head-unit' }>;
export type Speaker = Extract<Part, { kind: 'speaker' }>;
