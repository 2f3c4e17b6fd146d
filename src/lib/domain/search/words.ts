// How search splits and compares text, the same way for pages and for what people type.

const NON_ASCII = /[^\x00-\x7f]/;
const MARKDOWN = /[*_`#>[\]~!]|^\s*(?:[-+]|\d+[.)])\s/m;

/** Lower-case with accents folded, so "Coupé" and "coupe" compare equal. */
export function foldText(text: string): string {
	const lower = text.toLowerCase();
	return NON_ASCII.test(lower) ? lower.normalize('NFKD').replace(/[\u0300-\u036f]/g, '') : lower;
}

/** The words of a text: runs of letters and digits, folded ("6x9" stays one word). */
export function searchWords(text: string): string[] {
	return foldText(text).split(/[^a-z0-9]+/).filter(Boolean);
}

/** Markdown reduced to the words a reader sees: no quote marks, emphasis, headings or link targets. */
export function plainText(markdown: string): string {
	if (!MARKDOWN.test(markdown)) return markdown.replace(/\s+/g, ' ').trim();
	return markdown
		.replace(/!?\[([^\]]*)\]\([^)]*\)/g, '$1')
		.replace(/^\s{0,3}(?:#{1,6}|>+|[-*+]|\d+[.)])\s+/gm, '')
		.replace(/\*\*|__|\*|_|`{1,3}|~~/g, '')
		.replace(/\s+/g, ' ')
		.trim();
}
