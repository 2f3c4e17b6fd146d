import { parseLength, type LengthUnit, type UnitSystem } from '../units';
import { formatFieldValue, patternOf } from './fieldDiff';
import type { MergeConflict } from './merge';
import { CONTENT_SCHEMA_VERSION, FIELD_INFO, formatZodIssues, newItemId, parseContent, SEATS, type VehicleContent } from './schema';

// A vehicle page as an HTML form. Every field is text under a dotted name such as
// "seats.spaces.0.heightMm", so the editor works without JavaScript and a refused save
// hands back exactly what was typed.

type Leaf =
	| 'text'
	| 'markdown'
	| 'year'
	| 'mm'
	| 'm'
	| 'ohm'
	| 'amp'
	| 'flag'
	| 'flagOrUnknown'
	| 'choice'
	| 'choiceOrNone'
	| 'textList';
interface Group {
	readonly [key: string]: FormNode;
}
interface EntryList {
	readonly entry: Group;
}
type FormNode = Leaf | Group | EntryList;

/** The page's fields in the order the editor shows them; mirrors the content schema. */
const FORM = {
	identity: {
		make: 'text',
		model: 'text',
		yearFrom: 'year',
		yearTo: 'year',
		body: 'choice',
		market: 'text',
		aliases: 'textList',
		vinPatterns: 'textList',
		notes: 'markdown'
	},
	power: {
		batteryLocation: 'choiceOrNone',
		runs: { entry: { to: 'text', lengthM: 'm' } },
		groundPoints: { entry: { location: 'text', notes: 'text' } },
		fuseHolderSpot: 'text',
		notes: 'markdown'
	},
	firewall: {
		passages: { entry: { location: 'text', kind: 'choice', pushFrom: 'choice', holeMm: 'mm', avoid: 'text', tools: 'text' } },
		notes: 'markdown'
	},
	seats: {
		spaces: {
			entry: { seat: 'choice', lengthMm: 'mm', widthMm: 'mm', heightMm: 'mm', boardNeeded: 'flag', obstacles: 'text', travelNotes: 'text' }
		},
		notes: 'markdown'
	},
	dash: { opening: 'choiceOrNone', depthMm: 'mm', kit: 'text', trimSteps: 'textList', featuresKept: 'textList', notes: 'markdown' },
	harness: {
		connectors: 'text',
		factoryAmp: 'flagOrUnknown',
		reverseTrigger: 'text',
		illumination: 'text',
		can: 'text',
		wires: { entry: { function: 'text', colour: 'text', pin: 'text' } },
		ladder: { lines: { entry: { name: 'text', buttons: { entry: { name: 'text', ohms: 'ohm' } } } } },
		notes: 'markdown'
	},
	speakers: {
		locations: {
			entry: { location: 'text', nominalSize: 'text', cutoutMm: 'mm', depthMm: 'mm', impedanceOhm: 'ohm', grille: 'text' }
		},
		notes: 'markdown'
	},
	camera: {
		mounting: 'text',
		triggerSource: 'text',
		feeds: { entry: { name: 'text', kind: 'choice', fuseA: 'amp', location: 'text' } },
		notes: 'markdown'
	},
	removal: { steps: 'textList', surprises: 'textList', notes: 'markdown' }
} as const satisfies Record<string, Group>;

type DraftOf<N> = N extends 'textList'
	? string[]
	: N extends Leaf
		? string
		: N extends { readonly entry: infer G }
			? Array<{ id: string } & DraftOf<G>>
			: { -readonly [K in keyof N]: DraftOf<N[K]> };

/** Everything the editor form holds: the page as typed text, list entries keyed by id. */
export type ContentDraft = DraftOf<typeof FORM>;

type Raw = Record<string, unknown>;

const isEntryList = (node: FormNode): node is EntryList =>
	typeof node === 'object' && Object.keys(node).length === 1 && 'entry' in node;

const isRecord = (v: unknown): v is Raw => v !== null && typeof v === 'object' && !Array.isArray(v);

const join = (a: string, b: string | number) => (a ? `${a}.${b}` : String(b));

const capital = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

