import { afterAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { BASE, browserSession, PHONE, screenshot, signIn } from './browser';

const { freshPage } = browserSession(PHONE);

// Times are stored in UTC and shown in the shop's zone. New York keeps EST (UTC−5) from the first Sunday
// of November to the second Sunday of March, EDT (UTC−4) in between (US Energy Policy Act of 2005).
const NEW_YORK_NAME = /\d{4}-\d{2}-\d{2} \d{2}:\d{2} E[SD]T/;

/** Posted as the page's own script posts it (`asData`): a refusal comes back as data. */
async function setZone(page: Page, zone: string, asData = false) {
	const headers: Record<string, string> = asData ? { origin: BASE, accept: 'application/json', 'x-sveltekit-action': 'true' } : { origin: BASE };
	return page.request.post(`${BASE}/admin/settings?/timezone`, { form: { timeZone: zone }, headers });
}

let admin: Page | null = null;
afterAll(async () => {
	if (admin) await setZone(admin, 'UTC');
});

describe('the shop’s time zone', () => {
	it('is chosen on the settings page and used on history, the shop log and the job sheet', async () => {
		admin = await freshPage();
		await signIn(admin, 'admin');
		await admin.goto(`${BASE}/admin/settings`, { waitUntil: 'networkidle' });
		expect(await admin.inputValue('#timeZone')).toBe('UTC');
		await admin.selectOption('#timeZone', 'America/New_York');
		await admin.click('button:has-text("Save time zone")');
		await admin.getByRole('status').filter({ hasText: 'Times are now shown in America/New_York.' }).waitFor();
		expect(await admin.getByTestId('zone-now').textContent()).toMatch(NEW_YORK_NAME);
		await screenshot(admin, 'settings-time-zone-phone');

		for (const path of ['/vehicles/veldra-tarn-2009-2013-sedan/history', '/shop-log', '/vehicles/veldra-tarn-2009-2013-sedan/job-sheet']) {
			await admin.goto(`${BASE}${path}`, { waitUntil: 'networkidle' });
			const text = (await admin.textContent('main')) ?? '';
			expect(text, path).toMatch(NEW_YORK_NAME);
		}
	});

	it('shows the same moment five hours (winter) or four (summer) behind UTC', async () => {
		const page = admin!;
		const api = await page.request.get(`${BASE}/api/vehicles/veldra-tarn-2009-2013-sedan/revisions`);
		const newest = (await api.json()).items[0] as { id: number; createdAt: string };
		await page.goto(`${BASE}/vehicles/veldra-tarn-2009-2013-sedan/history`, { waitUntil: 'networkidle' });
		const shown = (await page.locator(`[data-revision="${newest.id}"]`).textContent()) ?? '';
		const [, day, hh, mm, name] = shown.match(/(\d{4}-\d{2}-\d{2}) (\d{2}):(\d{2}) (E[SD]T)/)!;
		const offsetHours = name === 'EST' ? 5 : 4;
		const back = new Date(`${day}T${hh}:${mm}:00Z`).getTime() + offsetHours * 3600_000;
		// The stored UTC instant, to the minute.
		expect(new Date(back).toISOString().slice(0, 16)).toBe(newest.createdAt.slice(0, 16));
	});

	it('refuses a zone the server does not know, with a message', async () => {
		const res = await setZone(admin!, 'Mars/Olympus_Mons', true);
		const answer = await res.json();
		expect(answer).toMatchObject({ type: 'failure', status: 400 });
		expect(answer.data).toContain('not a time zone this server knows');
		await admin!.goto(`${BASE}/admin/settings`, { waitUntil: 'networkidle' });
		expect(await admin!.inputValue('#timeZone')).toBe('America/New_York');
	});
});
