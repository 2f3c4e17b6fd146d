import { z } from 'zod';
import { fieldRegistry } from './fieldRules';
import type { EditHint, FieldInfo, ListInfo, PageRules, SearchHint } from './fieldTree';
import { SEARCH_LINES } from './searchLines';
import { FIELD_INFO, VEHICLE_FIELDS } from './vehicleFields';
import { MAX_MEASURED_MM, MAX_RUN_M } from '../sizeRules';
import {
	BATTERY_LOCATION_NAMES,
	BATTERY_LOCATIONS,
	BODY_STYLE_NAMES,
	BODY_STYLES,
	DASH_OPENING_NAMES,
	DASH_OPENINGS,
	FEED_KIND_NAMES,
	FEED_KINDS,
	PASSAGE_KIND_NAMES,
	PASSAGE_KINDS,
	PUSH_SIDE_NAMES,
	PUSH_SIDES,
	SEAT_NAMES,
	SEATS,
	SECTION_KEYS,
	SECTION_NAMES,
	type SectionKey
} from './vocabulary';

// One vehicle page as stored in a revision. Units are metric: mm for spaces and
// parts, m for cable runs, Ω for resistance and impedance, A for fuses.

export const CONTENT_SCHEMA_VERSION = 1;

export * from './vocabulary';
export { newItemId } from './itemId';
export { canonicalJson } from './canonicalJson';
export type { FieldInfo, FieldKind } from './fieldTree';

const capital = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

/** Hints for the editor and the search document, kept beside the rule. */
interface Show {
	edit?: EditHint;
	search?: SearchHint;
}

function leaf<T extends z.ZodType>(info: FieldInfo, schema: T): T {
	fieldRegistry.add(schema as z.ZodType, info);
	return schema;
}

export function text(label: string, max = 300, show: Show = {}) {
	const L = capital(label);
	return leaf(
		{ label, kind: 'text', ...show },
		z
			.string({ error: `${L} must be text.` })
			.trim()
			.max(max, { error: `${L} is too long: keep it under ${max} characters.` })
			.default('')
	);
}

/** Free text a person writes in several lines: obstacles, things to avoid. */
const longText = (label: string, max: number, show: Show = {}) => text(label, max, { ...show, edit: { multiline: true, ...show.edit } });

function requiredText(label: string, max = 80, show: Show = {}) {
	const L = capital(label);
	return leaf(
		{ label, kind: 'text', ...show },
		z
			.string({ error: (iss) => (iss.input === undefined ? `${L} is required.` : `${L} must be text.`) })
			.trim()
			.min(1, { error: `${L} is required.` })
			.max(max, { error: `${L} is too long: keep it under ${max} characters.` })
	);
}

const NOTES_MAX = 20_000;

export function notes(label: string) {
	return leaf(
		{ label, kind: 'markdown' },
		z
			.string({ error: `${capital(label)} must be text (Markdown).` })
			.max(NOTES_MAX, { error: `${capital(label)} are too long: keep them under ${NOTES_MAX} characters.` })
			.default('')
	);
}

function textList(label: string, itemLabel: string, show: Show & { maxItems?: number; maxLength?: number } = {}) {
	const { maxItems = 50, maxLength = 300, ...hints } = show;
	const L = capital(itemLabel);
	return leaf(
		{ label, kind: 'textList', ...hints },
		z
			.array(
				z
					.string({ error: `${L} must be text.` })
					.trim()
					.min(1, { error: `${L} cannot be empty; remove it instead.` })
					.max(maxLength, { error: `${L} is too long: keep it under ${maxLength} characters.` }),
				{ error: `${capital(label)} must be a list.` }
			)
			.max(maxItems, { error: `${capital(label)}: at most ${maxItems} entries.` })
			.default([])
	);
}

interface MeasureRule {
	unit: string;
	/** Smallest allowed value; `inclusive` says whether it may be equal. */
	min: number;
	inclusive: boolean;
	max: number;
	missing: string;
}

const MM: MeasureRule = { unit: 'mm', min: 0, inclusive: false, max: MAX_MEASURED_MM, missing: 'leave it empty if not measured' };

