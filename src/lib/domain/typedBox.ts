import type { Box } from './fit';
import { partSizeProblem } from './sizeRules';
import { parseLength, type LengthUnit } from './units';

// A box typed as three lengths (L × W × H), read the same way on the fit screen and by its load.

export type BoxSide = 'l' | 'w' | 'h';
export const BOX_SIDES: readonly (readonly [BoxSide, string])[] = [
	['l', 'Length'],
	['w', 'Width'],
	['h', 'Height']
];

export type TypedBox = { box: Box | null; errors: Partial<Record<BoxSide, string>> };

/**
 * The box in millimetres, or one message per side that names it ("Width: …"), so two sides with the
 * same fault still read as two messages. All three blank is no box and no complaint.
 */
export function readTypedBox(texts: Record<BoxSide, string>, unit: LengthUnit): TypedBox {
	if (BOX_SIDES.every(([side]) => !texts[side].trim())) return { box: null, errors: {} };
	const errors: TypedBox['errors'] = {};
	const mm = {} as Box;
	for (const [side, name] of BOX_SIDES) {
		const text = texts[side];
		if (!text.trim()) {
			errors[side] = `${name}: type the box's ${name.toLowerCase()}.`;
			continue;
		}
		try {
			mm[side] = parseLength(text, unit);
			const problem = partSizeProblem(mm[side]);
			if (problem) errors[side] = `${name}: ${problem}`;
		} catch (e) {
			errors[side] = `${name}: ${(e as Error).message}`;
		}
	}
	return Object.keys(errors).length ? { box: null, errors } : { box: mm, errors };
}
