import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import sharp from 'sharp';
import type { APIRequestContext } from 'playwright-core';
import { BASE, browserSession, DESKTOP, PHONE, screenshot, signIn } from './browser';

const { freshPage } = browserSession(DESKTOP);
let dir: string;
let slug: string;

/** A photo-like JPEG with fresh noise, so every run uploads bytes the page has not seen. */
async function samplePhoto(width: number, height: number): Promise<Buffer> {
	const r = Math.floor(Math.random() * 256);
	return sharp({ create: { width, height, channels: 3, background: { r, g: 110, b: 90 }, noise: { type: 'gaussian', mean: 110, sigma: 25 } } })
		.jpeg({ quality: 85 })
		.toBuffer();
}

/** The first sample page editors may change. */
async function editablePage(request: APIRequestContext): Promise<string> {
	const list = await (await request.get(`${BASE}/api/vehicles?pageSize=50`)).json();
	for (const item of list.items as { slug: string }[]) {
		const page = await (await request.get(`${BASE}/api/vehicles/${item.slug}`)).json();
		if (page.protection === 'none') return item.slug;
	}
	throw new Error('no unprotected sample page');
}

beforeAll(async () => {
	dir = mkdtempSync(join(tmpdir(), 'kickpanel-photos-e2e-'));
});
afterAll(async () => {
	rmSync(dir, { recursive: true, force: true });
});

describe('photos on a vehicle page', () => {
	it('lets the sample editor upload a photo at phone width and shows its thumbnail', async () => {
		const page = await freshPage(PHONE);
		await signIn(page, 'editor');
		slug = await editablePage(page.request);
		await page.goto(`${BASE}/vehicles/${slug}/photos`);
		expect(await page.getByRole('heading', { level: 1 }).textContent()).toContain('Photos');

		const file = join(dir, 'passenger-seat.jpg');
		writeFileSync(file, await samplePhoto(1800, 1350));
		const caption = `Seat rail bolts, sample ${Date.now()}`;
		await page.setInputFiles('#files', file);
		await page.selectOption('#section', 'seats');
		await page.fill('#caption', caption);
		await page.fill('#alt', 'Passenger seat rail with two bolts and a loom clip (sample photo)');
		await page.getByRole('button', { name: 'Upload photos' }).click();
		await page.getByRole('status').filter({ hasText: /Photo added as revision \d+/ }).waitFor({ timeout: 20_000 });

		const strip = page.getByRole('list', { name: 'Seat space photos' });
		const thumb = strip.locator('img[src$="/thumb"]').last();
		await thumb.scrollIntoViewIfNeeded();
		await expect.poll(() => thumb.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth), { timeout: 10_000 }).toBeGreaterThan(0);
		expect(await thumb.getAttribute('alt')).toMatch(/loom clip/);
		expect(await strip.textContent()).toContain(caption);
		await screenshot(page, 'photos-upload-editor-phone');

		await thumb.click();
		const dialog = page.locator('dialog[open]');
		await dialog.waitFor();
		const full = dialog.locator('img[src$="/display"]');
		await expect.poll(() => full.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth), { timeout: 10_000 }).toBeGreaterThan(0);
		await screenshot(page, 'photos-lightbox-phone');
		await dialog.getByRole('button', { name: 'Close photo' }).click();
		await page.waitForSelector('dialog[open]', { state: 'detached' });
		await page.close();
	});

	it('serves renditions as WebP with long-lived private caching keyed by the hash', async () => {
		const page = await freshPage();
		await signIn(page, 'editor');
		const res = await page.request.post(`${BASE}/api/vehicles/${slug}/photos`, {
			headers: { origin: BASE },
			multipart: {
				file: { name: 'dash.jpg', mimeType: 'image/jpeg', buffer: await samplePhoto(1200, 800) },
				section: 'dash',
				caption: 'Dash opening with the trim off',
				alt: 'Dash opening with the trim removed (sample photo)'
			}
		});
		expect(res.status()).toBe(201);
		const body = await res.json();
		expect(body).toMatchObject({ width: 1200, height: 800, url: `/photos/${body.id}/display`, thumbUrl: `/photos/${body.id}/thumb` });
		expect(body.id).toMatch(/^[0-9a-f]{64}$/);
		expect(body.sha256).toBe(body.id);

		const thumb = await page.request.get(`${BASE}${body.thumbUrl}`);
		expect(thumb.status()).toBe(200);
		const headers = thumb.headers();
		expect(headers['content-type']).toBe('image/webp');
		expect(headers['x-content-type-options']).toBe('nosniff');
		expect(headers['cache-control']).toBe('private, max-age=31536000, immutable');
		expect(headers.etag).toBe(`"${body.id}"`);
		expect((await sharp(await thumb.body()).metadata()).width).toBe(400);
		const again = await page.request.get(`${BASE}${body.thumbUrl}`, { headers: { 'if-none-match': headers.etag } });
		expect(again.status()).toBe(304);
		await page.close();
	});

	it('answers the upload API with 400, 413, 415 and 403 as documented', async () => {
		const page = await freshPage();
		await signIn(page, 'editor');
		const post = (multipart: Record<string, string | { name: string; mimeType: string; buffer: Buffer }>) =>
			page.request.post(`${BASE}/api/vehicles/${slug}/photos`, { headers: { origin: BASE }, multipart });

		const noAlt = await post({ file: { name: 'a.jpg', mimeType: 'image/jpeg', buffer: await samplePhoto(200, 150) }, section: 'seats' });
		expect(noAlt.status()).toBe(400);
		expect((await noAlt.json()).fieldErrors.alt).toMatch(/Describe what the photo shows/);

		const html = await post({ file: { name: 'seat.jpg', mimeType: 'image/jpeg', buffer: Buffer.from('<!doctype html><p>not a photo</p>') }, section: 'seats', alt: 'x' });
		expect(html.status()).toBe(415);
		expect((await html.json()).message).toMatch(/holds text/);

		const big = Buffer.concat([await samplePhoto(64, 64), Buffer.alloc(15 * 1024 * 1024)]);
		const tooBig = await post({ file: { name: 'big.jpg', mimeType: 'image/jpeg', buffer: big }, section: 'seats', alt: 'x' });
		expect(tooBig.status()).toBe(413);
		await page.close();

		const viewerPage = await freshPage();
		await signIn(viewerPage, 'viewer');
		const refused = await viewerPage.request.post(`${BASE}/api/vehicles/${slug}/photos`, {
			headers: { origin: BASE },
			multipart: { file: { name: 'a.jpg', mimeType: 'image/jpeg', buffer: await samplePhoto(200, 150) }, section: 'seats', alt: 'A seat' }
		});
		expect(refused.status()).toBe(403);
		const form = await viewerPage.goto(`${BASE}/vehicles/${slug}/photos`);
		expect(form!.status()).toBe(403);
		await viewerPage.close();
	});
});
