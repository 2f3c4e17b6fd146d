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

export function vehicleSlug(v: { make: string; model: string; yearFrom: number; yearTo: number; body: string }): string {
	const years = v.yearFrom === v.yearTo ? `${v.yearFrom}` : `${v.yearFrom}-${v.yearTo}`;
	return [slugify(v.make), slugify(v.model), years, slugify(v.body)].filter(Boolean).join('-');
}

export function vehicleTitle(v: { make: string; model: string; yearFrom: number; yearTo: number }): string {
	const years = v.yearFrom === v.yearTo ? `${v.yearFrom}` : `${v.yearFrom}–${v.yearTo}`;
	return `${v.make} ${v.model} ${years}`;
}
