import { diffWordsWithSpace } from 'diff';
import { formatLength, formatMetres, type UnitSystem } from '../units';
import { canonicalJson } from './canonicalJson';
import type { FieldInfo, FieldTree } from './fieldTree';
import type { VehicleContent } from './schema';
import { FIELD_INFO, VEHICLE_FIELDS } from './vehicleFields';
import { SEAT_NAMES, SECTION_KEYS, SECTION_NAMES, type SectionKey } from './vocabulary';

// Paths name a field the way a person finds it on the page: list entries by id, not
// position, so "seats.spaces[k3f9].heightMm" still means the same seat after a reorder.

export type PathSegment = string | { id: string };

const NAME = /[A-Za-z_][A-Za-z0-9_]*/y;
const STEP = /\.([A-Za-z_][A-Za-z0-9_]*)|\[([A-Za-z0-9_-]+)\]/y;

/** "seats.spaces[k3f9].heightMm" → ["seats", "spaces", { id: "k3f9" }, "heightMm"]. */
export function parsePath(path: string): PathSegment[] {
	const fail = () => new Error(`Cannot read the field path "${path}".`);
	NAME.lastIndex = 0;
	const head = NAME.exec(path);
	if (!head) throw fail();
	const segments: PathSegment[] = [head[0]];
	STEP.lastIndex = NAME.lastIndex;
	while (STEP.lastIndex < path.length) {
		const m = STEP.exec(path);
		if (!m) throw fail();
		segments.push(m[1] ?? { id: m[2] });
	}
	return segments;
}

export function formatPath(segments: readonly PathSegment[]): string {
	let out = '';
	for (const s of segments) out += typeof s === 'string' ? (out ? `.${s}` : s) : `[${s.id}]`;
	return out;
}

/** "seats.spaces[k3f9].heightMm" → "seats.spaces[].heightMm", the key of FIELD_INFO. */
export function patternOf(path: string): string {
	return path.replace(/\[[A-Za-z0-9_-]+\]/g, '[]');
}

type Entry = { id: string } & Record<string, unknown>;

const isEntry = (v: unknown): v is Entry =>
	v !== null && typeof v === 'object' && !Array.isArray(v) && typeof (v as Entry).id === 'string';

const isRecord = (v: unknown): v is Record<string, unknown> =>
	v !== null && typeof v === 'object' && !Array.isArray(v);

/** The value a path points at, or undefined when it is not there. */
export function valueAtPath(root: unknown, path: string): unknown {
	let node: unknown = root;
	for (const seg of parsePath(path)) {
		if (typeof seg === 'string') node = isRecord(node) ? node[seg] : undefined;
		else node = Array.isArray(node) ? node.find((e) => isEntry(e) && e.id === seg.id) : undefined;
		if (node === undefined) return undefined;
	}
	return node;
}

const capital = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

const NAME_MAX = 48;

/** A free-text name in quotes, cut at a word when long: “Driver side, above the pedal box…”. */
function quoted(v: unknown, fallback = 'unnamed'): string {
	const text = typeof v === 'string' ? v.trim() : '';
	if (!text) return fallback;
	if (text.length <= NAME_MAX) return `“${text}”`;
	const cut = text.slice(0, NAME_MAX);
	const space = cut.lastIndexOf(' ');
	return `“${(space > NAME_MAX / 2 ? cut.slice(0, space) : cut).replace(/[\s,;:.]+$/, '')}…”`;
}

/** How an entry of a list is called, from its own fields. */
const ENTRY_NOUNS: Record<string, (entry: Entry, parent: string | null) => string> = {
	'power.runs': (e) => `Power run to ${quoted(e.to, 'an unnamed spot')}`,
	'power.groundPoints': (e) => `Ground point ${quoted(e.location)}`,
	'firewall.passages': (e) => `Firewall passage ${quoted(e.location)}`,
	'seats.spaces': (e) => `${SEAT_NAMES[e.seat as keyof typeof SEAT_NAMES] ?? 'Unnamed'} seat space`,
	'harness.wires': (e) => `Wire ${quoted(e.function)}`,
	'harness.ladder.lines': (e) => `Steering control ${quoted(e.name)}`,
	'harness.ladder.lines[].buttons': (e, parent) => `${parent ?? 'Steering control'}, button ${quoted(e.name)}`,
	'speakers.locations': (e) =>
		typeof e.location === 'string' && e.location.trim() ? `${capital(e.location.trim())} speaker` : 'Unnamed speaker location',
	'camera.feeds': (e) => `Accessory feed ${quoted(e.name)}`,
	photos: (e) => `Photo ${quoted(e.caption, e.id)}`
};

function entryNoun(listPattern: string, entry: Entry, parent: string | null): string {
	return ENTRY_NOUNS[listPattern]?.(entry, parent) ?? `Entry ${entry.id}`;
}

