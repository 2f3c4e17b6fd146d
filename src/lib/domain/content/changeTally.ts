import { fieldChanges, notesChanges, patternOf, valueAtPath } from './fieldDiff';
import type { FieldTree } from './fieldTree';
import type { VehicleContent } from './schema';
import { VEHICLE_FIELDS } from './vehicleFields';

/** What a revision changed, in the terms a shop scans a log by. */
export type ChangeTally = {
	/** Structured fields changed, plus list entries added or removed (each counts once). */
	fields: number;
	/** Section notes rewritten. */
	notes: number;
	/** Measured figures (lengths, resistances, currents) that changed, came or went. */
	measurements: number;
};

const MEASURED = new Set(['mm', 'm', 'ohm', 'amp']);

const isMeasured = (fields: FieldTree, pattern: string) => MEASURED.has(fields.info[pattern]?.kind ?? '');

const hasValue = (v: unknown) => v !== null && v !== undefined && v !== '';

/** Measured figures recorded in an entry that came or went, including entries nested inside it. */
function measuredIn(entry: unknown, pattern: string, fields: FieldTree): number {
	if (!entry || typeof entry !== 'object') return 0;
	let n = 0;
	for (const [key, value] of Object.entries(entry as Record<string, unknown>)) {
		const inner = `${pattern}.${key}`;
		if (Array.isArray(value)) for (const item of value) n += measuredIn(item, `${inner}[]`, fields);
		else if (isMeasured(fields, inner) && hasValue(value)) n += 1;
	}
	return n;
}

/** Counts the changes between two versions of a page, walking the same field tree as the compare view. */
export function tallyChanges(before: VehicleContent, after: VehicleContent, fields: FieldTree = VEHICLE_FIELDS): ChangeTally {
	let measurements = 0;
	const changes = fieldChanges(before, after, { fields });
	for (const change of changes) {
		const pattern = patternOf(change.path);
		if (change.kind === 'changed') {
			if (isMeasured(fields, pattern)) measurements += 1;
		} else {
			const entry = valueAtPath(change.kind === 'added' ? after : before, change.path);
			measurements += measuredIn(entry, pattern, fields);
		}
	}
	return { fields: changes.length, notes: notesChanges(before, after).length, measurements };
}
