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

	it('shows the next page’s own figures when a link moves from one vehicle page to another without a full load', async () => {
		const page = await pageAs('viewer');
		await page.goto(`${BASE}/vehicles/${SLUG}`, { waitUntil: 'networkidle' });
		// Twice, so the second view is answered from the page memo as well.
		await page.goto(`${BASE}/vehicles/${SLUG}`, { waitUntil: 'networkidle' });
		// A link on the page, followed by the app's own router (a client-side navigation on the same route).
		await page.evaluate(() => {
			const a = document.createElement('a');
			a.href = '/vehicles/veldra-tarn-2009-2013-sedan';
			a.id = 'to-other-page';
			a.textContent = 'Other page';
			document.querySelector('main')!.append(a);
			(window as unknown as { stayed: boolean }).stayed = true;
		});
		await page.click('#to-other-page');
		await page.waitForURL(/veldra-tarn/);
		await expect.poll(async () => page.textContent('h1')).toContain('Veldra Tarn');
		// The same document: the app's router moved, the browser did not load a new page.
		expect(await page.evaluate(() => (window as unknown as { stayed?: boolean }).stayed)).toBe(true);
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
		// The newest entry: its change note, the section it touched and, worked by hand from the one
		// edit above, one field changed that is a measurement.
		const newest = page.getByTestId('revision-rows').locator('li').first();
		expect(await newest.textContent()).toContain('Passenger seat height re-measured');
		expect(await newest.textContent()).toMatch(/Seat space[\s\S]*1 field[\s\S]*1 measurement changed/);
		await screenshot(page, 'history-phone');
		await Promise.all([page.waitForURL(/\/compare\?/), page.click('button:has-text("Show what changed")')]);
		const body = await page.textContent('main');
		expect(body).toContain('Passenger seat space, height');
		expect(body).toMatch(/85 mm[\s\S]*82 mm/);
		await screenshot(page, 'compare-phone');
		await page.close();
	});

	it('lets a moderator restore the earlier revision at desktop width', async () => {
		const page = await pageAs('moderator', DESKTOP);
		await page.goto(`${BASE}/vehicles/${SLUG}/history`, { waitUntil: 'networkidle' });
		await page.click('a:has-text("Restore this revision")');
		// Nothing happens on the first tap: the dialog asks.
		const dialog = page.locator('dialog[open]');
		await dialog.waitFor();
		expect(await dialog.textContent()).toMatch(/Restore revision #\d+\?/);
		await dialog.locator('button:has-text("Yes, restore")').click();
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

// Repeat views of a page are sent from the render kept for them; every change must still show.
describe('a page opened again shows every change since', () => {
	const OTHER = 'korvane-bristle-2016-2022-suv';
	const seats = (page: import('playwright-core').Page) => page.textContent('#section-seats');

	it('follows a follow, the units, a trust mark and a new revision', async () => {
		const page = await pageAs('admin');
		const url = `${BASE}/vehicles/${OTHER}`;
		await page.goto(url, { waitUntil: 'networkidle' });
		await page.reload({ waitUntil: 'networkidle' });
		expect(await page.textContent('#section-power .prose')).toContain('current sensor on the negative terminal');
		expect(await seats(page)).toContain('115');

		await page.click('button:has-text("Follow this car")');
		await page.getByRole('button', { name: 'Following' }).waitFor();
		await page.reload({ waitUntil: 'networkidle' });
		expect(await page.getByRole('button', { name: 'Following' }).count()).toBe(1);
		await page.goto(`${BASE}/following`, { waitUntil: 'networkidle' });
		expect(await page.textContent('main')).toContain('Korvane Bristle');
		await page.goto(url, { waitUntil: 'networkidle' });
		await page.click('button:has-text("Following")');
		await page.getByRole('button', { name: 'Follow this car' }).waitFor();
		await page.reload({ waitUntil: 'networkidle' });
		expect(await page.getByRole('button', { name: 'Follow this car' }).count()).toBe(1);

		await page.click('button:has-text("in / ft")');
		await page.locator('button[aria-pressed="true"]:has-text("in / ft")').waitFor();
		await page.reload({ waitUntil: 'networkidle' });
		expect(await seats(page)).toContain('4.53 in'); // 115 mm ÷ 25.4 mm per inch (exact by definition)
		expect(await seats(page)).not.toContain('115 mm');
		await page.click('button:has-text("mm / m")');
		await page.locator('button[aria-pressed="true"]:has-text("mm / m")').waitFor();
		await page.reload({ waitUntil: 'networkidle' });
		expect(await seats(page)).toContain('115');

		await Promise.all([page.waitForURL((u) => u.searchParams.get('marked') === 'confirmed'), page.click('button:has-text("Fitted as described")')]);
		await page.goto(url, { waitUntil: 'networkidle' });
		expect(await page.getByTestId('trust-marks').first().textContent()).toMatch(/Confirmed by \d+ installer/);

		await Promise.all([page.waitForURL(/\/trust/), page.click('a:has-text("Flag a measurement as wrong")')]);
		expect(await page.locator('#flag-field option').count()).toBeGreaterThan(5);

		await page.goto(`${url}/edit`, { waitUntil: 'networkidle' });
		await page.fill('#f-seats-spaces-1-heightMm', '112');
		await page.fill('#summary', 'Passenger seat height with the new mat');
		await Promise.all([page.waitForURL(/saved=\d+/), page.click('button:has-text("Save revision")')]);
		await page.goto(url, { waitUntil: 'networkidle' });
		expect(await seats(page)).toContain('112');
		expect(await page.textContent('main')).toContain('Passenger seat height with the new mat');
		await page.close();
	});

	it('lets a writer put the removal steps in another order, with and without scripts', async () => {
		const page = await pageAs('editor');
		await page.goto(`${BASE}/vehicles/${OTHER}/edit`, { waitUntil: 'networkidle' });
		const steps = () => page.locator('input[name^="removal.steps."]').evaluateAll((els) => els.map((e) => (e as HTMLInputElement).value));
		const before = await steps();
		expect(before.length).toBeGreaterThan(2);
		await page.locator('#edit-removal').getByRole('button', { name: 'Move step 2 up' }).click();
		expect(await steps()).toEqual([before[1], before[0], ...before.slice(2)]);
		expect(await page.locator('#edit-removal').getByRole('button', { name: 'Move step 1 up' }).isDisabled()).toBe(true);
		await page.fill('#summary', 'Removal order as done in the bay');
		await Promise.all([page.waitForURL(/saved=\d+/), page.click('button:has-text("Save revision")')]);
		expect(await page.locator('#section-removal ol li').allTextContents()).toEqual([before[1], before[0], ...before.slice(2)]);
		await page.close();

		// Without scripts the same button posts the whole form; the page comes back with the list reordered.
		const plain = await pageAs('editor');
		await plain.goto(`${BASE}/vehicles/${OTHER}/edit`, { waitUntil: 'networkidle' });
		const { action, fields } = await plain.evaluate(() => {
			const form = document.querySelector('button[value^="move:removal.steps"]')!.closest('form')!;
			return { action: form.action, fields: [...new FormData(form)].map(([k, v]) => [k, String(v)]) };
		});
		const body = new URLSearchParams(fields);
		body.set('intent', 'move:removal.steps:0:down');
		const res = await plain.request.post(action, { headers: { origin: BASE, accept: 'text/html', 'content-type': 'application/x-www-form-urlencoded' }, data: body.toString() });
		expect(res.status()).toBe(200);
		const html = await res.text();
		const order = [...html.matchAll(/<input[^>]*name="removal\.steps\.\d+"[^>]*>/g)].map((m) => /value="([^"]*)"/.exec(m[0])?.[1]);
		expect(order).toEqual(before.map((t) => t.replaceAll('&', '&amp;').replaceAll('"', '&quot;')));
	});
});

describe('the shop log and the old addresses', () => {
	it('sends the old addresses on to the shop log and the cars a person follows', async () => {
		const page = await pageAs('moderator', DESKTOP);
		await page.goto(`${BASE}/changes?awaiting=1`, { waitUntil: 'networkidle' });
		expect(new URL(page.url()).pathname).toBe('/shop-log');
		expect(await page.textContent('h1')).toBe('Shop log');
		await page.goto(`${BASE}/watchlist`, { waitUntil: 'networkidle' });
		expect(new URL(page.url()).pathname).toBe('/following');
		const moved = await page.request.get(`${BASE}/vehicles/${SLUG}/watch`, { maxRedirects: 0 });
		expect(moved.status()).toBe(308);
		expect(moved.headers().location).toBe(`/vehicles/${SLUG}/follow`);
		await page.close();
	});

	it('lets a moderator sign off a change awaiting sign-off, at phone width', async () => {
		const page = await pageAs('moderator');
		await page.goto(`${BASE}/shop-log?awaiting=1`, { waitUntil: 'networkidle' });
		const before = Number((await page.textContent('main p:has-text("awaiting sign-off")'))!.match(/(\d+)/)![1]);
		expect(before).toBeGreaterThan(0);
		await screenshot(page, 'shop-log-phone');
		await page.getByRole('button', { name: 'Sign off' }).first().click();
		await page.getByRole('status').filter({ hasText: /#\d+ signed off\./ }).waitFor();
		await page.goto(`${BASE}/shop-log?awaiting=1`, { waitUntil: 'networkidle' });
		expect(await page.textContent('main')).toContain(`${before - 1} ${before - 1 === 1 ? 'change' : 'changes'} awaiting sign-off`);
		await page.close();
	});
});
