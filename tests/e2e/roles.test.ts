import { describe, expect, it } from 'vitest';
import { BASE, browserSession, DESKTOP, PHONE, screenshot, signIn, userFor } from './browser';

const { freshPage } = browserSession(DESKTOP);


describe('signing in by role', () => {
	it('sends a visitor to the sign-in page', async () => {
		const page = await freshPage();
		await page.goto(`${BASE}/vehicles`);
		expect(new URL(page.url()).pathname).toBe('/signin');
		await page.close();
	});

	it('refuses a wrong password with a message that does not say whether the e-mail exists', async () => {
		const page = await freshPage();
		await page.goto(`${BASE}/signin`);
		await page.fill('#email', 'nobody-here@kickpanel.test');
		await page.fill('#password', 'not-the-password');
		await page.click('button:has-text("Sign in")');
		const alert = page.getByRole('alert');
		await alert.waitFor();
		expect(await alert.textContent()).toMatch(/do not match an active account/);
		await page.fill('#email', userFor('viewer').email);
		await page.fill('#password', 'not-the-password');
		await page.click('button:has-text("Sign in")');
		await page.waitForTimeout(300);
		expect(await page.getByRole('alert').textContent()).toMatch(/do not match an active account/);
		await page.close();
	});

	for (const role of ['viewer', 'editor', 'moderator', 'admin']) {
		it(`signs in the sample ${role} at phone width and shows what the role allows`, async () => {
			const page = await freshPage(PHONE);
			const user = await signIn(page, role);
			expect(await page.getByTestId('who').textContent()).toContain(user.name);
			const staffLink = page.getByRole('link', { name: 'Staff' });
			expect(await staffLink.count()).toBe(role === 'admin' ? 1 : 0);
			await screenshot(page, `home-${role}-phone`);
			const admin = await page.goto(`${BASE}/admin/users`);
			expect(admin!.status()).toBe(role === 'admin' ? 200 : 403);
			await page.close();
		});
	}

	it('lets an admin see the staff list at desktop width', async () => {
		const page = await freshPage(DESKTOP);
		await signIn(page, 'admin');
		await page.goto(`${BASE}/admin/users`);
		for (const role of ['viewer', 'editor', 'moderator']) expect(await page.textContent('table')).toContain(userFor(role).email);
		await screenshot(page, 'staff-admin-desktop');
		await page.close();
	});

	it('refuses a viewer who posts straight to an editor-only action with 403', async () => {
		const page = await freshPage();
		await signIn(page, 'viewer');
		const res = await page.request.post(`${BASE}/admin/users?/role`, {
			form: { userId: '1', role: 'admin' },
			headers: { origin: BASE }
		});
		expect(res.status()).toBe(403);
		const api = await page.request.put(`${BASE}/api/vehicles/does-not-matter`, {
			data: { baseRevisionId: 1, content: {}, summary: 'x' },
			headers: { origin: BASE }
		});
		expect(api.status()).toBe(403);
		await page.close();
	});

	it('signs out and then needs signing in again', async () => {
		const page = await freshPage();
		await signIn(page, 'editor');
		await page.click('button:has-text("Sign out")');
		await page.waitForURL((url) => url.pathname === '/signin');
		await page.goto(`${BASE}/vehicles`);
		expect(new URL(page.url()).pathname).toBe('/signin');
		await page.close();
	});
});
