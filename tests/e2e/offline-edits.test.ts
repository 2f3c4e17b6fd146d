import { describe, expect, it } from 'vitest';
import { AxeBuilder } from '@axe-core/playwright';
import type { Page } from 'playwright-core';
import { BASE, browserSession, openBrowser, PHONE, screenshot, signIn } from './browser';

// Sample pages no other end-to-end file edits: one for a change that goes through, one for a clash.
const SENT = 'korvane-pennick-2003-2008-pickup';
const CLASH = 'halvik-corrin-1998-2004-coupe';
const HEIGHT = '#f-seats-spaces-0-heightMm';
// A page a reader pins (read only).
const PINNED = 'marrowby-cinder-2019-2024-coupe';

const { freshPage, nextTab } = browserSession(PHONE);

/** A writer opens a page's editor with signal, and the phone keeps it. */
async function editorKept(page: Page, slug: string): Promise<void> {
	await signIn(page, 'editor');
	await page.goto(`${BASE}/vehicles/${slug}/edit`, { waitUntil: 'networkidle' });
	await page.evaluate(() => navigator.serviceWorker.ready.then(() => undefined));
	// No draft from before: the form opens on the page as saved.
	await page.evaluate(() => localStorage.clear());
	await page.reload({ waitUntil: 'networkidle' });
	const address = `/vehicles/${slug}/edit`;
	await expect.poll(() => page.evaluate((a) => caches.match(a).then((r) => !!r), address), { timeout: 20_000 }).toBe(true);
}

/** With no signal: the kept editor opens, a figure changes and Save keeps the change on the phone. */
async function changeOffline(page: Page, slug: string, height: string): Promise<void> {
	await page.context().setOffline(true);
	await page.reload();
	await expect.poll(() => page.getByTestId('offline-banner').textContent()).toMatch(/Offline copy from \d{1,2}:\d{2}/);
	await page.fill(HEIGHT, height);
	await page.fill('#summary', `Driver seat height re-measured with no signal (sample ${height} mm)`);
	await page.getByRole('button', { name: 'Save revision' }).click();
	const kept = page.getByTestId('kept-on-phone');
	await kept.waitFor();
	expect(await kept.textContent()).toMatch(/Not saved yet: .*kept on the phone and will be sent when the network is back/);
	expect(await page.getByTestId('outbox').textContent()).toContain('Change to');
	expect(new URL(page.url()).pathname).toBe(`/vehicles/${slug}/edit`);
	expect(await page.inputValue(HEIGHT)).toBe(height);
}

/** The network returns and the person opens the page again in a new tab: the banner answers for what waited. */
async function backOnline(closed: Page, slug: string, answer: 'outbox-sent' | 'outbox-refused') {
	await closed.context().setOffline(false);
	const later = await nextTab();
	await later.goto(`${BASE}/vehicles/${slug}`, { waitUntil: 'networkidle' });
	const shown = later.getByTestId(answer);
	await shown.waitFor({ timeout: 20_000 });
	return { later, answer: shown };
}

const driverSeatHeight = async (page: Page, slug: string) =>
	(await (await page.request.get(`${BASE}/api/vehicles/${slug}`)).json()).content.seats.spaces[0].heightMm as number | null;

/** What the axe-core engine finds wrong on the screen (all rules, every impact). */
const violations = async (page: Page) => (await new AxeBuilder({ page }).analyze()).violations.map((v) => `${v.id}: ${v.nodes.map((n) => n.target.join(' ')).join(' | ')}`);

const draftsOnDevice = (page: Page) => page.evaluate(() => Object.keys(localStorage).filter((k) => k.startsWith('kickpanel.draft.')).length);

