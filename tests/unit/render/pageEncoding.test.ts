import zlib from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { encodePage, pageEncoding } from '../../../src/lib/server/render/pageEncoding';

describe('pageEncoding', () => {
	// RFC 9110 section 12.5.3 (Accept-Encoding): weights choose; among equal weights the server may prefer; "*"
	// stands for any coding not named; q=0 refuses a coding; with no header any coding is acceptable, and we
	// then send the page as it is.
	it('picks the coding the reader weights highest, brotli among equals', () => {
		expect(pageEncoding('gzip, deflate, br')).toBe('br');
		expect(pageEncoding('gzip')).toBe('gzip');
		expect(pageEncoding('br;q=0.1, gzip;q=0.9')).toBe('gzip');
		expect(pageEncoding('gzip;q=0.5, br;q=0.9')).toBe('br');
		expect(pageEncoding('br;q=0, gzip')).toBe('gzip');
		expect(pageEncoding('*')).toBe('br');
	});

	it('sends the page as it is when the reader names none of ours', () => {
		expect(pageEncoding(null)).toBe('identity');
		expect(pageEncoding('')).toBe('identity');
		expect(pageEncoding('identity')).toBe('identity');
		expect(pageEncoding('deflate')).toBe('identity');
		expect(pageEncoding('br;q=0, gzip;q=0')).toBe('identity');
	});
});

describe('encodePage', () => {
	const page = new TextEncoder().encode(`<main>${'<p>Seat rail to floor: 48 mm · Ω 2.2 kΩ</p>'.repeat(400)}</main>`);

	it('compresses to bytes a standard decoder turns back into the page', () => {
		const brotli = encodePage(page, 'br');
		expect(brotli.byteLength).toBeLessThan(page.byteLength / 10);
		expect(new Uint8Array(zlib.brotliDecompressSync(brotli))).toEqual(page);
		const gzip = encodePage(page, 'gzip');
		// RFC 1952 section 2.3.1: a gzip member starts with ID1 = 31, ID2 = 139 and CM = 8 (deflate).
		expect([...gzip.subarray(0, 3)]).toEqual([31, 139, 8]);
		expect(new Uint8Array(zlib.gunzipSync(gzip))).toEqual(page);
	});

	it('hands the bytes back untouched for identity', () => {
		expect(encodePage(page, 'identity')).toBe(page);
	});
});
