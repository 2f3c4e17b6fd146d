import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { BASE, browserSession, DESKTOP, PHONE, screenshot, signIn } from './browser';
import { fitVerdict } from '../../src/lib/domain/fit';

// The sample shop (content-seed/): invented vehicles. The Sundrake Kestle covers 2015–2021.
const SLUG = 'sundrake-kestle-2015-2021-hatchback';

const { freshPage } = browserSession(PHONE);

async function fitScreen(viewport = PHONE): Promise<Page> {
	const page = await freshPage(viewport);
	await signIn(page, 'viewer');
	await page.goto(`${BASE}/fit`);
	await page.locator('button:has-text("Check fit")').waitFor({ state: 'detached' });
	return page;
}

describe('the fit screen with a typed box', () => {
	it('shows the size fields beside the part list, names the side at fault and never goes stale', async () => {
		const page = await fitScreen(PHONE);
		for (const id of ['#fit-l', '#fit-w', '#fit-h']) expect(await page.locator(id).isVisible()).toBe(true);

		// Two sides with the same fault at once (the case that once broke the keyed list).
		await page.fill('#fit-l', 'x');
		await page.fill('#fit-w', 'x');
		const messages = page.getByTestId('fit-size-errors');
		await expect.poll(() => messages.textContent()).toMatch(/Length:[\s\S]*Width:[\s\S]*Height:/);
		await page.fill('#fit-l', '300');
		await page.fill('#fit-w', '200');
		await page.fill('#fit-h', '60');
		await expect.poll(() => messages.textContent()).toBe('');
		await page.close();
	});

	it('brings the verdict into view on a phone when the vehicle was chosen first, and folds to the typed size', async () => {
		const page = await fitScreen(PHONE);
		await page.selectOption('#fit-vehicle', SLUG);
		await page.waitForURL((u) => u.searchParams.get('vehicle') === SLUG);
		await page.fill('#fit-l', '300');
		await page.fill('#fit-w', '200');
		await page.fill('#fit-h', '60');
		await page.locator('#fit-h').press('Tab');
		const answer = page.getByTestId('fit-answer');
		const badge = answer.locator('[data-verdict]').first();
		await badge.waitFor();
		// Best seat: the sample passenger space (450 × 350 × 90 mm) against the box with the default clearance, by fitVerdict.
		expect(await badge.getAttribute('data-verdict')).toBe(fitVerdict({ l: 300, w: 200, h: 60 }, { l: 450, w: 350, h: 90 }).verdict);
		await expect.poll(async () => {
			const box = await badge.boundingBox();
			return box !== null && box.y >= 0 && box.y + box.height <= PHONE.height;
		}).toBe(true);
		expect(await page.getByTestId('fit-choice-summary').textContent()).toContain('300 × 200 × 60 mm');
		await screenshot(page, 'fit-typed-box-phone');
		await page.close();
	});

	it('checks the model year against the years the page covers', async () => {
		const page = await fitScreen(DESKTOP);
		await page.selectOption('#fit-vehicle', SLUG);
		await page.waitForURL((u) => u.searchParams.get('vehicle') === SLUG);
		await page.fill('#fit-year', '2012');
		await expect.poll(() => page.textContent('#fit-year-note')).toMatch(/2012 is outside the years this page covers \(2015–2021\)/);
		await page.fill('#fit-year', '2018');
		await expect.poll(() => page.textContent('#fit-year-note')).toBe('');
		await screenshot(page, 'fit-model-year-desktop');
		await page.close();
	});

	it('answers "which of our vehicles take it" for a typed box, for a viewer on a phone', async () => {
		const page = await fitScreen(PHONE);
		await page.fill('#fit-l', '300');
		await page.fill('#fit-w', '200');
		await page.fill('#fit-h', '60');
		const reverse = page.getByTestId('reverse-fit');
		await reverse.getByRole('button', { name: 'Find the vehicles that take it' }).click();
		const rows = reverse.getByTestId('reverse-rows');
		await rows.waitFor();
		const listed = await rows.textContent();
		// By hand, with the 10 mm clearance: the Kestle's passenger space 450 × 350 × 90 leaves 140, 140 and 20 mm;
		// the Corrin's tallest space is 62 mm, under 60 + 10 mm, so it is left out.
		expect(listed).toContain('Sundrake Kestle 2015–2021');
		expect(listed).not.toContain('Halvik Corrin');
		await screenshot(page, 'fit-reverse-box-phone');
		await reverse.getByRole('link', { name: /^Passenger seat: fits/ }).first().click();
		await page.getByTestId('fit-answer').locator('[data-verdict]').first().waitFor();
		expect(new URL(page.url()).searchParams.get('l')).toBe('300');
		// Changing the box asks again rather than showing the old list.
		await page.goto(`${BASE}/fit?l=300&w=200&h=60&unit=mm`);
		await page.locator('button:has-text("Check fit")').waitFor({ state: 'detached' });
		await page.getByTestId('reverse-rows').waitFor();
		await page.fill('#fit-h', '61');
		await page.getByRole('button', { name: 'Find the vehicles that take it' }).waitFor();
		expect(await page.getByTestId('reverse-rows').count()).toBe(0);
		await page.close();
	});
});