function measure(label: string, kind: 'mm' | 'm' | 'ohm' | 'amp', rule: MeasureRule, show: Show = {}) {
	const L = capital(label);
	const above = rule.inclusive ? `at least ${rule.min} ${rule.unit}` : `more than ${rule.min} ${rule.unit}`;
	const n = z.number({ error: `${L} must be a number in ${rule.unit}, or ${rule.missing}.` });
	const bounded = (rule.inclusive ? n.min(rule.min, { error: `${L} must be ${above}.` }) : n.gt(rule.min, { error: `${L} must be ${above}.` })).max(
		rule.max,
		{ error: `${L} must be at most ${rule.max} ${rule.unit}; check the unit.` }
	);
	return leaf({ label, kind, ...show }, bounded.nullable().default(null));
}

/** A space or part dimension, stored in mm and typed in mm or inches. */
export const mm = (label: string, show: Show = {}, max = MM.max) => measure(label, 'mm', { ...MM, max }, show);

function year(label: string) {
	const L = capital(label);
	return leaf(
		{ label, kind: 'year' },
		z
			.number({ error: (iss) => (iss.input === undefined ? `${L} is required.` : `${L} must be a year, for example 2012.`) })
			.int({ error: `${L} must be a whole year, for example 2012.` })
			.min(1950, { error: `${L} must be 1950 or later.` })
			.max(2100, { error: `${L} must be 2100 or earlier.` })
	);
}

function flag(label: string, show: Show = {}) {
	return leaf({ label, kind: 'flag', ...show }, z.boolean({ error: `${capital(label)} must be yes or no.` }));
}

function choice<const T extends readonly [string, ...string[]]>(
	label: string,
	values: T,
	names: Readonly<Record<T[number], string>>,
	show: Show = {}
) {
	return leaf(
		{ label, kind: 'choice', choices: names, ...show },
		z.enum(values, { error: `${capital(label)} must be one of: ${values.map((v) => names[v as T[number]]).join(', ')}.` })
	);
}

const ITEM_ID = /^[A-Za-z0-9_-]{1,64}$/;
const itemId = z
	.string({ error: 'Each entry needs an id.' })
	.regex(ITEM_ID, { error: 'An entry id is 1 to 64 letters, digits, "-" or "_".' });

/** A list of entries, each with its own id, so edits can be merged entry by entry. */
export function entries<T extends z.ZodType<{ id: string }>>(item: T, what: string, list: Omit<ListInfo, 'kind'>, max = 100) {
	return z
		.array(item, { error: `${capital(what)} must be a list.` })
		.max(max, { error: `${capital(what)}: at most ${max} entries.` })
		.superRefine((entries, ctx) => {
			const seen = new Set<string>();
			entries.forEach((entry, i) => {
				if (seen.has(entry.id)) {
					ctx.addIssue({ code: 'custom', path: [i, 'id'], message: `Two ${what} share the id "${entry.id}".` });
				}
				seen.add(entry.id);
			});
		})
		.default([])
		.register(fieldRegistry, { kind: 'list', ...list });
}

function section<T extends z.ZodRawShape>(name: string, shape: T) {
	return z.strictObject(shape, {
		error: (iss) =>
			iss.code === 'unrecognized_keys'
				? `${name} has fields this page version does not know: ${iss.keys.join(', ')}.`
				: iss.input === undefined
					? `${name} is required.`
					: `${name} must be a group of fields.`
	});
}

/** One section of the page, named for the editor and the history. */
export function pageSection<T extends z.ZodRawShape>(key: SectionKey, shape: T, hint?: string) {
	const label = SECTION_NAMES[key];
	const schema = section(label, shape);
	fieldRegistry.add(schema, { kind: 'page-section', label, hint });
	return schema;
}

// A VIN position is 0-9 or A-Z without I, O, Q (ISO 3779); * and ? are wildcards.
const VIN_PATTERN = /^[A-HJ-NPR-Z0-9*?]{1,17}$/;

