/** URL-safe lower-case words joined by hyphens; accents folded. */
export function slugify(text: string): string {
	return text
		.normalize('NFKD')
		.replace(/[\u0300-\u036f]/g, '')
		.toLowerCase()
		.replace(/[^a-z0-9]+/g, '-')
		.replace(/^-+|-+$/g, '')
		.slice(0, 80);
}

/** Model years as people read them: "2012" for one year, "2009–2013" (en dash) for a run; addresses use a hyphen. */
export function modelYears(v: { yearFrom: number; yearTo: number }, dash = '–'): string {
	return v.yearFrom === v.yearTo ? `${v.yearFrom}` : `${v.yearFrom}${dash}${v.yearTo}`;
}

export function vehicleSlug(v: { make: string; model: string; yearFrom: number; yearTo: number; body: string }): string {
	return [slugify(v.make), slugify(v.model), modelYears(v, '-'), slugify(v.body)].filter(Boolean).join('-');
}

export function vehicleTitle(v: { make: string; model: string; yearFrom: number; yearTo: number }): string {
	return `${v.make} ${v.model} ${modelYears(v)}`;
}
