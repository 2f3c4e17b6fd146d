import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { BASE, browserSession, DESKTOP, signIn } from './browser';

// Search, the fit check, the editor and history, worked with the keyboard alone: every step is
// reached with Tab and used with Enter, Space, arrows or typing.

const { freshPage } = browserSession(DESKTOP);
/** The smallest sample page, which no other end-to-end file edits: its editor has the fewest fields to pass. */
async function smallPage(page: Page): Promise<string> {
	const list = await (await page.request.get(`${BASE}/api/vehicles?pageSize=50`)).json();
	return (list.items as { slug: string }[]).map((i) => i.slug).find((s) => s.startsWith('marrowby-scree-'))!;
}

/** Presses Tab until the focused element matches `selector`; fails when it is never reached. */
async function tabTo(page: Page, selector: string, most = 400): Promise<void> {
	for (let i = 0; i < most; i++) {
		await page.keyboard.press('Tab');
		if (await page.evaluate((s) => document.activeElement?.matches(s) ?? false, selector)) return;
	}
	throw new Error(`${selector} was not reached with the Tab key`);
}

describe('a keyboard path through the main screens', () => {
	it('searches and opens a vehicle page', async () => {
		const page = await freshPage();
		await signIn(page, 'viewer');
		await page.goto(`${BASE}/`, { waitUntil: 'networkidle' });
		await tabTo(page, 'input[type="search"][name="q"]');
		await page.keyboard.type('tarn');
		await page.getByRole('option').first().waitFor();
		await Promise.all([page.waitForURL(/\/search\?/), page.keyboard.press('Enter')]);
		await tabTo(page, 'main a[href^="/vehicles/"]');
		await Promise.all([page.waitForURL(/\/vehicles\/[a-z0-9-]+$/), page.keyboard.press('Enter')]);
		expect(await page.getByRole('heading', { level: 1 }).textContent()).toBeTruthy();
		await page.close();
	});

	it('checks a part against a vehicle', async () => {
		const page = await freshPage();
		await signIn(page, 'viewer');
		await page.goto(`${BASE}/fit`, { waitUntil: 'networkidle' });
		await tabTo(page, '#fit-vehicle');
		await page.keyboard.press('ArrowDown');
		await tabTo(page, '#fit-part');
		await page.keyboard.press('ArrowDown');
		await page.getByTestId('fit-answer').waitFor({ timeout: 15_000 });
		expect(await page.getByTestId('fit-answer').textContent()).toMatch(/fit|tight|measured/i);
		await page.close();
	});

	it('edits a figure and saves the revision', async () => {
		const page = await freshPage();
		await signIn(page, 'editor');
		const slug = await smallPage(page);
		await page.goto(`${BASE}/vehicles/${slug}/edit`, { waitUntil: 'networkidle' });
		await tabTo(page, 'textarea');
		await page.keyboard.press('Control+End');
		await page.keyboard.type(' Checked again (sample).');
		await tabTo(page, '#summary');
		await page.keyboard.type('Keyboard check of the notes (sample)');
		await tabTo(page, 'button[value="save"]');
		await Promise.all([page.waitForURL(new RegExp(`/vehicles/${slug}(\\?|$)`), { timeout: 20_000 }), page.keyboard.press('Enter')]);
		await page.getByText(/Saved revision \d+/).waitFor();
		await page.close();
	}, 180_000);

	it('picks two revisions in history and shows what changed', async () => {
		const page = await freshPage();
		await signIn(page, 'moderator');
		const slug = await smallPage(page);
		await page.goto(`${BASE}/vehicles/${slug}/history`, { waitUntil: 'networkidle' });
		await tabTo(page, 'input[name="pick"]');
		await page.keyboard.press('Space');
		await tabTo(page, 'input[name="pick"]:not(:checked)');
		await page.keyboard.press('Space');
		await tabTo(page, 'button:is(.btn-primary)');
		await Promise.all([page.waitForURL(/\/compare\?/), page.keyboard.press('Enter')]);
		expect(await page.getByRole('heading', { level: 1 }).textContent()).toBeTruthy();
		await page.close();
	});
});
