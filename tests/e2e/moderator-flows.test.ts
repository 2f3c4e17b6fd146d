import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { chromium, type Page } from 'playwright-core';
import { BASE, browserSession, PHONE, screenshot, signIn } from './browser';

// A sample page no other end-to-end file edits: it gets a few revisions to restore and hide.
const SLUG = 'brenmoor-arrand-2005-2010-sedan';
const HEIGHT = '#f-seats-spaces-0-heightMm';

const { freshPage } = browserSession(PHONE);

async function saveHeight(page: Page, height: string) {
	await page.goto(`${BASE}/vehicles/${SLUG}/edit`, { waitUntil: 'networkidle' });
	await page.fill(HEIGHT, height);
	await page.fill('#summary', `Seat height ${height}`);
	await Promise.all([page.waitForURL(/saved=\d+/), page.click('button:has-text("Save revision")')]);
}

const revisionCount = async (page: Page) => page.getByTestId('revision-rows').locator('li').count();

/** Nothing on the page is wider than the phone: no sideways scrolling. */
async function expectNoSidewaysScroll(page: Page) {
	const { scroll, view } = await page.evaluate(() => ({ scroll: document.documentElement.scrollWidth, view: window.innerWidth }));
	expect(scroll, `${page.url()} scrolls sideways`).toBeLessThanOrEqual(view);
}

