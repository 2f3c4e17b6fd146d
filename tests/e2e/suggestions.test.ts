import { afterAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { BASE, browserSession, openBrowser, PHONE, screenshot, signIn } from './browser';

// A sample page no other end-to-end file edits; locked for moderators while these tests run.
const SLUG = 'brenmoor-sallow-2011-2017-wagon';
const HEIGHT = '#f-seats-spaces-0-heightMm';

const { freshPage } = browserSession(PHONE);

/** A moderator in a browser of their own: one browser holds one signed-in person. */
async function moderatorBrowser() {
	const other = await openBrowser(PHONE);
	const page = await other.context.newPage();
	page.on('pageerror', (error) => moderatorErrors.push(error.message));
	await signIn(page, 'moderator');
	const lock = async (protection: 'none' | 'moderators') => {
		const res = await page.request.post(`${BASE}/vehicles/${SLUG}/history?/lock`, { form: { protection }, headers: { origin: BASE } });
		expect(res.status()).toBe(200);
	};
	return { page, lock, close: () => other.close() };
}

async function editorOn(page: Page) {
	await signIn(page, 'editor');
	await page.goto(`${BASE}/vehicles/${SLUG}/edit`, { waitUntil: 'networkidle' });
	await page.evaluate(() => localStorage.clear());
}

let moderator: Awaited<ReturnType<typeof moderatorBrowser>> | null = null;
const moderatorErrors: string[] = [];
afterAll(async () => {
	await moderator?.lock('none').catch(() => undefined);
	await moderator?.close();
	expect(moderatorErrors, 'uncaught errors in the moderator’s pages').toEqual([]);
});

describe('a writer suggests a change to a page locked for moderators', () => {
	it('offers “Suggest this change” when a moderator locks the page mid-edit, and keeps everything typed', async () => {
		moderator = await moderatorBrowser();
		const page = await freshPage();
		await editorOn(page);
		await page.fill(HEIGHT, '131');
		await page.fill('#summary', 'Driver seat height with the rails right down');
		await moderator.lock('moderators');

		await page.click('button:has-text("Save revision")');
		await page.getByRole('alert').filter({ hasText: /locked this page while you were editing/ }).waitFor();
		expect(await page.inputValue(HEIGHT)).toBe('131');
		await screenshot(page, 'editor-locked-offers-suggestion-phone');

		await Promise.all([page.waitForURL(/\/suggestions\/\d+\?kept=1$/), page.click('button:has-text("Suggest this change")')]);
		await page.getByRole('status').filter({ hasText: /kept for a moderator/ }).waitFor();
		const main = (await page.textContent('main')) ?? '';
		expect(main).toContain('Waiting for a moderator');
		expect(main).toMatch(/Driver seat space, height[\s\S]*131 mm/);
		await screenshot(page, 'suggestion-kept-phone');
		await page.close();
	});

	it('opens the editor of a locked page in suggest mode, with no Save button', async () => {
		const page = await freshPage();
		await editorOn(page);
		await page.getByTestId('suggest-mode').waitFor();
		expect(await page.locator('button:has-text("Save revision")').count()).toBe(0);
		await page.fill('#f-seats-spaces-0-lengthMm', '455');
		await page.fill('#summary', 'Length to the rear rail');
		await Promise.all([page.waitForURL(/\/suggestions\/\d+/), page.click('button:has-text("Suggest this change")')]);
		// The writer's own suggestions wait in the shop log too.
		await page.goto(`${BASE}/shop-log`, { waitUntil: 'networkidle' });
		const listed = page.getByTestId('suggestions');
		expect(await listed.textContent()).toMatch(/Your suggested changes waiting[\s\S]*Length to the rear rail[\s\S]*Driver seat height with the rails right down/);
		await page.close();
	});

	it('lets a moderator apply one from the shop log through the normal save, and decline another with a note', async () => {
		const page = moderator!.page;
		await page.goto(`${BASE}/shop-log`, { waitUntil: 'networkidle' });
		const waiting = page.getByTestId('suggestions');
		expect(await waiting.textContent()).toContain('Suggested changes waiting for a moderator');
		await screenshot(page, 'shop-log-suggestions-phone');

		// The older one (the height) is listed last.
		await Promise.all([page.waitForURL(/\/suggestions\/\d+$/), waiting.getByRole('link', { name: /Look at suggestion/ }).last().click()]);
		await page.waitForLoadState('networkidle');
		expect(await page.textContent('main')).toContain('Driver seat height with the rails right down');
		await Promise.all([page.waitForURL(/\/vehicles\/[^/]+\?saved=\d+/), page.click('button:has-text("Apply this change")')]);
		expect(await page.textContent('#section-seats')).toContain('131');

		// The page lists the one still waiting.
		const onPage = page.getByTestId('suggestions');
		await Promise.all([page.waitForURL(/\/suggestions\/\d+$/), onPage.getByRole('link', { name: /Look at suggestion/ }).click()]);
		await page.waitForLoadState('networkidle');
		await page.click('button:has-text("Decline with this note")');
		await page.getByText('Say why, in a few words').waitFor();
		await page.fill('#note', 'Measured again: the rail sits at 450 mm');
		await page.click('button:has-text("Decline with this note")');
		await page.getByRole('status').filter({ hasText: /Declined: the writer hears it by mail/ }).waitFor();
		expect(await page.getByTestId('suggestion-status').textContent()).toBe('Declined');
		await screenshot(page, 'suggestion-declined-phone');
	});

	it('tells the writer of both answers by mail', async () => {
		const admin = await freshPage();
		await signIn(admin, 'admin');
		await admin.goto(`${BASE}/admin/outbox?to=${encodeURIComponent('editor@kickpanel.test')}`, { waitUntil: 'networkidle' });
		const list = (await admin.getByTestId('outbox').textContent()) ?? '';
		expect(list).toMatch(/applied your suggested change to Brenmoor Sallow/);
		expect(list).toMatch(/declined your suggested change to Brenmoor Sallow/);
		await admin.close();
	});
});
