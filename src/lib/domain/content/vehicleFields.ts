import { VEHICLE_FIELD_NODES } from './fieldTree.data';
import { treeOf, type FieldInfo, type FieldTree } from './fieldTree';

/** The vehicle page's field tree: what the form, the editor, the diff, search and the reading page walk. */
export const VEHICLE_FIELDS: FieldTree = treeOf(VEHICLE_FIELD_NODES);

/** Every leaf field of a page, keyed by its pattern: "seats.spaces[].heightMm". */
export const FIELD_INFO: Readonly<Record<string, FieldInfo>> = VEHICLE_FIELDS.info;
