/** A calculator's fields as a query string, leaving out the empty ones, so the address can be shared. */
export function queryOf(fields: Record<string, string | boolean | undefined>): string {
	const p = new URLSearchParams();
	for (const [k, v] of Object.entries(fields)) {
		if (v === true) p.set(k, 'on');
		else if (typeof v === 'string' && v.trim() !== '') p.set(k, v);
	}
	const s = p.toString();
	return s ? `?${s}` : '';
}

/** Initial field values: the address first, then the defaults. */
export function fieldsFrom<K extends string>(params: URLSearchParams, defaults: Record<K, string>): Record<K, string> {
	const out = { ...defaults };
	for (const k of Object.keys(defaults) as K[]) {
		const v = params.get(k);
		if (v !== null) out[k] = v;
	}
	return out;
}

/**
 * Where a calculator's figures go onto a job sheet: the vehicle's sheet when the calculator was
 * opened for a vehicle, else the vehicle picker that forwards them.
 */
export function jobSheetHref(figures: Record<string, string | readonly string[] | undefined>, vehicle: string | null): string {
	const p = new URLSearchParams();
	for (const [k, v] of Object.entries(figures)) {
		for (const item of typeof v === 'string' ? [v] : (v ?? [])) if (item.trim() !== '') p.append(k, item.trim());
	}
	const q = p.size ? `?${p}` : '';
	return vehicle ? `/vehicles/${encodeURIComponent(vehicle)}/job-sheet${q}` : `/job-sheet${q}`;
}
