// How well a query's words name a page's car: the rank of identity matches in search.

/** A page's identity words; one object is shared by every page with the same make, model, aliases and body. */
export type NameWords = { id: number; makeWords: readonly string[]; modelWords: readonly string[]; aliasWords: readonly string[]; bodyWords: readonly string[] };

// Plain loops: these run for every identity match of every keystroke.
function has(list: readonly string[], w: string): boolean {
	for (let i = 0; i < list.length; i++) if (list[i] === w) return true;
	return false;
}
function begins(list: readonly string[], w: string): boolean {
	for (let i = 0; i < list.length; i++) if (list[i].startsWith(w)) return true;
	return false;
}

/** The forward-tokenised name field's test: the word begins one of the page's identity words. */
export const startsAWord = (n: NameWords, w: string) => begins(n.makeWords, w) || begins(n.modelWords, w) || begins(n.aliasWords, w) || begins(n.bodyWords, w);

/** Identity matches rank by how exactly each word names the car: model, then make, then another name. */
export function identityScore(n: NameWords, named: string[]): number {
	let score = 100;
	for (let i = 0; i < named.length; i++) {
		const w = named[i];
		if (has(n.modelWords, w)) score += 30;
		else if (has(n.makeWords, w)) score += 20;
		else if (has(n.aliasWords, w)) score += 15;
		else if (begins(n.modelWords, w)) score += 8;
		else if (begins(n.makeWords, w)) score += 6;
		else if (begins(n.aliasWords, w)) score += 4;
	}
	return score;
}
