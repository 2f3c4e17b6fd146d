import { lengthText, readAmps, readLength, readOhms, type LengthUnit } from '../units';
import { fieldName, type FieldNode, type FieldTree, type GroupNode, type LeafNode, type PageRules } from './fieldTree';
import { formRoot, INDEX, isRecord, joinPath, type Raw } from './formShape';
import { newItemId } from './itemId';
import { CONTENT_SCHEMA_VERSION, formatZodIssues, VEHICLE_RULES, type VehicleContent } from './schema';
import { VEHICLE_FIELDS } from './vehicleFields';
import type { ConflictView } from './conflictViews';

// A vehicle page as an HTML form. Every field is text under a dotted name such as
// "seats.spaces.0.heightMm", so the editor works without JavaScript and a refused save
// hands back exactly what was typed. The fields come from the page's field tree.

type DraftOf<T> = T extends readonly string[]
	? string[]
	: T extends readonly (infer E)[]
		? Array<{ id: string } & DraftOf<Omit<E, 'id'>>>
		: T extends object
			? { -readonly [K in keyof T]: DraftOf<T[K]> }
			: string;

/** Everything the editor form holds: the page as typed text, list entries keyed by id. */
export type ContentDraft = DraftOf<Omit<VehicleContent, 'schemaVersion' | 'photos'>>;


const isMeasure = (kind: string): kind is 'mm' | 'm' | 'ohm' | 'amp' => kind === 'mm' || kind === 'm' || kind === 'ohm' || kind === 'amp';

// ---- Content → draft ----

function leafToDraft(leaf: LeafNode, value: unknown, unit: LengthUnit): unknown {
	switch (leaf.info.kind) {
		case 'textList':
			return Array.isArray(value) ? value.map(String) : [];
		case 'mm':
		case 'm':
			return lengthText(leaf.info.kind, typeof value === 'number' ? value : null, unit);
		case 'ohm':
		case 'amp':
		case 'year':
			return typeof value === 'number' ? String(value) : '';
		case 'flag':
			return value === true ? 'yes' : leaf.nullable && value === false ? 'no' : '';
		default:
			return typeof value === 'string' ? value : '';
	}
}

function toDraft(node: FieldNode, value: unknown, unit: LengthUnit): unknown {
	if (node.type === 'field') return leafToDraft(node, value, unit);
	if (node.type === 'list') {
		const list = Array.isArray(value) ? value.filter(isRecord) : [];
		return list.map((e) => ({ id: String(e.id), ...(toDraft(node.entry, e, unit) as Raw) }));
	}
	const out: Raw = {};
	const v = isRecord(value) ? value : {};
	for (const child of node.children) out[child.key] = toDraft(child, v[child.key], unit);
	return out;
}

/** The editor form filled from stored content, lengths in the given unit. */
export function formFromContent(content: VehicleContent, unit: LengthUnit = 'mm', fields: FieldTree = VEHICLE_FIELDS): ContentDraft {
	return toDraft(formRoot(fields), content, unit) as ContentDraft;
}

// ---- Posted fields → draft ----

const NAME_SEGMENT = /^[A-Za-z0-9_-]{1,64}$/;
const ITEM_ID = /^[A-Za-z0-9_-]{1,64}$/;

function indexed(raw: unknown): unknown[] {
	if (!isRecord(raw)) return [];
	return Object.keys(raw)
		.filter((k) => INDEX.test(k))
		.sort((a, b) => Number(a) - Number(b))
		.map((k) => raw[k]);
}

function fromRaw(node: FieldNode, raw: unknown): unknown {
	if (node.type === 'field') {
		if (node.info.kind === 'textList') return indexed(raw).map((v) => (typeof v === 'string' ? v : ''));
		return typeof raw === 'string' ? raw.replace(/\r\n?/g, '\n') : '';
	}
	if (node.type === 'list') {
		return indexed(raw).map((item) => {
			const r = isRecord(item) ? item : {};
			const id = typeof r.id === 'string' && ITEM_ID.test(r.id) ? r.id : newItemId();
			return { id, ...(fromRaw(node.entry, r) as Raw) };
		});
	}
	const out: Raw = {};
	const r = isRecord(raw) ? raw : {};
	for (const child of node.children) out[child.key] = fromRaw(child, r[child.key]);
	return out;
}

/** Posted name/value pairs back into a draft; names the form does not have are ignored. */
export function draftFromEntries(entries: Iterable<readonly [string, string]>, fields: FieldTree = VEHICLE_FIELDS): ContentDraft {
	const root = formRoot(fields);
	const sections = new Set(root.children.map((c) => c.key));
	const tree: Raw = Object.create(null);
	for (const [name, value] of entries) {
		const path = name.split('.');
		if (!sections.has(path[0]) || !path.every((s) => NAME_SEGMENT.test(s))) continue;
		let node = tree;
		for (const seg of path.slice(0, -1)) {
			if (!isRecord(node[seg])) node[seg] = Object.create(null);
			node = node[seg] as Raw;
		}
		node[path[path.length - 1]] = value;
	}
	return fromRaw(root, tree) as ContentDraft;
}

// ---- Draft → content ----

/** An entry nobody typed into; choices and ticks alone do not count. */
function isBlank(node: FieldNode, value: unknown): boolean {
	if (node.type === 'field') {
		const kind = node.info.kind;
		if (kind === 'textList') return !Array.isArray(value) || value.every((s) => !String(s).trim());
		if (kind === 'flag' || kind === 'choice') return true;
		return typeof value !== 'string' || !value.trim();
	}
	if (node.type === 'list') return !Array.isArray(value) || value.every((item) => isBlank(node.entry, item));
	const v = isRecord(value) ? value : {};
	return node.children.every((child) => isBlank(child, v[child.key]));
}

