import { COMMON_FIELDS, FIELD_LABELS, KIND_FIELDS, LENGTH_FIELDS, NUMBER, NUMBER_FIELDS, PART_FIELDS, PART_KIND_NAMES, PART_KINDS, YES_NO_FIELDS, type PartField, type PartKind } from './part';
import { partInputSchema, type PartData } from './partSchema';
import { parseLength, type LengthUnit } from './units';

// The catalogue form read on the server: typed text to a part the rule accepts.

export type PartFormResult = { ok: true; part: PartData } | { ok: false; errors: Partial<Record<PartField | 'form', string>> };

/** Reads the catalogue form: typed text to a validated part, or one message per field. */
export function readPartForm(values: Partial<Record<string, string>>, unit: LengthUnit = 'mm'): PartFormResult {
	const errors: Partial<Record<PartField | 'form', string>> = {};
	const raw: Record<string, unknown> = {};
	const kind = (values.kind ?? '').trim();
	// Only the chosen kind's fields are read: a form shows every kind's fields until a script hides them.
	const used: readonly PartField[] = (PART_KINDS as readonly string[]).includes(kind) ? [...COMMON_FIELDS, ...KIND_FIELDS[kind as PartKind]] : PART_FIELDS;
	for (const field of used) {
		const text = (values[field] ?? '').trim();
		if (YES_NO_FIELDS.has(field)) {
			if (text === 'yes' || text === 'on' || text === 'true') raw[field] = true;
			else if (text === 'no' || text === '' || text === 'false') raw[field] = false;
			else errors[field] = `${FIELD_LABELS[field]} must be yes or no.`;
		} else if (LENGTH_FIELDS.has(field) || NUMBER_FIELDS.has(field)) {
			if (text === '') continue;
			if (LENGTH_FIELDS.has(field)) {
				try {
					raw[field] = parseLength(text, unit);
				} catch (e) {
					errors[field] = (e as Error).message;
				}
			} else if (NUMBER.test(text)) {
				raw[field] = Number(text);
			} else {
				errors[field] = `"${text}" is not a number.`;
			}
		} else {
			raw[field] = text;
		}
	}
	const parsed = partInputSchema.safeParse(raw);
	if (!parsed.success) {
		for (const issue of parsed.error.issues) {
			const key = (issue.path[0] as PartField | undefined) ?? 'form';
			// A field the chosen kind does not use is never required, so a missing one reads "is required".
			errors[key] ??= issue.code === 'invalid_type' && raw[key as string] === undefined ? requiredMessage(key) : issue.message;
		}
	}
	if (Object.keys(errors).length > 0 || !parsed.success) return { ok: false, errors };
	return { ok: true, part: parsed.data };
}

function requiredMessage(field: PartField | 'form'): string {
	return field === 'kind' ? `Choose a kind: ${PART_KINDS.map((k) => PART_KIND_NAMES[k]).join(', ')}.` : `${FIELD_LABELS[field]} is required for this kind of part.`;
}
