import { readdirSync, readFileSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';

// Kickpanel's words for working together are its own: the shop log, following a car, sign-off,
// locking a page for moderators, pausing someone's editing, change notes. These phrases belong to
// another program's interface and must not come back into anything a person reads.
const RETIRED = [
	'recent changes',
	'watchlist',
	'watch this page',
	'watch pages i edit',
	'stop watching',
	'watched page',
	'mark reviewed',
	'marked reviewed',
	'unreviewed',
	'not reviewed',
	'selected revisions',
	'contributions',
	'set protection',
	'page protected',
	'page is protected',
	'protected:',
	'blocked from editing',
	'block from editing',
	'lift the block',
	'reason given',
	'edit summary',
	'editing {',
	'>diff<',
	'showing results for',
	'did you mean',
	'daily digest',
	'was changed by',
	'★',
	'☆'
];

const SRC = join(import.meta.dirname, '../../src');
// The one place that must name the old addresses, to send them on.
const EXEMPT = new Set(['lib/server/movedAddresses.ts']);

function files(dir: string): string[] {
	return readdirSync(dir, { withFileTypes: true }).flatMap((e) => (e.isDirectory() ? files(join(dir, e.name)) : [join(dir, e.name)]));
}

const STRINGS = /'(?:[^'\\\n]|\\.)*'|"(?:[^"\\\n]|\\.)*"|`(?:[^`\\]|\\.)*`/g;

/** String literals of script code, comments removed first (an apostrophe in a comment is not a quote). */
function scriptStrings(code: string): string {
	const bare = code.replace(/\/\*[\s\S]*?\*\//g, '').replace(/(^|[^:'"`])\/\/.*$/gm, '$1');
	return (bare.match(STRINGS) ?? []).join('\n');
}

/** What a person can read from a source file: markup and text of pages, strings of code. */
export function readableText(path: string, source: string): string {
	if (path.endsWith('.svx') || path.endsWith('.html')) return source;
	if (path.endsWith('.svelte')) {
		const scripts = [...source.matchAll(/<script[^>]*>([\s\S]*?)<\/script>/g)].map((m) => scriptStrings(m[1]));
		const markup = source.replace(/<script[^>]*>[\s\S]*?<\/script>/g, '').replace(/<style[^>]*>[\s\S]*?<\/style>/g, '');
		return [markup, ...scripts].join('\n');
	}
	if (path.endsWith('.ts')) return scriptStrings(source);
	return '';
}

function retiredIn(text: string): string[] {
	const lower = text.toLowerCase();
	return RETIRED.filter((phrase) => lower.includes(phrase));
}

describe('retired vocabulary', () => {
	it('finds a retired phrase in markup, in a string and in a template literal, but not in a comment', () => {
		expect(retiredIn(readableText('a.svelte', '<script>const t = `Recent changes`;</script><h1>Watchlist</h1>'))).toEqual(['recent changes', 'watchlist']);
		expect(retiredIn(readableText('a.ts', "const m = 'Mark reviewed'; // the old Edit summary label"))).toEqual(['mark reviewed']);
		expect(retiredIn(readableText('a.ts', "// it's no longer called Recent changes\nconst ok = 'Shop log';"))).toEqual([]);
	});

	it('is absent from every page, component, mail and message under src/', () => {
		const found: string[] = [];
		for (const path of files(SRC)) {
			const rel = relative(SRC, path).split('\\').join('/');
			if (EXEMPT.has(rel)) continue;
			for (const phrase of retiredIn(readableText(path, readFileSync(path, 'utf8')))) found.push(`${rel}: “${phrase}”`);
		}
		expect(found).toEqual([]);
	});
});
