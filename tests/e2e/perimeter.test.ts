import { describe, expect, it } from 'vitest';
import { BASE, browserSession, signIn } from './browser';

// What every answer carries and what the app refuses before a route reads the body.
// Header names and meanings: the CSP Level 3 and Fetch standards, RFC 6797 (HSTS), RFC 7034.

describe('the perimeter', () => {
	const session = browserSession();

	it('sends a script policy with hashes, no framing and no cross-site referrer on pages', async () => {
		const res = await fetch(`${BASE}/signin`);
		expect(res.status).toBe(200);
		const csp = res.headers.get('content-security-policy') ?? '';
		expect(csp).toContain("frame-ancestors 'none'");
		expect(csp).toContain("object-src 'none'");
		expect(csp).toMatch(/script-src 'self'( 'sha256-[A-Za-z0-9+/=]+')+/);
		expect(csp).toMatch(/img-src 'self' data: blob:(;|$)/);
		expect(res.headers.get('x-frame-options')).toBe('DENY');
		expect(res.headers.get('referrer-policy')).toBe('same-origin');
		expect(res.headers.get('x-content-type-options')).toBe('nosniff');
		expect(res.headers.get('permissions-policy')).toContain('geolocation=()');
	});

	it('answers health as up or down without the database driver’s words', async () => {
		const res = await fetch(`${BASE}/api/health`);
		const body = await res.json();
		expect(Object.keys(body).sort()).toEqual(['database', 'status']);
		expect(body).toEqual({ status: 'ok', database: 'up' });
	});

	it('lets Auth.js answer its own endpoints under /auth/ and nothing else', async () => {
		const providers = await fetch(`${BASE}/auth/providers`);
		expect(providers.status).toBe(200);
		expect(Object.keys(await providers.json())).toEqual(['credentials']);
		// Outside /auth/ the same word is an address the app does not have, behind the sign-in like any other.
		const elsewhere = await fetch(`${BASE}/api/providers`);
		expect(elsewhere.status).toBe(401);
	});

	it('refuses an oversized sign-in post before reading it', async () => {
		const res = await fetch(`${BASE}/signin`, {
			method: 'POST',
			headers: { 'content-type': 'application/x-www-form-urlencoded', origin: BASE },
			body: `email=${'a'.repeat(64 * 1024)}`
		});
		expect(res.status).toBe(413);
		expect(await res.text()).toMatch(/at most 16 KB/);
	});

	it('takes JSON only when it is sent as JSON, and keeps a page working under the policy', async () => {
		const page = await session.freshPage();
		await signIn(page, 'editor');
		const plain = await page.request.post(`${BASE}/api/markdown`, {
			headers: { 'content-type': 'text/plain', origin: BASE },
			data: JSON.stringify({ text: '**bold**' })
		});
		expect(plain.status()).toBe(415);
		expect((await plain.json()).message).toMatch(/Content-Type: application\/json/);
		const asJson = await page.request.post(`${BASE}/api/markdown`, { data: { text: '**bold**' } });
		expect(asJson.status()).toBe(200);
		expect((await asJson.json()).html).toContain('<strong>bold</strong>');
		// A page that hydrates: a blocked inline script would be reported by the session's policy watch.
		await page.goto(`${BASE}/vehicles`, { waitUntil: 'networkidle' });
		expect(await page.locator('h1').first().isVisible()).toBe(true);
		await page.close();
	});
});
