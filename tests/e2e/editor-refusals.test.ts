import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { BASE, browserSession, openBrowser, PHONE, screenshot, signIn } from './browser';

// A sample page no other end-to-end file edits. Every refused save must come back to the form with
// everything typed and a message that says what happened.
const SLUG = 'brenmoor-zennock-2018-2024-van';
const HEIGHT = '#f-seats-spaces-0-heightMm';
const NOTE = '#summary';

const { freshPage } = browserSession(PHONE);

async function editorOpen(page: Page) {
	await signIn(page, 'editor');
	await page.goto(`${BASE}/vehicles/${SLUG}/edit`, { waitUntil: 'networkidle' });
	// No draft kept from the tests before: the form opens on the page as saved.
	await page.evaluate(() => localStorage.clear());
	await page.reload({ waitUntil: 'networkidle' });
}

async function typeWork(page: Page, height: string, note: string) {
	await page.fill(HEIGHT, height);
	await page.fill(NOTE, note);
}

async function expectKept(page: Page, height: string, note: string) {
	expect(new URL(page.url()).pathname).toBe(`/vehicles/${SLUG}/edit`);
	expect(await page.inputValue(HEIGHT)).toBe(height);
	expect(await page.inputValue(NOTE)).toBe(note);
}

/** Someone else, in a browser of their own. */
async function otherPerson(role: string) {
	const other = await openBrowser(PHONE);
	const page = await other.context.newPage();
	await signIn(page, role);
	return { page, close: () => other.close() };
}

describe('a refused save comes back to the form with everything typed', () => {
	it('after a sign-out in another tab: says so, keeps the work', async () => {
		const page = await freshPage();
		await editorOpen(page);
		await typeWork(page, '141', 'Seat height, signed out meanwhile');
		// Another tab of the same browser signs out.
		const res = await page.request.post(`${BASE}/signout`, { form: {}, headers: { origin: BASE }, maxRedirects: 0 });
		expect(res.status()).toBeLessThan(400);
		await page.click('button:has-text("Save revision")');
		await page.getByRole('alert').filter({ hasText: /You are signed out/ }).waitFor();
		await expectKept(page, '141', 'Seat height, signed out meanwhile');
		await screenshot(page, 'editor-signed-out-phone');
		await page.close();
	});

	it('after a moderator pauses the writer’s editing: shows the pause, keeps the work', async () => {
		const page = await freshPage();
		await editorOpen(page);
		await typeWork(page, '142', 'Seat height, paused meanwhile');

		const admin = await otherPerson('admin');
		try {
			await admin.page.goto(`${BASE}/admin/users`, { waitUntil: 'networkidle' });
			const href = await admin.page.getByRole('link', { name: 'Odell Brask' }).first().getAttribute('href');
			const until = new Date(Date.now() + 2 * 24 * 3600_000).toISOString().slice(0, 10);
			const paused = await admin.page.request.post(`${BASE}${href}?/pause`, { form: { reason: 'Checking the last three pages first', until }, headers: { origin: BASE } });
			expect(paused.status()).toBe(200);

			await page.click('button:has-text("Save revision")');
			await page.getByRole('alert').filter({ hasText: /Your editing is paused until .*Checking the last three pages first/ }).waitFor();
			await expectKept(page, '142', 'Seat height, paused meanwhile');
			await screenshot(page, 'editor-paused-phone');

			const ended = await admin.page.request.post(`${BASE}${href}?/end`, { form: {}, headers: { origin: BASE } });
			expect(ended.status()).toBe(200);
		} finally {
			await admin.close();
			await page.close();
		}
	});

	it('after someone else saved the same field: names who and when, keeps the work, and saves once settled', async () => {
		const page = await freshPage();
		await editorOpen(page);
		await typeWork(page, '143', 'Seat height from my tape');

		const moderator = await otherPerson('moderator');
		try {
			await moderator.page.goto(`${BASE}/vehicles/${SLUG}/edit`, { waitUntil: 'networkidle' });
			await moderator.page.fill(HEIGHT, '150');
			await moderator.page.fill(NOTE, 'Seat height from the moderator');
			await Promise.all([moderator.page.waitForURL(/saved=\d+/), moderator.page.click('button:has-text("Save revision")')]);
		} finally {
			await moderator.close();
		}

		await page.click('button:has-text("Save revision")');
		const named = page.getByTestId('saved-meanwhile');
		await named.waitFor();
		// The moderator of the sample shop, and a time in the shop's zone (UTC unless set otherwise).
		expect(await named.textContent()).toMatch(/^Mirela Vantongeren saved revision \d+ at \d{4}-\d{2}-\d{2} \d{2}:\d{2} [A-Z+\-:0-9]+$/);
		await expectKept(page, '143', 'Seat height from my tape');
		await screenshot(page, 'editor-conflict-phone');

		// "Keep mine" is chosen already: the second press saves the writer's figure over the moderator's.
		await Promise.all([page.waitForURL(/saved=\d+/), page.click('button:has-text("Save revision")')]);
		expect(await page.textContent('#section-seats')).toContain('143');
		await page.close();
	});
});
