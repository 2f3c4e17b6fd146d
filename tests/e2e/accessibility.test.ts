import { beforeAll, describe, expect, it } from 'vitest';
import { AxeBuilder } from '@axe-core/playwright';
import sharp from 'sharp';
import type { APIRequestContext, Page } from 'playwright-core';
import { BASE, browserSession, DESKTOP, PHONE, signIn } from './browser';
import { roleAtLeast, type Role } from '../../src/lib/domain/roles';

// Every main screen, at phone and desk width, checked by the axe-core engine with all of its rules
// (best practices included): no violation of any impact is allowed. Each screen is checked for every
// role that may open it, since menus, buttons and notices differ from one role to the next.

const { freshPage } = browserSession(DESKTOP);

/** `role`: the first role that may open the screen; every role above it opens it too. */
type Screen = { name: string; path: (slug: string, revisions: number[]) => string; role: Role };
const SCREENS: Screen[] = [
	{ name: 'home', path: () => '/', role: 'viewer' },
	{ name: 'search', path: () => '/search?q=seat', role: 'viewer' },
	{ name: 'vehicle list', path: () => '/vehicles', role: 'viewer' },
	{ name: 'vehicle page', path: (s) => `/vehicles/${s}`, role: 'viewer' },
	{ name: 'flag form', path: (s) => `/vehicles/${s}/trust`, role: 'viewer' },
	{ name: 'job sheet', path: (s) => `/vehicles/${s}/job-sheet`, role: 'viewer' },
	{ name: 'history', path: (s) => `/vehicles/${s}/history`, role: 'viewer' },
	{ name: 'compare', path: (s, r) => `/vehicles/${s}/compare?from=${r[1]}&to=${r[0]}`, role: 'viewer' },
	{ name: 'editor', path: (s) => `/vehicles/${s}/edit`, role: 'editor' },
	{ name: 'photos', path: (s) => `/vehicles/${s}/photos`, role: 'editor' },
	{ name: 'fit check', path: (s) => `/fit?vehicle=${s}`, role: 'viewer' },
	{ name: 'calculators', path: () => '/calc', role: 'viewer' },
	{ name: 'power wire calculator', path: () => '/calc/power-wire', role: 'viewer' },
	{ name: 'shop log', path: () => '/shop-log', role: 'viewer' },
	{ name: 'following', path: () => '/following', role: 'viewer' },
	{ name: 'parts', path: () => '/parts', role: 'viewer' },
	{ name: 'account', path: () => '/account', role: 'viewer' },
	{ name: 'pauses', path: () => '/admin/pauses', role: 'moderator' },
	{ name: 'staff', path: () => '/admin/users', role: 'admin' },
	{ name: 'shop settings', path: () => '/admin/settings', role: 'admin' },
	{ name: 'audit', path: () => '/admin/audit', role: 'admin' },
	{ name: 'mail queue', path: () => '/admin/outbox', role: 'admin' }
];
const ROLES: Role[] = ['viewer', 'editor', 'moderator', 'admin'];
const WIDTHS = { phone: PHONE, desk: DESKTOP };

let slug = '';
let revisions: number[] = [];

/** A sample page with two readable revisions, giving it a second one (a photo) when it has only one. */
async function pageWithHistory(request: APIRequestContext): Promise<void> {
	const list = await (await request.get(`${BASE}/api/vehicles?pageSize=50`)).json();
	for (const item of list.items as { slug: string }[]) {
		const page = await (await request.get(`${BASE}/api/vehicles/${item.slug}`)).json();
		if (page.protection !== 'none') continue;
		const listed = async () => (await (await request.get(`${BASE}/api/vehicles/${item.slug}/revisions`)).json()).items as { id: number; hidden?: boolean }[];
		const items = async () => (await listed()).map((r) => r.id);
		// A page with a hidden revision (another file's sentinel) cannot be compared by everyone.
		if ((await listed()).some((r) => r.hidden)) continue;
		if ((await items()).length < 2) {
			const photo = await sharp({ create: { width: 800, height: 600, channels: 3, background: { r: 110, g: 100, b: 90 } } }).jpeg().toBuffer();
			const res = await request.post(`${BASE}/api/vehicles/${item.slug}/photos`, {
				headers: { origin: BASE },
				multipart: { file: { name: 'grommet.jpg', mimeType: 'image/jpeg', buffer: photo }, section: 'firewall', alt: 'Firewall grommet (sample photo)' }
			});
			expect(res.status()).toBe(201);
		}
		slug = item.slug;
		revisions = await items();
		return;
	}
	throw new Error('no unprotected sample page');
}

async function violations(page: Page): Promise<string[]> {
	const result = await new AxeBuilder({ page }).options({ resultTypes: ['violations'] }).analyze();
	return result.violations.map((v) => `${v.id} (${v.impact}): ${v.help} — ${v.nodes.map((n) => n.target.join(' ')).slice(0, 4).join(' | ')}`);
}

beforeAll(async () => {
	const page = await freshPage();
	await signIn(page, 'editor');
	await pageWithHistory(page.request);
	await page.close();
});

describe('screens anyone can use', () => {
	it('sign-in page at phone and desk width has no violations', async () => {
		const page = await freshPage(PHONE);
		await page.goto(`${BASE}/signin`, { waitUntil: 'load' });
		for (const viewport of Object.values(WIDTHS)) {
			await page.setViewportSize(viewport);
			expect(await violations(page)).toEqual([]);
		}
		await page.close();
	});

	it('the vehicle page, search and the fit check read in the dark setting with no violations', async () => {
		const page = await freshPage(PHONE);
		await page.emulateMedia({ colorScheme: 'dark' });
		await signIn(page, 'viewer');
		const found: Record<string, string[]> = {};
		for (const address of [`/vehicles/${slug}#section-seats`, '/search?q=seat', `/fit?vehicle=${slug}`]) {
			await page.setViewportSize(PHONE);
			await page.goto(`${BASE}${address}`, { waitUntil: 'load' });
			for (const [width, viewport] of Object.entries(WIDTHS)) {
				await page.setViewportSize(viewport);
				const problems = await violations(page);
				if (problems.length) found[`${address} at ${width} width`] = problems;
			}
		}
		expect(found).toEqual({});
		await page.close();
	}, 300_000);

	for (const role of ROLES) {
		it(
			`the main screens of the ${role}, at phone and desk width, have no violations`,
			async () => {
				const page = await freshPage(PHONE);
				await signIn(page, role);
				const found: Record<string, string[]> = {};
				for (const screen of SCREENS.filter((s) => roleAtLeast(role, s.role))) {
					const address = screen.path(slug, revisions);
					await page.setViewportSize(PHONE);
					const res = await page.goto(`${BASE}${address}`, { waitUntil: 'load' });
					expect(res?.status(), address).toBe(200);
					// The same screen at both widths: the layout follows the viewport without a reload.
					for (const [width, viewport] of Object.entries(WIDTHS)) {
						await page.setViewportSize(viewport);
						const problems = await violations(page);
						if (problems.length) found[`${screen.name} at ${width} width ${address}`] = problems;
					}
				}
				expect(found).toEqual({});
				await page.close();
			},
			600_000
		);
	}
});