const vinPatterns = leaf(
	{
		label: 'VIN patterns',
		kind: 'textList',
		edit: { label: 'VIN patterns (* or ? for any character)', noun: 'VIN pattern' },
		search: false
	},
	z
		.array(
			z
				.string({ error: 'A VIN pattern must be text.' })
				.trim()
				.toUpperCase()
				.regex(VIN_PATTERN, {
					error: 'A VIN pattern is up to 17 VIN characters (0-9, A-Z without I, O, Q) with * or ? as wildcards.'
				}),
			{ error: 'VIN patterns must be a list.' }
		)
		.max(50, { error: 'VIN patterns: at most 50 entries.' })
		.default([])
);

// Make, model and aliases are indexed as identity words, so the search document leaves them out.
export const identitySchema = section('Identity', {
	make: requiredText('make', 80, { search: false }),
	model: requiredText('model', 80, { search: false }),
	yearFrom: year('first model year'),
	yearTo: year('last model year'),
	body: choice('body style', BODY_STYLES, BODY_STYLE_NAMES, { edit: { label: 'Body' } }),
	market: text('market / region', 200),
	aliases: textList('also sold as', 'an alias', { maxItems: 30, maxLength: 120, edit: { noun: 'name' }, search: false }),
	vinPatterns,
	notes: notes('identity notes')
}).superRefine((identity, ctx) => {
	if (identity.yearTo < identity.yearFrom) {
		ctx.addIssue({
			code: 'custom',
			path: ['yearTo'],
			message: `The last model year (${identity.yearTo}) is before the first (${identity.yearFrom}).`
		});
	}
});

const powerRun = section('A power run', {
	id: itemId,
	to: text('run to', 120, { edit: { placeholder: 'e.g. boot floor, under passenger seat' }, search: { label: 'Run to' } }),
	lengthM: measure('length', 'm', {
		unit: 'm',
		min: 0,
		inclusive: false,
		max: MAX_RUN_M,
		missing: 'leave it empty if not measured'
	})
});

const groundPoint = section('A ground point', {
	id: itemId,
	location: text('location', 200, { search: { label: 'Ground' } }),
	notes: text('notes', 1000)
});

const powerSchema = pageSection('power', {
	batteryLocation: choice('battery location', BATTERY_LOCATIONS, BATTERY_LOCATION_NAMES, { search: { label: 'Battery', lowerCase: true } })
		.nullable()
		.default(null),
	fuseHolderSpot: text('fuse holder spot', 300, { edit: { label: 'Fuse holder spot near the battery' }, search: { label: 'Fuse holder' } }),
	runs: entries(powerRun, 'power runs', { noun: 'power run', title: 'Cable runs from the battery' }),
	groundPoints: entries(groundPoint, 'ground points', { noun: 'ground point', title: 'Chassis ground points' }),
	notes: notes('power & ground notes')
});

const passage = section('A firewall passage', {
	id: itemId,
	location: text('location', 200, { edit: { label: 'Where' }, search: false }),
	holeMm: mm('hole size', { search: { label: 'Hole' } }, 100),
	kind: choice('kind', PASSAGE_KINDS, PASSAGE_KIND_NAMES),
	pushFrom: choice('easiest to push from', PUSH_SIDES, PUSH_SIDE_NAMES),
	avoid: longText('things to avoid', 1000, { edit: { placeholder: 'Brake lines, looms…' }, search: { label: 'Avoid' } }),
	tools: longText('tools that help', 500, { search: { label: 'Tools' } })
});

const firewallSchema = pageSection('firewall', {
	passages: entries(passage, 'firewall passages', {
		noun: 'passage',
		searchLine: SEARCH_LINES.passage
	}),
	notes: notes('firewall notes')
});

export const seatSpaceSchema = section('A seat space', {
	id: itemId,
	seat: choice('seat', SEATS, SEAT_NAMES, { edit: { span: 'col-span-2 sm:col-span-1' }, search: { label: 'Seat' } }),
	lengthMm: mm('length'),
	widthMm: mm('width'),
	heightMm: mm('height'),
	obstacles: longText('obstacles', 1000, { edit: { placeholder: 'Floor ridge, rail, duct…', row: 'grid gap-3 sm:grid-cols-2' } }),
	travelNotes: longText('seat travel notes', 1000),
	boardNeeded: flag('mounting board needed', { edit: { label: 'A mounting board or spacer is needed' } }).default(false)
});