function fieldLabel(info: FieldInfo, noun: string | null): string {
	return noun ? `${noun}, ${info.label}` : capital(info.label);
}

const SECTIONS: readonly string[] = SECTION_KEYS;

/**
 * A person's name for a path: "Passenger seat space, height". Entries are looked up
 * in the given contents in order, so a removed entry still gets its name.
 */
export function describePath(path: string, ...contents: unknown[]): string {
	const segs = parsePath(path);
	let nodes: unknown[] = contents;
	let pattern = '';
	let noun: string | null = null;
	for (let i = 0; i < segs.length; i++) {
		const seg = segs[i];
		if (typeof seg === 'string') {
			pattern = pattern ? `${pattern}.${seg}` : seg;
			nodes = nodes.map((n) => (isRecord(n) ? n[seg] : undefined));
			continue;
		}
		const found = nodes.map((n) => (Array.isArray(n) ? n.find((e) => isEntry(e) && e.id === seg.id) : undefined));
		const entry = found.find(isEntry);
		noun = entry ? entryNoun(pattern, entry, noun) : `Entry ${seg.id}`;
		nodes = found;
		pattern = `${pattern}[]`;
	}
	const info = FIELD_INFO[pattern];
	if (info) return fieldLabel(info, noun);
	if (noun) return noun;
	if (SECTIONS.includes(pattern)) return SECTION_NAMES[pattern as SectionKey];
	if (pattern === 'photos') return 'Photos';
	return capital(pattern.split('.').pop() ?? path);
}

const NOT_MEASURED = 'not measured';
const NOT_RECORDED = 'not recorded';

/** Ω values the way a meter reads them: "680 Ω", "2.2 kΩ", "1.5 MΩ". */
function formatOhms(ohm: number): string {
	const trimmed = (v: number) => String(Number(v.toFixed(3)));
	if (ohm >= 1_000_000) return `${trimmed(ohm / 1_000_000)} MΩ`;
	if (ohm >= 1000) return `${trimmed(ohm / 1000)} kΩ`;
	return `${trimmed(ohm)} Ω`;
}

/** A stored value shown in the reader's units. */
export function formatFieldValue(pattern: string, value: unknown, units: UnitSystem = 'metric', fields: FieldTree = VEHICLE_FIELDS): string {
	const info = fields.info[pattern];
	if (!info) return value == null ? NOT_RECORDED : String(value);
	switch (info.kind) {
		case 'mm':
			return formatLength(value as number | null, units, { missing: NOT_MEASURED });
		case 'm':
			return formatMetres(value as number | null, units, { missing: NOT_MEASURED });
		case 'ohm':
			return typeof value === 'number' ? formatOhms(value) : NOT_MEASURED;
		case 'amp':
			return typeof value === 'number' ? `${value} A` : NOT_RECORDED;
		case 'flag':
			return value === true ? 'yes' : value === false ? 'no' : 'not known';
		case 'choice':
			return typeof value === 'string' ? (info.choices?.[value] ?? value) : NOT_RECORDED;
		case 'section':
			return typeof value === 'string' ? (SECTION_NAMES[value as SectionKey] ?? value) : NOT_RECORDED;
		case 'textList':
			return Array.isArray(value) && value.length ? value.join('; ') : 'none';
		case 'year':
			return typeof value === 'number' ? String(value) : NOT_RECORDED;
		default:
			return typeof value === 'string' && value.trim() ? value : NOT_RECORDED;
	}
}

/** One line of an added or removed entry: its filled-in fields. */
function summarizeEntry(listPattern: string, entry: Entry, units: UnitSystem, fields: FieldTree): string {
	const infoOf = fields.info;
	const parts: string[] = [];
	for (const [key, value] of Object.entries(entry)) {
		if (key === 'id' || key === 'itemId') continue;
		const pattern = `${listPattern}[].${key}`;
		if (Array.isArray(value) && !infoOf[pattern]) {
			parts.push(`${value.length} ${value.length === 1 ? 'entry' : 'entries'}`);
			continue;
		}
		const info = infoOf[pattern];
		if (!info || value === '' || value === null || (Array.isArray(value) && value.length === 0)) continue;
		parts.push(`${info.label}: ${formatFieldValue(pattern, value, units, fields)}`);
	}
	return parts.join('; ') || 'no details yet';
}

export type ChangeKind = 'changed' | 'added' | 'removed';

export interface FieldChange {
	path: string;
	section: SectionKey;
	label: string;
	kind: ChangeKind;
	/** Shown values, in the reader's units; null for an entry that was not there. */
	before: string | null;
	after: string | null;
}

export interface FieldDiffOptions {
	units?: UnitSystem;
	/** The page's field tree; the vehicle page's unless a test brings its own. */
	fields?: FieldTree;
}

const same = (a: unknown, b: unknown) => canonicalJson(a) === canonicalJson(b);

