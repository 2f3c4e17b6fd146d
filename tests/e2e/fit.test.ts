import { describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type Page } from 'playwright-core';
import { BASE, browserSession, DESKTOP, PHONE, screenshot, signIn, userFor } from './browser';
import { fitVerdict } from '../../src/lib/domain/fit';

// The sample shop (content-seed/): invented vehicles and parts.
const VEHICLE = 'Veldra Tarn 2009–2013 · Sedan';
const VEHICLE_SLUG = 'veldra-tarn-2009-2013-sedan';
const PART = /^SMPL-4D · /;

const { freshPage } = browserSession(PHONE);


async function selectByLabel(page: Page, selector: string, label: string | RegExp) {
	const options = await page.locator(`${selector} option`).evaluateAll((els) => els.map((e) => ({ value: (e as HTMLOptionElement).value, text: e.textContent?.trim() ?? '' })));
	const hit = options.find((o) => (typeof label === 'string' ? o.text === label : label.test(o.text)));
	if (!hit) throw new Error(`no option ${label} in ${selector}: ${options.map((o) => o.text).join(' | ')}`);
	await page.selectOption(selector, hit.value);
}

describe('will it fit, at the counter', () => {
	it('gives a viewer the verdict on one phone screen, then the job sheet', async () => {
		const page = await freshPage(PHONE);
		await signIn(page, 'viewer');
		await page.goto(`${BASE}/fit`);
		// Once the page is live, the "Check fit" button (for browsers without scripts) goes away.
		await page.locator('button:has-text("Check fit")').waitFor({ state: 'detached' });
		await selectByLabel(page, '#fit-vehicle', VEHICLE);
		await page.waitForURL((u) => u.searchParams.get('vehicle') === VEHICLE_SLUG);
		await selectByLabel(page, '#fit-part', PART);
		const answer = page.getByTestId('fit-answer');
		await answer.waitFor();
		const badge = answer.locator('[data-verdict]').first();
		// The sample passenger seat (505 × 380 × 95 mm) against the 200 × 140 × 45 mm amplifier, by fitVerdict
		const expected = fitVerdict({ l: 200, w: 140, h: 45 }, { l: 505, w: 380, h: 95 });
		expect(await badge.getAttribute('data-verdict')).toBe(expected.verdict);
		expect(await badge.textContent()).toMatch(/Fits/);
		expect(await answer.getByTestId('fit-reason').textContent()).toMatch(/passenger seat/);
		await answer.getByTestId('seat-figure').waitFor();
		expect(await answer.getByTestId('fit-evidence').textContent()).toMatch(/Measured by .+ \(revision \d+\)/);
		// the verdict and the picture are within the first screen
		const box = await badge.boundingBox();
		expect(box!.y + box!.height).toBeLessThan(PHONE.height);
		expect(new URL(page.url()).searchParams.get('part')).not.toBeNull();
		await screenshot(page, 'fit-viewer-phone');

		await answer.getByTestId('job-sheet-link').click();
		await page.waitForURL((u) => u.pathname === `/vehicles/${VEHICLE_SLUG}/job-sheet`);
		const cut = page.getByTestId('cut-list');
		await cut.waitFor();
		expect(await cut.textContent()).toMatch(/Power cable[\s\S]*AWG/);
		expect(await page.getByTestId('cautions').textContent()).toMatch(/Disconnect the battery/);
		await page.emulateMedia({ media: 'print' });
		expect(await page.locator('header.no-print').first().isVisible()).toBe(false);
		expect(await page.getByTestId('job-sheet-form').isVisible()).toBe(false);
		expect(await page.getByTestId('job-sheet').isVisible()).toBe(true);
		await screenshot(page, 'job-sheet-print');
		await page.close();
	});

	it('finds the vehicle by typing a model and year, then answers for the part', async () => {
		const page = await freshPage(PHONE);
		await signIn(page, 'viewer');
		await page.goto(`${BASE}/fit`, { waitUntil: 'networkidle' });
		const find = page.getByLabel('Find the vehicle: model, year or VIN');
		await find.fill('tarn 2012');
		await page.getByRole('option', { name: /Veldra Tarn/ }).first().waitFor();
		await find.press('ArrowDown');
		await find.press('Enter');
		await page.waitForURL((u) => u.searchParams.get('vehicle') === VEHICLE_SLUG);
		// The lists below follow the vehicle picked, and the site search box did not navigate away.
		await expect.poll(() => page.inputValue('#fit-vehicle')).toBe(VEHICLE_SLUG);
		expect(new URL(page.url()).pathname).toBe('/fit');
		await selectByLabel(page, '#fit-part', PART);
		await page.getByTestId('fit-answer').locator('[data-verdict]').first().waitFor();
		await screenshot(page, 'fit-typed-vehicle-phone');
		await page.close();
	});

	it('works without JavaScript through the GET form', async () => {
		const dir = mkdtempSync(join(tmpdir(), 'kickpanel-e2e-nojs-'));
		const nojs = await chromium.launchPersistentContext(dir, {
			executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
			headless: true,
			viewport: PHONE,
			javaScriptEnabled: false,
			args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync']
		});
		try {
			const page = await nojs.newPage();
			await page.goto(`${BASE}/signin`);
			await page.fill('#email', userFor('viewer').email);
			await page.fill('#password', userFor('viewer').password);
			await Promise.all([page.waitForURL((url) => !url.pathname.startsWith('/signin')), page.click('button:has-text("Sign in")')]);
			await page.goto(`${BASE}/fit`);
			await selectByLabel(page, '#fit-vehicle', VEHICLE);
			await selectByLabel(page, '#fit-part', PART);
			await Promise.all([page.waitForURL((u) => u.searchParams.has('part')), page.click('button:has-text("Check fit")')]);
			expect(await page.getByTestId('fit-answer').locator('[data-verdict]').first().textContent()).toMatch(/Fits|Tight|Does not fit/);
		} finally {
			await nojs.close();
			rmSync(dir, { recursive: true, force: true });
		}
	});

	it('lists the vehicles a part fits on the part page', async () => {
		const page = await freshPage(DESKTOP);
		await signIn(page, 'viewer');
		await page.goto(`${BASE}/parts?kind=amplifier`);
		await page.getByRole('link', { name: /SMPL-4D compact four-channel/ }).click();
		const rows = page.getByTestId('reverse-rows');
		await rows.waitFor();
		expect(await rows.textContent()).toContain('Veldra Tarn 2009–2013');
		await screenshot(page, 'part-reverse-desktop');
		await page.close();
	});

	it('lets an installer mark the page fitted as described', async () => {
		const page = await freshPage(PHONE);
		await signIn(page, 'viewer');
		await page.goto(`${BASE}/vehicles/${VEHICLE_SLUG}/trust`);
		await page.click('button:has-text("Fitted as described")');
		await page.waitForURL((u) => u.searchParams.get('marked') === 'confirmed');
		expect(await page.getByTestId('trust-marks').textContent()).toMatch(/Confirmed by \d+ installer/);
		await page.close();
	});
});