describe('restore and hide ask first, on a phone', () => {
	it('asks in a dialog before restoring: Cancel changes nothing, Yes restores', async () => {
		const page = await freshPage();
		await signIn(page, 'moderator');
		await saveHeight(page, '96');
		await saveHeight(page, '97');
		await page.goto(`${BASE}/vehicles/${SLUG}/history`, { waitUntil: 'networkidle' });
		const before = await revisionCount(page);

		await page.getByRole('link', { name: /Restore/ }).first().click();
		const dialog = page.locator('dialog[open]');
		await dialog.waitFor();
		expect(await dialog.textContent()).toMatch(/Restore revision #\d+\?/);
		await screenshot(page, 'restore-asks-phone');
		await dialog.getByRole('button', { name: 'Cancel' }).click();
		await dialog.waitFor({ state: 'detached' });
		expect(await revisionCount(page)).toBe(before);

		await page.getByRole('link', { name: /Restore/ }).first().click();
		await page.locator('dialog[open]').getByRole('button', { name: /Yes, restore/ }).click();
		await page.getByRole('status').filter({ hasText: /Restored revision \d+ as new revision \d+/ }).waitFor();
		expect(await revisionCount(page)).toBe(before + 1);
		await expectNoSidewaysScroll(page);
		await page.close();
	});

	it('asks before hiding, and takes a reason', async () => {
		const page = await freshPage();
		await signIn(page, 'moderator');
		await page.goto(`${BASE}/vehicles/${SLUG}/history`, { waitUntil: 'networkidle' });
		const row = page.getByTestId('revision-rows').locator('li').nth(1);
		await row.getByRole('link', { name: 'Hide' }).click();
		const dialog = page.locator('dialog[open]');
		await dialog.getByLabel(/Reason/).fill('Customer’s name in the notes (sample)');
		await dialog.getByRole('button', { name: /Yes, hide/ }).click();
		await page.getByRole('status').filter({ hasText: /Revision \d+ hidden/ }).waitFor();
		await page.close();
	});

	it('refuses a restore posted without the confirmation', async () => {
		const page = await freshPage();
		await signIn(page, 'moderator');
		// Posted as the page's own script posts a form, so the refusal comes back as data.
		const res = await page.request.post(`${BASE}/vehicles/${SLUG}/history?/restore`, { form: { revisionId: '1' }, headers: { origin: BASE, accept: 'application/json', 'x-sveltekit-action': 'true' } });
		const answer = await res.json();
		expect(answer).toMatchObject({ type: 'failure', status: 400 });
		expect(answer.data).toContain('Confirm first');
		await page.close();
	});

	it('restores from the What changed screen', async () => {
		const page = await freshPage();
		await signIn(page, 'moderator');
		await saveHeight(page, '98');
		await page.goto(`${BASE}/vehicles/${SLUG}/history`, { waitUntil: 'networkidle' });
		await Promise.all([page.waitForURL(/\/compare\?/), page.getByRole('link', { name: /Show what changed in/ }).first().click()]);
		await page.waitForLoadState('networkidle');
		await page.getByRole('link', { name: /Restore the older revision/ }).click();
		await Promise.all([page.waitForURL(/\/history\?restored=\d+/), page.locator('dialog[open]').getByRole('button', { name: /Yes, restore/ }).click()]);
		await page.getByRole('status').filter({ hasText: /Restored revision \d+ as new revision \d+/ }).waitFor();
		await page.goto(`${BASE}/vehicles/${SLUG}`);
		// The page said 96 mm before the 98 mm save (the first test restored it): restoring the older side brings 96 back.
		expect(await page.textContent('#section-seats')).toContain('96');
		expect(await page.textContent('#section-seats')).not.toContain('98');
		await page.close();
	});

	it('asks on a page of its own in a browser without scripts', async () => {
		const dir = mkdtempSync(join(tmpdir(), 'kickpanel-e2e-nojs-'));
		const context = await chromium.launchPersistentContext(dir, {
			executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
			headless: true,
			viewport: PHONE,
			javaScriptEnabled: false,
			args: ['--no-sandbox', '--disable-gpu', '--no-first-run']
		});
		try {
			const page = await context.newPage();
			await page.goto(`${BASE}/signin`);
			await page.fill('#email', 'moderator@kickpanel.test');
			await page.fill('#password', 'sample-moderator-pass');
			await Promise.all([page.waitForURL((url) => !url.pathname.startsWith('/signin') && !url.pathname.startsWith('/auth')), page.click('button:has-text("Sign in")')]);
			await page.goto(`${BASE}/vehicles/${SLUG}/history`);
			await Promise.all([page.waitForURL(/\/history\/confirm\?do=restore&revision=\d+/), page.getByRole('link', { name: /Restore/ }).first().click()]);
			expect(await page.textContent('main')).toMatch(/Restore revision #\d+\?/);
			await screenshot(page, 'restore-confirm-page-no-scripts-phone');
			await Promise.all([page.waitForURL(/\/history\?restored=\d+/), page.getByRole('button', { name: /Yes, restore/ }).click()]);
			expect(await page.textContent('main')).toMatch(/Restored revision \d+ as new revision \d+/);
		} finally {
			await context.close();
			rmSync(dir, { recursive: true, force: true });
		}
	});
});

describe('lists read as cards on a phone', () => {
	it('history, the shop log, staff, pauses and the audit log need no sideways scrolling', async () => {
		const page = await freshPage();
		await signIn(page, 'admin');
		for (const path of [`/vehicles/${SLUG}/history`, '/shop-log', '/admin/users', '/admin/pauses', '/admin/audit']) {
			await page.goto(`${BASE}${path}`, { waitUntil: 'networkidle' });
			await expectNoSidewaysScroll(page);
		}
		await screenshot(page, 'audit-cards-phone');
		await page.goto(`${BASE}/admin/users`, { waitUntil: 'networkidle' });
		await screenshot(page, 'staff-cards-phone');
		// Each e-mail address wraps at its @ and dots, never letter by letter: no line of it is a lone letter or two.
		const lines = await page.evaluate(() => {
			const cell = [...document.querySelectorAll('td[data-label="E-mail"] .email')][0] as HTMLElement;
			const range = document.createRange();
			range.selectNodeContents(cell);
			const tops = new Set([...range.getClientRects()].map((r) => Math.round(r.top)));
			return { lines: tops.size, text: cell.textContent, words: getComputedStyle(cell).wordBreak };
		});
		expect(lines.text).toMatch(/@kickpanel\.test$/);
		expect(lines.words).toBe('normal');
		// A sample address fits on one line of a 390 px card, or at most breaks at its @ and dot.
		expect(lines.lines).toBeLessThanOrEqual(3);
		await page.close();
	});
});
