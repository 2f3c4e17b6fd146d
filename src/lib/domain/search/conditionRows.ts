// The measured-space rows of the search form, read from and written to the address: each row is one
// entry of the parallel lists measure / op / value, so a search with its rows can be shared as a link.
// "Add a condition" and "Remove" are buttons of the same GET form (they work without scripts): the
// address they produce is tidied into plain rows again.

export const MAX_CONDITION_ROWS = 6;

export type ConditionRow = { measure: string; op: string; value: string };

const BLANK: ConditionRow = { measure: '', op: 'gte', value: '' };

/**
 * The rows as listed in the address, at least one (blank) so the form always has a row to fill. `rows`
 * says how many the form shows: a change in it is a change of address even when only blank rows differ.
 */
export function conditionRows(params: URLSearchParams): ConditionRow[] {
	const measures = params.getAll('measure');
	const ops = params.getAll('op');
	const values = params.getAll('value');
	const shown = Math.min(MAX_CONDITION_ROWS, Math.max(0, Math.trunc(Number(params.get('rows'))) || 0));
	const n = Math.max(measures.length, values.length, shown, 1);
	return Array.from({ length: n }, (_, i) => ({ measure: measures[i] ?? '', op: ops[i] || 'gte', value: values[i] ?? '' }));
}

/**
 * When the form was sent by "Add a condition" (`add`) or a row's "Remove" (`drop=i`), the address to go to
 * instead: the same search with that row added (blank, up to the limit) or taken out. Null otherwise.
 */
export function tidiedRows(params: URLSearchParams): string | null {
	const drop = params.get('drop');
	const add = params.has('add');
	if (drop === null && !add) return null;
	let rows = conditionRows(params);
	const at = Number(drop);
	if (drop !== null && Number.isInteger(at) && at >= 0 && at < rows.length) rows = rows.filter((_, i) => i !== at);
	if (add && rows.length < MAX_CONDITION_ROWS) rows.push({ ...BLANK });
	const next = new URLSearchParams();
	for (const [key, value] of params) if (!['measure', 'op', 'value', 'drop', 'add', 'page', 'rows'].includes(key)) next.append(key, value);
	for (const row of rows) {
		next.append('measure', row.measure);
		next.append('op', row.op);
		next.append('value', row.value);
	}
	next.set('rows', String(Math.max(rows.length, 1)));
	return next.toString();
}
