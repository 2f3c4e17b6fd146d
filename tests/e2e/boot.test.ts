import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { BASE, browserSession, PHONE, screenshot, signIn } from './browser';

// The sample shop (content-seed/): the Veldra Tarn's invented boot is 960 mm deep at the floor,
// 620 at the 470 mm shelf, 930 between the arches; its load opening 960 × 450 mm.
const VEHICLE_SLUG = 'veldra-tarn-2009-2013-sedan';

const { freshPage } = browserSession(PHONE);

async function partValue(page: Page, sku: string): Promise<string> {
	const options = await page.locator('#fit-part option').evaluateAll((els) => els.map((e) => ({ value: (e as HTMLOptionElement).value, text: e.textContent ?? '' })));
	const hit = options.find((o) => o.text.startsWith(`${sku} · `));
	if (!hit) throw new Error(`no part ${sku}`);
	return hit.value;
}

describe('will this box go in my boot', () => {
	it('answers on the phone in three steps: vehicle, box, verdict', async () => {
		const page = await freshPage(PHONE);
		await signIn(page, 'viewer');
		await page.goto(`${BASE}/fit?vehicle=${VEHICLE_SLUG}`);
		await page.locator('button:has-text("Check fit")').waitFor({ state: 'detached' });
		const twin = await partValue(page, 'SMPL-E212');
		await page.selectOption('#fit-part', await partValue(page, 'SMPL-E10'));
		const boot = page.getByTestId('boot-fit');
		await boot.waitFor();
		// SMPL-E10 is 420 × 380 × 360 mm: 470 − 360 − 10 = 100 mm under the shelf, and it passes the opening (by hand)
		expect(await boot.locator('[data-verdict]').first().getAttribute('data-verdict')).toBe('fits');
		expect(await page.getByTestId('boot-fit-reason').textContent()).toMatch(/Fits in the boot/);
		// the twin 12 in box (480 mm tall) stands 20 mm too tall under the 470 mm shelf: 470 − 480 − 10 (by hand)
		// on a phone the form folds away under the answer: the address carries the part as well
		await page.goto(`${BASE}/fit?vehicle=${VEHICLE_SLUG}&part=${twin}`);
		await expect.poll(() => page.getByTestId('boot-fit-reason').textContent()).toMatch(/20 mm too tall/);
		await screenshot(page, 'boot-fit-phone');
		await page.close();
	});

	it('answers the API with a verdict, and a message for a bad box', async () => {
		const page = await freshPage(PHONE);
		await signIn(page, 'viewer');
		const ok = await page.request.post(`${BASE}/api/fit/enclosure`, {
			data: { box: { l: 500, lTop: 300, w: 800, h: 400 }, opening: { w: 1000, h: 600 }, space: { l: 700, lTop: 450, w: 1000, archW: 900, h: 500 }, marginMm: 10 }
		});
		expect(ok.status()).toBe(200);
		// hand-worked wedge case: 190 deep, 90 wide, 90 high
		expect(await ok.json()).toMatchObject({ verdict: 'fits', throughOpening: true, margins: { l: 190, w: 90, h: 90 }, limiting: 'w' });
		const bad = await page.request.post(`${BASE}/api/fit/enclosure`, { data: { box: { l: -5, w: 800, h: 400 }, opening: { w: 1000, h: 600 }, space: { l: 700, w: 1000, h: 500 } } });
		expect(bad.status()).toBe(400);
		expect((await bad.json()).message).toMatch(/Box depth must be more than 0 mm/);
		const reverse = await page.request.get(`${BASE}/api/fit/enclosure?l=420&w=380&h=360`);
		expect((await reverse.json()).matches.map((m: { vehicleSlug: string }) => m.vehicleSlug)).toContain(VEHICLE_SLUG);
		await page.close();
	});
});