describe('calculators', () => {
	it('sizes a power wire live, as the domain function does', async () => {
		const page = await freshPage(PHONE);
		await signIn(page, 'viewer');
		await page.goto(`${BASE}/calc/power-wire`);
		await page.locator('button:has-text("Work it out")').waitFor({ state: 'detached' });
		await page.fill('#pw-current', '60');
		await page.fill('#pw-run', '4.8');
		const gauge = page.getByTestId('wire-gauge');
		await gauge.waitFor();
		// by hand, ABYC E-11 at 12 V and 3 %: 5.3 m = 17.39 ft round trip; 10.75 × 60 × 17.39 / 0.36 = 31,155 cmil,
		// more than 6 AWG's 24,538, so 4 AWG (37,360); fuse ≥ 1.25 × 60 = 75 A → 80 A (common practice, ISO 8820-3 maxi)
		expect(await gauge.textContent()).toMatch(/^4 AWG/);
		expect(await page.getByTestId('fuse-rating').textContent()).toMatch(/^80 A/);
		expect(await page.getByTestId('wire-basis').textContent()).toMatch(/12 V nominal/);
		expect(await page.getByTestId('drop-chart').locator('[data-testid="target-line"]').count()).toBe(1);
		expect(new URL(page.url()).searchParams.get('currentA')).toBe('60');
		await screenshot(page, 'calc-power-wire-phone');

		const api = await page.request.get(`${BASE}/api/calc/awg/4`);
		expect(api.status()).toBe(200);
		// ASTM B258: 4 AWG is 0.2043 in = 5.189 mm across
		expect((await api.json()).diameterMm).toBeCloseTo(5.189, 3);
		const bad = await page.request.post(`${BASE}/api/calc/power-wire`, { data: { currentA: 0, powerLengthM: 4, groundLengthM: 0.5, volts: 14.4, maxDropPct: 3 } });
		expect(bad.status()).toBe(400);
		expect((await bad.json()).fieldErrors.currentA).toMatch(/more than 0 A/);
		await page.close();
	});

	it('shows colliding steering-wheel buttons, and apart after the suggested resistor', async () => {
		const page = await freshPage(DESKTOP);
		await signIn(page, 'viewer');
		await page.goto(`${BASE}/calc/ladder`);
		await page.locator('button:has-text("Check the ladder")').waitFor({ state: 'detached' });
		await page.fill('#ld-buttons1', 'Volume + = 1000\nVolume − = 2200');
		await page.fill('#ld-buttons2', 'Mode = 1020\nMute = 4700');
		await page.getByTestId('ladder-verdict').waitFor();
		expect(await page.getByTestId('ladder-verdict').textContent()).toMatch(/collide[\s\S]*in series/);
		const charts = page.getByTestId('ladder-chart');
		expect(await charts.count()).toBe(2);
		expect(await charts.nth(0).locator('[data-clash="yes"]').count()).toBe(2);
		expect(await charts.nth(1).locator('[data-clash="yes"]').count()).toBe(0);
		await page.close();
	});
});
