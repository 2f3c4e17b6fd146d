import type { UnitSystem } from '../units';
import type { FieldTree } from './fieldTree';
import { formatFieldValue, patternOf } from './fieldDiff';
import type { MergeConflict } from './merge';
import { VEHICLE_FIELDS } from './vehicleFields';

// Fields two people changed at once, shown side by side so the writer can pick a value.

export interface ConflictView {
	path: string;
	label: string;
	base: string;
	theirs: string;
	yours: string;
	/** Notes: shown as blocks of text rather than one line. */
	long: boolean;
}

function conflictValue(path: string, value: unknown, units: UnitSystem, fields: FieldTree): string {
	const pattern = patternOf(path);
	if (pattern.endsWith('[]') || (!fields.info[pattern] && value !== null && typeof value === 'object')) {
		return value === null || value === undefined ? 'removed' : 'kept, with changes';
	}
	return formatFieldValue(pattern, value, units, fields);
}

/** Base, theirs and yours of each conflicting field, as a person reads them. */
export function conflictViews(conflicts: readonly MergeConflict[], units: UnitSystem, fields: FieldTree = VEHICLE_FIELDS): ConflictView[] {
	return conflicts.map((c) => ({
		path: c.path,
		label: c.label,
		base: conflictValue(c.path, c.base, units, fields),
		theirs: conflictValue(c.path, c.theirs, units, fields),
		yours: conflictValue(c.path, c.yours, units, fields),
		long: fields.info[patternOf(c.path)]?.kind === 'markdown'
	}));
}
