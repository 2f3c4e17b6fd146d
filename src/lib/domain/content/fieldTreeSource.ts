import type { FieldNode } from './fieldTree';
import { SEARCH_LINES } from './searchLines';
import * as vocabulary from './vocabulary';

// The field tree written out as a TypeScript module (fieldTree.data.ts). Choice names and search
// lines are written as references to the modules that hold them, so no list is copied.

const named = new Map<unknown, string>([
	...Object.entries(vocabulary).map(([name, value]) => [value, name] as const),
	...Object.entries(SEARCH_LINES).map(([name, fn]) => [fn, `SEARCH_LINES.${name}`] as const)
]);

const IDENTIFIER = /^[A-Za-z_$][\w$]*$/;

function literal(value: unknown, indent: string): string {
	const name = named.get(value);
	if (name) return name;
	if (typeof value === 'function') throw new Error('A function in the field tree must be one of SEARCH_LINES.');
	if (value === null || typeof value !== 'object') return JSON.stringify(value);
	const inner = `${indent}\t`;
	if (Array.isArray(value)) {
		if (value.length === 0) return '[]';
		return `[\n${value.map((v) => `${inner}${literal(v, inner)}`).join(',\n')}\n${indent}]`;
	}
	const entries = Object.entries(value).filter(([, v]) => v !== undefined);
	if (entries.length === 0) return '{}';
	const key = (k: string) => (IDENTIFIER.test(k) ? k : JSON.stringify(k));
	return `{\n${entries.map(([k, v]) => `${inner}${key(k)}: ${literal(v, inner)}`).join(',\n')}\n${indent}}`;
}

/** The text of fieldTree.data.ts for the page's top-level nodes. */
export function fieldTreeModule(top: FieldNode[]): string {
	const body = literal(top, '');
	const used = [...named.values()].filter((n) => !n.startsWith('SEARCH_LINES.') && new RegExp(`\\b${n}\\b`).test(body)).sort();
	const imports = [
		`import type { FieldNode } from './fieldTree';`,
		...(body.includes('SEARCH_LINES.') ? [`import { SEARCH_LINES } from './searchLines';`] : []),
		...(used.length ? [`import { ${used.join(', ')} } from './vocabulary';`] : [])
	];
	return `${imports.join('\n')}

// Written by \`npm run fields:write\` from the rules in schema.ts; do not edit by hand.
// tests/unit/content/fieldTreeData.test.ts fails when this and the rules differ.

export const VEHICLE_FIELD_NODES: FieldNode[] = ${body};
`;
}
