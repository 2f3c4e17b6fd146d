import { mkdtempSync, readFileSync, rmSync, mkdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, expect } from 'vitest';
import { chromium, type BrowserContext, type Page } from 'playwright-core';

export const BASE = process.env.ORIGIN ?? 'http://127.0.0.1:3117';
export const PHONE = { width: 390, height: 844 };
export const DESKTOP = { width: 1280, height: 900 };

type SeedUser = { email: string; password: string; role: string; name: string };
export const seedUsers: SeedUser[] = JSON.parse(readFileSync(new URL('../../content-seed/users.json', import.meta.url), 'utf8')).users;
export const userFor = (role: string) => seedUsers.find((u) => u.role === role)!;

export async function openBrowser(viewport = DESKTOP): Promise<{ context: BrowserContext; close: () => Promise<void> }> {
	const dir = mkdtempSync(join(tmpdir(), 'kickpanel-e2e-'));
	const context = await chromium.launchPersistentContext(dir, {
		executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
		headless: true,
		viewport,
		args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync']
	});
	return {
		context,
		close: async () => {
			await context.close();
			rmSync(dir, { recursive: true, force: true });
		}
	};
}

export async function signIn(page: Page, role: string): Promise<SeedUser> {
	const user = userFor(role);
	await page.goto(`${BASE}/signin`, { waitUntil: 'networkidle' });
	await page.fill('#email', user.email);
	await page.fill('#password', user.password);
	await Promise.all([page.waitForURL((url) => !url.pathname.startsWith('/signin')), page.click('button:has-text("Sign in")')]);
	return user;
}

export async function screenshot(page: Page, name: string): Promise<void> {
	const dir = new URL('./screenshots/', import.meta.url).pathname;
	mkdirSync(dir, { recursive: true });
	await page.screenshot({ path: join(dir, `${name}.png`), fullPage: true });
}

/**
 * One browser for a test file, opened before its tests and closed after; each test takes a fresh
 * signed-out page. Anything the Content-Security-Policy blocked, and any uncaught error in a page's
 * scripts, fails the file.
 */
export function browserSession(defaultViewport = DESKTOP) {
	let context: BrowserContext;
	let close: (() => Promise<void>) | undefined;
	const blocked: string[] = [];
	const pageErrors: string[] = [];
	beforeAll(async () => {
		({ context, close } = await openBrowser(defaultViewport));
	});
	afterAll(async () => {
		await close?.();
		expect(blocked, 'blocked by the Content-Security-Policy').toEqual([]);
		expect(pageErrors, 'uncaught errors in the page').toEqual([]);
	});
	async function watched(viewport: { width: number; height: number }): Promise<Page> {
		const page = await context.newPage();
		page.on('console', (message) => {
			if (message.type() === 'error' && /Content Security Policy/i.test(message.text())) blocked.push(`${page.url()}: ${message.text()}`);
		});
		page.on('pageerror', (error) => pageErrors.push(`${page.url()}: ${error.message}`));
		await page.setViewportSize(viewport);
		return page;
	}
	return {
		async freshPage(viewport = defaultViewport): Promise<Page> {
			await context.clearCookies();
			return watched(viewport);
		},
		/** Another tab of the same browser, still signed in as before (the phone reopened later). */
		nextTab(viewport = defaultViewport): Promise<Page> {
			return watched(viewport);
		}
	};
}
