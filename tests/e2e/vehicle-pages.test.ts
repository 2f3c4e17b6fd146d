import { describe, expect, it } from 'vitest';
import { BASE, browserSession, DESKTOP, PHONE, screenshot, signIn } from './browser';

// A sample page no other end-to-end file edits.
const SLUG = 'halvik-stennet-2020-2025-sedan';
const { freshPage } = browserSession(PHONE);

async function pageAs(role: string, viewport = PHONE) {
	const page = await freshPage(viewport);
	await signIn(page, role);
	return page;
}

describe('a writer edits, a moderator puts it right', () => {
	it('reads the page on a phone with the seat figures and the cautions', async () => {
		const page = await pageAs('viewer');
		await page.goto(`${BASE}/vehicles/${SLUG}`);
		expect(await page.textContent('h1')).toContain('Halvik Stennet');
		expect(await page.textContent('#section-seats')).toContain('85');
		expect(await page.textContent('#section-power')).toMatch(/Disconnect the battery/);
		expect(await page.getByRole('link', { name: 'Edit' }).count()).toBe(0);
		await screenshot(page, 'vehicle-viewer-phone');
		const edit = await page.goto(`${BASE}/vehicles/${SLUG}/edit`);
		expect(edit!.status()).toBe(403);
		await page.close();
	});

	it('lets the writer change the passenger seat height from a phone and shows it in history and compare', async () => {
		const page = await pageAs('editor');
		await page.goto(`${BASE}/vehicles/${SLUG}/edit`, { waitUntil: 'networkidle' });
		await page.fill('#f-seats-spaces-1-heightMm', '82');
		await page.fill('#summary', 'Passenger seat height re-measured');
		await screenshot(page, 'editor-phone');
		await Promise.all([page.waitForURL(/saved=\d+/), page.click('button:has-text("Save revision")')]);
		await page.getByRole('status').filter({ hasText: /Saved revision \d+/ }).waitFor();

		await page.goto(`${BASE}/vehicles/${SLUG}/history`);
		expect(await page.textContent('table')).toContain('Passenger seat height re-measured');
		await Promise.all([page.waitForURL(/\/compare\?/), page.click('button:has-text("Compare selected revisions")')]);
		const body = await page.textContent('main');
		expect(body).toContain('Passenger seat space, height');
		expect(body).toMatch(/85 mm[\s\S]*82 mm/);
		await screenshot(page, 'compare-phone');
		await page.close();
	});

	it('lets a moderator restore the earlier revision at desktop width', async () => {
		const page = await pageAs('moderator', DESKTOP);
		await page.goto(`${BASE}/vehicles/${SLUG}/history`, { waitUntil: 'networkidle' });
		await page.click('button:has-text("Restore this revision")');
		await page.getByText(/Restored revision \d+ as new revision \d+/).waitFor();
		await screenshot(page, 'history-moderator-desktop');
		await page.goto(`${BASE}/vehicles/${SLUG}`);
		expect(await page.textContent('main')).toMatch(/Restored revision \d+ by/);
		await page.close();
	});

	it('refuses the restore action to an editor who posts it directly', async () => {
		const page = await pageAs('editor');
		const res = await page.request.post(`${BASE}/vehicles/${SLUG}/history?/restore`, { form: { revisionId: '1' }, headers: { origin: BASE } });
		expect(res.status()).toBe(403);
		await page.close();
	});
});
