// Reading past a typo: one slip of the finger in a make or model name, checked against the names the wiki knows.

/** Words shorter than this are never corrected: a one-letter change to a short word is another word. */
export const FUZZY_MIN_LENGTH = 4;

const sameRun = (a: string, ai: number, b: string, bi: number, n: number) => {
	for (let k = 0; k < n; k++) if (a.charCodeAt(ai + k) !== b.charCodeAt(bi + k)) return false;
	return true;
};

/**
 * True when the first `bLength` letters of b are a, or a with one letter substituted, inserted, deleted,
 * or two neighbours swapped (the four single errors of Damerau, 1964). Linear, and allocates nothing:
 * it runs against every known name on each unmatched word.
 */
export function withinOneEdit(a: string, b: string, bLength = b.length): boolean {
	const la = a.length;
	const lb = bLength;
	if (la - lb > 1 || lb - la > 1) return false;
	let i = 0;
	while (i < la && i < lb && a.charCodeAt(i) === b.charCodeAt(i)) i++;
	if (i === la && i === lb) return true;
	if (la === lb) {
		if (sameRun(a, i + 1, b, i + 1, la - i - 1)) return true;
		return i + 1 < la && a[i] === b[i + 1] && a[i + 1] === b[i] && sameRun(a, i + 2, b, i + 2, la - i - 2);
	}
	return la > lb ? sameRun(a, i + 1, b, i, la - i - 1) : sameRun(a, i, b, i + 1, lb - i - 1);
}

export type Correction = { from: string; to: string };

/**
 * The known name `word` is most likely a slip for, or null. Whole names win over the start of a longer
 * name (someone still typing), then the name on more pages, then alphabetical order so answers are stable.
 * `vocabulary` maps each known name word to the number of pages that use it.
 */
export function closestName(word: string, vocabulary: ReadonlyMap<string, number>): string | null {
	if (word.length < FUZZY_MIN_LENGTH || !/^[a-z]+$/.test(word) || vocabulary.has(word)) return null;
	let best: { to: string; whole: boolean; pages: number } | null = null;
	for (const [name, pages] of vocabulary) {
		if (name.length < FUZZY_MIN_LENGTH) continue;
		let to: string | null = null;
		let whole = false;
		if (withinOneEdit(word, name)) {
			to = name;
			whole = true;
		} else if (name.length > word.length && withinOneEdit(word, name, word.length)) {
			to = name.slice(0, word.length);
		}
		if (to === null) continue;
		const better =
			!best ||
			(whole && !best.whole) ||
			(whole === best.whole && (pages > best.pages || (pages === best.pages && to < best.to)));
		if (better) best = { to, whole, pages };
	}
	return best?.to ?? null;
}
