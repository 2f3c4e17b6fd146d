import { formatDay } from '../../domain/shopTime';
import { formatFieldValue } from '../../domain/content/fieldDiff';
import type { VehicleContent } from '../../domain/content/schema';
import { VEHICLE_FIELDS } from '../../domain/content/vehicleFields';
import { SECTION_KEYS, SECTION_NAMES, type SectionKey } from '../../domain/content/vocabulary';
import { fieldName, type FieldTree } from '../../domain/content/fieldTree';
import { formatLength, formatMetres, type UnitSystem } from '../../domain/units';

/** "95 mm" → { value: "95", unit: "mm" }; null when not measured, for a figure card's big number. */
export function lengthParts(mm: number | null, units: UnitSystem): { value: string; unit: string } | null {
	if (mm === null) return null;
	return split(formatLength(mm, units));
}

export function metreParts(m: number | null, units: UnitSystem): { value: string; unit: string } | null {
	if (m === null) return null;
	return split(formatMetres(m, units));
}

function split(text: string): { value: string; unit: string } {
	const at = text.lastIndexOf(' ');
	return { value: text.slice(0, at), unit: text.slice(at + 1) };
}

/** A stored value as the page shows it, e.g. ("harness.ladder.lines[].buttons[].ohms", 2200) → "2.2 kΩ". */
export const shown = (pattern: string, value: unknown, units: UnitSystem) => formatFieldValue(pattern, value, units);

const filled = (v: unknown): boolean =>
	Array.isArray(v) ? v.length > 0 : typeof v === 'string' ? v.trim() !== '' : v !== null && v !== undefined && v !== false;

export type Fact = { label: string; value: string };

/**
 * The filled-in fields of a section or entry ("seats", "seats.spaces[]") that its reading
 * component does not show in a place of its own (`shows`), labelled from the field tree. A field
 * added to the schema appears here until a component gives it a special place. Notes (Markdown)
 * are rendered with the section's notes, and lists by their component.
 */
export function otherFacts(pattern: string, values: object, shows: readonly string[], units: UnitSystem, fields: FieldTree = VEHICLE_FIELDS): Fact[] {
	const node = fields.nodes.get(pattern.replace(/\[\]$/, ''));
	const group = node?.type === 'list' ? node.entry : node?.type === 'group' ? node : null;
	const record = values as Record<string, unknown>;
	const facts: Fact[] = [];
	for (const child of group?.children ?? []) {
		if (child.type !== 'field' || child.info.kind === 'markdown' || shows.includes(child.key) || !filled(record[child.key])) continue;
		facts.push({ label: fieldName(child.info), value: formatFieldValue(child.pattern, record[child.key], units, fields) });
	}
	return facts;
}

/** A section with nothing recorded yet besides its defaults. */
export function sectionIsEmpty(content: VehicleContent, key: SectionKey): boolean {
	if (key === 'identity') return false;
	const section = content[key] as Record<string, unknown>;
	return Object.entries(section).every(([field, v]) => {
		if (field === 'ladder') return (v as { lines: unknown[] }).lines.length === 0;
		return !filled(v);
	});
}

export const SECTIONS = SECTION_KEYS.map((key) => ({ key, title: SECTION_NAMES[key] }));

/** The day in the shop's time zone: the same text on the server and in the browser, whatever either's own zone. */
export const shortDate = (iso: string, zone: string) => formatDay(iso, zone);

/** Sizes in one unit, e.g. "410 × 300 × 95 mm"; "?" stands for a side not measured. */
export function dimensions(mm: readonly (number | null)[], units: UnitSystem): string {
	const parts = mm.map((v) => lengthParts(v, units));
	const unit = parts.find((p) => p)?.unit ?? '';
	return `${parts.map((p) => p?.value ?? '?').join(' × ')}${unit ? ` ${unit}` : ''}`;
}
