import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import sharp from 'sharp';
import exifr from 'exifr';
import type { Page, Request } from 'playwright-core';
import { BASE, browserSession, PHONE, signIn } from './browser';

const { freshPage } = browserSession(PHONE);
let dir: string;

beforeAll(() => {
	dir = mkdtempSync(join(tmpdir(), 'kickpanel-phone-photos-'));
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/**
 * A camera-like 4000 × 3000 JPEG stored sideways (EXIF orientation 6, "rotate 90° clockwise") with
 * a location in its EXIF, as phones write them.
 */
async function cameraPhoto(): Promise<string> {
	const bytes = await sharp({ create: { width: 4000, height: 3000, channels: 3, background: { r: 120, g: 90, b: 70 }, noise: { type: 'gaussian', mean: 100, sigma: 20 } } })
		.withExif({ IFD0: { Make: 'Sample camera' }, IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '51/1 30/1 0/1', GPSLongitudeRef: 'W', GPSLongitude: '0/1 7/1 0/1' } })
		.withMetadata({ orientation: 6 })
		.jpeg({ quality: 80 })
		.toBuffer();
	expect((await exifr.gps(bytes))?.latitude).toBe(51.5);
	const file = join(dir, `IMG_${Date.now()}.jpg`);
	writeFileSync(file, bytes);
	return file;
}

/** The JPEG inside a multipart upload body, from its start-of-image marker to its end marker. */
function jpegIn(body: Buffer): Buffer {
	const start = body.indexOf(Buffer.from([0xff, 0xd8, 0xff]));
	const end = body.lastIndexOf(Buffer.from([0xff, 0xd9]));
	expect(start).toBeGreaterThanOrEqual(0);
	return body.subarray(start, end + 2);
}

async function editablePhotosPage(page: Page): Promise<string> {
	const list = await (await page.request.get(`${BASE}/api/vehicles?pageSize=50`)).json();
	for (const item of list.items as { slug: string }[]) {
		const one = await (await page.request.get(`${BASE}/api/vehicles/${item.slug}`)).json();
		if (one.protection === 'none') return item.slug;
	}
	throw new Error('no unprotected sample page');
}

async function fillUpload(page: Page, file: string) {
	await page.setInputFiles('#files', file);
	await page.selectOption('#section', 'boot');
	await page.fill('#alt', 'Boot floor with the spare-wheel cover lifted (sample photo)');
}

describe('photos from a phone', () => {
	it('scales a camera photo down upright and sends it without its location, showing progress', async () => {
		const page = await freshPage(PHONE);
		await signIn(page, 'editor');
		const slug = await editablePhotosPage(page);
		await page.goto(`${BASE}/vehicles/${slug}/photos`, { waitUntil: 'networkidle' });
		await fillUpload(page, await cameraPhoto());

		const sent: Request[] = [];
		page.on('request', (r) => {
			if (r.method() === 'POST' && r.url().includes('/photos?/upload')) sent.push(r);
		});
		await page.getByRole('button', { name: 'Upload photos' }).click();
		await page.locator('progress#upload-progress').waitFor();
		await page.getByRole('status').filter({ hasText: /Photo added as revision \d+/ }).waitFor({ timeout: 30_000 });

		expect(sent).toHaveLength(1);
		const jpeg = jpegIn(sent[0].postDataBuffer()!);
		const meta = await sharp(jpeg).metadata();
		// 4000 × 3000 turned upright is 3000 × 4000; within 2048 px on the long side: 1536 × 2048 (hand-worked, scale 0.512).
		expect([meta.width, meta.height]).toEqual([1536, 2048]);
		expect(meta.orientation ?? 1).toBe(1);
		expect(await exifr.gps(jpeg).catch(() => undefined)).toBeUndefined();
		await page.close();
	});

	it('sends the photo again when the connection drops', async () => {
		const page = await freshPage(PHONE);
		await signIn(page, 'editor');
		const slug = await editablePhotosPage(page);
		await page.goto(`${BASE}/vehicles/${slug}/photos`, { waitUntil: 'networkidle' });
		let tries = 0;
		await page.route('**/photos?/upload', async (route) => {
			tries++;
			if (tries === 1) await route.abort('connectionreset');
			else await route.continue();
		});
		await fillUpload(page, await cameraPhoto());
		await page.getByRole('button', { name: 'Upload photos' }).click();
		await page.getByText(/Connection dropped; trying again \(1 of 3\)/).waitFor();
		await page.getByRole('status').filter({ hasText: /Photo added as revision \d+/ }).waitFor({ timeout: 30_000 });
		expect(tries).toBe(2);
		await page.close();
	});
});
