import type { z } from 'zod';

// The vehicle page's fields as a tree: sections → fields and lists of entries. The form codec,
// the editor, the field diff and the search document all walk this tree instead of naming fields
// themselves. Plain data: the browser reads it without the rules it was declared beside (schema.ts).

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
	/** Everything at the page's top level, in order: the sections and the photo list. */
	top: FieldNode[];
	/** Top-level sections in page order. */
	sections: GroupNode[];
	/** Every field by pattern. */
	info: Readonly<Record<string, FieldInfo>>;
	/** Every node by pattern (lists by their own pattern, "seats.spaces"). */
	nodes: ReadonlyMap<string, FieldNode>;
}

function index(n: FieldNode, info: Record<string, FieldInfo>, nodes: Map<string, FieldNode>): void {
	nodes.set(n.pattern, n);
	if (n.type === 'field') info[n.pattern] = n.info;
	else if (n.type === 'list') for (const c of n.entry.children) index(c, info, nodes);
	else for (const c of n.children) index(c, info, nodes);
}

/** The tree of a page whose top level holds these nodes (its sections, and lists such as photos), indexed by pattern. */
export function treeOf(top: FieldNode[]): FieldTree {
	const info: Record<string, FieldInfo> = {};
	const nodes = new Map<string, FieldNode>();
	for (const c of top) index(c, info, nodes);
	const sections = top.filter((c): c is GroupNode => c.type === 'group' && !!c.section);
	return { top, sections, info, nodes };
}

/** A page's field tree with the rule the whole page is checked against on every save. */
export interface PageRules extends FieldTree {
	schema: z.ZodType;
}

const capital = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

/** A field's own name at the start of a sentence: "Hole size". */
export const fieldName = (info: FieldInfo): string => capital(info.label);

/** The label an input carries in the editor. */
export const inputLabel = (info: FieldInfo): string => info.edit?.label ?? fieldName(info);
