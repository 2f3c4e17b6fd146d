import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { BASE, browserSession, DESKTOP, openBrowser, PHONE, screenshot, userFor } from './browser';

const { freshPage } = browserSession(DESKTOP);

// Typing before the page has hydrated can be undone by hydration, so every visit waits for the network to settle.
async function visit(page: Page, path: string) {
	await page.goto(`${BASE}${path}`);
	await page.waitForLoadState('networkidle');
}

async function signInAs(page: Page, email: string, password: string) {
	await visit(page, '/signin');
	await page.fill('#email', email);
	await page.fill('#password', password);
	// The sign-in answer passes through /auth/… on its way to the page.
	await Promise.all([page.waitForURL((url) => !url.pathname.startsWith('/signin') && !url.pathname.startsWith('/auth')), page.click('button:has-text("Sign in")')]);
}

const signInAdmin = (page: Page) => signInAs(page, userFor('admin').email, userFor('admin').password);


describe('inviting a new member of staff', () => {
	const address = `fitter-${Date.now()}@kickpanel.test`;
	const name = 'Invited Fitter (sample)';
	const password = 'left-kick-panel-9';
	let invitePath = '';

	it('lets an admin send an invitation by e-mail', async () => {
		const page = await freshPage(DESKTOP);
		await signInAdmin(page);
		await visit(page, '/admin/users');
		// The least the new person may need: viewer, until the admin picks more.
		expect(await page.inputValue('#invite-role')).toBe('viewer');
		await page.fill('#invite-email', address);
		await page.selectOption('#invite-role', 'editor');
		await page.click('button:has-text("Send invitation")');
		await page.getByText(`Invitation sent to ${address}`).waitFor();
		expect(await page.textContent('body')).toContain('Invitations not yet accepted');
		await screenshot(page, 'invite-sent-desktop');
		await page.close();
	});

	it('shows the invitation in the outbox with a link to set up the account', async () => {
		const page = await freshPage(DESKTOP);
		await signInAdmin(page);
		await visit(page, `/admin/outbox?to=${encodeURIComponent(address)}`);
		await Promise.all([page.waitForURL((url) => /^\/admin\/outbox\/[0-9]+-[0-9a-f]+$/.test(url.pathname)), page.locator('[data-testid="outbox"] a').first().click()]);
		const text = (await page.locator('[data-testid="mail-text"]').textContent()) ?? '';
		const match = text.match(/https?:\/\/[^\s]+(\/invite\/[A-Za-z0-9_-]{43})/);
		expect(match, text).not.toBeNull();
		invitePath = match![1];
		await screenshot(page, 'outbox-invite-desktop');
		await page.close();
	});

	it('lets the invited person choose a name and password on a phone, and signs them in', async () => {
		const page = await freshPage(PHONE);
		await visit(page, invitePath);
		expect(await page.textContent('main')).toContain(address);
		await page.fill('#name', name);
		await page.fill('#password', password);
		await page.fill('#confirm', password);
		await screenshot(page, 'invite-accept-phone');
		await Promise.all([page.waitForURL((url) => url.pathname === '/'), page.click('button:has-text("Create my account")')]);
		await page.getByTestId('who').waitFor();
		const who = await page.getByTestId('who').textContent();
		expect(who).toContain(name);
		expect(who).toContain('editor');
		await screenshot(page, 'invited-signed-in-phone');
		await page.close();
	});

	it('does not let the same link be used twice', async () => {
		const page = await freshPage(PHONE);
		await visit(page, invitePath);
		expect(await page.textContent('main')).toContain('does not work any more');
		await page.close();
	});

	it('signs out the other devices when the password is changed, and keeps this one', async () => {
		const phone = await freshPage(PHONE);
		await signInAs(phone, address, password);
		const other = await openBrowser(DESKTOP);
		try {
			const desk = await other.context.newPage();
			await signInAs(desk, address, password);

			await visit(phone, '/account');
			await phone.fill('#current', password);
			await phone.fill('#new-password', 'right-kick-panel-7');
			await phone.fill('#confirm', 'right-kick-panel-7');
			await phone.click('form[action="?/password"] button');
			await phone.getByText('Every other device was signed out; this one stays signed in.').waitFor();

			await visit(phone, '/vehicles');
			expect(new URL(phone.url()).pathname).toBe('/vehicles');
			await visit(desk, '/vehicles');
			expect(new URL(desk.url()).pathname).toBe('/signin');
			await signInAs(desk, address, 'right-kick-panel-7');
			expect(await desk.getByTestId('who').textContent()).toContain(name);
		} finally {
			await other.close();
			await phone.close();
		}
	});
});

describe('signing out', () => {
	it('makes a copy of the session cookie stop working', async () => {
		const page = await freshPage(DESKTOP);
		await signInAs(page, userFor('viewer').email, userFor('viewer').password);
		const cookie = (await page.context().cookies()).find((c) => c.name.endsWith('authjs.session-token'));
		expect(cookie).toBeDefined();
		const withCopy = () => fetch(`${BASE}/api/vehicles`, { headers: { cookie: `${cookie!.name}=${cookie!.value}` } });
		expect((await withCopy()).status).toBe(200);

		await Promise.all([page.waitForURL((url) => url.pathname === '/signin'), page.click('button:has-text("Sign out")')]);
		expect((await withCopy()).status).toBe(401);
		await page.close();
	});
});
