import { z } from 'zod';
import { AMP_CLASS_EFFICIENCY, type AmpClass } from './power';
import type { Box } from './fit';
import { partSizeMm } from './sizeInputs';
import { MM_PER_INCH, parseLength, type LengthUnit } from './units';

// A product in the shop's catalogue. Sizes are stored in mm; every kind keeps the figures its
// own check needs: a box for amplifiers and enclosures, DIN size and chassis depth for head
// units, cut-out and mounting depth for speakers.

export const PART_KINDS = ['amplifier', 'head-unit', 'speaker', 'enclosure'] as const;
export type PartKind = (typeof PART_KINDS)[number];
export const PART_KIND_NAMES: Readonly<Record<PartKind, string>> = {
	amplifier: 'Amplifier',
	'head-unit': 'Head unit',
	speaker: 'Speaker',
	enclosure: 'Enclosure'
};
export const PART_KIND_PLURALS: Readonly<Record<PartKind, string>> = {
	amplifier: 'Amplifiers',
	'head-unit': 'Head units',
	speaker: 'Speakers',
	enclosure: 'Enclosures'
};

export const AMP_CLASSES = ['A/B', 'D'] as const;
export type AmplifierClass = (typeof AMP_CLASSES)[number];

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

/** The outside box a seat-space check uses, or null for a kind that is not checked against a seat. */
export function partBox(part: PartData): Box | null {
	if (part.kind === 'amplifier' || part.kind === 'enclosure') return { l: part.lengthMm, w: part.widthMm, h: part.heightMm };
	return null;
}

/** Which check a part takes: against a seat space, the dash opening, or a speaker location. */
export function partCheck(kind: PartKind): 'seat' | 'dash' | 'speaker' {
	return kind === 'head-unit' ? 'dash' : kind === 'speaker' ? 'speaker' : 'seat';
}

const CLASS_KEY: Readonly<Record<AmplifierClass, AmpClass>> = { 'A/B': 'AB', D: 'D' };

/** The amplifier's own efficiency when the catalogue has it, else the typical figure for its class. */
export function amplifierEfficiency(part: Pick<Amplifier, 'ampClass' | 'efficiency'>): number {
	return part.efficiency ?? AMP_CLASS_EFFICIENCY[CLASS_KEY[part.ampClass]];
}

// ---- The catalogue form: every field is typed text ----

// An amplifier's form fields, in form order.
const AMPLIFIER_FIELDS = [
	'lengthMm',
	'widthMm',
	'heightMm',
	'channels',
	'rmsWattsPerChannel',
	'ampClass',
	'efficiency',
	'fuseRatingA',
	'rms4OhmW',
	'rms2OhmW',
	'rms1OhmW',
	'minLoadOhm',
	'bridgeable',
	'bridgedRmsW'
] as const;

/** Form field names; lengths take mm or inches ("3.5 in"), a bare number in the form's unit. */
export const PART_FIELDS = [
	'kind',
	'sku',
	'name',
	...AMPLIFIER_FIELDS,
	'dinSize',
	'chassisDepthMm',
	'nominalSize',
	'cutoutMm',
	'mountingDepthMm',
	'impedanceOhm',
	'voiceCoils',
	'ohmsPerCoil',
	'notes'
] as const;
export type PartField = (typeof PART_FIELDS)[number];
export type PartFormValues = Record<PartField, string>;

const LENGTH_FIELDS: ReadonlySet<PartField> = new Set(['lengthMm', 'widthMm', 'heightMm', 'chassisDepthMm', 'cutoutMm', 'mountingDepthMm']);
/** Yes/no fields: the form sends "yes" or "no". */
const YES_NO_FIELDS: ReadonlySet<PartField> = new Set(['bridgeable']);
const TEXT_FIELDS: ReadonlySet<PartField> = new Set(['kind', 'sku', 'name', 'ampClass', 'nominalSize', 'notes']);
/** Every other field is a plain number: watts, ohms, amps, counts. */
const NUMBER_FIELDS: ReadonlySet<PartField> = new Set(PART_FIELDS.filter((f) => !LENGTH_FIELDS.has(f) && !YES_NO_FIELDS.has(f) && !TEXT_FIELDS.has(f)));

const NUMBER = /^[+-]?(\d+(\.\d+)?|\.\d+)$/;

