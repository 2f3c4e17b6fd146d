import { AMP_CLASS_EFFICIENCY, type AmpClass } from './power';
import type { Box } from './fit';
import type { Amplifier, PartData, Speaker } from './partSchema';
import { PART_KINDS, type AmplifierClass, type PartKind } from './partKinds';
import { MM_PER_INCH, type LengthUnit } from './units';

// A product in the shop's catalogue. Sizes are stored in mm; every kind keeps the figures its
// own check needs: a box for amplifiers and enclosures, DIN size and chassis depth for head
// units, cut-out and mounting depth for speakers.

export * from './partKinds';
export type { Amplifier, HeadUnit, Part, PartData, PartInput, Speaker } from './partSchema';

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

export const LENGTH_FIELDS: ReadonlySet<PartField> = new Set(['lengthMm', 'widthMm', 'heightMm', 'chassisDepthMm', 'cutoutMm', 'mountingDepthMm']);
/** Yes/no fields: the form sends "yes" or "no". */
export const YES_NO_FIELDS: ReadonlySet<PartField> = new Set(['bridgeable']);
export const TEXT_FIELDS: ReadonlySet<PartField> = new Set(['kind', 'sku', 'name', 'ampClass', 'nominalSize', 'notes']);
/** Every other field is a plain number: watts, ohms, amps, counts. */
export const NUMBER_FIELDS: ReadonlySet<PartField> = new Set(PART_FIELDS.filter((f) => !LENGTH_FIELDS.has(f) && !YES_NO_FIELDS.has(f) && !TEXT_FIELDS.has(f)));

export const NUMBER = /^[+-]?(\d+(\.\d+)?|\.\d+)$/;

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

export const FIELD_LABELS: Readonly<Record<PartField | 'form', string>> = {
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

export const COMMON_FIELDS: readonly PartField[] = ['kind', 'sku', 'name', 'notes'];

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
