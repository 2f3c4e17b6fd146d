import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { jpegName, percentSent, scaledSize, UPLOAD_LONG_SIDE } from '../../src/lib/domain/photoUpload';

describe('scaledSize', () => {
	it('brings a 12-megapixel 4:3 camera frame down to 2048 px on its long side', () => {
		// Hand-worked: 4032 × 3024 scaled by 2048/4032 = 0.50794 → 2048 × 1536 (3024 × 0.50794 = 1536.0).
		expect(scaledSize(4032, 3024)).toEqual({ width: 2048, height: 1536 });
	});

	it('keeps a portrait frame upright: the height is the long side', () => {
		// Hand-worked: 3000 × 4000 scaled by 2048/4000 = 0.512 → 1536 × 2048.
		expect(scaledSize(3000, 4000)).toEqual({ width: 1536, height: 2048 });
	});

	it('rounds to whole pixels', () => {
		// Hand-worked: 1000 × 333 within 500 → scale 0.5 → 500 × 166.5, rounded to 167.
		expect(scaledSize(1000, 333, 500)).toEqual({ width: 500, height: 167 });
	});

	it('never enlarges a small photo', () => {
		expect(scaledSize(800, 600)).toEqual({ width: 800, height: 600 });
	});

	it('refuses a photo without a size', () => {
		expect(() => scaledSize(0, 600)).toThrow(RangeError);
		expect(() => scaledSize(Number.NaN, 600)).toThrow(RangeError);
	});

	it('stays within the long side and keeps the proportions to within a pixel', () => {
		fc.assert(
			fc.property(fc.integer({ min: 1, max: 20_000 }), fc.integer({ min: 1, max: 20_000 }), (w, h) => {
				const out = scaledSize(w, h);
				expect(Math.max(out.width, out.height)).toBeLessThanOrEqual(Math.max(UPLOAD_LONG_SIDE, 1));
				expect(out.width).toBeLessThanOrEqual(w);
				expect(out.height).toBeLessThanOrEqual(h);
				// The scaled height is the width times the original ratio, give or take the rounding of each side.
				expect(Math.abs(out.height - (out.width * h) / w)).toBeLessThanOrEqual(1 + h / w);
			})
		);
	});
});

describe('jpegName', () => {
	it('renames any camera file to a .jpg', () => {
		expect(jpegName('IMG_0042.HEIC')).toBe('IMG_0042.jpg');
		expect(jpegName('seat.rail.png')).toBe('seat.rail.jpg');
		expect(jpegName('kick panel')).toBe('kick panel.jpg');
		expect(jpegName('.jpg')).toBe('photo.jpg');
	});
});

describe('percentSent', () => {
	it('counts whole percent sent and stays between 0 and 100', () => {
		// Hand-worked: 512 KiB of 2 MiB is 25 %; 2 of 3 bytes is 66.7 %, shown as 66.
		expect(percentSent(512 * 1024, 2 * 1024 * 1024)).toBe(25);
		expect(percentSent(2, 3)).toBe(66);
		expect(percentSent(10, 0)).toBe(0);
		expect(percentSent(11, 10)).toBe(100);
	});
});
