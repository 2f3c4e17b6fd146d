import { describe, expect, it } from 'vitest';
import sharp from 'sharp';
import type { APIRequestContext, Page } from 'playwright-core';
import { BASE, browserSession, PHONE, screenshot, signIn } from './browser';

const { freshPage } = browserSession(PHONE);

/** A small photo-like JPEG with fresh noise, so each run keeps bytes the phone has not seen. */
const samplePhoto = () =>
	sharp({ create: { width: 800, height: 600, channels: 3, background: { r: 90, g: 100, b: 110 }, noise: { type: 'gaussian', mean: 100, sigma: 30 } } })
		.jpeg({ quality: 80 })
		.toBuffer();

/** Two sample pages an editor may add photos to, each given a seat-space photo. */
async function twoPagesWithPhotos(request: APIRequestContext): Promise<string[]> {
	const list = await (await request.get(`${BASE}/api/vehicles?pageSize=50`)).json();
	const slugs: string[] = [];
	for (const item of list.items as { slug: string }[]) {
		if (slugs.length === 2) break;
		const page = await (await request.get(`${BASE}/api/vehicles/${item.slug}`)).json();
		if (page.protection !== 'none') continue;
		const res = await request.post(`${BASE}/api/vehicles/${item.slug}/photos`, {
			headers: { origin: BASE },
			multipart: {
				file: { name: 'seat.jpg', mimeType: 'image/jpeg', buffer: await samplePhoto() },
				section: 'seats',
				alt: `Seat rail and floor under the passenger seat (sample photo ${Date.now()})`
			}
		});
		expect(res.status()).toBe(201);
		slugs.push(item.slug);
	}
	return slugs;
}

/** Every photo in the open section has loaded its image. */
async function photosShown(page: Page, section: string): Promise<number> {
	const thumbs = page.locator(`#section-${section} img[src$="/thumb"]`);
	const count = await thumbs.count();
	for (let i = 0; i < count; i++) {
		const img = thumbs.nth(i);
		await img.scrollIntoViewIfNeeded();
		await expect.poll(() => img.evaluate((el: HTMLImageElement) => el.complete && el.naturalWidth), { timeout: 10_000 }).toBeGreaterThan(0);
	}
	return count;
}

/** Waits until the phone holds a page (and, when asked, the photos it shows). */
async function keptOnPhone(page: Page, address: string, photos: number): Promise<void> {
	await expect
		.poll(
			() =>
				page.evaluate(async ([a]) => {
					const found = await caches.match(a as string);
					const photoKeys = (await Promise.all((await caches.keys()).map(async (n) => (await (await caches.open(n)).keys()).filter((r) => r.url.includes('/photos/')).length))).reduce((x, y) => x + y, 0);
					return found ? photoKeys : -1;
				}, [address]),
			{ timeout: 20_000 }
		)
		.toBeGreaterThanOrEqual(photos);
}

describe('reading vehicle pages with no signal', () => {
	it('lets the page start its own service worker and no other', async () => {
		const csp = (await fetch(`${BASE}/signin`)).headers.get('content-security-policy') ?? '';
		expect(csp).toContain("worker-src 'self';");
		const worker = await fetch(`${BASE}/service-worker.js`);
		expect(worker.status).toBe(200);
		expect(worker.headers.get('content-type')).toMatch(/javascript/);
	});

	it('keeps an opened page and a pinned page with their photos, and sends a flag made offline when the network returns', async () => {
		const page = await freshPage(PHONE);
		await signIn(page, 'editor');
		const [opened, pinned] = await twoPagesWithPhotos(page.request);

		// The service worker takes charge of the pages once it is ready.
		await page.goto(`${BASE}/vehicles/${opened}`, { waitUntil: 'networkidle' });
		await page.evaluate(() => navigator.serviceWorker.ready.then(() => undefined));
		await page.reload({ waitUntil: 'networkidle' });
		await keptOnPhone(page, `/vehicles/${opened}`, 2);

		await page.goto(`${BASE}/vehicles/${pinned}`, { waitUntil: 'networkidle' });
		await page.getByRole('button', { name: 'Pin for today' }).click();
		await page.getByRole('button', { name: 'Pinned for today' }).waitFor();
		await keptOnPhone(page, `/vehicles/${pinned}/job-sheet`, 4);

		await page.context().setOffline(true);
		for (const slug of [opened, pinned]) {
			await page.goto(`${BASE}/vehicles/${slug}#section-seats`);
			await expect.poll(() => page.getByTestId('offline-banner').textContent()).toMatch(/Offline copy from \d{1,2}:\d{2}/);
			expect(await page.getByRole('heading', { level: 1 }).textContent()).toBeTruthy();
			expect(await photosShown(page, 'seats')).toBeGreaterThan(0);
		}
		await screenshot(page, 'offline-pinned-page-phone');
		await page.goto(`${BASE}/vehicles/${pinned}/job-sheet`);
		expect(await page.getByRole('heading', { level: 1 }).textContent()).toBeTruthy();

		// A flag made offline waits on the phone and says so; nothing claims it was sent.
		const note = `Seat box height is 10 mm lower with the new carpet (sample ${Date.now()})`;
		await page.goto(`${BASE}/vehicles/${pinned}/trust`);
		await page.selectOption('#flag-field', { index: 0 });
		await page.fill('#flag-note', note);
		await page.getByRole('button', { name: 'Flag as wrong' }).click();
		await page.getByText('Saved on this phone, will send when back online').first().waitFor();
		await page.getByTestId('outbox').waitFor();

		await page.context().setOffline(false);
		await page.getByText(/Sent from this phone: Flag on /).waitFor({ timeout: 20_000 });
		const trust = await (await page.request.get(`${BASE}/vehicles/${pinned}/trust`)).text();
		expect(trust).toContain(note.replace(/"/g, '&quot;'));
		await page.close();
	});

	it('stops a form that cannot wait with no signal, and says nothing was sent', async () => {
		const page = await freshPage(PHONE);
		await signIn(page, 'viewer');
		const list = await (await page.request.get(`${BASE}/api/vehicles?pageSize=1`)).json();
		await page.goto(`${BASE}/vehicles/${list.items[0].slug}`, { waitUntil: 'networkidle' });
		await page.evaluate(() => navigator.serviceWorker.ready.then(() => undefined));
		await page.context().setOffline(true);
		const metric = page.getByRole('button', { name: 'mm / m' });
		const pressed = await metric.getAttribute('aria-pressed');
		await page.getByRole('button', { name: 'in / ft' }).click();
		await page.getByRole('alert').filter({ hasText: 'Not sent: this phone is offline' }).waitFor();
		expect(await metric.getAttribute('aria-pressed')).toBe(pressed);
		expect(await page.getByTestId('outbox').count()).toBe(0);
		await page.context().setOffline(false);
		await page.close();
	});
});
