import { z } from 'zod';
import { MAX_MEASURED_MM, MAX_RUN_M } from '../sizeRules';

// One vehicle page as stored in a revision. Units are metric: mm for spaces and
// parts, m for cable runs, Ω for resistance and impedance, A for fuses.

export const CONTENT_SCHEMA_VERSION = 1;

export const SECTION_KEYS = [
	'identity',
	'power',
	'firewall',
	'seats',
	'dash',
	'harness',
	'speakers',
	'camera',
	'removal'
] as const;
export type SectionKey = (typeof SECTION_KEYS)[number];

export const SECTION_NAMES: Readonly<Record<SectionKey, string>> = {
	identity: 'Identity',
	power: 'Power & ground',
	firewall: 'Firewall pass-through',
	seats: 'Seat space',
	dash: 'Dash & head unit',
	harness: 'Harness & integration',
	speakers: 'Speakers',
	camera: 'Camera & accessories',
	removal: 'Removal & surprises'
};

export const BODY_STYLES = ['sedan', 'hatchback', 'wagon', 'coupe', 'convertible', 'suv', 'pickup', 'van', 'other'] as const;
export type BodyStyle = (typeof BODY_STYLES)[number];
export const BODY_STYLE_NAMES: Readonly<Record<BodyStyle, string>> = {
	sedan: 'Sedan',
	hatchback: 'Hatchback',
	wagon: 'Wagon / estate',
	coupe: 'Coupé',
	convertible: 'Convertible',
	suv: 'SUV',
	pickup: 'Pickup',
	van: 'Van',
	other: 'Other body'
};

export const BATTERY_LOCATIONS = ['engine-bay', 'boot', 'under-seat', 'other'] as const;
export type BatteryLocation = (typeof BATTERY_LOCATIONS)[number];
export const BATTERY_LOCATION_NAMES: Readonly<Record<BatteryLocation, string>> = {
	'engine-bay': 'Engine bay',
	boot: 'Boot / trunk',
	'under-seat': 'Under a seat',
	other: 'Elsewhere'
};

export const PASSAGE_KINDS = ['factory-grommet', 'added-grommet', 'drilled'] as const;
export type PassageKind = (typeof PASSAGE_KINDS)[number];
export const PASSAGE_KIND_NAMES: Readonly<Record<PassageKind, string>> = {
	'factory-grommet': 'Factory grommet',
	'added-grommet': 'Added grommet',
	drilled: 'Drilled hole'
};

export const PUSH_SIDES = ['cabin', 'engine-bay', 'either'] as const;
export type PushSide = (typeof PUSH_SIDES)[number];
export const PUSH_SIDE_NAMES: Readonly<Record<PushSide, string>> = {
	cabin: 'From the cabin',
	'engine-bay': 'From the engine bay',
	either: 'Either side'
};

export const SEATS = ['driver', 'passenger', 'rear'] as const;
export type Seat = (typeof SEATS)[number];
export const SEAT_NAMES: Readonly<Record<Seat, string>> = {
	driver: 'Driver',
	passenger: 'Passenger',
	rear: 'Rear'
};

export const DASH_OPENINGS = ['single-din', 'double-din', 'oversize', 'integrated'] as const;
export type DashOpening = (typeof DASH_OPENINGS)[number];
export const DASH_OPENING_NAMES: Readonly<Record<DashOpening, string>> = {
	'single-din': 'Single DIN',
	'double-din': 'Double DIN',
	oversize: 'Oversize',
	integrated: 'Integrated (no DIN opening)'
};

export const FEED_KINDS = ['constant', 'switched', 'ignition', 'accessory'] as const;
export type FeedKind = (typeof FEED_KINDS)[number];
export const FEED_KIND_NAMES: Readonly<Record<FeedKind, string>> = {
	constant: 'Constant 12 V',
	switched: 'Switched 12 V',
	ignition: 'Ignition',
	accessory: 'Accessory (ACC)'
};

