import { z } from 'zod';
import { treeOf, type FieldInfo, type FieldNode, type GroupNode, type ListInfo, type PageRules, type SectionInfo } from './fieldTree';

// Field information rides on the zod rules it is declared with (schema.ts); this walk reads it back
// as the plain field tree. The vehicle page's tree is kept written out (fieldTree.data.ts) so the
// browser needs no rules; a unit test holds the two equal.

type Registered = FieldInfo | ListInfo | SectionInfo;

/** Field information attached to zod schemas; the walk below finds it. */
export const fieldRegistry = z.registry<Registered>();

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

/** Reads the field tree out of a page schema whose fields were registered in `fieldRegistry`. */
export function fieldTree(schema: z.ZodType): PageRules {
	const root = node('', '', schema);
	if (root?.type !== 'group') throw new Error('A page schema is an object of sections.');
	return { ...treeOf(root.children), schema };
}
