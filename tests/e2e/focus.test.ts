import { describe, expect, it } from 'vitest';
import { BASE, browserSession, PHONE, signIn } from './browser';

const { freshPage } = browserSession(PHONE);

// The copper accent (#b4622a, tailwind.config.ts) drawn 3 px round whatever the keyboard is on.
const COPPER = 'rgb(180, 98, 42)';

describe('keyboard focus', () => {
	it('draws a visible outline round the focused control', async () => {
		const page = await freshPage(PHONE);
		await page.goto(`${BASE}/signin`, { waitUntil: 'networkidle' });
		await page.locator('#email').focus();
		await page.keyboard.press('Tab');
		const outline = () =>
			page.evaluate(() => {
				const el = document.activeElement as HTMLElement;
				const style = getComputedStyle(el);
				return { tag: el.tagName, style: style.outlineStyle, width: style.outlineWidth, color: style.outlineColor };
			});
		const onPassword = await outline();
		expect(onPassword.tag).toBe('INPUT');
		expect(onPassword).toMatchObject({ style: 'solid', width: '3px', color: COPPER });

		await signIn(page, 'viewer');
		await page.goto(`${BASE}/fit`, { waitUntil: 'networkidle' });
		await page.locator('#fit-vehicle').focus();
		await page.keyboard.press('Tab');
		expect(await outline()).toMatchObject({ style: 'solid', width: '3px', color: COPPER });
		await page.close();
	});
});