export function emptyPartForm(kind: PartKind = 'amplifier'): PartFormValues {
	const values = Object.fromEntries(PART_FIELDS.map((f) => [f, ''])) as PartFormValues;
	values.kind = kind;
	values.ampClass = 'D';
	values.dinSize = '1';
	values.bridgeable = 'no';
	values.voiceCoils = '1';
	return values;
}

const trimmed = (n: number, decimals: number) => String(Number(n.toFixed(decimals)));

/** A stored part as form text, lengths in the given unit; enough digits that saving unchanged changes nothing visible. */
export function partFormValues(part: PartData, unit: LengthUnit = 'mm'): PartFormValues {
	const values = emptyPartForm(part.kind);
	for (const [key, value] of Object.entries(part) as [string, unknown][]) {
		if (!(PART_FIELDS as readonly string[]).includes(key) || value === null || value === undefined) continue;
		const field = key as PartField;
		values[field] =
			typeof value === 'boolean'
				? value
					? 'yes'
					: 'no'
				: LENGTH_FIELDS.has(field) && typeof value === 'number'
				? unit === 'mm'
					? trimmed(value, 3)
					: trimmed(value / MM_PER_INCH, 4)
				: String(value);
	}
	return values;
}

export type PartFormResult = { ok: true; part: PartData } | { ok: false; errors: Partial<Record<PartField | 'form', string>> };

/** Reads the catalogue form: typed text to a validated part, or one message per field. */
export function readPartForm(values: Partial<Record<string, string>>, unit: LengthUnit = 'mm'): PartFormResult {
	const errors: Partial<Record<PartField | 'form', string>> = {};
	const raw: Record<string, unknown> = {};
	const kind = (values.kind ?? '').trim();
	// Only the chosen kind's fields are read: a form shows every kind's fields until a script hides them.
	const used: readonly PartField[] = (PART_KINDS as readonly string[]).includes(kind) ? [...COMMON_FIELDS, ...KIND_FIELDS[kind as PartKind]] : PART_FIELDS;
	for (const field of used) {
		const text = (values[field] ?? '').trim();
		if (YES_NO_FIELDS.has(field)) {
			if (text === 'yes' || text === 'on' || text === 'true') raw[field] = true;
			else if (text === 'no' || text === '' || text === 'false') raw[field] = false;
			else errors[field] = `${FIELD_LABELS[field]} must be yes or no.`;
		} else if (LENGTH_FIELDS.has(field) || NUMBER_FIELDS.has(field)) {
			if (text === '') continue;
			if (LENGTH_FIELDS.has(field)) {
				try {
					raw[field] = parseLength(text, unit);
				} catch (e) {
					errors[field] = (e as Error).message;
				}
			} else if (NUMBER.test(text)) {
				raw[field] = Number(text);
			} else {
				errors[field] = `"${text}" is not a number.`;
			}
		} else {
			raw[field] = text;
		}
	}
	const parsed = partInputSchema.safeParse(raw);
	if (!parsed.success) {
		for (const issue of parsed.error.issues) {
			const key = (issue.path[0] as PartField | undefined) ?? 'form';
			// A field the chosen kind does not use is never required, so a missing one reads "is required".
			errors[key] ??= issue.code === 'invalid_type' && raw[key as string] === undefined ? requiredMessage(key) : issue.message;
		}
	}
	if (Object.keys(errors).length > 0 || !parsed.success) return { ok: false, errors };
	return { ok: true, part: parsed.data };
}

const FIELD_LABELS: Readonly<Record<PartField | 'form', string>> = {
	form: 'This form',
	kind: 'Kind',
	sku: 'SKU',
	name: 'Name',
	lengthMm: 'Length',
	widthMm: 'Width',
	heightMm: 'Height',
	channels: 'Channels',
	rmsWattsPerChannel: 'RMS power per channel',
	ampClass: 'Amplifier class',
	efficiency: 'Efficiency',
	fuseRatingA: 'Own fuses (A)',
	rms4OhmW: 'RMS per channel at 4 Ω',
	rms2OhmW: 'RMS per channel at 2 Ω',
	rms1OhmW: 'RMS per channel at 1 Ω',
	minLoadOhm: 'Minimum load per channel',
	bridgeable: 'Bridgeable',
	bridgedRmsW: 'Bridged RMS at 4 Ω',
	dinSize: 'DIN size',
	chassisDepthMm: 'Chassis depth',
	nominalSize: 'Nominal size',
	cutoutMm: 'Cut-out diameter',
	mountingDepthMm: 'Mounting depth',
	impedanceOhm: 'Impedance',
	voiceCoils: 'Voice coils',
	ohmsPerCoil: 'Impedance per voice coil',
	notes: 'Notes'
};

