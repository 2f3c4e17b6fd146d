import { describe, expect, it } from 'vitest';
import { BASE, browserSession, PHONE, screenshot, signIn } from './browser';

// The sample shop (content-seed/): the Veldra Tarn's invented alternator gives 65 A at idle, 110 A at cruise.
const VEHICLE_SLUG = 'veldra-tarn-2009-2013-sedan';

const { freshPage } = browserSession(PHONE);

describe('install calculators on a phone', () => {
	it('lists every wiring of two dual 4 Ω subwoofers and checks them against a sample amplifier', async () => {
		const page = await freshPage(PHONE);
		await signIn(page, 'viewer');
		await page.goto(`${BASE}/calc/coil-wiring`);
		await page.locator('button:has-text("Show the wirings")').waitFor({ state: 'detached' });
		// Ohm's law by hand: coils in parallel 2 Ω a driver → 1 or 4 Ω; coils in series 8 Ω a driver → 4 or 16 Ω.
		const ohms = async () => page.getByTestId('wiring-option').evaluateAll((els) => els.map((e) => Number(e.getAttribute('data-ohms'))));
		await expect.poll(ohms).toEqual([1, 4, 4, 16]);
		expect(await page.getByTestId('wiring-diagram').count()).toBe(4);
		const mono = await page.locator('#cw-amp option').evaluateAll((els) => (els as HTMLOptionElement[]).find((o) => o.text.startsWith('SMPL-1D · '))?.value);
		await page.selectOption('#cw-amp', mono!);
		// The sample SMPL-1D is rated (invented) 800 W at 1 Ω and 300 W at 4 Ω, stable to 1 Ω.
		await expect.poll(() => page.getByTestId('load-check').first().textContent()).toMatch(/800 W RMS/);
		expect(await page.getByTestId('load-check').last().textContent()).toMatch(/No rated figure at or above 16 Ω/);
		expect(new URL(page.url()).searchParams.get('amp')).toBe(mono);
		await screenshot(page, 'calc-coil-wiring-phone');
		await page.close();
	});

	it('works out the charging budget from the vehicle page without scripts', async () => {
		const page = await freshPage(PHONE);
		await signIn(page, 'viewer');
		// On a phone the page shows one section at a time: the boot section, where the panel is, is opened.
		await page.goto(`${BASE}/vehicles/${VEHICLE_SLUG}#section-boot`);
		const panel = page.getByTestId('charging-budget');
		if (!(await panel.locator('#cb-vehicle').isVisible())) await page.locator('#section-boot > summary').click();
		await panel.locator('#cb-vehicle').fill('25');
		await panel.locator('#cb-added').fill('40');
		await Promise.all([page.waitForURL((u) => u.pathname === '/calc/charging'), panel.locator('button').click()]);
		// By hand: 110 − (25 + 40) = 45 A at cruise; 65 − 65 = 0 A at idle, under a tenth of 65 A (common practice).
		await expect.poll(() => page.getByTestId('charging-verdict').textContent()).toMatch(/Keeps up with 45 A spare at cruise, but only 0 A at idle/);
		// 40 A added is a fifth or more of 110 A (common practice): the three charging cables, 4 AWG for 110 A
		// (Handbook of Electronic Tables chassis wiring: 6 AWG 101 A, 4 AWG 135 A).
		expect(await page.getByTestId('charging-cables').locator('tbody tr').count()).toBe(3);
		expect(await page.getByTestId('charging-cables').textContent()).toMatch(/4 AWG/);
		expect(await page.getByTestId('cautions').textContent()).toMatch(/negative terminal first/);
		// 13.2 V running is below the 13.8–14.4 V a charging system holds (common practice).
		await page.locator('button:has-text("Work it out")').waitFor({ state: 'detached' });
		await page.fill('#ch-run', '13.2');
		await expect.poll(() => page.getByTestId('battery-reading').textContent()).toMatch(/not keeping the battery charged/);
		await screenshot(page, 'calc-charging-phone');
		await page.close();
	});

	it('works out net volume and port tuning', async () => {
		const page = await freshPage(PHONE);
		await signIn(page, 'viewer');
		await page.goto(`${BASE}/calc/box-volume`);
		await page.locator('button:has-text("Work it out")').waitFor({ state: 'detached' });
		await page.fill('#bv-l', '500');
		await page.fill('#bv-w', '400');
		await page.fill('#bv-h', '350');
		await page.fill('#bv-driver', '2.5');
		await page.selectOption('#bv-port', 'round');
		await page.fill('#bv-dia', '100');
		await page.fill('#bv-pl', '250');
		// By hand: 464 × 364 × 314 mm = 53.03 L, less 2.5 L and π × 50² × 250 mm³ = 1.96 L → 48.57 L;
		// Helmholtz with 0.85 r + 0.6133 r end corrections → about 38.6 Hz.
		await expect.poll(() => page.getByTestId('net-volume').textContent()).toMatch(/^48\.57 L/);
		expect(await page.getByTestId('port-tuning').textContent()).toMatch(/^38\.6 Hz/);
		await screenshot(page, 'calc-box-volume-phone');
		await page.close();
	});

	it('works out a sealed box, and says when Qtc is below Qts', async () => {
		const page = await freshPage(PHONE);
		await signIn(page, 'viewer');
		await page.goto(`${BASE}/calc/sealed-box?fsHz=30&qts=0.4&vasL=60&qtc=0.707`);
		// Small (JAES 1972–73), by hand: Vb = 60 / ((0.707/0.4)² − 1) = 28.2 L; fc = 30 × 1.7675 = 53 Hz.
		expect(await page.getByTestId('sealed-volume').textContent()).toMatch(/^28\.2 L/);
		await page.locator('button:has-text("Work it out")').waitFor({ state: 'detached' });
		await page.fill('#sb-qtc', '0.3');
		await expect.poll(() => page.locator('#sb-qtc-error').textContent()).toMatch(/higher than the driver's Qts/);
		await screenshot(page, 'calc-sealed-box-phone');
		await page.close();
	});

	it("records an amplifier's rated loads, minimum load and bridging in the catalogue", async () => {
		const page = await freshPage(PHONE);
		await signIn(page, 'moderator');
		await page.goto(`${BASE}/parts/new`);
		// Invented figures for a test part, not a real product.
		await page.fill('#part-sku', 'TEST-LOADS-2');
		await page.fill('#part-name', 'Test two-channel with load figures');
		for (const [field, value] of [
			['lengthMm', '260'],
			['widthMm', '180'],
			['heightMm', '55'],
			['channels', '2'],
			['rmsWattsPerChannel', '75'],
			['rms4OhmW', '75'],
			['rms2OhmW', '110'],
			['minLoadOhm', 'two']
		]) {
			await page.fill(`#part-amplifier-${field}`, value);
		}
		await page.selectOption('#part-amplifier-bridgeable', 'yes');
		await page.fill('#part-amplifier-bridgedRmsW', '220');
		await page.click('button:has-text("Add to the catalogue")');
		await expect.poll(() => page.locator('#part-amplifier-minLoadOhm-error').textContent()).toBe('"two" is not a number.');
		await page.fill('#part-amplifier-minLoadOhm', '2');
		await Promise.all([page.waitForURL((u) => u.searchParams.get('saved') === '1'), page.click('button:has-text("Add to the catalogue")')]);
		const figures = await page.locator('dl').first().textContent();
		expect(figures).toMatch(/RMS at 2 Ω\s*110 W per channel/);
		expect(figures).toMatch(/Minimum load\s*2 Ω per channel/);
		expect(figures).toMatch(/Bridgeable\s*yes, 220 W RMS at 4 Ω bridged/);
		await page.close();
	});

	it('answers each endpoint, and 400 with a message for bad input', async () => {
		const page = await freshPage(PHONE);
		await signIn(page, 'viewer');
		const post = (path: string, data: unknown) => page.request.post(`${BASE}/api/calc/${path}`, { data });

		const load = await post('load', { drivers: [{ count: 2, coils: 2, ohmsPerCoil: 4 }] });
		expect(load.status()).toBe(200);
		expect((await load.json()).options.map((o: { ohms: number }) => o.ohms)).toEqual([1, 4, 4, 16]);
		const badLoad = await post('load', { drivers: [{ count: 2, coils: 3, ohmsPerCoil: 4 }] });
		expect(badLoad.status()).toBe(400);
		expect((await badLoad.json()).message).toMatch(/Voice coils must be 1 \(single\) or 2 \(dual\)/);

		const charging = await post('charging', { alternatorA: 110, alternatorIdleA: 65, vehicleLoadA: 25, addedLoadA: 40 });
		expect(await charging.json()).toMatchObject({ verdict: 'tight', headroomA: 45, idleHeadroomA: 0, upgrade: [{ run: 'alternator-battery', awg: '4' }, { awg: '4' }, { awg: '4' }] });
		const badCharging = await post('charging', { alternatorA: 100, alternatorIdleA: 120, vehicleLoadA: 20, addedLoadA: 10 });
		expect(badCharging.status()).toBe(400);
		expect((await badCharging.json()).fieldErrors.alternatorIdleA).toBe("The alternator's output at idle cannot be more than at cruise.");

		const sealed = await post('sealed', { fsHz: 28, qts: 0.5, vasL: 90, qtc: 1 });
		// Small: (1/0.5)² − 1 = 3 → 30 L; fc = 2 × 28 = 56 Hz (by hand).
		expect(await sealed.json()).toMatchObject({ volumeL: 30, fcHz: 56 });
		const badSealed = await post('sealed', { fsHz: 28, qts: 0.5, vasL: 'lots', qtc: 1 });
		expect(badSealed.status()).toBe(400);
		expect((await badSealed.json()).fieldErrors.vasL).toBe('Vas must be a number of litres.');

		const enclosure = await post('enclosure', { outside: { l: 500, w: 400, h: 350 }, wallMm: 18, driverDisplacementL: 2.5 });
		// By hand: 464 × 364 × 314 mm = 53.033 L, less 2.5 L.
		expect((await enclosure.json()).netL).toBeCloseTo(50.533, 3);
		const badEnclosure = await post('enclosure', { outside: { l: 30, w: 400, h: 350 }, wallMm: 18, driverDisplacementL: 0 });
		expect(badEnclosure.status()).toBe(400);
		expect((await badEnclosure.json()).fieldErrors.wallMm).toMatch(/leave no room inside/);
		await page.close();
	});
});