describe('a change made in the editor with no signal', () => {
	it('keeps no editor for a reader: the refusal is not stored, even on a pinned page', async () => {
		const page = await freshPage();
		await signIn(page, 'viewer');
		await page.goto(`${BASE}/vehicles/${PINNED}`, { waitUntil: 'networkidle' });
		await page.evaluate(() => navigator.serviceWorker.ready.then(() => undefined));
		await page.getByRole('button', { name: 'Pin for today' }).click();
		await page.getByRole('button', { name: 'Pinned for today' }).waitFor();
		const res = await page.goto(`${BASE}/vehicles/${PINNED}/edit`, { waitUntil: 'networkidle' });
		expect(res?.status()).toBe(403);
		const kept = await page.evaluate(async (slug) => {
			const names = await caches.keys();
			const found = await Promise.all(names.map(async (n) => (await (await caches.open(n)).keys()).map((r) => new URL(r.url).pathname)));
			return found.flat().filter((p) => p.startsWith(`/vehicles/${slug}`));
		}, PINNED);
		expect(kept).toContain(`/vehicles/${PINNED}/job-sheet`);
		expect(kept).not.toContain(`/vehicles/${PINNED}/edit`);
		await page.close();
	});

	it('is kept on the phone, leaves the editor without asking, and is saved as a revision when the network returns', async () => {
		const page = await freshPage();
		await editorKept(page, SENT);
		await changeOffline(page, SENT, '74');
		await screenshot(page, 'offline-edit-kept-phone');
		expect(await violations(page)).toEqual([]);
		expect(await draftsOnDevice(page)).toBe(1);

		// Nothing typed is left unsent, so leaving does not ask.
		const asked: string[] = [];
		page.on('dialog', (dialog) => {
			asked.push(dialog.message());
			void dialog.dismiss();
		});
		await page.getByRole('link', { name: 'Back to the page' }).click();
		await page.waitForURL((url) => url.pathname === `/vehicles/${SENT}`);
		expect(asked).toEqual([]);
		await page.close();

		// Later, with signal again, any screen sends it.
		const { later, answer: sent } = await backOnline(page, SENT, 'outbox-sent');
		expect(await sent.textContent()).toMatch(/Sent from this phone: Change to Korvane Pennick/);
		expect(await driverSeatHeight(later, SENT)).toBe(74);
		expect(await draftsOnDevice(later)).toBe(0);
		await later.goto(`${BASE}/vehicles/${SENT}/history`, { waitUntil: 'networkidle' });
		expect(await later.locator('main').textContent()).toContain('Driver seat height re-measured with no signal (sample 74 mm)');
		await later.close();
	});

	it('is refused when someone saved the same figure meanwhile, and the editor offers the draft and shows the clash', async () => {
		const page = await freshPage();
		await editorKept(page, CLASH);
		await changeOffline(page, CLASH, '63');
		await page.close();

		// Meanwhile a moderator, with signal, saves another figure in the same place.
		const other = await openBrowser(PHONE);
		try {
			const moderator = await other.context.newPage();
			await signIn(moderator, 'moderator');
			await moderator.goto(`${BASE}/vehicles/${CLASH}/edit`, { waitUntil: 'networkidle' });
			await moderator.fill(HEIGHT, '66');
			await moderator.fill('#summary', 'Driver seat height with the new rails (sample)');
			await Promise.all([moderator.waitForURL(/saved=\d+/), moderator.click('button:has-text("Save revision")')]);
		} finally {
			await other.close();
		}

		const { later, answer: refused } = await backOnline(page, CLASH, 'outbox-refused');
		expect(await refused.textContent()).toMatch(/Change to Halvik Corrin.*was not accepted: Someone else saved this page while you were editing/);
		expect(await driverSeatHeight(later, CLASH)).toBe(66);
		await screenshot(later, 'offline-edit-refused-phone');
		expect(await violations(later)).toEqual([]);

		await Promise.all([later.waitForURL((url) => url.pathname === `/vehicles/${CLASH}/edit`), refused.getByRole('link', { name: 'Open the editor' }).click()]);
		const offer = later.getByTestId('draft-offer');
		await offer.waitFor();
		expect(await later.inputValue(HEIGHT)).toBe('66');
		await offer.getByRole('button', { name: 'Bring back my draft' }).click();
		expect(await later.inputValue(HEIGHT)).toBe('63');
		await later.getByRole('button', { name: 'Save revision' }).click();
		const named = later.getByTestId('saved-meanwhile');
		await named.waitFor();
		// The moderator of the sample shop.
		expect(await named.textContent()).toMatch(/^Mirela Vantongeren saved revision \d+ at /);
		await screenshot(later, 'offline-edit-conflict-phone');

		// "Keep mine" is chosen already: saving settles it, and the refused change leaves the phone.
		await Promise.all([later.waitForURL(/saved=\d+/), later.click('button:has-text("Save revision")')]);
		expect(await driverSeatHeight(later, CLASH)).toBe(63);
		await later.reload({ waitUntil: 'networkidle' });
		expect(await later.getByTestId('outbox-refused').count()).toBe(0);
		expect(await draftsOnDevice(later)).toBe(0);
		await later.close();
	});
});
