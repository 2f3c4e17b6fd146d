import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import sharp from 'sharp';
import exifr from 'exifr';
import type { Page } from 'playwright-core';
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

/** Notes the files each upload hands to the browser's XMLHttpRequest, so the test can read what left the phone. */
function recordSentFiles(): void {
	const send = XMLHttpRequest.prototype.send;
	const sent: File[] = [];
	Object.assign(window, { sentFiles: sent });
	XMLHttpRequest.prototype.send = function (body) {
		if (body instanceof FormData) for (const f of body.getAll('files')) if (f instanceof File) sent.push(f);
		return send.call(this, body);
	};
}

/** The bytes of the n-th file sent, read back from the page. */
async function sentFile(page: Page, n: number): Promise<{ name: string; type: string; bytes: Buffer }> {
	const file = await page.evaluate(async (i) => {
		const f = (window as unknown as { sentFiles: File[] }).sentFiles[i];
		const url = await new Promise<string>((resolve) => {
			const reader = new FileReader();
			reader.onload = () => resolve(String(reader.result));
			reader.readAsDataURL(f);
		});
		return { name: f.name, type: f.type, base64: url.slice(url.indexOf(',') + 1) };
	}, n);
	return { name: file.name, type: file.type, bytes: Buffer.from(file.base64, 'base64') };
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
		await page.addInitScript(recordSentFiles);
		await signIn(page, 'editor');
		const slug = await editablePhotosPage(page);
		await page.goto(`${BASE}/vehicles/${slug}/photos`, { waitUntil: 'networkidle' });
		await fillUpload(page, await cameraPhoto());
		await page.getByRole('button', { name: 'Upload photos' }).click();
		await page.locator('progress#upload-progress').waitFor();
		await page.getByRole('status').filter({ hasText: /Photo added as revision \d+/ }).waitFor({ timeout: 30_000 });

		const sent = await sentFile(page, 0);
		expect(sent.type).toBe('image/jpeg');
		expect(sent.name).toMatch(/^IMG_\d+\.jpg$/);
		const jpeg = sent.bytes;
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
