import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { BASE, browserSession, DESKTOP, openBrowser, PHONE, screenshot, signIn } from './browser';

// Sample pages no other end-to-end file edits.
const DRAFTED = 'sundrake-kestle-2015-2021-hatchback';
const LOCKED = 'pellinor-caddow-2013-2018-suv';
const HEIGHT = '#f-seats-spaces-0-heightMm';

const { freshPage } = browserSession(PHONE);

async function editorAs(role: string, slug: string, viewport = PHONE): Promise<Page> {
	const page = await freshPage(viewport);
	await signIn(page, role);
	await page.goto(`${BASE}/vehicles/${slug}/edit`, { waitUntil: 'networkidle' });
	return page;
}

describe('typed work in the editor is never lost', () => {
	it('asks before a menu link leaves unsaved changes, and stays when told to', async () => {
		const page = await editorAs('editor', DRAFTED);
		await page.fill(HEIGHT, '79');
		let asked = '';
		page.once('dialog', (dialog) => {
			asked = dialog.message();
			void dialog.dismiss();
		});
		await page.getByRole('link', { name: 'Back to the page' }).click();
		await expect.poll(() => asked).toMatch(/not saved yet/);
		expect(new URL(page.url()).pathname).toBe(`/vehicles/${DRAFTED}/edit`);
		expect(await page.inputValue(HEIGHT)).toBe('79');
		await page.close();
	});

	it('asks the browser before a reload with unsaved changes', async () => {
		const page = await editorAs('editor', DRAFTED);
		await page.fill(HEIGHT, '78');
		// Chromium only asks after the person has touched the page, as a real writer has.
		await page.click(HEIGHT);
		const asked = new Promise<string>((resolve) => page.once('dialog', (dialog) => {
			resolve(dialog.type());
			void dialog.dismiss();
		}));
		void page.reload().catch(() => undefined);
		expect(await asked).toBe('beforeunload');
		expect(await page.inputValue(HEIGHT)).toBe('78');
		await page.close();
	});

	it('keeps a draft on the device and offers it back when the editor opens again', async () => {
		const page = await editorAs('editor', DRAFTED);
		// Start with nothing kept from the tests before.
		await page.evaluate(() => localStorage.clear());
		await page.reload({ waitUntil: 'networkidle' });
		await page.fill(HEIGHT, '77');
		await page.fill('#summary', 'Driver seat re-measured with the mat out');
		page.on('dialog', (dialog) => void dialog.accept());
		await page.goto(`${BASE}/vehicles/${DRAFTED}`, { waitUntil: 'networkidle' });
		await page.goto(`${BASE}/vehicles/${DRAFTED}/edit`, { waitUntil: 'networkidle' });
		const offer = page.getByTestId('draft-offer');
		await offer.waitFor();
		expect(await offer.textContent()).toMatch(/unsaved work on this page/);
		expect(await page.inputValue(HEIGHT)).not.toBe('77');
		await screenshot(page, 'editor-draft-offer-phone');
		await offer.getByRole('button', { name: 'Bring back my draft' }).click();
		expect(await page.inputValue(HEIGHT)).toBe('77');
		expect(await page.inputValue('#summary')).toBe('Driver seat re-measured with the mat out');

		// A saved draft is forgotten: the next opening offers nothing.
		await Promise.all([page.waitForURL(/saved=\d+/), page.click('button:has-text("Save revision")')]);
		await page.goto(`${BASE}/vehicles/${DRAFTED}/edit`, { waitUntil: 'networkidle' });
		expect(await page.inputValue(HEIGHT)).toBe('77');
		expect(await page.getByTestId('draft-offer').count()).toBe(0);
		await page.close();
	});

	it('hands the form back with everything typed when a moderator protects the page meanwhile', async () => {
		const page = await editorAs('editor', LOCKED, DESKTOP);
		await page.fill(HEIGHT, '101');
		await page.fill('#summary', 'Driver seat height with the rails down');

		// The moderator works in another browser: one browser holds one signed-in person.
		const other = await openBrowser(DESKTOP);
		const moderator = await other.context.newPage();
		await signIn(moderator, 'moderator');
		const protect = (protection: string) => moderator.request.post(`${BASE}/vehicles/${LOCKED}/history?/lock`, { form: { protection }, headers: { origin: BASE } });
		expect((await protect('moderators')).status()).toBe(200);
		try {
			await page.click('button:has-text("Save revision")');
			const alert = page.getByRole('alert').filter({ hasText: /locked this page while you were editing/ });
			await alert.waitFor();
			expect(new URL(page.url()).pathname).toBe(`/vehicles/${LOCKED}/edit`);
			expect(await page.inputValue(HEIGHT)).toBe('101');
			expect(await page.inputValue('#summary')).toBe('Driver seat height with the rails down');
			await screenshot(page, 'editor-protected-meanwhile-desktop');
		} finally {
			await protect('none');
			await other.close();
			await page.close();
		}
	});
});
