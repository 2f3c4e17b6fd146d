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

/**
 * A model year typed beside a page: nothing when blank, a message when it is not a year or falls outside
 * the years the page covers (its figures may not apply to that car).
 */
export function modelYearProblem(text: string, v: { yearFrom: number; yearTo: number }): string | null {
	const typed = text.trim();
	if (!typed) return null;
	if (!/^\d{4}$/.test(typed)) return `Model year: type four digits, e.g. ${v.yearFrom}.`;
	const year = Number(typed);
	if (year < v.yearFrom || year > v.yearTo) {
		return `Model year ${year} is outside the years this page covers (${modelYears(v)}): its figures may not apply. Check the car or pick the page for its years.`;
	}
	return null;
}