const seatsSchema = pageSection(
	'seats',
	{
		spaces: entries(seatSpaceSchema, 'seat spaces', { noun: 'seat space', grid: 'grid grid-cols-2 gap-3 sm:grid-cols-4' }),
		notes: notes('seat space notes')
	},
	'The usable box under each seat. Leave a size empty if it was not measured.'
);

const dashSchema = pageSection('dash', {
	opening: choice('dash opening', DASH_OPENINGS, DASH_OPENING_NAMES, { edit: { label: 'Opening' }, search: { label: 'Opening' } })
		.nullable()
		.default(null),
	openingWidthMm: mm('measured opening width', { edit: { label: 'Opening width (measured)' } }, 400),
	openingHeightMm: mm('measured opening height', { edit: { label: 'Opening height (measured)' } }, 400),
	depthMm: mm('usable chassis depth'),
	kit: text('dash kit and trim', 300, { edit: { label: 'Dash kit and trim needed', row: 'grid gap-4' }, search: { label: 'Kit' } }),
	trimSteps: textList('trim removal steps', 'a trim removal step', { edit: { label: 'Trim removal steps, in order', noun: 'step', ordered: true } }),
	featuresKept: textList('factory features to keep', 'a feature', { edit: { noun: 'feature' } }),
	notes: notes('dash notes')
});

const wire = section('A wire', {
	id: itemId,
	function: text('function', 120, { edit: { span: 'col-span-2 sm:col-span-1' }, search: false }),
	colour: text('colour', 80, { edit: { label: 'Factory colour' }, search: false }),
	pin: text('pin', 40, { search: { label: 'Pin' } })
});

const ohms = (label: string, show: Show) =>
	measure(label, 'ohm', { unit: 'Ω', min: 0, inclusive: true, max: 10_000_000, missing: 'leave it empty if not measured' }, show);

const ladderButton = section('A steering-wheel button', {
	id: itemId,
	name: text('name', 80, { edit: { label: 'Button', placeholder: 'e.g. Vol +' } }),
	ohms: ohms('resistance', { edit: { placeholder: 'e.g. 680, 2.2k, 4k7' } })
});

const ladderLine = section('A steering-wheel control line', {
	id: itemId,
	name: text('name', 80, { edit: { label: 'Line name', placeholder: 'e.g. SWC 1 (Key 1)' }, search: false }),
	buttons: entries(ladderButton, 'buttons on this line', { noun: 'button', grid: 'grid grid-cols-2 gap-3', frame: 'border-l-4 border-copper-200 pl-3' }, 30)
});

const harnessSchema = pageSection('harness', {
	factoryAmp: flag('factory amplifier', { search: false }).nullable().default(null),
	reverseTrigger: text('reverse trigger', 300, { search: { label: 'Reverse trigger' } }),
	illumination: text('illumination', 300, { search: { label: 'Illumination' } }),
	connectors: longText('connector notes', 1000),
	can: longText('CAN notes', 1000, { edit: { row: 'grid gap-4' } }),
	wires: entries(wire, 'wires', { noun: 'wire', title: 'Wire table', grid: 'grid grid-cols-2 gap-3 sm:grid-cols-3', searchLine: SEARCH_LINES.wire }, 200),
	ladder: section('The steering-wheel control ladder', {
		lines: entries(ladderLine, 'control lines', { noun: 'control line', title: 'Steering-wheel control ladder', grid: 'grid gap-3' }, 8)
	}).prefault({}),
	notes: notes('harness notes')
});

const amps = (label: string, show: Show = {}) =>
	measure(label, 'amp', { unit: 'A', min: 0, inclusive: false, max: 500, missing: 'leave it empty if not known' }, show);