/** How a stored value is shown and merged. */
export type FieldKind =
	| 'text'
	| 'markdown'
	| 'textList'
	| 'mm'
	| 'm'
	| 'ohm'
	| 'amp'
	| 'year'
	| 'flag'
	| 'choice'
	| 'section';

export interface FieldInfo {
	/** Section-level fields carry a full label, item fields a short one ("height"). */
	label: string;
	kind: FieldKind;
	choices?: Readonly<Record<string, string>>;
}

/**
 * Every leaf field of a page, keyed by its pattern: "seats.spaces[].heightMm".
 * Filled as the schema below is built, so a label lives beside its rule.
 */
const fieldInfo: Record<string, FieldInfo> = {};
export const FIELD_INFO: Readonly<Record<string, FieldInfo>> = fieldInfo;

const capital = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

function leaf<T>(pattern: string, info: FieldInfo, schema: T): T {
	fieldInfo[pattern] = info;
	return schema;
}

function text(pattern: string, label: string, max = 300) {
	const L = capital(label);
	return leaf(
		pattern,
		{ label, kind: 'text' },
		z
			.string({ error: `${L} must be text.` })
			.trim()
			.max(max, { error: `${L} is too long: keep it under ${max} characters.` })
			.default('')
	);
}

function requiredText(pattern: string, label: string, max = 80) {
	const L = capital(label);
	return leaf(
		pattern,
		{ label, kind: 'text' },
		z
			.string({ error: (iss) => (iss.input === undefined ? `${L} is required.` : `${L} must be text.`) })
			.trim()
			.min(1, { error: `${L} is required.` })
			.max(max, { error: `${L} is too long: keep it under ${max} characters.` })
	);
}

const NOTES_MAX = 20_000;

function notes(pattern: string, label: string) {
	return leaf(
		pattern,
		{ label, kind: 'markdown' },
		z
			.string({ error: `${capital(label)} must be text (Markdown).` })
			.max(NOTES_MAX, { error: `${capital(label)} are too long: keep them under ${NOTES_MAX} characters.` })
			.default('')
	);
}

