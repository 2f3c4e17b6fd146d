// VIN patterns recorded on a page ("VD1TN*"): `?` stands for one character, `*` for any run (also none).
// A pattern covers the whole VIN, so one without `*` must be all 17 characters.

/** Whether `vin` (normalised, 17 characters) fits the pattern. Iterative glob match with one back-track point. */
export function vinPatternMatches(pattern: string, vin: string): boolean {
	const p = pattern.toUpperCase();
	let pi = 0;
	let vi = 0;
	let star = -1;
	let resume = 0;
	while (vi < vin.length) {
		if (pi < p.length && (p[pi] === '?' || p[pi] === vin[vi])) {
			pi++;
			vi++;
		} else if (pi < p.length && p[pi] === '*') {
			star = pi++;
			resume = vi;
		} else if (star >= 0) {
			pi = star + 1;
			vi = ++resume;
		} else {
			return false;
		}
	}
	while (pi < p.length && p[pi] === '*') pi++;
	return pi === p.length;
}

/** How many characters a pattern pins down; a longer fixed part is the closer match. */
export function vinPatternSpecificity(pattern: string): number {
	return pattern.replace(/[*?]/g, '').length;
}