interface Build {
	unit: LengthUnit;
	errors: Record<string, string>;
	/** Content path of a kept list entry → its place in the form. */
	places: Map<string, string>;
}

interface Where {
	form: string;
	content: string;
}

function measureFrom(leaf: LeafNode, kind: 'mm' | 'm' | 'ohm' | 'amp', text: string, base: unknown, at: Where, b: Build): number | null {
	const t = text.trim();
	if (!t) return null;
	const label = fieldName(leaf.info);
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

function leafFromDraft(leaf: LeafNode, value: unknown, base: unknown, at: Where, b: Build): unknown {
	const text = typeof value === 'string' ? value : '';
	const kind = leaf.info.kind;
	if (kind === 'textList') {
		const list = Array.isArray(value) ? value.map(String) : [];
		const out: string[] = [];
		list.forEach((item, i) => {
			if (!item.trim()) return;
			b.places.set(joinPath(at.content, out.length), joinPath(at.form, i));
			out.push(item);
		});
		return out;
	}
	if (kind === 'year') return text.trim() === '' ? undefined : Number(text.trim());
	if (isMeasure(kind)) return measureFrom(leaf, kind, text, base, at, b);
	if (kind === 'flag') {
		if (!leaf.nullable) return text === 'yes';
		return text === 'yes' ? true : text === 'no' ? false : null;
	}
	if (kind === 'choice' && leaf.nullable) return text === '' ? null : text;
	return text;
}

function fromDraft(node: FieldNode, value: unknown, base: unknown, at: Where, b: Build): unknown {
	if (node.type === 'field') return leafFromDraft(node, value, base, at, b);
	if (node.type === 'list') {
		const list = Array.isArray(value) ? value.filter(isRecord) : [];
		const baseList = Array.isArray(base) ? base.filter(isRecord) : [];
		const out: Raw[] = [];
		list.forEach((item, i) => {
			if (isBlank(node.entry, item)) return;
			const where = { form: joinPath(at.form, i), content: joinPath(at.content, out.length) };
			b.places.set(where.content, where.form);
			const baseItem = baseList.find((e) => e.id === item.id);
			out.push({ id: item.id, ...(fromDraft(node.entry, item, baseItem, where, b) as Raw) });
		});
		return out;
	}
	const out: Raw = {};
	const v = isRecord(value) ? value : {};
	const bv = isRecord(base) ? base : {};
	for (const child of node.children) {
		const where = { form: joinPath(at.form, child.key), content: joinPath(at.content, child.key) };
		out[child.key] = fromDraft(child, v[child.key], bv[child.key], where, b);
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
export function contentFromDraft(
	draft: ContentDraft,
	unit: LengthUnit,
	base?: VehicleContent | null,
	fields: PageRules = VEHICLE_RULES
): FormContent {
	const b: Build = { unit, errors: {}, places: new Map() };
	const built = fromDraft(formRoot(fields), draft, base ?? null, { form: '', content: '' }, b) as Raw;
	const candidate = { schemaVersion: CONTENT_SCHEMA_VERSION, ...built, photos: base?.photos ?? [] };
	const formPath = (path: string) => placeIn(b.places, path);
	const parsed = fields.schema.safeParse(candidate);
	const errors: Record<string, string> = {};
	if (!parsed.success) {
		for (const [path, message] of Object.entries(formatZodIssues(parsed.error))) errors[formPath(path)] ??= message;
	}
	Object.assign(errors, b.errors);
	const ok = parsed.success && Object.keys(errors).length === 0;
	return { draft, content: ok ? (parsed.data as VehicleContent) : null, errors, formPath };
}

/** Posted fields to page content; see contentFromDraft. */
export function contentFromForm(
	entries: Iterable<readonly [string, string]>,
	unit: LengthUnit,
	base?: VehicleContent | null,
	fields: PageRules = VEHICLE_RULES
): FormContent {
	return contentFromDraft(draftFromEntries(entries, fields), unit, base, fields);
}

function flatten(node: FieldNode, value: unknown, name: string, out: [string, string][]): void {
	if (node.type === 'field') {
		if (node.info.kind === 'textList') {
			(Array.isArray(value) ? value : []).forEach((v, i) => out.push([joinPath(name, i), String(v)]));
			return;
		}
		// An unticked box is not posted at all.
		if (node.info.kind === 'flag' && !node.nullable && value !== 'yes') return;
		out.push([name, typeof value === 'string' ? value : '']);
		return;
	}
	if (node.type === 'list') {
		(Array.isArray(value) ? value : []).forEach((item, i) => {
			const at = joinPath(name, i);
			out.push([`${at}.id`, String(isRecord(item) ? item.id : '')]);
			flatten(node.entry, item, at, out);
		});
		return;
	}
	const v = isRecord(value) ? value : {};
	for (const child of node.children) flatten(child, v[child.key], joinPath(name, child.key), out);
}

/** The name/value pairs a browser posts for this draft, in form order. */
export function formEntries(draft: ContentDraft, fields: FieldTree = VEHICLE_FIELDS): [string, string][] {
	const out: [string, string][] = [];
	flatten(formRoot(fields), draft, '', out);
	return out;
}

/** What the editor shows again after a refused save: the draft as typed, its unit, and conflicts still to settle. */
export interface EditorValues {
	draft: ContentDraft;
	unit: LengthUnit;
	summary: string;
	baseRevisionId: number;
	/** Conflicts still to settle: shown, and posted back as JSON with the save. */
	conflicts: ConflictView[];
	conflictsJson: string;
	/** Who saved the revision the conflicts are against, and when (ISO). */
	meanwhile?: { by: string; at: string } | null;
	/** The page was locked for moderators while this was typed: it may still be suggested. */
	offerSuggestion?: boolean;
}
