import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { BASE, browserSession, PHONE, screenshot, signIn } from './browser';

const { freshPage } = browserSession(PHONE);

type SeedSeat = { seat: string; heightMm: number | null };
type SeedVehicle = { identity?: { model: string }; content?: { identity: { model: string }; seats: { spaces: SeedSeat[] } }; seats?: { spaces: SeedSeat[] } };
// The oracle is the sample data file itself: which sample cars record a driver seat height at all.
const seed: SeedVehicle[] = (() => {
	const raw = JSON.parse(readFileSync(new URL('../../content-seed/vehicles.json', import.meta.url), 'utf8'));
	return Array.isArray(raw) ? raw : raw.vehicles;
})();
const seatsOf = (v: SeedVehicle) => (v.content ?? v).seats?.spaces ?? [];
const modelOf = (v: SeedVehicle) => (v.content?.identity ?? v.identity)!.model;

const rowCount = (page: import('playwright-core').Page) => page.locator('select[name="measure"]').count();

describe('search filters on a phone', () => {
	it('adds measured-space conditions up to six and removes one, in the form and the address', async () => {
		const page = await freshPage();
		await signIn(page, 'viewer');
		await page.goto(`${BASE}/search`, { waitUntil: 'networkidle' });
		await page.getByText('Filters').first().click();
		expect(await rowCount(page)).toBe(1);
		for (let n = 2; n <= 6; n++) {
			await Promise.all([
				page.waitForURL((url) => url.searchParams.getAll('measure').length === n),
				page.getByRole('button', { name: '+ Add a condition' }).click()
			]);
			await expect.poll(() => rowCount(page), { timeout: 15_000 }).toBe(n);
		}
		expect(await page.getByRole('button', { name: '+ Add a condition' }).count()).toBe(0);
		expect(new URL(page.url()).searchParams.getAll('measure')).toHaveLength(6);
		await screenshot(page, 'search-six-conditions-phone');

		await page.selectOption('#measure-0', 'driver-seat-height');
		await page.fill('#value-0', '1');
		await page.selectOption('#measure-4', 'dash-depth');
		await page.fill('#value-4', '1');
		await Promise.all([
			page.waitForURL((url) => url.searchParams.getAll('measure').length === 5),
			page.getByRole('button', { name: 'Remove condition 5' }).click()
		]);
		await expect.poll(() => rowCount(page), { timeout: 15_000 }).toBe(5);
		const url = new URL(page.url());
		expect(url.searchParams.getAll('measure')).toEqual(['driver-seat-height', '', '', '', '']);
		expect(url.searchParams.getAll('value')[0]).toBe('1');
		expect(await page.inputValue('#value-0')).toBe('1');
		await page.close();
	});

	it('leaves out cars whose driver seat has no height measured', async () => {
		const measured = seed.filter((v) => seatsOf(v).some((s) => s.seat === 'driver' && s.heightMm !== null)).map(modelOf).sort();
		const unmeasured = seed.filter((v) => !seatsOf(v).some((s) => s.seat === 'driver' && s.heightMm !== null)).map(modelOf);
		expect(unmeasured.length).toBeGreaterThan(0);
		const page = await freshPage();
		await signIn(page, 'viewer');
		// Any height at all (at least 1 mm): every car that records one, none that does not.
		const body = await page.request.get(`${BASE}/api/search?measure=driver-seat-height&op=gte&value=1&limit=50`);
		const models = ((await body.json()).items as { model: string }[]).map((h) => h.model);
		for (const m of unmeasured) expect(models).not.toContain(m);
		for (const m of measured) expect(models).toContain(m);
		await page.close();
	});
});
