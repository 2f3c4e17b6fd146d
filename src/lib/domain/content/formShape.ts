import type { FieldTree, GroupNode } from './fieldTree';

// How the editor form lays a page out: dotted names, list positions, the sections it holds.
// Shared by the form codec (server) and the editor's buttons (browser).

export type Raw = Record<string, unknown>;

export const isRecord = (v: unknown): v is Raw => v !== null && typeof v === 'object' && !Array.isArray(v);

export const joinPath = (a: string, b: string | number) => (a ? `${a}.${b}` : String(b));

/** The part of the tree the form holds: every section, in page order. */
export const formRoot = (fields: FieldTree): GroupNode => ({ type: 'group', key: '', pattern: '', children: fields.sections });

/** Posted list positions: "0" to "9999". */
export const INDEX = /^\d{1,4}$/;
