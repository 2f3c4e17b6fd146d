// npm run bench:transfer — what a phone downloads for the fullest sample vehicle page: a first view on a phone
// that never opened Kickpanel (empty cache, no service worker), and a repeat view with the cache warm and the
// service worker in charge. Headless Chromium (Debian's) at 390 px talks to the app through a counting proxy,
// so every byte that crossed the network is counted, the service worker's own fetches included; the page's
// own requests are broken down by kind from the browser's network events.
import { readFile } from 'node:fs/promises';
import net from 'node:net';
import { loadavg, tmpdir } from 'node:os';
import { mkdtempSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import mariadb from 'mariadb';
import { chromium, type Page } from 'playwright-core';
import { benchDatabase, startBuiltApp, writeResults } from './lib';

const DB_PORT = Number(process.env.BENCH_DB_PORT ?? 3347);
const APP_PORT = Number(process.env.BENCH_APP_PORT ?? 3348);
const FIRST_VIEW_KB = 150;
const REPEAT_VIEW_KB = 20;
const MAIN_CONTENT_MS = 2000;
// A mid-range phone on a weak mobile signal: 150 ms round trip, 1.6 Mbit/s down, 750 kbit/s up, the CPU four
// times slower than this machine's (the usual "slow 4G" profile of browser developer tools).
const PHONE_NETWORK = { offline: false, latency: 150, downloadThroughput: (1.6 * 1024 * 1024) / 8, uploadThroughput: (750 * 1024) / 8 };
const PHONE_CPU_SLOWDOWN = 4;

const db = benchDatabase('transfer', DB_PORT);
db.start();
process.env.DB_NAME = 'kickpanel';
// Server modules read the database settings when first imported, so they come in after the port is set.
const { migrateToLatest } = await import('../../src/lib/server/db/migrate');
const { closeDb } = await import('../../src/lib/server/db');
const { seedSampleShop } = await import('../../src/lib/server/services/seed');
const read = async (name: string) => JSON.parse(await readFile(`content-seed/${name}`, 'utf8'));
await migrateToLatest();
await seedSampleShop({
	shop: (await read('shop.json')).shop,
	users: (await read('users.json')).users,
	vehicles: (await read('vehicles.json')).vehicles,
	parts: (await read('parts.json')).parts
});
await closeDb();

// The fullest sample page: the one whose current revision holds the most.
const conn = await mariadb.createConnection({ host: '127.0.0.1', port: DB_PORT, user: 'kickpanel', password: 'kickpanel-local', database: 'kickpanel' });
const [{ slug }] = await conn.query('SELECT v.slug FROM vehicles v JOIN revisions r ON r.id = v.latest_revision_id ORDER BY LENGTH(r.content) DESC LIMIT 1');
await conn.end();
const viewer = (await read('users.json')).users.find((u: { role: string }) => u.role === 'viewer');

const PROXY_PORT = APP_PORT + 1;
const base = `http://127.0.0.1:${PROXY_PORT}`;
const app = await startBuiltApp(APP_PORT, { ...db.env, DB_NAME: 'kickpanel', AUTH_SECRET: 'bench-secret-bench-secret-bench-secret', ORIGIN: base });
// Every byte the app sends the phone passes here.
let wireBytes = 0;
const proxy = net.createServer((phone) => {
	const upstream = net.connect(APP_PORT, '127.0.0.1');
	upstream.on('data', (chunk) => (wireBytes += chunk.length));
	phone.pipe(upstream).pipe(phone);
	const close = () => {
		phone.destroy();
		upstream.destroy();
	};
	phone.on('error', close);
	upstream.on('error', close);
});
await new Promise<void>((r) => proxy.listen(PROXY_PORT, '127.0.0.1', r));
const profile = mkdtempSync(join(tmpdir(), 'kickpanel-transfer-'));
const browser = await chromium.launchPersistentContext(profile, {
	executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
	headless: true,
	viewport: { width: 390, height: 844 },
	deviceScaleFactor: 3,
	isMobile: true,
	hasTouch: true,
	args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync']
});

type Transfer = { bytes: number; wireBytes: number; requests: number; fromCache: number; byKind: Record<string, number>; largest: [string, number][] };

/** Opens the address and scrolls to the end (so lazy photos load too), adding up the bytes each response took on the wire. */
async function measure(page: Page, url: string): Promise<Transfer> {
	const cdp = await page.context().newCDPSession(page);
	await cdp.send('Network.enable');
	const kinds = new Map<string, string>();
	const cached = new Set<string>();
	const urls = new Map<string, string>();
	const result: Transfer = { bytes: 0, wireBytes: 0, requests: 0, fromCache: 0, byKind: {}, largest: [] };
	const wireAtStart = wireBytes;
	cdp.on('Network.responseReceived', (e) => {
		kinds.set(e.requestId, e.type);
		urls.set(e.requestId, `${e.response.status} ${new URL(e.response.url).pathname}`);
		if (e.response.fromDiskCache || e.response.fromPrefetchCache || e.response.fromServiceWorker) cached.add(e.requestId);
	});
	cdp.on('Network.requestServedFromCache', (e) => cached.add(e.requestId));
	cdp.on('Network.loadingFinished', (e) => {
		result.requests++;
		if (cached.has(e.requestId)) result.fromCache++;
		const kind = kinds.get(e.requestId) ?? 'Other';
		result.bytes += e.encodedDataLength;
		result.byKind[kind] = (result.byKind[kind] ?? 0) + e.encodedDataLength;
		result.largest.push([urls.get(e.requestId) ?? e.requestId, e.encodedDataLength]);
	});
	await page.goto(url, { waitUntil: 'networkidle' });
	await page.evaluate(async () => {
		for (let y = 0; y < document.body.scrollHeight; y += window.innerHeight) {
			window.scrollTo(0, y);
			await new Promise((r) => setTimeout(r, 50));
		}
	});
	await page.waitForLoadState('networkidle');
	await cdp.detach();
	result.wireBytes = wireBytes - wireAtStart;
	result.largest = result.largest.sort((a, b) => b[1] - a[1]).slice(0, 8);
	return result;
}

/** First and largest contentful paint of a first view (empty cache, no service worker) on the throttled phone profile. */
async function paintOnPhone(page: Page, url: string): Promise<{ fcpMs: number; lcpMs: number }> {
	await page.goto('about:blank');
	const cdp = await page.context().newCDPSession(page);
	await cdp.send('Network.enable');
	await cdp.send('Network.clearBrowserCache');
	await cdp.send('Storage.clearDataForOrigin', { origin: base, storageTypes: 'cache_storage,service_workers' });
	await cdp.send('Network.emulateNetworkConditions', PHONE_NETWORK);
	await cdp.send('Emulation.setCPUThrottlingRate', { rate: PHONE_CPU_SLOWDOWN });
	try {
		await page.goto(url, { waitUntil: 'load' });
		return await page.evaluate(
			() =>
				new Promise<{ fcpMs: number; lcpMs: number }>((resolve) => {
					const fcp = performance.getEntriesByName('first-contentful-paint')[0]?.startTime ?? NaN;
					let lcp = NaN;
					new PerformanceObserver((list) => {
						for (const entry of list.getEntries()) lcp = entry.startTime;
					}).observe({ type: 'largest-contentful-paint', buffered: true });
					setTimeout(() => resolve({ fcpMs: fcp, lcpMs: lcp }), 500);
				})
		);
	} finally {
		await cdp.send('Emulation.setCPUThrottlingRate', { rate: 1 });
		await cdp.send('Network.emulateNetworkConditions', { offline: false, latency: 0, downloadThroughput: -1, uploadThroughput: -1 });
		await cdp.detach();
	}
}

try {
	const page = await browser.newPage();
	await page.goto(`${base}/signin`, { waitUntil: 'networkidle' });
	await page.fill('#email', viewer.email);
	await page.fill('#password', viewer.password);
	await Promise.all([page.waitForURL((u) => !u.pathname.startsWith('/signin')), page.click('button:has-text("Sign in")')]);
	// The sign-in pages filled the cache and installed the service worker; a first view starts from nothing
	// but the session cookie.
	await page.goto('about:blank');
	const cdp = await browser.newCDPSession(page);
	await cdp.send('Network.clearBrowserCache');
	await cdp.send('Storage.clearDataForOrigin', { origin: base, storageTypes: 'cache_storage,service_workers,indexeddb' });
	await cdp.detach();

	const url = `${base}/vehicles/${slug}`;
	const first = await measure(page, url);
	// After the first view the service worker keeps the app for offline use, in the background.
	const beforeKeeping = wireBytes;
	await page.evaluate(async () => {
		const registration = await navigator.serviceWorker?.ready;
		if (registration?.active?.state !== 'activated') await new Promise((r) => setTimeout(r, 2000));
	});
	await new Promise((r) => setTimeout(r, 1000));
	const keptForOffline = wireBytes - beforeKeeping;
	await page.goto('about:blank');
	const repeat = await measure(page, url);
	const throttled = await paintOnPhone(page, url);
	const kb = (b: number) => (b / 1024).toFixed(1);
	const kinds = (t: Transfer) =>
		Object.entries(t.byKind)
			.sort((a, b) => b[1] - a[1])
			.map(([k, b]) => `${k} ${kb(b)} KB`)
			.join(', ');
	const mark = (ok: boolean) => (ok ? 'met' : 'MISSED');
	writeResults('transfer', { slug, first, keptForOffline, repeat, throttled, loadAverage: loadavg() });
	console.log(`
what a phone downloads for /vehicles/${slug} (390 px, headless Chromium, loopback)
  first view, empty cache   ${kb(first.bytes)} KB in ${first.requests} requests (target ≤ ${FIRST_VIEW_KB} KB) [${mark(first.bytes <= FIRST_VIEW_KB * 1024)}] · on the wire with headers ${kb(first.wireBytes)} KB
    ${kinds(first)}
    largest: ${first.largest.map(([u, b]) => `${u} ${kb(b)} KB`).join(', ')}
  then, in the background, the service worker keeps the app for offline use: ${kb(keptForOffline)} KB
  repeat view, warm cache   ${kb(repeat.wireBytes)} KB on the wire, ${repeat.requests} requests, ${repeat.fromCache} answered by the cache or the service worker (target ≤ ${REPEAT_VIEW_KB} KB) [${mark(repeat.wireBytes <= REPEAT_VIEW_KB * 1024)}]
  first view on a throttled phone (150 ms, 1.6 Mbit/s, CPU ÷${PHONE_CPU_SLOWDOWN}): first paint ${throttled.fcpMs.toFixed(0)} ms · main content (largest paint) ${throttled.lcpMs.toFixed(0)} ms (target < ${MAIN_CONTENT_MS} ms) [${mark(throttled.lcpMs < MAIN_CONTENT_MS)}]
`);
} finally {
	await browser.close();
	proxy.close();
	rmSync(profile, { recursive: true, force: true });
	app.kill('SIGTERM');
	await new Promise((r) => app.once('exit', r));
	db.stop();
}
