// What a phone keeps for reading a vehicle page with no signal: which addresses, which of the
// app's own files, and how many pages and photos it holds before the oldest give way.

/** Cache names; the shell's carries the build version so a new release replaces it whole. */
export const SHELF = {
	shellPrefix: 'kp-shell-',
	recent: 'kp-recent',
	pinned: 'kp-pinned',
	photos: 'kp-photos'
} as const;

/** Pages a person opened lately, kept newest first; older ones give way. */
export const RECENT_PAGES = 24;
/** Entries of the recent shelf: each page with its flag form and, for a writer, its editor. */
export const RECENT_ENTRIES = RECENT_PAGES * 3;
/** Photo renditions kept for those pages. */
export const RECENT_PHOTOS = 240;

/** Header a kept copy carries: when the phone stored it (ISO time). */
export const KEPT_AT_HEADER = 'x-kept-at';

export type KeptView = 'page' | 'job-sheet' | 'trust' | 'edit';

/** Vehicle addresses that are not a page of their own. */
const NOT_A_PAGE = new Set(['new']);
const VIEWS: Record<string, KeptView> = { '': 'page', '/job-sheet': 'job-sheet', '/trust': 'trust', '/edit': 'edit' };
const VEHICLE_PATH = /^\/vehicles\/([a-z0-9][a-z0-9-]*)(\/job-sheet|\/trust|\/edit)?\/?$/;

/** The vehicle page and view an address shows, when it is one a phone keeps. */
export function keptView(pathname: string): { slug: string; view: KeptView } | null {
	const m = VEHICLE_PATH.exec(pathname);
	if (!m || NOT_A_PAGE.has(m[1])) return null;
	return { slug: m[1], view: VIEWS[m[2] ?? ''] };
}

/** The editor's address for a page: kept when a writer opens it, or pins the page. */
export const editorAddress = (slug: string) => `/vehicles/${slug}/edit`;

/**
 * The addresses kept with a page: the flag form always; the job sheet when pinned for the day, and
 * the editor too when the person may edit (a reader's editor answer is a refusal, never kept).
 */
export function companionsOf(slug: string, pinned: boolean, writer = false): string[] {
	const base = `/vehicles/${slug}`;
	if (!pinned) return [`${base}/trust`];
	return writer ? [`${base}/trust`, `${base}/job-sheet`, editorAddress(slug)] : [`${base}/trust`, `${base}/job-sheet`];
}

/** A refusal (signed out, not allowed, gone) means a kept copy of that address should go too. */
export const dropsKeptCopy = (status: number) => status === 401 || status === 403 || status === 404 || status === 410;

const PHOTO_REF = /\/photos\/([0-9a-f]{64})\/(?:thumb|display)\b/g;

/** Both renditions (thumb and display) of every photo a page's HTML shows, each once. */
export function photoAddresses(html: string): string[] {
	const ids = new Set<string>();
	for (const m of html.matchAll(PHOTO_REF)) ids.add(m[1]);
	return [...ids].flatMap((id) => [`/photos/${id}/thumb`, `/photos/${id}/display`]);
}

/** A photo rendition's address. */
export const isPhotoAddress = (pathname: string) => /^\/photos\/[0-9a-f]{64}\/(?:thumb|display)$/.test(pathname);

/**
 * The app files a phone stores on install: scripts, styles, the cut faces and the Latin WOFF2 faces (fixed or variable weight). Other
 * scripts' font subsets and the older WOFF copies are fetched only if a page asks for them.
 */
export function shellFiles(files: readonly string[]): string[] {
	return files.filter((f) => {
		if (/\.(?:woff2?|ttf|otf)$/.test(f)) return /-(?:latin|core)-(?:\d{3}|wght)-[a-z]+\.[^/]*woff2$/.test(f);
		return true;
	});
}

/** "YYYY-MM-DD" of a moment in the phone's own time zone: a pin lasts for that day. */
export function localDay(at: Date): string {
	const pad = (n: number) => String(n).padStart(2, '0');
	return `${at.getFullYear()}-${pad(at.getMonth() + 1)}-${pad(at.getDate())}`;
}

/** Whichever of two kept copies was stored last (by their kept-at time), or the one there is. */
export function newerCopy<T extends { keptAt: string | null }>(a: T | undefined, b: T | undefined): T | undefined {
	if (!a) return b;
	if (!b) return a;
	return (Date.parse(b.keptAt ?? '') || 0) > (Date.parse(a.keptAt ?? '') || 0) ? b : a;
}
