import { z } from 'zod';
import { BODY_STYLE_NAMES, BODY_STYLES, type BodyStyle } from '../content/vocabulary';
import { inToMm, mmToIn } from '../units';
import { MAX_MEASURED_MM } from '../sizeRules';
import { COMPARISON_NAMES, MEASUREMENTS, measurementByKey, toMicrometres, type MeasureCondition } from './measurements';
import { YEAR_MAX, YEAR_MIN } from './query';
import { MAX_CONDITION_ROWS } from './conditionRows';

export const QUERY_MAX = 200;
/** Measured-space conditions one search may carry: as many as the form has rows. */
export const MAX_CONDITIONS = MAX_CONDITION_ROWS;

export type SearchFilters = {
	q: string;
	make?: string;
	year?: number;
	body?: BodyStyle;
	photos?: boolean;
	conditions: MeasureCondition[];
};

const blankToUndefined = (v: unknown) => (typeof v === 'string' && v.trim() === '' ? undefined : v);

const filtersSchema = z.object({
	q: z
		.string()
		.max(QUERY_MAX, { error: `The search is too long: keep it under ${QUERY_MAX} characters.` })
		.default(''),
	make: z.preprocess(
		blankToUndefined,
		z.string().trim().max(80, { error: 'The make is too long: keep it under 80 characters.' }).optional()
	),
	year: z.preprocess(
		blankToUndefined,
		z.coerce
			.number({ error: 'The year must be a number, for example 2012.' })
			.int({ error: 'The year must be a whole year, for example 2012.' })
			.min(YEAR_MIN, { error: `The year must be ${YEAR_MIN} or later.` })
			.max(YEAR_MAX, { error: `The year must be ${YEAR_MAX} or earlier.` })
			.optional()
	),
	body: z.preprocess(
		blankToUndefined,
		z
			.enum(BODY_STYLES, { error: `The body style must be one of: ${BODY_STYLES.map((b) => BODY_STYLE_NAMES[b]).join(', ')}.` })
			.optional()
	),
	photos: z.preprocess(
		blankToUndefined,
		z
			.enum(['1', 'on', 'true', '0', 'off', 'false'], { error: '"photos" must be 1 (only pages with photos) or 0.' })
			.transform((v) => v === '1' || v === 'on' || v === 'true')
			.optional()
	),
	unit: z.preprocess(blankToUndefined, z.enum(['mm', 'in'], { error: 'The unit must be mm or in.' }).default('mm'))
});

const measureKey = z.enum(MEASUREMENTS.map((m) => m.key) as [string, ...string[]], {
	error: `The measurement must be one of: ${MEASUREMENTS.map((m) => m.label.toLowerCase()).join(', ')}.`
});
const opSchema = z.enum(['gte', 'lte'], { error: `The comparison must be "gte" (${COMPARISON_NAMES.gte}) or "lte" (${COMPARISON_NAMES.lte}).` });
const valueSchema = z.coerce
	.number({ error: 'A measurement value must be a number.' })
	.positive({ error: 'A measurement value must be more than 0.' })
	.max(MAX_MEASURED_MM, { error: `A measurement value must be at most ${MAX_MEASURED_MM} mm (${Math.floor(mmToIn(MAX_MEASURED_MM))} in); check the unit.` });

export type FilterParse = { ok: true; filters: SearchFilters } | { ok: false; message: string; field: string };

/**
 * Reads search filters from a query string. Measurement conditions come as parallel lists
 * (`measure`, `op`, `value`), one entry per row of the form; a row with no measurement or no value is skipped.
 */
export function parseSearchFilters(params: URLSearchParams): FilterParse {
	const base = filtersSchema.safeParse({
		q: params.get('q') ?? undefined,
		make: params.get('make') ?? undefined,
		year: params.get('year') ?? undefined,
		body: params.get('body') ?? undefined,
		photos: params.get('photos') ?? undefined,
		unit: params.get('unit') ?? undefined
	});
	if (!base.success) {
		const issue = base.error.issues[0];
		return { ok: false, message: issue.message, field: String(issue.path[0] ?? 'q') };
	}
	const measures = params.getAll('measure');
	const ops = params.getAll('op');
	const values = params.getAll('value');
	const conditions: MeasureCondition[] = [];
	for (let i = 0; i < measures.length; i++) {
		const rawValue = (values[i] ?? '').trim();
		if (!measures[i] || !rawValue) continue;
		const measure = measureKey.safeParse(measures[i]);
		if (!measure.success) return { ok: false, message: measure.error.issues[0].message, field: 'measure' };
		const op = opSchema.safeParse(ops[i] ?? 'gte');
		if (!op.success) return { ok: false, message: op.error.issues[0].message, field: 'op' };
		const value = valueSchema.safeParse(base.data.unit === 'in' ? inToMm(Number(rawValue.replace(',', '.'))) : rawValue.replace(',', '.'));
		if (!value.success) {
			const label = measurementByKey.get(measure.data)!.label;
			return { ok: false, message: `${label}: ${value.error.issues[0].message}`, field: 'value' };
		}
		conditions.push({ measure: measure.data, op: op.data, mm: toMicrometres(value.data) / 1000 });
	}
	if (conditions.length > MAX_CONDITIONS) {
		return { ok: false, message: `At most ${MAX_CONDITIONS} measurement conditions at a time.`, field: 'measure' };
	}
	const { unit: _unit, ...rest } = base.data;
	return { ok: true, filters: { ...rest, conditions } };
}