export const partFieldLabel = (field: PartField): string => FIELD_LABELS[field];

function requiredMessage(field: PartField | 'form'): string {
	return field === 'kind' ? `Choose a kind: ${PART_KINDS.map((k) => PART_KIND_NAMES[k]).join(', ')}.` : `${FIELD_LABELS[field]} is required for this kind of part.`;
}

const COMMON_FIELDS: readonly PartField[] = ['kind', 'sku', 'name', 'notes'];

/**
 * The posted form as field values: common fields by name, a kind's own fields as
 * "<kind>.<field>" (each kind has its own inputs, so the chosen kind's win).
 */
export function partFieldsFromForm(entries: Iterable<[string, FormDataEntryValue]>): Partial<PartFormValues> {
	const all = new Map<string, string>();
	for (const [k, v] of entries) if (typeof v === 'string') all.set(k, v);
	const kind = all.get('kind') ?? '';
	const out: Partial<PartFormValues> = {};
	for (const f of COMMON_FIELDS) out[f] = all.get(f) ?? '';
	if ((PART_KINDS as readonly string[]).includes(kind)) {
		for (const f of KIND_FIELDS[kind as PartKind]) out[f] = all.get(`${kind}.${f}`) ?? all.get(f) ?? '';
	}
	return out;
}

/** Which form fields a kind uses, in form order. */
export const KIND_FIELDS: Readonly<Record<PartKind, readonly PartField[]>> = {
	amplifier: AMPLIFIER_FIELDS,
	'head-unit': ['dinSize', 'chassisDepthMm', 'lengthMm', 'widthMm', 'heightMm'],
	speaker: ['nominalSize', 'cutoutMm', 'mountingDepthMm', 'impedanceOhm', 'voiceCoils', 'ohmsPerCoil'],
	enclosure: ['lengthMm', 'widthMm', 'heightMm']
};

/** The rated loads an amplifier's figures are given at, highest first: RMS watts per channel at each. */
export function ratedLoads(part: Pick<Amplifier, 'rms4OhmW' | 'rms2OhmW' | 'rms1OhmW'>): { ohms: number; watts: number }[] {
	const rows: { ohms: number; watts: number | null }[] = [
		{ ohms: 4, watts: part.rms4OhmW },
		{ ohms: 2, watts: part.rms2OhmW },
		{ ohms: 1, watts: part.rms1OhmW }
	];
	return rows.filter((r): r is { ohms: number; watts: number } => r.watts !== null);
}

/** A speaker's coils: the recorded figures, else one coil at its nominal impedance; null when neither is known. */
export function speakerCoils(part: Pick<Speaker, 'voiceCoils' | 'ohmsPerCoil' | 'impedanceOhm'>): { coils: 1 | 2; ohmsPerCoil: number } | null {
	const perCoil = part.ohmsPerCoil ?? (part.voiceCoils === 1 ? part.impedanceOhm : null);
	return perCoil === null ? null : { coils: part.voiceCoils, ohmsPerCoil: perCoil };
}

/** The catalogue's one-line description: "260 × 180 × 55 mm, 2 × 75 W". */
export function partSummary(part: PartData): string {
	const box = (p: { lengthMm: number | null; widthMm: number | null; heightMm: number | null }) =>
		p.lengthMm && p.widthMm && p.heightMm ? `${trimmed(p.lengthMm, 1)} × ${trimmed(p.widthMm, 1)} × ${trimmed(p.heightMm, 1)} mm` : null;
	switch (part.kind) {
		case 'amplifier':
			return `${box(part)}, ${part.channels} × ${trimmed(part.rmsWattsPerChannel, 1)} W RMS, class ${part.ampClass}`;
		case 'head-unit':
			return `${part.dinSize === 1 ? 'Single' : 'Double'} DIN, ${trimmed(part.chassisDepthMm, 1)} mm chassis depth`;
		case 'speaker':
			return [
				part.nominalSize,
				`${trimmed(part.cutoutMm, 1)} mm cut-out`,
				`${trimmed(part.mountingDepthMm, 1)} mm deep`,
				part.voiceCoils === 2 ? `dual ${part.ohmsPerCoil ?? '?'} Ω coils` : part.impedanceOhm ? `${part.impedanceOhm} Ω` : null
			]
				.filter(Boolean)
				.join(', ');
		case 'enclosure':
			return box(part) ?? '';
	}
}
