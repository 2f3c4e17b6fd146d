import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { BASE, browserSession, DESKTOP, PHONE, screenshot, signIn } from './browser';

// The fullest sample page: nine sections, cautions in several of them.
const SLUG = 'veldra-tarn-2009-2013-sedan';

const { freshPage } = browserSession(PHONE);

const openSections = (page: Page) => page.locator('details[id^="section-"]').evaluateAll((all) => all.filter((d) => (d as HTMLDetailsElement).open).map((d) => d.id));

describe('the bay view of a vehicle page', () => {
	it('opens on a phone with cautions, quick facts and only the section the address names', async () => {
		const page = await freshPage(PHONE);
		await signIn(page, 'viewer');
		await page.goto(`${BASE}/vehicles/${SLUG}#section-power`, { waitUntil: 'networkidle' });
		await expect.poll(() => openSections(page)).toEqual(['section-power']);
		expect(await page.getByRole('heading', { name: 'Cautions for this car' }).isVisible()).toBe(true);
		expect(await page.getByRole('region', { name: 'Quick facts' }).first().isVisible()).toBe(true);

		// A chip in the sticky jump list opens its section and closes the one before.
		const jump = page.getByRole('navigation', { name: 'Jump to a section' });
		expect(await jump.evaluate((nav) => getComputedStyle(nav).position)).toBe('sticky');
		await jump.getByRole('link', { name: 'Seat space' }).click();
		await expect.poll(() => openSections(page)).toEqual(['section-seats']);
		await screenshot(page, 'bay-view-phone');

		// Every control a thumb presses is at least 44 px tall (links inside running text aside).
		const small = await page.locator('main').evaluate((main) =>
			[...main.querySelectorAll('button, summary, nav a, a.btn, select, input:not([type="hidden"])')]
				.filter((el) => (el as HTMLElement).offsetParent !== null && !el.closest('.sr-only'))
				.map((el) => ({ what: `${el.tagName} ${(el.textContent ?? '').trim().slice(0, 30)}`, height: el.getBoundingClientRect().height }))
				.filter((c) => c.height < 44)
		);
		expect(small).toEqual([]);
		await page.close();
	});

	it('keeps the reading layout at desk width: every section with something in it stays open', async () => {
		const page = await freshPage(DESKTOP);
		await signIn(page, 'viewer');
		await page.goto(`${BASE}/vehicles/${SLUG}#section-power`, { waitUntil: 'networkidle' });
		const open = await openSections(page);
		expect(open.length).toBeGreaterThanOrEqual(8);
		expect(await page.getByRole('heading', { name: 'Cautions for this car' }).isVisible()).toBe(false);
		await page.close();
	});
});
