import { describe, expect, it } from 'vitest';
import { companionsOf, dropsKeptCopy, editorAddress, isPhotoAddress, keptView, localDay, newerCopy, photoAddresses, shellFiles } from '../../src/lib/domain/offlineShelf';

const ID = 'a'.repeat(64);
const OTHER = '0123456789abcdef'.repeat(4);

describe('keptView', () => {
	it('names the page and view of the addresses a phone keeps', () => {
		expect(keptView('/vehicles/veldra-tarn-2009-2013-sedan')).toEqual({ slug: 'veldra-tarn-2009-2013-sedan', view: 'page' });
		expect(keptView('/vehicles/veldra-tarn/job-sheet')).toEqual({ slug: 'veldra-tarn', view: 'job-sheet' });
		expect(keptView('/vehicles/veldra-tarn/trust/')).toEqual({ slug: 'veldra-tarn', view: 'trust' });
		expect(keptView('/vehicles/veldra-tarn/edit')).toEqual({ slug: 'veldra-tarn', view: 'edit' });
		expect(keptView(editorAddress('korvane-pennick-2003-2008-pickup'))).toEqual({ slug: 'korvane-pennick-2003-2008-pickup', view: 'edit' });
	});

	it('keeps nothing else: history, the new-page form and its editor, other screens', () => {
		for (const path of [
			'/vehicles/veldra-tarn/history',
			'/vehicles/veldra-tarn/edit/photos',
			'/vehicles/veldra-tarn/editor',
			'/vehicles/new',
			'/vehicles/new/edit',
			'/vehicles',
			'/search',
			'/vehicles/Veldra'
		]) {
			expect(keptView(path)).toBeNull();
		}
	});
});

describe('companionsOf', () => {
	it('keeps the flag form with every page and the job sheet with a pinned one', () => {
		expect(companionsOf('x', false)).toEqual(['/vehicles/x/trust']);
		expect(companionsOf('x', true)).toEqual(['/vehicles/x/trust', '/vehicles/x/job-sheet']);
	});

	it('pins the editor only for a writer, and never rides along with a page merely read', () => {
		expect(companionsOf('x', true, true)).toEqual(['/vehicles/x/trust', '/vehicles/x/job-sheet', '/vehicles/x/edit']);
		expect(companionsOf('x', false, true)).toEqual(['/vehicles/x/trust']);
		expect(companionsOf('x', true, false)).not.toContain('/vehicles/x/edit');
	});
});

describe('dropsKeptCopy', () => {
	it('lets go of a copy the server now refuses, and keeps it through a fault', () => {
		// HTTP semantics (RFC 9110 §15.5–15.6): 401, 403, 404 and 410 say the address is not for this reader (or gone); 5xx is a passing fault.
		for (const status of [401, 403, 404, 410]) expect(dropsKeptCopy(status)).toBe(true);
		for (const status of [200, 303, 400, 409, 429, 500, 502, 503]) expect(dropsKeptCopy(status)).toBe(false);
	});
});

describe('photoAddresses', () => {
	it('lists both renditions of each photo a page shows, once', () => {
		const html = `<img src="/photos/${ID}/thumb"><a href="/photos/${ID}/display"></a><img src="/photos/${OTHER}/thumb">`;
		expect(photoAddresses(html)).toEqual([`/photos/${ID}/thumb`, `/photos/${ID}/display`, `/photos/${OTHER}/thumb`, `/photos/${OTHER}/display`]);
	});

	it('ignores addresses that are not a photo rendition', () => {
		expect(photoAddresses('<a href="/photos/abc/thumb"></a><a href="/vehicles/x/photos">')).toEqual([]);
		expect(isPhotoAddress(`/photos/${ID}/display`)).toBe(true);
		expect(isPhotoAddress(`/photos/${ID}/original`)).toBe(false);
	});
});

describe('shellFiles', () => {
	it('keeps scripts, styles, the cut faces and the Latin WOFF2 faces only', () => {
		const files = [
			'/_app/immutable/entry/start.js',
			'/_app/immutable/assets/0.css',
			'/_app/immutable/assets/ibm-plex-sans-latin-400-normal.CDDApCn2.woff2',
			'/_app/immutable/assets/ibm-plex-sans-latin-400-normal.CYLoc0-x.woff',
			'/_app/immutable/assets/ibm-plex-sans-latin-ext-400-normal.C5H60-Va.woff2',
			'/_app/immutable/assets/merriweather-cyrillic-700-normal.x.woff2',
			'/favicon.svg',
			'/_app/immutable/assets/ibm-plex-sans-latin-wght-normal.D3x1.woff2',
			'/_app/immutable/assets/ibm-plex-sans-greek-wght-normal.D3x2.woff2',
			'/_app/immutable/assets/merriweather-core-700-normal.DhZV.woff2',
			'/_app/immutable/assets/ibm-plex-sans-core-wght-normal.CcdS.woff2'
		];
		expect(shellFiles(files)).toEqual([files[0], files[1], files[2], files[6], files[7], files[9], files[10]]);
	});
});

describe('localDay', () => {
	it('writes the day in the phone’s own calendar', () => {
		expect(localDay(new Date(2026, 11, 5, 23, 59))).toBe('2026-12-05');
		expect(localDay(new Date(2027, 0, 1, 0, 0))).toBe('2027-01-01');
	});
});

describe('newerCopy', () => {
	it('picks the copy kept last, or the only one', () => {
		const early: { keptAt: string | null; n?: number } = { keptAt: '2026-12-05T09:42:00Z', n: 1 };
		const late = { keptAt: '2026-12-05T10:05:00Z', n: 2 };
		expect(newerCopy(early, late)).toBe(late);
		expect(newerCopy(late, early)).toBe(late);
		expect(newerCopy(undefined, early)).toBe(early);
		expect(newerCopy({ keptAt: null }, early)).toBe(early);
	});
});
