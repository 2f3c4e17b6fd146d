/** JSON with object keys sorted at every level: equal content gives equal text, for hashing and "no change". */
export function canonicalJson(content: unknown): string {
	return JSON.stringify(sortKeys(content));
}

function sortKeys(value: unknown): unknown {
	if (Array.isArray(value)) return value.map((v) => (v === undefined ? null : sortKeys(v)));
	if (value !== null && typeof value === 'object') {
		const out: Record<string, unknown> = {};
		for (const key of Object.keys(value).sort()) {
			const v = (value as Record<string, unknown>)[key];
			if (v !== undefined) out[key] = sortKeys(v);
		}
		return out;
	}
	return value;
}