const labelOf = (pattern: string) => capital(FIELD_INFO[pattern]?.label ?? pattern.split('.').pop() ?? 'this field');

// ---- Lengths and other measures as typed text ----

/** The unit a length field is typed in: spaces in mm or in, cable runs in m or ft. */
export function inputUnit(kind: 'mm' | 'm', unit: LengthUnit): string {
	if (kind === 'mm') return unit;
	return unit === 'mm' ? 'm' : 'ft';
}

const MM_PER: Record<string, number> = { mm: 1, in: 25.4, m: 1000, ft: 304.8 };
// Enough digits that a tape reading survives: 0.1 mm, 0.01 in, 1 cm on a run.
const DECIMALS: Record<string, number> = { mm: 1, in: 2, m: 2, ft: 2 };

const trimmed = (value: number, decimals: number) => String(Number(value.toFixed(decimals)));

/** A stored length (mm for spaces, m for runs) as form text in the form's unit. */
export function lengthText(kind: 'mm' | 'm', stored: number | null, unit: LengthUnit): string {
	if (stored === null || !Number.isFinite(stored)) return '';
	const shown = inputUnit(kind, unit);
	const mm = kind === 'mm' ? stored : stored * 1000;
	return trimmed(mm / MM_PER[shown], DECIMALS[shown]);
}