const bootSchema = pageSection(
	'boot',
	{
		floorLengthMm: mm('floor length', { edit: { label: 'Floor length (lip to seat back, at the floor)' } }),
		depthTopMm: mm('depth at the top', { edit: { label: 'Depth at the top (where the seat back leans in)' } }),
		floorWidthMm: mm('floor width'),
		archWidthMm: mm('width between the wheel arches', { edit: { label: 'Between the wheel arches' } }),
		heightMm: mm('height to the shelf or cover', { edit: { label: 'Height to the shelf or cover' } }),
		openingWidthMm: mm('load opening width', { edit: { row: 'grid grid-cols-2 gap-3 sm:grid-cols-3' } }),
		openingHeightMm: mm('load opening height'),
		lipHeightMm: mm('lip height', { edit: { label: 'Lip height above the floor' } }, 1000),
		passThroughWidthMm: mm('rear-seat pass-through width', { edit: { label: 'Pass-through width', row: 'grid grid-cols-2 gap-3 sm:grid-cols-4' } }),
		passThroughHeightMm: mm('rear-seat pass-through height', { edit: { label: 'Pass-through height' } }),
		alternatorIdleA: amps('alternator output at idle', { edit: { label: 'Alternator at idle', placeholder: 'e.g. 60' } }),
		alternatorCruiseA: amps('alternator output at cruise', { edit: { label: 'Alternator at cruise', placeholder: 'e.g. 110' } }),
		notes: notes('boot & cargo notes')
	},
	'The cargo floor up to the shelf or cover, the opening a box goes through, and the alternator figures for the charging budget. Leave a size empty if it was not measured.'
);

const speakerLocation = section('A speaker location', {
	id: itemId,
	location: text('location', 120, { edit: { placeholder: 'e.g. front door' }, search: false }),
	nominalSize: text('nominal size', 40, { edit: { placeholder: 'e.g. 6.5" or 165 mm' }, search: false }),
	impedanceOhm: measure(
		'impedance',
		'ohm',
		{ unit: 'Ω', min: 0, inclusive: false, max: 32, missing: 'leave it empty if not known' },
		{ edit: { placeholder: 'e.g. 4' } }
	),
	cutoutMm: mm('cut-out', {}, 500),
	depthMm: mm('mounting depth', {}, 300),
	grille: text('grille notes', 500)
});

const speakersSchema = pageSection('speakers', {
	locations: entries(speakerLocation, 'speaker locations', {
		noun: 'speaker location',
		grid: 'grid grid-cols-2 gap-3 sm:grid-cols-3',
		searchLine: SEARCH_LINES.speakerLocation
	}),
	notes: notes('speaker notes')
});

const feed = section('An accessory feed', {
	id: itemId,
	name: text('name', 120, { edit: { label: 'Feed' }, search: false }),
	kind: choice('kind', FEED_KINDS, FEED_KIND_NAMES),
	fuseA: measure(
		'fuse',
		'amp',
		{ unit: 'A', min: 0, inclusive: false, max: 400, missing: 'leave it empty if not known' },
		{ edit: { placeholder: 'e.g. 10' } }
	),
	location: text('location', 200, { edit: { label: 'Where' }, search: false })
});

const cameraSchema = pageSection('camera', {
	mounting: longText('camera mounting', 500, { search: { label: 'Camera' } }),
	triggerSource: longText('camera trigger source', 300, { search: { label: 'Trigger' } }),
	feeds: entries(feed, 'accessory feeds', {
		noun: 'accessory feed',
		title: 'Hard-wire feeds',
		grid: 'grid grid-cols-2 gap-3 sm:grid-cols-4',
		searchLine: SEARCH_LINES.feed
	}),
	notes: notes('camera notes')
});

const removalSchema = pageSection('removal', {
	steps: textList('removal steps', 'a removal step', { edit: { label: 'What comes out, in order', noun: 'step', ordered: true } }),
	surprises: textList('surprises', 'a surprise', { edit: { noun: 'surprise' } }),
	notes: notes('removal notes')
});

const photo = section('A photo', {
	// A photo's sha256 (64 hex digits) or another stored photo id.
	id: itemId,
	section: leaf(
		{ label: 'section', kind: 'section' },
		z.enum(SECTION_KEYS, { error: `A photo belongs to one of: ${SECTION_KEYS.map((k) => SECTION_NAMES[k]).join(', ')}.` })
	),
	// The passage, seat space, speaker… the photo shows, when it shows one.
	itemId: leaf({ label: 'shows entry', kind: 'text' }, itemId.nullable().default(null)),
	caption: text('caption', 300),
	alt: text('description for screen readers', 300)
});

