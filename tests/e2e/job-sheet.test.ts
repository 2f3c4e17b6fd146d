import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { BASE, browserSession, PHONE, screenshot, signIn } from './browser';

// The sample shop (content-seed/): invented vehicles and parts. Veldra Tarn's first measured power
// run is 4.8 m; its alternator gives 110 A at cruise and 65 A at idle (sample data).
const SLUG = 'veldra-tarn-2009-2013-sedan';
const SHEET = `${BASE}/vehicles/${SLUG}/job-sheet`;

const { freshPage } = browserSession(PHONE);

const text = async (page: Page, testId: string) => (await page.getByTestId(testId).textContent())?.replace(/\s+/g, ' ').trim() ?? '';

async function openForm(page: Page) {
	const form = page.getByTestId('job-sheet-form');
	if (!(await form.isVisible())) await page.locator('summary:has-text("Choose parts and run lengths")').click();
	await form.waitFor();
}

async function tick(page: Page, sku: string) {
	await page.locator('label', { has: page.locator('span.figure', { hasText: new RegExp(`^${sku}$`) }) }).locator('input[name="part"]').check();
}

describe('the job sheet, on a phone', () => {
	it('takes a typed amplifier and the customer, and prints both', async () => {
		const page = await freshPage(PHONE);
		await signIn(page, 'viewer');
		await page.goto(SHEET);
		await openForm(page);
		await page.fill('#js-customer', 'Sample Customer');
		await page.fill('#js-order', 'WO-1042');
		// The usual worked example of the North American check digit (49 CFR 565): valid, check digit X.
		await page.fill('#js-vin', '1M8GDM9AXKP042788');
		await page.fill('#js-year', '2011');
		await page.fill('#js-amp-name-0', 'Customer four-channel');
		await page.fill('#js-amp-w-0', '80');
		await page.fill('#js-amp-ch-0', '4');
		await page.selectOption('#js-amp-class-0', 'D');
		await page.fill('#js-amp-fuse-0', '40');
		await page.fill('#js-remote', '4.2');
		await page.fill('#js-speaker', '3');
		await Promise.all([page.waitForURL((u) => u.searchParams.get('ampW') === '80'), page.click('button:has-text("Update the sheet")')]);

		const customer = await text(page, 'job-customer');
		expect(customer).toContain('Sample Customer');
		expect(customer).toContain('WO-1042');
		expect(customer).toContain('1M8GDM9AXKP042788');
		expect(customer).toContain('2011');
		expect(await text(page, 'job-material')).toBe('copper (OFC)');
		// by hand: 4 × 80 W class D at 80 % (common practice), 12 V: 33.33 A. Run 4.8 m + 0.5 m ground = 17.39 ft;
		// ABYC E-11: 10.75 × 33.33 × 17.39 / 0.36 = 17,308 cmil → 6 AWG (24,538 cmil; ASTM B258 area 13.3 mm²).
		// Fuse ≥ max(1.25 × 33.33 = 41.7 A, own 40 A) → 50 A (ISO 8820-3 maxi, from memory), within 6 AWG's 101 A.
		expect(await text(page, 'job-main')).toMatch(/^6 AWG \(13\.3 mm²\) copper \(OFC\)/);
		expect(await text(page, 'job-main-fuse')).toMatch(/^50 A/);
		expect(await text(page, 'job-power')).toContain('Customer four-channel draw');
		expect(await text(page, 'cut-list')).toMatch(/Remote turn-on lead[\s\S]*18 AWG \(0\.823 mm²\)/);
		await screenshot(page, 'job-sheet-typed-phone');

		// A mistyped VIN and a year outside the page are refused with a message, and what was typed stays.
		await openForm(page);
		await page.fill('#js-vin', '1M8GDM9A1KP042788');
		await page.fill('#js-year', '2016');
		await Promise.all([page.waitForURL((u) => u.searchParams.get('year') === '2016'), page.click('button:has-text("Update the sheet")')]);
		expect(await page.locator('#js-vin-error').textContent()).toMatch(/Check digit \(position 9\) is 1 but the other characters give X/);
		expect(await page.locator('#js-year-error').textContent()).toMatch(/outside the years this page covers \(2009–2013\)/);
		expect(await page.inputValue('#js-amp-w-0')).toBe('80');
		expect(await page.inputValue('#js-customer')).toBe('Sample Customer');
		await page.close();
	});

	it('gives the same gauge and fuse as the calculator and distribution endpoints', async () => {
		const page = await freshPage(PHONE);
		await signIn(page, 'viewer');
		const wire = await (await page.request.post(`${BASE}/api/calc/power-wire`, { data: { currentA: 45, powerLengthM: 3.5, groundLengthM: 0.5, ownFuseA: 60 } })).json();
		const plan = await (await page.request.post(`${BASE}/api/calc/distribution`, { data: { amps: [{ currentA: 45, fuseA: 60 }], mainLengthM: 3.5, branchLengthsM: [], groundLengthsM: [0.5] } })).json();
		await page.goto(`${SHEET}?ampA=45&ampFuse=60&power=3.5&ground=0.5`);
		// by hand: 4 m = 13.12 ft; 10.75 × 45 × 13.12 / 0.36 = 17,634 cmil → 6 AWG; fuse ≥ max(56.25 A, 60 A) → 60 A
		expect([wire.awg, wire.fuseA]).toEqual(['6', 60]);
		expect([plan.main.awg, plan.main.fuseA]).toEqual(['6', 60]);
		expect(await text(page, 'job-main')).toMatch(new RegExp(`^${wire.awg} AWG \\(13\\.3 mm²\\)`));
		expect(await text(page, 'job-main-fuse')).toMatch(new RegExp(`^${plan.main.fuseA} A`));
		await page.close();
	});

	it('carries the power-wire calculator figures to a vehicle picked afterwards', async () => {
		const page = await freshPage(PHONE);
		await signIn(page, 'viewer');
		await page.goto(`${BASE}/calc/power-wire`);
		await page.locator('button:has-text("Work it out")').waitFor({ state: 'detached' });
		await page.fill('#pw-current', '60');
		await page.fill('#pw-run', '4.8');
		// ASTM B258: 4 AWG is 41,740 cmil = 21.2 mm²
		expect(await text(page, 'wire-label')).toBe('4 AWG (21.2 mm²) copper (OFC)');
		await page.getByTestId('put-on-job-sheet').click();
		await page.waitForURL((u) => u.pathname === '/job-sheet');
		await page.selectOption('#pick-vehicle', SLUG);
		await Promise.all([page.waitForURL((u) => u.pathname === `/vehicles/${SLUG}/job-sheet`), page.click('button:has-text("Open the job sheet")')]);
		// the same figures as the calculator (hand-worked in the calculator test): 4 AWG and an 80 A fuse
		expect(await text(page, 'job-main')).toMatch(/^4 AWG \(21\.2 mm²\)/);
		expect(await text(page, 'job-main-fuse')).toMatch(/^80 A/);
		await page.close();
	});

	it('plans two amplifiers and a dual-voice-coil subwoofer: distribution, fuses, final load and charging', async () => {
		const page = await freshPage(PHONE);
		await signIn(page, 'viewer');
		await page.goto(SHEET);
		await openForm(page);
		await tick(page, 'SMPL-4D');
		await tick(page, 'SMPL-1D');
		await page.selectOption('#js-sub-part', { label: 'SMPL-W10D Samplewick SMPL-W10D 10 in dual-coil subwoofer' });
		await page.fill('#js-vehicle-load', '25');
		await Promise.all([page.waitForURL((u) => u.searchParams.get('vehicleLoad') === '25'), page.click('button:has-text("Update the sheet")')]);

		// by hand at 12 V: SMPL-4D 4 × 60 W at 85 % = 23.53 A, SMPL-1D 500 W at 88 % = 47.35 A (sample catalogue figures).
		// Main 4.8 m, branches and grounds 0.5 m (assumed): the main takes 4.8 / 5.8 of 3 % = 2.48 %:
		// 10.75 × 70.88 × 15.75 ft / 0.298 V = 40,280 cmil → 2 AWG (62,450; 33.6 mm²); fuse ≥ max(88.6, 25 + 60) → 100 A.
		expect(await text(page, 'job-main')).toMatch(/^2 AWG \(33\.6 mm²\)/);
		expect(await text(page, 'job-main-fuse')).toMatch(/^100 A/);
		// Branches get the 1.55 % left over 1 m: SMPL-4D 4,472 cmil → 12 AWG, 30 A; SMPL-1D 8,998 cmil → 10 AWG, but its
		// 60 A fuse is more than 10 AWG carries (55 A, handbook chassis table), so 8 AWG.
		const branches = page.getByTestId('job-branch');
		expect(await branches.count()).toBe(2);
		const power = await text(page, 'job-power');
		expect(power).toMatch(/Branch to SMPL-4D 30 A blade fuse at the block, 12 AWG \(3\.31 mm²\)/);
		expect(power).toMatch(/Branch to SMPL-1D 60 A blade fuse at the block, 8 AWG \(8\.37 mm²\)/);
		const grounds = await text(page, 'job-grounds');
		expect(grounds).toMatch(/SMPL-4D 12 AWG \(3\.31 mm²\)/);
		expect(grounds).toMatch(/SMPL-1D 8 AWG \(8\.37 mm²\)/);
		// 2 amplifiers × 0.1 A (from memory) = 0.2 A, within the assumed 0.3 A head-unit output (common practice)
		expect(await text(page, 'job-remote')).toMatch(/within the head unit's remote output/);
		// Ohm's law: two 4 Ω coils in parallel = 2 Ω, at or above SMPL-1D's 1 Ω minimum; rated 500 W at 2 Ω (catalogue)
		expect(await text(page, 'job-final-load')).toMatch(/the amplifier sees 2 Ω ✓ stable/);
		expect(await text(page, 'job-load')).toMatch(/Rated 500 W RMS at 2 Ω/);
		// 25 A + 70.88 A = 95.9 A: 14.1 A spare of 110 A at cruise, 30.9 A short of 65 A at idle
		expect(await text(page, 'job-charging-verdict')).toMatch(/Keeps up at cruise with 14\.1 A spare, but falls 30\.9 A short at idle/);
		await screenshot(page, 'job-sheet-two-amps-dvc-phone');
		await page.close();
	});

	it('puts the distribution calculator plan on the sheet with the same cables and fuses', async () => {
		const page = await freshPage(PHONE);
		await signIn(page, 'viewer');
		await page.goto(`${BASE}/calc/distribution`);
		await page.locator('button:has-text("Work it out")').waitFor({ state: 'detached' });
		await page.fill('#dist-a-0', '23.53');
		await page.fill('#dist-fuse-0', '25');
		await page.fill('#dist-ground-0', '0.3');
		await page.fill('#dist-a-1', '47.35');
		await page.fill('#dist-fuse-1', '60');
		await page.fill('#dist-ground-1', '0.3');
		await page.fill('#dist-main', '2');
		// Hand-worked in the distribution tests: main 6 AWG (13.3 mm², ASTM B258) with a 100 A fuse;
		// branches 12 AWG with 30 A and 8 AWG with 60 A (handbook chassis ampacity 41 A and 73 A)
		expect(await text(page, 'dist-main')).toBe('6 AWG (13.3 mm²) · 100 A blade fuse');
		const rows = page.getByTestId('dist-branches').locator('tbody tr');
		expect((await rows.nth(0).locator('td').allTextContents()).slice(0, 3)).toEqual(['Amplifier 1', '12 AWG (3.31 mm²)', '30 A blade']);
		expect((await rows.nth(1).locator('td').allTextContents()).slice(0, 3)).toEqual(['Amplifier 2', '8 AWG (8.37 mm²)', '60 A blade']);
		await page.getByTestId('put-on-job-sheet').click();
		await page.waitForURL((u) => u.pathname === '/job-sheet');
		await page.selectOption('#pick-vehicle', SLUG);
		await Promise.all([page.waitForURL((u) => u.pathname === `/vehicles/${SLUG}/job-sheet`), page.click('button:has-text("Open the job sheet")')]);
		expect(await text(page, 'job-main')).toMatch(/^6 AWG \(13\.3 mm²\)/);
		expect(await text(page, 'job-main-fuse')).toMatch(/^100 A/);
		const power = await text(page, 'job-power');
		expect(power).toMatch(/30 A blade fuse at the block, 12 AWG \(3\.31 mm²\)/);
		expect(power).toMatch(/60 A blade fuse at the block, 8 AWG \(8\.37 mm²\)/);
		await page.close();
	});

	it('carries a box typed on the fit screen to the sheet', async () => {
		const page = await freshPage(PHONE);
		await signIn(page, 'viewer');
		await page.goto(`${BASE}/fit?vehicle=${SLUG}&l=300&w=200&h=60`);
		const link = page.getByTestId('job-sheet-link');
		await link.waitFor();
		await link.click();
		await page.waitForURL((u) => u.pathname === `/vehicles/${SLUG}/job-sheet`);
		const box = await text(page, 'job-typed-box');
		expect(box).toMatch(/Box from the fit check · 300 mm × 200 mm × 60 mm/);
		expect(box).toMatch(/seat/);
		await page.close();
	});
});
