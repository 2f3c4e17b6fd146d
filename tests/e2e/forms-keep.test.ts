import { describe, expect, it } from 'vitest';
import { BASE, browserSession, PHONE, screenshot, signIn } from './browser';

const { freshPage } = browserSession(PHONE);

describe('forms keep what was typed', () => {
	it('keeps the body style through two refused new-vehicle posts and asks only for the first year', async () => {
		const page = await freshPage(PHONE);
		await signIn(page, 'editor');
		await page.goto(`${BASE}/vehicles/new`, { waitUntil: 'networkidle' });
		await page.fill('#make', 'Quillan');
		await page.selectOption('#body', 'wagon');
		const create = () => page.click('button:has-text("Create page and start editing")');
		await create();
		const alert = page.getByRole('alert');
		await alert.waitFor();
		expect(await page.inputValue('#body')).toBe('wagon');
		await page.fill('#model', 'Tarrow');
		await create();
		await expect.poll(() => page.textContent('#yearFrom-error')).toMatch(/Type the first model year/);
		expect(await page.inputValue('#body')).toBe('wagon');
		expect(await page.inputValue('#model')).toBe('Tarrow');
		expect(await page.locator('#yearTo-error').count()).toBe(0);
		await screenshot(page, 'new-vehicle-refused-phone');
		await page.close();
	});

	it('echoes a calculator entry exactly as typed', async () => {
		const page = await freshPage(PHONE);
		await signIn(page, 'viewer');
		await page.goto(`${BASE}/calc/amp-current`);
		await page.locator('button:has-text("Work it out")').waitFor({ state: 'detached' });
		await page.fill('#amp-watts', 'abc');
		await expect.poll(() => page.locator('.field-error').first().textContent()).toBe('RMS power per channel: "abc" is not a number.');
		await page.close();
	});
});