function textList(pattern: string, label: string, itemLabel: string, maxItems = 50, maxLength = 300) {
	const L = capital(itemLabel);
	return leaf(
		pattern,
		{ label, kind: 'textList' },
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

function measure(pattern: string, label: string, kind: 'mm' | 'm' | 'ohm' | 'amp', rule: MeasureRule) {
	const L = capital(label);
	const above = rule.inclusive ? `at least ${rule.min} ${rule.unit}` : `more than ${rule.min} ${rule.unit}`;
	const n = z.number({ error: `${L} must be a number in ${rule.unit}, or ${rule.missing}.` });
	const bounded = (rule.inclusive ? n.min(rule.min, { error: `${L} must be ${above}.` }) : n.gt(rule.min, { error: `${L} must be ${above}.` })).max(
		rule.max,
		{ error: `${L} must be at most ${rule.max} ${rule.unit}; check the unit.` }
	);
	return leaf(pattern, { label, kind }, bounded.nullable().default(null));
}

const mm = (pattern: string, label: string) => measure(pattern, label, 'mm', MM);

function year(pattern: string, label: string) {
	const L = capital(label);
	return leaf(
		pattern,
		{ label, kind: 'year' },
		z
			.number({ error: (iss) => (iss.input === undefined ? `${L} is required.` : `${L} must be a year, for example 2012.`) })
			.int({ error: `${L} must be a whole year, for example 2012.` })
			.min(1950, { error: `${L} must be 1950 or later.` })
			.max(2100, { error: `${L} must be 2100 or earlier.` })
	);
}

function flag(pattern: string, label: string) {
	return leaf(pattern, { label, kind: 'flag' }, z.boolean({ error: `${capital(label)} must be yes or no.` }));
}

function choice<const T extends readonly [string, ...string[]]>(
	pattern: string,
	label: string,
	values: T,
	names: Readonly<Record<T[number], string>>
) {
	return leaf(
		pattern,
		{ label, kind: 'choice', choices: names },
		z.enum(values, { error: `${capital(label)} must be one of: ${values.map((v) => names[v as T[number]]).join(', ')}.` })
	);
}

const ITEM_ID = /^[A-Za-z0-9_-]{1,64}$/;
const itemId = z
	.string({ error: 'Each entry needs an id.' })
	.regex(ITEM_ID, { error: 'An entry id is 1 to 64 letters, digits, "-" or "_".' });

/** A list of entries, each with its own id, so edits can be merged entry by entry. */
function entries<T extends z.ZodType<{ id: string }>>(item: T, what: string, max = 100) {
	return z
		.array(item, { error: `${capital(what)} must be a list.` })
		.max(max, { error: `${capital(what)}: at most ${max} entries.` })
		.superRefine((list, ctx) => {
			const seen = new Set<string>();
			list.forEach((entry, i) => {
				if (seen.has(entry.id)) {
					ctx.addIssue({ code: 'custom', path: [i, 'id'], message: `Two ${what} share the id "${entry.id}".` });
				}
				seen.add(entry.id);
			});
		})
		.default([]);
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

// A VIN position is 0-9 or A-Z without I, O, Q (ISO 3779); * and ? are wildcards.
const VIN_PATTERN = /^[A-HJ-NPR-Z0-9*?]{1,17}$/;

const vinPatterns = leaf(
	'identity.vinPatterns',
	{ label: 'VIN patterns', kind: 'textList' },
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

export const identitySchema = section('Identity', {
	make: requiredText('identity.make', 'make'),
	model: requiredText('identity.model', 'model'),
	yearFrom: year('identity.yearFrom', 'first model year'),
	yearTo: year('identity.yearTo', 'last model year'),
	body: choice('identity.body', 'body style', BODY_STYLES, BODY_STYLE_NAMES),
	market: text('identity.market', 'market / region', 200),
	aliases: textList('identity.aliases', 'also sold as', 'an alias', 30, 120),
	vinPatterns,
	notes: notes('identity.notes', 'identity notes')
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
	to: text('power.runs[].to', 'run to', 120),
	lengthM: measure('power.runs[].lengthM', 'length', 'm', {
		unit: 'm',
		min: 0,
		inclusive: false,
		max: MAX_RUN_M,
		missing: 'leave it empty if not measured'
	})
});

const groundPoint = section('A ground point', {
	id: itemId,
	location: text('power.groundPoints[].location', 'location', 200),
	notes: text('power.groundPoints[].notes', 'notes', 1000)
});

const powerSchema = section('Power & ground', {
	batteryLocation: choice('power.batteryLocation', 'battery location', BATTERY_LOCATIONS, BATTERY_LOCATION_NAMES)
		.nullable()
		.default(null),
	runs: entries(powerRun, 'power runs'),
	groundPoints: entries(groundPoint, 'ground points'),
	fuseHolderSpot: text('power.fuseHolderSpot', 'fuse holder spot', 300),
	notes: notes('power.notes', 'power & ground notes')
});

const passage = section('A firewall passage', {
	id: itemId,
	location: text('firewall.passages[].location', 'location', 200),
	kind: choice('firewall.passages[].kind', 'kind', PASSAGE_KINDS, PASSAGE_KIND_NAMES),
	pushFrom: choice('firewall.passages[].pushFrom', 'easiest to push from', PUSH_SIDES, PUSH_SIDE_NAMES),
	holeMm: measure('firewall.passages[].holeMm', 'hole size', 'mm', { ...MM, max: 100 }),
	avoid: text('firewall.passages[].avoid', 'things to avoid', 1000),
	tools: text('firewall.passages[].tools', 'tools that help', 500)
});

const firewallSchema = section('Firewall pass-through', {
	passages: entries(passage, 'firewall passages'),
	notes: notes('firewall.notes', 'firewall notes')
});

const seatSpace = section('A seat space', {
	id: itemId,
	seat: choice('seats.spaces[].seat', 'seat', SEATS, SEAT_NAMES),
	lengthMm: mm('seats.spaces[].lengthMm', 'length'),
	widthMm: mm('seats.spaces[].widthMm', 'width'),
	heightMm: mm('seats.spaces[].heightMm', 'height'),
	obstacles: text('seats.spaces[].obstacles', 'obstacles', 1000),
	boardNeeded: flag('seats.spaces[].boardNeeded', 'mounting board needed').default(false),
	travelNotes: text('seats.spaces[].travelNotes', 'seat travel notes', 1000)
});

const seatsSchema = section('Seat space', {
	spaces: entries(seatSpace, 'seat spaces'),
	notes: notes('seats.notes', 'seat space notes')
});

const dashSchema = section('Dash & head unit', {
	opening: choice('dash.opening', 'dash opening', DASH_OPENINGS, DASH_OPENING_NAMES).nullable().default(null),
	depthMm: mm('dash.depthMm', 'usable chassis depth'),
	kit: text('dash.kit', 'dash kit and trim', 300),
	trimSteps: textList('dash.trimSteps', 'trim removal steps', 'a trim removal step'),
	featuresKept: textList('dash.featuresKept', 'factory features to keep', 'a feature'),
	notes: notes('dash.notes', 'dash notes')
});

const wire = section('A wire', {
	id: itemId,
	function: text('harness.wires[].function', 'function', 120),
	colour: text('harness.wires[].colour', 'colour', 80),
	pin: text('harness.wires[].pin', 'pin', 40)
});

const ohms = (pattern: string, label: string) =>
	measure(pattern, label, 'ohm', { unit: 'Ω', min: 0, inclusive: true, max: 10_000_000, missing: 'leave it empty if not measured' });

const ladderButton = section('A steering-wheel button', {
	id: itemId,
	name: text('harness.ladder.lines[].buttons[].name', 'name', 80),
	ohms: ohms('harness.ladder.lines[].buttons[].ohms', 'resistance')
});

const ladderLine = section('A steering-wheel control line', {
	id: itemId,
	name: text('harness.ladder.lines[].name', 'name', 80),
	buttons: entries(ladderButton, 'buttons on this line', 30)
});

const harnessSchema = section('Harness & integration', {
	connectors: text('harness.connectors', 'connector notes', 1000),
	wires: entries(wire, 'wires', 200),
	factoryAmp: flag('harness.factoryAmp', 'factory amplifier').nullable().default(null),
	reverseTrigger: text('harness.reverseTrigger', 'reverse trigger', 300),
	illumination: text('harness.illumination', 'illumination', 300),
	can: text('harness.can', 'CAN notes', 1000),
	ladder: section('The steering-wheel control ladder', {
		lines: entries(ladderLine, 'control lines', 8)
	}).prefault({}),
	notes: notes('harness.notes', 'harness notes')
});

const speakerLocation = section('A speaker location', {
	id: itemId,
	location: text('speakers.locations[].location', 'location', 120),
	nominalSize: text('speakers.locations[].nominalSize', 'nominal size', 40),
	cutoutMm: measure('speakers.locations[].cutoutMm', 'cut-out', 'mm', { ...MM, max: 500 }),
	depthMm: measure('speakers.locations[].depthMm', 'mounting depth', 'mm', { ...MM, max: 300 }),
	impedanceOhm: measure('speakers.locations[].impedanceOhm', 'impedance', 'ohm', {
		unit: 'Ω',
		min: 0,
		inclusive: false,
		max: 32,
		missing: 'leave it empty if not known'
	}),
	grille: text('speakers.locations[].grille', 'grille notes', 500)
});

const speakersSchema = section('Speakers', {
	locations: entries(speakerLocation, 'speaker locations'),
	notes: notes('speakers.notes', 'speaker notes')
});

const feed = section('An accessory feed', {
	id: itemId,
	name: text('camera.feeds[].name', 'name', 120),
	kind: choice('camera.feeds[].kind', 'kind', FEED_KINDS, FEED_KIND_NAMES),
	fuseA: measure('camera.feeds[].fuseA', 'fuse', 'amp', {
		unit: 'A',
		min: 0,
		inclusive: false,
		max: 400,
		missing: 'leave it empty if not known'
	}),
	location: text('camera.feeds[].location', 'location', 200)
});

const cameraSchema = section('Camera & accessories', {
	mounting: text('camera.mounting', 'camera mounting', 500),
	triggerSource: text('camera.triggerSource', 'camera trigger source', 300),
	feeds: entries(feed, 'accessory feeds'),
	notes: notes('camera.notes', 'camera notes')
});

const removalSchema = section('Removal & surprises', {
	steps: textList('removal.steps', 'removal steps', 'a removal step'),
	surprises: textList('removal.surprises', 'surprises', 'a surprise'),
	notes: notes('removal.notes', 'removal notes')
});

const photo = section('A photo', {
	// A photo's sha256 (64 hex digits) or another stored photo id.
	id: itemId,
	section: leaf(
		'photos[].section',
		{ label: 'section', kind: 'section' },
		z.enum(SECTION_KEYS, { error: `A photo belongs to one of: ${SECTION_KEYS.map((k) => SECTION_NAMES[k]).join(', ')}.` })
	),
	// The passage, seat space, speaker… the photo shows, when it shows one.
	itemId: leaf('photos[].itemId', { label: 'shows entry', kind: 'text' }, itemId.nullable().default(null)),
	caption: text('photos[].caption', 'caption', 300),
	alt: text('photos[].alt', 'description for screen readers', 300)
});

export const vehicleContentSchema = z.strictObject(
	{
		schemaVersion: z.literal(CONTENT_SCHEMA_VERSION, {
			error: `This page uses a content version this app does not read (expected version ${CONTENT_SCHEMA_VERSION}).`
		}),
		identity: identitySchema,
		power: powerSchema.prefault({}),
		firewall: firewallSchema.prefault({}),
		seats: seatsSchema.prefault({}),
		dash: dashSchema.prefault({}),
		harness: harnessSchema.prefault({}),
		speakers: speakersSchema.prefault({}),
		camera: cameraSchema.prefault({}),
		removal: removalSchema.prefault({}),
		photos: entries(photo, 'photos', 200)
	},
	{
		error: (iss) =>
			iss.code === 'unrecognized_keys'
				? `The page has fields this version does not know: ${iss.keys.join(', ')}.`
				: 'A vehicle page must be a JSON object.'
	}
);

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

const ID_ALPHABET = 'abcdefghijkmnpqrstuvwxyz23456789';

/** A short id for a new list entry: 10 characters, 50 random bits. */
export function newItemId(): string {
	const bytes = globalThis.crypto.getRandomValues(new Uint8Array(10));
	// 256 is a multiple of the 32-letter alphabet, so every letter is equally likely.
	return Array.from(bytes, (b) => ID_ALPHABET[b % ID_ALPHABET.length]).join('');
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

/** JSON with object keys sorted at every level: equal content gives equal text, for hashing and "no change". */
export function canonicalJson(content: unknown): string {
	return JSON.stringify(sortKeys(content));
}

function sortKeys(value: unknown): unknown {
	if (Array.isArray(value)) return value.map((v) => (v === undefined ? null : sortKeys(v)));
	if (value !== null && typeof value === 'object') {
		const out: Record<string, unknown> = {};
		for (const key of Object.keys(value).sort()) {
			const v = (value as Record<string, unknown>)[key];
			if (v !== undefined) out[key] = sortKeys(v);
		}
		return out;
	}
	return value;
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