/** The rule of a whole page around its sections; a fixture page for tests is built the same way. */
export function pageSchema<T extends z.ZodRawShape>(sections: T) {
	return z.strictObject(
		{
			schemaVersion: z.literal(CONTENT_SCHEMA_VERSION, {
				error: `This page uses a content version this app does not read (expected version ${CONTENT_SCHEMA_VERSION}).`
			}),
			...sections,
			photos: entries(photo, 'photos', { noun: 'photo' }, 200)
		},
		{
			error: (iss) =>
				iss.code === 'unrecognized_keys'
					? `The page has fields this version does not know: ${iss.keys.join(', ')}.`
					: 'A vehicle page must be a JSON object.'
		}
	);
}

export const vehicleContentSchema = pageSchema({
	identity: identitySchema.register(fieldRegistry, { kind: 'page-section', label: SECTION_NAMES.identity }),
	// A section left out of stored content reads as empty.
	power: powerSchema.prefault({}),
	firewall: firewallSchema.prefault({}),
	seats: seatsSchema.prefault({}),
	dash: dashSchema.prefault({}),
	harness: harnessSchema.prefault({}),
	boot: bootSchema.prefault({}),
	speakers: speakersSchema.prefault({}),
	camera: cameraSchema.prefault({}),
	removal: removalSchema.prefault({})
});

export { FIELD_INFO, VEHICLE_FIELDS };

/** The vehicle page's field tree with its rule: what a save is read and checked by. */
export const VEHICLE_RULES: PageRules = { ...VEHICLE_FIELDS, schema: vehicleContentSchema };

export type VehicleContent = z.output<typeof vehicleContentSchema>;
export type VehicleContentInput = z.input<typeof vehicleContentSchema>;
export type Identity = VehicleContent['identity'];
export type IdentityInput = z.input<typeof identitySchema>;
export type PowerSection = VehicleContent['power'];
export type PowerRun = PowerSection['runs'][number];
export type GroundPoint = PowerSection['groundPoints'][number];
export type FirewallSection = VehicleContent['firewall'];
export type FirewallPassage = FirewallSection['passages'][number];
export type SeatsSection = VehicleContent['seats'];
export type SeatSpace = SeatsSection['spaces'][number];
export type DashSection = VehicleContent['dash'];
export type HarnessSection = VehicleContent['harness'];
export type HarnessWire = HarnessSection['wires'][number];
export type LadderLine = HarnessSection['ladder']['lines'][number];
export type LadderButton = LadderLine['buttons'][number];
export type BootSection = VehicleContent['boot'];
export type SpeakersSection = VehicleContent['speakers'];
export type SpeakerLocation = SpeakersSection['locations'][number];
export type CameraSection = VehicleContent['camera'];
export type AccessoryFeed = CameraSection['feeds'][number];
export type RemovalSection = VehicleContent['removal'];
export type Photo = VehicleContent['photos'][number];

/** A new page with the identity filled in and every section empty; throws a ZodError on a bad identity. */
export function emptyContent(identity: IdentityInput): VehicleContent {
	return vehicleContentSchema.parse({ schemaVersion: CONTENT_SCHEMA_VERSION, identity });
}

/** Validates stored or posted content; a string is read as JSON first. */
export function parseContent(json: unknown): z.ZodSafeParseResult<VehicleContent> {
	let value = json;
	if (typeof json === 'string') {
		try {
			value = JSON.parse(json);
		} catch (e) {
			const error = new z.ZodError([
				{ code: 'custom', path: [], message: `The page is not readable JSON (${(e as Error).message}).`, input: json }
			]);
			return { success: false, error } as z.ZodSafeParseResult<VehicleContent>;
		}
	}
	return vehicleContentSchema.safeParse(value);
}

/** Issues keyed by form path ("seats.spaces.0.heightMm"; "" for the page itself), first message per field. */
export function formatZodIssues(error: z.ZodError): Record<string, string> {
	const out: Record<string, string> = {};
	for (const issue of error.issues) {
		const key = issue.path.map(String).join('.');
		if (!(key in out)) out[key] = issue.message;
	}
	return out;
}
