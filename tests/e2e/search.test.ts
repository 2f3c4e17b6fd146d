import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { BASE, browserSession, DESKTOP, PHONE, screenshot, signIn } from './browser';
import { checkDigit } from '../../src/lib/domain/vin';

const { freshPage } = browserSession(PHONE);


/** Waits until the page's scripts have taken over the header box, so typing reaches its handlers. */
async function headerBox(page: Page) {
	await page.waitForLoadState('networkidle');
	return page.locator('#site-search');
}

// An invented VIN for the sample Veldra Tarn (VIN pattern VD1TN*): letter at position 7, C at 10 → 2012.
const body = 'VD1TN5A70CX123456';
const SAMPLE_VIN = body.slice(0, 8) + checkDigit(body) + body.slice(9);
const TARN = '/vehicles/veldra-tarn-2009-2013-sedan';

describe('search from the header box', () => {
	it('finds "2012 tarn" as you type at phone width and opens the page from the keyboard', async () => {
		const page = await freshPage(PHONE);
		await signIn(page, 'viewer');
		const box = await headerBox(page);
		await box.click();
		await box.pressSequentially('2012 tarn', { delay: 30 });
		const first = page.locator('#site-search-options [role=option]').first();
		await first.waitFor();
		expect(await first.textContent()).toContain('Veldra Tarn');
		expect(await first.locator('mark').allTextContents()).toEqual(expect.arrayContaining(['Tarn', '2009–2013']));
		expect(await box.getAttribute('aria-expanded')).toBe('true');
		await screenshot(page, 'search-box-phone');

		await box.press('ArrowDown');
		expect(await box.getAttribute('aria-activedescendant')).toBe('site-search-option-0');
		expect(await first.getAttribute('aria-selected')).toBe('true');
		await Promise.all([page.waitForURL((url) => url.pathname === TARN), box.press('Enter')]);
		await page.close();
	});

	it('closes the suggestions on Escape and still searches the full page on Enter', async () => {
		const page = await freshPage(DESKTOP);
		await signIn(page, 'viewer');
		const box = await headerBox(page);
		await box.click();
		await box.pressSequentially('tar', { delay: 30 });
		await page.locator('#site-search-options [role=option]').first().waitFor();
		await box.press('Escape');
		expect(await box.getAttribute('aria-expanded')).toBe('false');
		expect(await box.inputValue()).toBe('tar');
		await Promise.all([page.waitForURL((url) => url.pathname === '/search'), box.press('Enter')]);
		expect(new URL(page.url()).searchParams.get('q')).toBe('tar');
		expect(await page.getByTestId('search-results').textContent()).toContain('Veldra Tarn');
		await screenshot(page, 'search-page-desktop');
		await page.close();
	});

	it('recognises a pasted VIN and leads to its page', async () => {
		const page = await freshPage(PHONE);
		await signIn(page, 'viewer');
		const box = await headerBox(page);
		await box.click();
		await box.evaluate((el, text) => {
			const data = new DataTransfer();
			data.setData('text/plain', text);
			el.dispatchEvent(new ClipboardEvent('paste', { clipboardData: data, bubbles: true, cancelable: true }));
		}, SAMPLE_VIN);
		await page.keyboard.insertText(SAMPLE_VIN);
		const options = page.locator('#site-search-options [role=option]');
		await options.first().waitFor();
		expect(await options.first().textContent()).toContain('VIN pattern on the page');
		expect(await options.last().textContent()).toContain(`VIN ${SAMPLE_VIN}`);
		expect(await options.last().textContent()).toContain('check digit ✓');
		await screenshot(page, 'search-box-vin-phone');
		await box.press('ArrowUp');
		await Promise.all([page.waitForURL((url) => url.pathname === `/vin/${SAMPLE_VIN}`), box.press('Enter')]);
		const result = page.getByTestId('vin-result');
		expect(await result.textContent()).toContain('2012');
		await Promise.all([page.waitForURL((url) => url.pathname === TARN), result.getByRole('link', { name: /Veldra Tarn/ }).click()]);
		await page.close();
	});

	it('explains a VIN that cannot be right', async () => {
		const page = await freshPage(PHONE);
		await signIn(page, 'viewer');
		const box = await headerBox(page);
		await box.click();
		await box.pressSequentially(SAMPLE_VIN.slice(0, 16), { delay: 10 });
		const notice = page.locator('#site-search-notice');
		await notice.waitFor();
		expect(await notice.textContent()).toContain('A VIN has 17 characters; this one has 16.');
		const res = await page.request.get(`${BASE}/api/vin/${SAMPLE_VIN.slice(0, 16)}O`);
		expect(res.status()).toBe(400);
		expect((await res.json()).message).toMatch(/never uses the letters I, O or Q/);
		await page.close();
	});
});

describe('the search page', () => {
	it('works without scripts: a plain GET lists the page with why it matched', async () => {
		const page = await freshPage(DESKTOP);
		await signIn(page, 'viewer');
		const res = await page.request.get(`${BASE}/search?q=tarn+12`);
		expect(res.status()).toBe(200);
		const html = await res.text();
		expect(html).toContain('href="/vehicles/veldra-tarn-2009-2013-sedan"');
		expect(html).toContain('<mark');
		await page.close();
	});

	it('filters on a measured space at phone width', async () => {
		const page = await freshPage(PHONE);
		await signIn(page, 'viewer');
		await page.goto(`${BASE}/search?measure=passenger-seat-height&op=gte&value=90`);
		const results = page.getByTestId('search-results');
		const text = await results.textContent();
		expect(text).toMatch(/Passenger seat space clearance height: \d+ mm/);
		for (const figure of text!.match(/height: (\d+) mm/g)!) expect(Number(figure.match(/\d+/)![0])).toBeGreaterThanOrEqual(90);
		await screenshot(page, 'search-measured-phone');
		await page.close();
	});

	it('says what is wrong with a filter', async () => {
		const page = await freshPage(PHONE);
		await signIn(page, 'viewer');
		await page.goto(`${BASE}/search?q=tarn&year=12`);
		expect(await page.getByRole('alert').textContent()).toContain('The year must be 1950 or later.');
		await page.close();
	});
});