interface Walk {
	units: UnitSystem;
	fields: FieldTree;
	out: FieldChange[];
}

function walk(
	before: unknown,
	after: unknown,
	path: PathSegment[],
	pattern: string,
	noun: string | null,
	section: SectionKey,
	w: Walk
): void {
	if (same(before, after)) return;
	const info = w.fields.info[pattern];
	if (info) {
		// Section notes are long Markdown; notesChanges shows them word by word.
		if (info.kind === 'markdown') return;
		w.out.push({
			path: formatPath(path),
			section,
			label: fieldLabel(info, noun),
			kind: 'changed',
			before: formatFieldValue(pattern, before, w.units, w.fields),
			after: formatFieldValue(pattern, after, w.units, w.fields)
		});
		return;
	}
	if (Array.isArray(before) || Array.isArray(after)) {
		walkEntries(asEntries(before), asEntries(after), path, pattern, noun, section, w);
		return;
	}
	const b = isRecord(before) ? before : {};
	const a = isRecord(after) ? after : {};
	for (const key of unionKeys(a, b)) {
		walk(b[key], a[key], [...path, key], pattern ? `${pattern}.${key}` : key, noun, section, w);
	}
}

const asEntries = (v: unknown): Entry[] => (Array.isArray(v) ? v.filter(isEntry) : []);

function unionKeys(first: Record<string, unknown>, second: Record<string, unknown>): string[] {
	const keys = Object.keys(first);
	for (const k of Object.keys(second)) if (!keys.includes(k)) keys.push(k);
	return keys;
}

function entrySection(entry: Entry, fallback: SectionKey): SectionKey {
	return SECTIONS.includes(entry.section as string) ? (entry.section as SectionKey) : fallback;
}

function walkEntries(
	before: Entry[],
	after: Entry[],
	path: PathSegment[],
	pattern: string,
	parentNoun: string | null,
	section: SectionKey,
	w: Walk
): void {
	const beforeById = new Map(before.map((e) => [e.id, e]));
	const afterIds = new Set(after.map((e) => e.id));
	const isPhotos = pattern === 'photos';
	for (const entry of after) {
		const old = beforeById.get(entry.id);
		const entryPath = [...path, { id: entry.id }];
		const noun = entryNoun(pattern, entry, parentNoun);
		const where = isPhotos ? entrySection(entry, section) : section;
		if (!old) {
			w.out.push({
				path: formatPath(entryPath),
				section: where,
				label: noun,
				kind: 'added',
				before: null,
				after: summarizeEntry(pattern, entry, w.units, w.fields)
			});
			continue;
		}
		for (const key of unionKeys(entry, old)) {
			if (key === 'id') continue;
			walk(old[key], entry[key], [...entryPath, key], `${pattern}[].${key}`, noun, where, w);
		}
	}
	for (const old of before) {
		if (afterIds.has(old.id)) continue;
		w.out.push({
			path: formatPath([...path, { id: old.id }]),
			section: isPhotos ? entrySection(old, section) : section,
			label: entryNoun(pattern, old, parentNoun),
			kind: 'removed',
			before: summarizeEntry(pattern, old, w.units, w.fields),
			after: null
		});
	}
}

/** Every structured field that differs, in page order, labelled in the trade's words. */
export function fieldChanges(before: VehicleContent, after: VehicleContent, options: FieldDiffOptions = {}): FieldChange[] {
	const w: Walk = { units: options.units ?? 'metric', fields: options.fields ?? VEHICLE_FIELDS, out: [] };
	const b: Record<string, unknown> = before;
	const a: Record<string, unknown> = after;
	for (const { key } of w.fields.sections) walk(b[key], a[key], [key], key, null, key as SectionKey, w);
	walkEntries(asEntries(b.photos), asEntries(a.photos), ['photos'], 'photos', null, 'identity', w);
	return w.out;
}

export interface NotesPart {
	value: string;
	added?: true;
	removed?: true;
}

export interface NotesChange {
	section: SectionKey;
	label: string;
	parts: NotesPart[];
}

/** Section notes that differ, as a word diff that keeps spacing and line breaks. */
export function notesChanges(before: VehicleContent, after: VehicleContent): NotesChange[] {
	const out: NotesChange[] = [];
	for (const key of SECTION_KEYS) {
		const b = valueAtPath(before, `${key}.notes`);
		const a = valueAtPath(after, `${key}.notes`);
		const oldText = typeof b === 'string' ? b : '';
		const newText = typeof a === 'string' ? a : '';
		if (oldText === newText) continue;
		const parts = diffWordsWithSpace(oldText, newText).map((c): NotesPart => {
			const part: NotesPart = { value: c.value };
			if (c.added) part.added = true;
			if (c.removed) part.removed = true;
			return part;
		});
		out.push({ section: key, label: `${SECTION_NAMES[key]} notes`, parts });
	}
	return out;
}
