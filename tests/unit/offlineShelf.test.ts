import { describe, expect, it } from 'vitest';
import { companionsOf, isPhotoAddress, keptView, localDay, newerCopy, photoAddresses, shellFiles } from '../../src/lib/domain/offlineShelf';

const ID = 'a'.repeat(64);
const OTHER = '0123456789abcdef'.repeat(4);

describe('keptView', () => {
	it('names the page and view of the addresses a phone keeps', () => {
		expect(keptView('/vehicles/veldra-tarn-2009-2013-sedan')).toEqual({ slug: 'veldra-tarn-2009-2013-sedan', view: 'page' });
		expect(keptView('/vehicles/veldra-tarn/job-sheet')).toEqual({ slug: 'veldra-tarn', view: 'job-sheet' });
		expect(keptView('/vehicles/veldra-tarn/trust/')).toEqual({ slug: 'veldra-tarn', view: 'trust' });
	});

	it('keeps nothing else: the editor, history, the new-page form, other screens', () => {
		for (const path of ['/vehicles/veldra-tarn/edit', '/vehicles/veldra-tarn/history', '/vehicles/new', '/vehicles', '/search', '/vehicles/Veldra']) {
			expect(keptView(path)).toBeNull();
		}
	});
});

describe('companionsOf', () => {
	it('keeps the flag form with every page and the job sheet with a pinned one', () => {
		expect(companionsOf('x', false)).toEqual(['/vehicles/x/trust']);
		expect(companionsOf('x', true)).toEqual(['/vehicles/x/trust', '/vehicles/x/job-sheet']);
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
	it('keeps scripts, styles and the Latin WOFF2 faces only', () => {
		const files = [
			'/_app/immutable/entry/start.js',
			'/_app/immutable/assets/0.css',
			'/_app/immutable/assets/ibm-plex-sans-latin-400-normal.CDDApCn2.woff2',
			'/_app/immutable/assets/ibm-plex-sans-latin-400-normal.CYLoc0-x.woff',
			'/_app/immutable/assets/ibm-plex-sans-latin-ext-400-normal.C5H60-Va.woff2',
			'/_app/immutable/assets/merriweather-cyrillic-700-normal.x.woff2',
			'/favicon.svg',
			'/_app/immutable/assets/ibm-plex-sans-latin-wght-normal.D3x1.woff2',
			'/_app/immutable/assets/ibm-plex-sans-greek-wght-normal.D3x2.woff2'
		];
		expect(shellFiles(files)).toEqual([files[0], files[1], files[2], files[6], files[7]]);
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
