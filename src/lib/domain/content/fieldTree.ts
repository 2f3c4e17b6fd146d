import { z } from 'zod';

// The vehicle page's fields, declared once beside their zod rules (schema.ts) and read back
// as a tree: sections → fields and lists of entries. The form codec, the editor, the field
// diff and the search document all walk this tree instead of naming fields themselves.

/** How a stored value is shown, typed and merged. */
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

/** How the editor shows a field, where that differs from the plain default. */
export interface EditHint {
	/** The input's label when the stored label reads badly on its own ("Where" for a location). */
	label?: string;
	placeholder?: string;
	multiline?: boolean;
	/** Starts a new row of inputs with these grid classes. */
	row?: string;
	/** Grid classes for this input within its row. */
	span?: string;
	/** One item of a text list: "step", "VIN pattern". */
	noun?: string;
	/** Items done in order get numbers and move buttons. */
	ordered?: boolean;
}

/** How a field reads in the search document: a labelled value ("Hole: 12 mm"), or left out. */
export type SearchHint = false | { label: string; lowerCase?: boolean };

export interface FieldInfo {
	/** Section-level fields carry a full label, item fields a short one ("height"). */
	label: string;
	kind: FieldKind;
	choices?: Readonly<Record<string, string>>;
	edit?: EditHint;
	search?: SearchHint;
}

export interface ListInfo {
	kind: 'list';
	/** What one entry is called: "seat space". */
	noun: string;
	/** Heading above the list in the editor. */
	title?: string;
	/** Grid classes for the first row of an entry's inputs. */
	grid?: string;
	/** Classes around the list when it sits inside another entry. */
	frame?: string;
	/** A sentence made of several of the entry's fields, placed first in the search document. */
	searchLine?: (entry: Readonly<Record<string, unknown>>) => string;
}

export interface SectionInfo {
	kind: 'page-section';
	label: string;
	/** A line under the section's heading in the editor. */
	hint?: string;
}

type Registered = FieldInfo | ListInfo | SectionInfo;

/** Field information attached to zod schemas; the walk below finds it. */
export const fieldRegistry = z.registry<Registered>();

export interface LeafNode {
	type: 'field';
	key: string;
	/** "seats.spaces[].heightMm": the key of every per-field table. */
	pattern: string;
	info: FieldInfo;
	/** Null is a stored value: a choice or flag may be "not recorded". */
	nullable: boolean;
}

export interface GroupNode {
	type: 'group';
	key: string;
	pattern: string;
	children: FieldNode[];
	section?: SectionInfo;
}

export interface ListNode {
	type: 'list';
	key: string;
	pattern: string;
	info: ListInfo;
	entry: GroupNode;
}

export type FieldNode = LeafNode | GroupNode | ListNode;

export interface FieldTree {
	/** The whole page's rule, checked on every save. */
	schema: z.ZodType;
	/** Top-level sections in page order. */
	sections: GroupNode[];
	/** Every field by pattern. */
	info: Readonly<Record<string, FieldInfo>>;
	/** Every node by pattern (lists by their own pattern, "seats.spaces"). */
	nodes: ReadonlyMap<string, FieldNode>;
}

interface ZodDef {
	type: string;
	innerType?: z.ZodType;
	in?: z.ZodType;
	shape?: Record<string, z.ZodType>;
	element?: z.ZodType;
}

const defOf = (schema: z.ZodType) => (schema as unknown as { _zod: { def: ZodDef } })._zod.def;

const WRAPPERS = new Set(['default', 'prefault', 'nullable', 'optional', 'readonly', 'catch', 'pipe']);

/** The schema under defaults, nullables and pipes, with the first field information found on the way. */
function unwrap(schema: z.ZodType): { core: z.ZodType; info: Registered | undefined; nullable: boolean } {
	let core = schema;
	let info = fieldRegistry.get(core);
	let nullable = false;
	for (let def = defOf(core); WRAPPERS.has(def.type); def = defOf(core)) {
		if (def.type === 'nullable') nullable = true;
		const inner = def.type === 'pipe' ? def.in : def.innerType;
		if (!inner) break;
		core = inner;
		info ??= fieldRegistry.get(core);
	}
	return { core, info, nullable };
}

const join = (a: string, b: string) => (a ? `${a}.${b}` : b);

function node(key: string, pattern: string, schema: z.ZodType): FieldNode | null {
	const { core, info, nullable } = unwrap(schema);
	const def = defOf(core);
	if (info && info.kind !== 'list' && info.kind !== 'page-section') return { type: 'field', key, pattern, info, nullable };
	if (def.type === 'object' && def.shape) {
		const group = groupOf(key, pattern, def.shape);
		if (info?.kind === 'page-section') group.section = info;
		return group;
	}
	if (def.type === 'array' && def.element && info?.kind === 'list') {
		const entry = node('', `${pattern}[]`, def.element);
		if (entry?.type !== 'group') return null;
		return { type: 'list', key, pattern, info, entry };
	}
	return null;
}

function groupOf(key: string, pattern: string, shape: Record<string, z.ZodType>): GroupNode {
	const children: FieldNode[] = [];
	for (const [k, child] of Object.entries(shape)) {
		const n = node(k, pattern.endsWith('[]') ? `${pattern}.${k}` : join(pattern, k), child);
		if (n) children.push(n);
	}
	return { type: 'group', key, pattern, children };
}

function index(n: FieldNode, info: Record<string, FieldInfo>, nodes: Map<string, FieldNode>): void {
	nodes.set(n.pattern, n);
	if (n.type === 'field') info[n.pattern] = n.info;
	else if (n.type === 'list') for (const c of n.entry.children) index(c, info, nodes);
	else for (const c of n.children) index(c, info, nodes);
}

/** Reads the field tree out of a page schema whose fields were registered in `fieldRegistry`. */
export function fieldTree(schema: z.ZodType): FieldTree {
	const root = node('', '', schema);
	if (root?.type !== 'group') throw new Error('A page schema is an object of sections.');
	const info: Record<string, FieldInfo> = {};
	const nodes = new Map<string, FieldNode>();
	for (const c of root.children) index(c, info, nodes);
	const sections = root.children.filter((c): c is GroupNode => c.type === 'group' && !!c.section);
	return { schema, sections, info, nodes };
}

const capital = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

/** A field's own name at the start of a sentence: "Hole size". */
export const fieldName = (info: FieldInfo): string => capital(info.label);

/** The label an input carries in the editor. */
export const inputLabel = (info: FieldInfo): string => info.edit?.label ?? fieldName(info);