const HAS_UNIT = /[a-z"'″′“”‘’]/i;

/** Typed text to a stored length: mm for spaces, m for runs. A bare number is in the form's unit. */
export function readLength(kind: 'mm' | 'm', text: string, unit: LengthUnit): number {
	// To the micrometre: drops float noise such as 3.5 in = 88.89999999999999 mm.
	if (kind === 'mm') return Math.round(parseLength(text, unit) * 1000) / 1000;
	const withUnit = HAS_UNIT.test(text) ? text : `${text.trim()} ${inputUnit('m', unit)}`;
	return Math.round(parseLength(withUnit, 'mm') * 1000) / 1_000_000;
}

const OHMS = /^(\d+(?:\.\d+)?|\.\d+)\s*([kKM])?\s*(?:Ω|ohms?|r)?$/i;
// Resistor code letters standing in for the decimal point: 4k7 = 4.7 kΩ, 2R2 = 2.2 Ω (IEC 60062).
const OHMS_CODE = /^(\d+)([kKMRr])(\d+)$/;
const PREFIX: Record<string, number> = { k: 1e3, K: 1e3, M: 1e6, m: 1e-3, R: 1, r: 1 };

export function readOhms(text: string, label = 'Resistance'): number {
	const t = text.trim();
	let m = OHMS_CODE.exec(t);
	if (m) return Number(`${m[1]}.${m[3]}`) * PREFIX[m[2]];
	m = OHMS.exec(t);
	if (m) return Number(m[1]) * (m[2] ? PREFIX[m[2]] : 1);
	throw new Error(`${label}: could not read "${t}" as ohms; for example 680, 2.2k or 4k7.`);
}

const AMPS = /^(\d+(?:\.\d+)?|\.\d+)\s*a?$/i;

export function readAmps(text: string, label = 'Fuse'): number {
	const m = AMPS.exec(text.trim());
	if (m) return Number(m[1]);
	throw new Error(`${label}: could not read "${text.trim()}" as amps; for example 10 or 7.5 A.`);
}

// ---- Content → draft ----

function toDraft(node: FormNode, value: unknown, unit: LengthUnit): unknown {
	if (typeof node === 'string') {
		switch (node) {
			case 'textList':
				return Array.isArray(value) ? value.map(String) : [];
			case 'mm':
			case 'm':
				return lengthText(node, typeof value === 'number' ? value : null, unit);
			case 'ohm':
			case 'amp':
				return typeof value === 'number' ? String(value) : '';
			case 'year':
				return typeof value === 'number' ? String(value) : '';
			case 'flag':
				return value === true ? 'yes' : '';
			case 'flagOrUnknown':
				return value === true ? 'yes' : value === false ? 'no' : '';
			default:
				return typeof value === 'string' ? value : '';
		}
	}
	if (isEntryList(node)) {
		const list = Array.isArray(value) ? value.filter(isRecord) : [];
		return list.map((e) => ({ id: String(e.id), ...(toDraft(node.entry, e, unit) as Raw) }));
	}
	const out: Raw = {};
	const v = isRecord(value) ? value : {};
	for (const key of Object.keys(node)) out[key] = toDraft(node[key], v[key], unit);
	return out;
}

/** The editor form filled from stored content, lengths in the given unit. */
export function formFromContent(content: VehicleContent, unit: LengthUnit = 'mm'): ContentDraft {
	return toDraft(FORM, content, unit) as ContentDraft;
}

// ---- Posted fields → draft ----

const NAME_SEGMENT = /^[A-Za-z0-9_-]{1,64}$/;
const INDEX = /^\d{1,4}$/;
const ITEM_ID = /^[A-Za-z0-9_-]{1,64}$/;

function indexed(raw: unknown): unknown[] {
	if (!isRecord(raw)) return [];
	return Object.keys(raw)
		.filter((k) => INDEX.test(k))
		.sort((a, b) => Number(a) - Number(b))
		.map((k) => raw[k]);
}

function fromRaw(node: FormNode, raw: unknown): unknown {
	if (typeof node === 'string') {
		if (node === 'textList') return indexed(raw).map((v) => (typeof v === 'string' ? v : ''));
		return typeof raw === 'string' ? raw.replace(/\r\n?/g, '\n') : '';
	}
	if (isEntryList(node)) {
		return indexed(raw).map((item) => {
			const r = isRecord(item) ? item : {};
			const id = typeof r.id === 'string' && ITEM_ID.test(r.id) ? r.id : newItemId();
			return { id, ...(fromRaw(node.entry, r) as Raw) };
		});
	}
	const out: Raw = {};
	const r = isRecord(raw) ? raw : {};
	for (const key of Object.keys(node)) out[key] = fromRaw(node[key], r[key]);
	return out;
}

/** Posted name/value pairs back into a draft; names the form does not have are ignored. */
export function draftFromEntries(entries: Iterable<readonly [string, string]>): ContentDraft {
	const tree: Raw = Object.create(null);
	for (const [name, value] of entries) {
		const path = name.split('.');
		if (!Object.hasOwn(FORM, path[0]) || !path.every((s) => NAME_SEGMENT.test(s))) continue;
		let node = tree;
		for (const seg of path.slice(0, -1)) {
			if (!isRecord(node[seg])) node[seg] = Object.create(null);
			node = node[seg] as Raw;
		}
		node[path[path.length - 1]] = value;
	}
	return fromRaw(FORM, tree) as ContentDraft;
}

// ---- Draft → content ----

/** An entry nobody typed into; choices and ticks alone do not count. */
function isBlank(node: FormNode, value: unknown): boolean {
	if (typeof node === 'string') {
		if (node === 'textList') return !Array.isArray(value) || value.every((s) => !String(s).trim());
		if (node === 'flag' || node === 'flagOrUnknown' || node === 'choice' || node === 'choiceOrNone') return true;
		return typeof value !== 'string' || !value.trim();
	}
	if (isEntryList(node)) return !Array.isArray(value) || value.every((item) => isBlank(node.entry, item));
	const v = isRecord(value) ? value : {};
	return Object.keys(node).every((key) => isBlank(node[key], v[key]));
}

interface Build {
	unit: LengthUnit;
	errors: Record<string, string>;
	/** Content path of a kept list entry → its place in the form. */
	places: Map<string, string>;
}

interface Where {
	pattern: string;
	form: string;
	content: string;
}

function measureFrom(kind: 'mm' | 'm' | 'ohm' | 'amp', text: string, base: unknown, at: Where, b: Build): number | null {
	const t = text.trim();
	if (!t) return null;
	const label = labelOf(at.pattern);
	try {
		if (kind === 'ohm') return readOhms(t, label);
		if (kind === 'amp') return readAmps(t, label);
		const value = readLength(kind, t, b.unit);
		// Unchanged at the precision shown keeps the stored figure exact (no 95 → 94.996 mm drift).
		if (typeof base === 'number' && lengthText(kind, value, b.unit) === lengthText(kind, base, b.unit)) return base;
		return value;
	} catch (e) {
		const message = e instanceof Error ? e.message : String(e);
		b.errors[at.form] = kind === 'mm' || kind === 'm' ? `${label}: ${message.charAt(0).toLowerCase()}${message.slice(1)}` : message;
		return null;
	}
}

function fromDraft(node: FormNode, value: unknown, base: unknown, at: Where, b: Build): unknown {
	if (typeof node === 'string') {
		const text = typeof value === 'string' ? value : '';
		switch (node) {
			case 'textList': {
				const list = Array.isArray(value) ? value.map(String) : [];
				const out: string[] = [];
				list.forEach((item, i) => {
					if (!item.trim()) return;
					b.places.set(join(at.content, out.length), join(at.form, i));
					out.push(item);
				});
				return out;
			}
			case 'year':
				return text.trim() === '' ? undefined : Number(text.trim());
			case 'mm':
			case 'm':
			case 'ohm':
			case 'amp':
				return measureFrom(node, text, base, at, b);
			case 'flag':
				return text === 'yes';
			case 'flagOrUnknown':
				return text === 'yes' ? true : text === 'no' ? false : null;
			case 'choiceOrNone':
				return text === '' ? null : text;
			default:
				return text;
		}
	}
	if (isEntryList(node)) {
		const list = Array.isArray(value) ? value.filter(isRecord) : [];
		const baseList = Array.isArray(base) ? base.filter(isRecord) : [];
		const out: Raw[] = [];
		list.forEach((item, i) => {
			if (isBlank(node.entry, item)) return;
			const where = { pattern: `${at.pattern}[]`, form: join(at.form, i), content: join(at.content, out.length) };
			b.places.set(where.content, where.form);
			const baseItem = baseList.find((e) => e.id === item.id);
			out.push({ id: item.id, ...(fromDraft(node.entry, item, baseItem, where, b) as Raw) });
		});
		return out;
	}
	const out: Raw = {};
	const v = isRecord(value) ? value : {};
	const bv = isRecord(base) ? base : {};
	for (const key of Object.keys(node)) {
		const where = { pattern: join(at.pattern, key), form: join(at.form, key), content: join(at.content, key) };
		out[key] = fromDraft(node[key], v[key], bv[key], where, b);
	}
	return out;
}

export interface FormContent {
	draft: ContentDraft;
	/** The page to save, or null when a field needs attention. */
	content: VehicleContent | null;
	/** Messages keyed by form field name. */
	errors: Record<string, string>;
	/** A content path ("seats.spaces.0.heightMm") as the form field that holds it; empty entries are skipped when saving. */
	formPath: (contentPath: string) => string;
}

function placeIn(places: Map<string, string>, path: string): string {
	const segs = path.split('.');
	for (let n = segs.length; n > 0; n--) {
		const mapped = places.get(segs.slice(0, n).join('.'));
		if (mapped !== undefined) return [mapped, ...segs.slice(n)].join('.');
	}
	return path;
}

/**
 * A draft as page content, checked against the schema. `base` is the revision the
 * edit started from: it supplies the photos and keeps exact figures that were not retyped.
 */
export function contentFromDraft(draft: ContentDraft, unit: LengthUnit, base?: VehicleContent | null): FormContent {
	const b: Build = { unit, errors: {}, places: new Map() };
	const built = fromDraft(FORM, draft, base ?? null, { pattern: '', form: '', content: '' }, b) as Raw;
	const candidate = { schemaVersion: CONTENT_SCHEMA_VERSION, ...built, photos: base?.photos ?? [] };
	const formPath = (path: string) => placeIn(b.places, path);
	const parsed = parseContent(candidate);
	const errors: Record<string, string> = {};
	if (!parsed.success) {
		for (const [path, message] of Object.entries(formatZodIssues(parsed.error))) errors[formPath(path)] ??= message;
	}
	Object.assign(errors, b.errors);
	const ok = parsed.success && Object.keys(errors).length === 0;
	return { draft, content: ok ? parsed.data : null, errors, formPath };
}

/** Posted fields to page content; see contentFromDraft. */
export function contentFromForm(
	entries: Iterable<readonly [string, string]>,
	unit: LengthUnit,
	base?: VehicleContent | null
): FormContent {
	return contentFromDraft(draftFromEntries(entries), unit, base);
}

// ---- Editing the draft: adding and removing entries, switching units ----

export type EditIntent =
	| { kind: 'save' }
	| { kind: 'stay' }
	| { kind: 'add'; list: string }
	| { kind: 'remove'; list: string; index: number }
	| { kind: 'move'; list: string; index: number; direction: 'up' | 'down' }
	| { kind: 'unit'; unit: LengthUnit };

/** The value of the submit button pressed: "save", "add:seats.spaces", "remove:seats.spaces:1", "move:removal.steps:2:up", "unit:in". */
export function readIntent(value: unknown): EditIntent {
	const text = typeof value === 'string' ? value : 'save';
	const [kind, list, index, direction] = text.split(':');
	if (kind === 'add' && list) return { kind, list };
	if (kind === 'remove' && list && INDEX.test(index ?? '')) return { kind, list, index: Number(index) };
	if (kind === 'move' && list && INDEX.test(index ?? '') && (direction === 'up' || direction === 'down')) return { kind, list, index: Number(index), direction };
	if (kind === 'unit' && (list === 'mm' || list === 'in')) return { kind, unit: list };
	if (kind === 'stay') return { kind };
	return { kind: 'save' };
}

interface ListAt {
	node: EntryList | 'textList';
	list: unknown[];
	pattern: string;
}

/** The list a dotted form path points at, e.g. "harness.ladder.lines.2.buttons". */
function listAt(draft: ContentDraft, path: string): ListAt | null {
	let node: FormNode = FORM;
	let value: unknown = draft;
	let pattern = '';
	const segs = path.split('.');
	for (let i = 0; i < segs.length; i++) {
		const seg = segs[i];
		if (typeof node === 'string' || isEntryList(node) || !Object.hasOwn(node, seg) || !isRecord(value)) return null;
		node = node[seg];
		value = value[seg];
		pattern = join(pattern, seg);
		if (node === 'textList' && i === segs.length - 1 && Array.isArray(value)) return { node, list: value, pattern };
		if (typeof node !== 'string' && isEntryList(node)) {
			if (!Array.isArray(value)) return null;
			if (i === segs.length - 1) return { node, list: value, pattern };
			const at: string = segs[++i];
			if (!INDEX.test(at ?? '')) return null;
			value = value[Number(at)];
			node = node.entry;
			pattern = `${pattern}[]`;
		}
	}
	return null;
}

function blankEntry(group: Group, pattern: string): Raw {
	const out: Raw = {};
	for (const [key, node] of Object.entries(group)) {
		const p = join(pattern, key);
		if (node === 'choice') out[key] = Object.keys(FIELD_INFO[p]?.choices ?? {})[0] ?? '';
		else if (node === 'textList') out[key] = [];
		else if (typeof node === 'string') out[key] = '';
		else if (isEntryList(node)) out[key] = [];
		else out[key] = blankEntry(node, p);
	}
	return out;
}

const MAX_ENTRIES = 200;

/** Applies an add/remove/move/unit intent to the draft in place; returns the unit now in use. */
export function applyIntent(draft: ContentDraft, intent: EditIntent, unit: LengthUnit): LengthUnit {
	if (intent.kind === 'unit') {
		convertDraftUnits(draft, unit, intent.unit);
		return intent.unit;
	}
	if (intent.kind !== 'add' && intent.kind !== 'remove' && intent.kind !== 'move') return unit;
	const at = listAt(draft, intent.list);
	if (!at) return unit;
	if (intent.kind === 'remove') {
		if (intent.index < at.list.length) at.list.splice(intent.index, 1);
		return unit;
	}
	if (intent.kind === 'move') {
		// Swaps the entry with its neighbour; at either end of the list nothing moves.
		const to = intent.index + (intent.direction === 'up' ? -1 : 1);
		if (intent.index < at.list.length && to >= 0 && to < at.list.length) {
			[at.list[intent.index], at.list[to]] = [at.list[to], at.list[intent.index]];
		}
		return unit;
	}
	if (at.list.length >= MAX_ENTRIES) return unit;
	if (at.node === 'textList') {
		at.list.push('');
		return unit;
	}
	const entry: Raw = { id: newItemId(), ...blankEntry(at.node.entry, `${at.pattern}[]`) };
	// A new seat space starts on a seat not yet recorded.
	if (at.pattern === 'seats.spaces') {
		const used = new Set(at.list.map((e) => (isRecord(e) ? e.seat : null)));
		entry.seat = SEATS.find((s) => !used.has(s)) ?? SEATS[0];
	}
	at.list.push(entry);
	return unit;
}

function convertNode(node: FormNode, value: unknown, from: LengthUnit, to: LengthUnit, set: (v: string) => void): void {
	if (node === 'mm' || node === 'm') {
		if (typeof value !== 'string' || !value.trim()) return;
		try {
			set(lengthText(node, readLength(node, value, from), to));
		} catch {
			// Left as typed; saving will point at it.
		}
		return;
	}
	if (typeof node === 'string') return;
	if (isEntryList(node)) {
		if (Array.isArray(value)) for (const item of value) convertNode(node.entry, item, from, to, () => {});
		return;
	}
	if (!isRecord(value)) return;
	for (const key of Object.keys(node)) convertNode(node[key], value[key], from, to, (v) => (value[key] = v));
}

/** Retypes every readable length in the other unit; unreadable text stays as typed. */
export function convertDraftUnits(draft: ContentDraft, from: LengthUnit, to: LengthUnit): void {
	if (from === to) return;
	convertNode(FORM, draft, from, to, () => {});
}

function flatten(node: FormNode, value: unknown, name: string, out: [string, string][]): void {
	if (node === 'textList') {
		(Array.isArray(value) ? value : []).forEach((v, i) => out.push([join(name, i), String(v)]));
		return;
	}
	if (typeof node === 'string') {
		// An unticked box is not posted at all.
		if (node === 'flag' && value !== 'yes') return;
		out.push([name, typeof value === 'string' ? value : '']);
		return;
	}
	if (isEntryList(node)) {
		(Array.isArray(value) ? value : []).forEach((item, i) => {
			const at = join(name, i);
			out.push([`${at}.id`, String(isRecord(item) ? item.id : '')]);
			flatten(node.entry, item, at, out);
		});
		return;
	}
	const v = isRecord(value) ? value : {};
	for (const key of Object.keys(node)) flatten(node[key], v[key], join(name, key), out);
}

/** The name/value pairs a browser posts for this draft, in form order. */
export function formEntries(draft: ContentDraft): [string, string][] {
	const out: [string, string][] = [];
	flatten(FORM, draft, '', out);
	return out;
}

// ---- Conflicts shown to the writer ----

export interface ConflictView {
	path: string;
	label: string;
	base: string;
	theirs: string;
	yours: string;
	/** Notes: shown as blocks of text rather than one line. */
	long: boolean;
}

function conflictValue(path: string, value: unknown, units: UnitSystem): string {
	const pattern = patternOf(path);
	if (pattern.endsWith('[]') || (!FIELD_INFO[pattern] && value !== null && typeof value === 'object')) {
		return value === null || value === undefined ? 'removed' : 'kept, with changes';
	}
	return formatFieldValue(pattern, value, units);
}

/** Base, theirs and yours of each conflicting field, as a person reads them. */
export function conflictViews(conflicts: readonly MergeConflict[], units: UnitSystem): ConflictView[] {
	return conflicts.map((c) => ({
		path: c.path,
		label: c.label,
		base: conflictValue(c.path, c.base, units),
		theirs: conflictValue(c.path, c.theirs, units),
		yours: conflictValue(c.path, c.yours, units),
		long: FIELD_INFO[patternOf(c.path)]?.kind === 'markdown'
	}));
}
