// npm run bench:pages — vehicle page render times and throughput at 10,000 vehicles / 100,000 revisions.
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import http from 'node:http';
import { loadavg } from 'node:os';
import autocannon from 'autocannon';
import mariadb from 'mariadb';
import { benchDatabase, busy, databasePid, fmt, signInCookie, startBuiltApp, summarize, writeResults } from './lib';
import { canonicalJson, type VehicleContent } from '../../src/lib/domain/content/schema';
import { vehicleSlug } from '../../src/lib/domain/slug';

const VEHICLES = Number(process.env.BENCH_VEHICLES ?? 10_000);
const REVISIONS = Number(process.env.BENCH_REVISIONS ?? 100_000);
const LONG_HISTORY = 500;
// Measurement runs on one set of data (BENCH_RUNS, default 1); the data and stored parts are made once.
const RUNS = Math.max(1, Number(process.env.BENCH_RUNS ?? 1));
// Several checkouts may benchmark on one machine at once: each may pick its own ports.
const DB_PORT = Number(process.env.BENCH_DB_PORT ?? 3337);
const APP_PORT = Number(process.env.BENCH_APP_PORT ?? 3338);
const PLAIN_PORT = APP_PORT + 1;

const templates: VehicleContent[] = JSON.parse(readFileSync('content-seed/vehicles.json', 'utf8')).vehicles;
const db = benchDatabase('pages', DB_PORT, '1G');
db.start();
process.env.DB_NAME = 'kickpanel';
// Server modules read the database settings when first imported, so they come in after the port is set.
const { renderNotes, NOTES_RENDERER_VERSION } = await import('../../src/lib/server/services/rendering');
const { migrateToLatest } = await import('../../src/lib/server/db/migrate');
const { closeDb } = await import('../../src/lib/server/db');
const { createUser } = await import('../../src/lib/server/services/users');
await migrateToLatest();
const conn = await mariadb.createConnection({ host: '127.0.0.1', port: DB_PORT, user: 'kickpanel', password: 'kickpanel-local', database: 'kickpanel' });
const count = async (sql: string) => Number((await conn.query(sql))[0].n);
// With BENCH_KEEP=1 a database left by an earlier run with as many pages is measured again as it is.
const kept = db.keep && (await count('SELECT COUNT(*) AS n FROM vehicles')) === VEHICLES;
if (kept) console.log(`[bench] measuring the ${VEHICLES} pages kept from an earlier run`);
else {
	await createUser({ email: 'bench-viewer@kickpanel.test', name: 'Bench Viewer', password: 'bench-viewer-pass', role: 'viewer' }, null);
	const writer = await createUser({ email: 'bench-writer@kickpanel.test', name: 'Bench Writer', password: 'bench-writer-pass', role: 'editor' }, null);
	await generate(writer.id);
}
await closeDb();
const revisionCount = await count('SELECT COUNT(*) AS n FROM revisions');
const slugs: string[] = (await conn.query('SELECT slug FROM vehicles ORDER BY id')).map((r: { slug: string }) => r.slug);
// The page with the long history is the first one.
const largest = { vehicle: 1, ids: (await conn.query('SELECT id FROM revisions WHERE vehicle_id = 1 ORDER BY id')).map((r: { id: number }) => Number(r.id)) };

const base = `http://127.0.0.1:${APP_PORT}`;
const app = await startBuiltApp(APP_PORT, { ...db.env, DB_NAME: 'kickpanel', AUTH_SECRET: 'bench-secret-bench-secret-bench-secret', DB_POOL_MAX: '20' });
let plain: http.Server | null = null;
const agent = new http.Agent({ keepAlive: true, maxSockets: 1 });
try {
	// The pages were written straight into the database, so the app renders their stored parts after it starts,
	// as it does after every new build; the views below are measured once that is done.
	// Parts stored by an earlier build (a kept database) do not count: this build renders its own, and the
	// earlier builds' parts are dropped, so a kept database holds what a fresh one would.
	const renderer = JSON.parse(readFileSync('build/client/_app/version.json', 'utf8')).version as string;
	if (kept) await conn.query('DELETE FROM rendered_pages WHERE renderer <> ?', [renderer]);
	const t1 = performance.now();
	const missing = async () =>
		Number(
			(
				await conn.query(
					'SELECT COUNT(*) AS n FROM vehicles v JOIN revisions r ON r.id = v.latest_revision_id WHERE (SELECT COUNT(*) FROM rendered_pages rp WHERE rp.sha256 = r.sha256 AND rp.renderer = ?) < 2',
					[renderer]
				)
			)[0].n
		);
	while ((await missing()) > 0) await new Promise((r) => setTimeout(r, 1_000));
	const partsSeconds = (performance.now() - t1) / 1000;
	console.log(`[bench] stored page parts rendered for ${VEHICLES} pages in ${partsSeconds.toFixed(1)} s`);
	const cookie = await signInCookie(base, 'bench-viewer@kickpanel.test', 'bench-viewer-pass');
	// Timed views ask for compression as a browser does and take the bytes as they come: decoding them is the
	// client's work (a browser does it natively; fetch's stream decoder alone added ~4 ms a view here).
	const get = (path: string) =>
		new Promise<{ ms: number }>((resolve, reject) => {
			const t = performance.now();
			http
				.get(base + path, { agent, headers: { cookie, 'accept-encoding': 'gzip, deflate, br' } }, (res) => {
					res.resume();
					res.on('end', () => (res.statusCode === 200 ? resolve({ ms: performance.now() - t }) : reject(new Error(`${path} answered ${res.statusCode}`))));
				})
				.on('error', reject);
		});
	const pageText = async (path: string) => {
		const res = await fetch(base + path, { headers: { cookie, 'accept-encoding': 'identity' } });
		if (res.status !== 200) throw new Error(`${path} answered ${res.status}`);
		return res.text();
	};
	// Each run reads its own share of the pages, so a page read in one run is still a first view in the next.
	const allRuns: unknown[] = [];
	for (let run = 1; run <= RUNS; run++) {
		const shift = (run - 1) * Math.floor(slugs.length / RUNS);
		// A warm-up pass so the JIT has compiled the hot paths.
		for (let i = 0; i < 300; i++) await get(`/vehicles/${slugs[(shift + i * 37) % slugs.length]}`);
		const render: number[] = [];
		for (let i = 0; i < 500; i++) render.push((await get(`/vehicles/${slugs[(shift + i * 7919) % slugs.length]}`)).ms);
		const cold: number[] = [];
		for (let i = 0; i < 200; i++) cold.push((await get(`/vehicles/${slugs[(shift + i * 104729 + 17) % slugs.length]}`)).ms);
		const history: number[] = [];
		for (let i = 0; i < 20; i++) history.push((await get(`/vehicles/${slugs[0]}/history`)).ms);
		const compare: number[] = [];
		const [a, b] = [largest.ids[1], largest.ids[largest.ids.length - 1]];
		for (let i = 0; i < 20; i++) compare.push((await get(`/vehicles/${slugs[0]}/compare?from=${a}&to=${b}`)).ms);

		// Two pages: the most fully documented sample (every section, ladder, wire table) and a sparse one.
		const pages = { full: `/vehicles/${slugs[templates.length * 3]}`, sparse: `/vehicles/${slugs[templates.length * 3 + 12]}` };
		const load = (url: string, headers: Record<string, string>) =>
			autocannon({ url, connections: 50, duration: Number(process.env.BENCH_SECONDS ?? 10), headers });
		const throughput: Record<string, { bytes: number; plainRps: number; plainP99: number; pageRps: number; pageP99: number; non2xx: number; ratio: number }> = {};
		for (const [kind, target] of Object.entries(pages)) {
			const html = await pageText(target);
			plain?.close();
			plain = http.createServer((_req, res) => {
				res.writeHead(200, { 'content-type': 'text/html; charset=utf-8' });
				res.end(html);
			});
			await new Promise<void>((r) => plain!.listen(PLAIN_PORT, '127.0.0.1', r));
			const plainRun = await load(`http://127.0.0.1:${PLAIN_PORT}/`, {});
			const pageRun = await load(base + target, { cookie });
			throughput[kind] = {
				bytes: html.length,
				plainRps: plainRun.requests.average,
				plainP99: plainRun.latency.p99,
				pageRps: pageRun.requests.average,
				pageP99: pageRun.latency.p99,
				non2xx: pageRun.non2xx,
				ratio: pageRun.requests.average / plainRun.requests.average
			};
		}
		// Every request a different page, in a shuffled order: what a shop full of counters sees, where few
		// views repeat and most pages are rendered afresh.
		const order = slugs.map((slug, i) => ({ slug, k: (shift + i * 7_919) % slugs.length })).sort((x, y) => x.k - y.k).map((x) => x.slug);
		let at = 0;
		const { result: mixedRun, appCores, databaseCores } = await busy({ app: app.pid!, database: databasePid('pages') }, () => autocannon({
			url: base,
			connections: 50,
			duration: Number(process.env.BENCH_SECONDS ?? 10),
			headers: { cookie },
			requests: [{ method: 'GET', setupRequest: (req: Record<string, unknown>) => ({ ...req, path: `/vehicles/${order[at++ % order.length]}` }) }]
		}));
		const mixed = { appCores, databaseCores, rps: mixedRun.requests.average, p50: mixedRun.latency.p50, p99: mixedRun.latency.p99, non2xx: mixedRun.non2xx, distinctPages: Math.min(at, order.length) };
		const distinctRatio = mixed.rps / throughput.full.plainRps;
		const results = {
			vehicles: VEHICLES,
			revisions: revisionCount,
			storedPartsSeconds: partsSeconds,
			renderFirstViewMs: summarize(render),
			renderSecondViewMs: summarize(cold),
			history500Ms: summarize(history),
			compareLargeMs: summarize(compare),
			throughput,
			mixed: { ...mixed, ratioToPlain: distinctRatio },
			loadAverage: loadavg()
		};
		allRuns.push(results);
		writeResults('pages', { runs: allRuns });
		const mark = (ok: boolean) => (ok ? 'met' : 'MISSED');
		const line = (k: string) => {
			const t = throughput[k];
			const ok = t.ratio >= 0.5 && t.pageP99 <= 100;
			return `  ${k.padEnd(7)} page (${(t.bytes / 1024).toFixed(0)} KB): plain ${t.plainRps.toFixed(0)} req/s (p99 ${t.plainP99} ms) · vehicle page ${t.pageRps.toFixed(0)} req/s (p99 ${t.pageP99} ms, non-2xx ${t.non2xx}) · ratio ${t.ratio.toFixed(3)} [${mark(ok)}]`;
		};
		const first = results.renderFirstViewMs;
		const second = results.renderSecondViewMs;
		console.log(`
run ${run} of ${RUNS} · vehicle page, ${VEHICLES} vehicles / ${revisionCount} revisions (server time seen by a client on loopback; load average ${loadavg().map((l) => l.toFixed(2)).join(' ')})
  first view of a page, sequential        p50 ${fmt(first.p50)}  p95 ${fmt(first.p95)}  (target p95 ≤ 10 ms) [${mark(first.p95 <= 10)}]
  first view of other pages, sequential   p50 ${fmt(second.p50)}  p95 ${fmt(second.p95)}  (target p95 ≤ 10 ms) [${mark(second.p95 <= 10)}]
  history, ${LONG_HISTORY} revisions                  p50 ${fmt(results.history500Ms.p50)}  p95 ${fmt(results.history500Ms.p95)}
  compare, two large revisions            p50 ${fmt(results.compareLargeMs.p50)}  p95 ${fmt(results.compareLargeMs.p95)}
autocannon, 50 connections, signed in as a viewer, one page again and again (target: ratio to plain ≥ 0.5, p99 ≤ 100 ms)
${line('full')}
${line('sparse')}
autocannon, 50 connections, a different page each request (${mixed.distinctPages} pages, each a first view) (target: ≥ 0.15 of plain, p99 ≤ 250 ms)
  ${mixed.rps.toFixed(0)} req/s · ${distinctRatio.toFixed(3)} of plain (${throughput.full.plainRps.toFixed(0)} req/s, full page) · p50 ${mixed.p50} ms · p99 ${mixed.p99} ms · non-2xx ${mixed.non2xx} [${mark(distinctRatio >= 0.15 && mixed.p99 <= 250)}]
  busy meanwhile: app server ${(mixed.appCores * 100).toFixed(0)} % of a core · database ${(mixed.databaseCores * 100).toFixed(0)} % of a core
`);
	}
} finally {
	agent.destroy();
	plain?.close();
	await conn.end();
	// Let requests autocannon gave up on at the end of its last run finish before the database goes.
	await new Promise((r) => setTimeout(r, 2_000));
	app.kill('SIGTERM');
	await new Promise((r) => app.once('exit', r));
	db.stop();
}

/** Writes the pages, their revisions and rendered notes straight into the database. */
async function generate(writerId: number) {
	console.log(`[bench] generating ${VEHICLES} vehicles with ${REVISIONS} revisions…`);
	const t0 = performance.now();
	const makes = Array.from({ length: 40 }, (_, i) => `Benchmake ${String.fromCharCode(65 + (i % 26))}${i}`);
	await conn.batch('INSERT INTO makes (id, name, slug) VALUES (?, ?, ?)', makes.map((m, i) => [i + 1, m, m.toLowerCase().replace(/\s+/g, '-')]));
	const modelRows: [number, number, string, string][] = [];
	for (let i = 0; i < VEHICLES / 5; i++) modelRows.push([i + 1, (i % makes.length) + 1, `Model ${i}`, `model-${i}`]);
	await conn.batch('INSERT INTO models (id, make_id, name, slug) VALUES (?, ?, ?, ?)', modelRows);

	const perVehicle = Math.max(1, Math.floor((REVISIONS - LONG_HISTORY) / VEHICLES));
	// The remainder goes one each to the first vehicles, so the total is exactly REVISIONS.
	const extra = Math.max(0, REVISIONS - LONG_HISTORY - perVehicle * (VEHICLES - 1));
	let revisionId = 0;
	const now = Date.now();
	for (let start = 0; start < VEHICLES; start += 500) {
		const vehicleRows: unknown[][] = [];
		const revisionRows: unknown[][] = [];
		const notesRows: unknown[][] = [];
		for (let v = start; v < Math.min(VEHICLES, start + 500); v++) {
			const model = modelRows[v % modelRows.length];
			const template = structuredClone(templates[v % templates.length]);
			const yearFrom = 1995 + (v % 25);
			template.identity = { ...template.identity, make: makes[model[1] - 1], model: model[2], yearFrom, yearTo: yearFrom + (v % 6), notes: template.identity.notes + `\n\nBench page ${v}.` };
			const slug = vehicleSlug(template.identity) + `-${v}`;
			const count = v === 0 ? LONG_HISTORY : perVehicle + (v <= extra ? 1 : 0);
			let parent: number | null = null;
			let previousSize = 0;
			for (let r = 0; r < count; r++) {
				const content = structuredClone(template);
				if (content.seats.spaces[0]) content.seats.spaces[0].heightMm = 60 + ((v + r) % 60);
				content.removal.notes = `${content.removal.notes}\n\nRevision ${r}: re-measured after job ${v * 100 + r}.`.repeat(v === 0 && r % 2 ? 8 : 1);
				const json = canonicalJson(content);
				const id = ++revisionId;
				const sha256 = createHash('sha256').update(json).digest('hex');
				// As a save does: the notes are rendered and kept beside the revision.
				notesRows.push([sha256, NOTES_RENDERER_VERSION, JSON.stringify(renderNotes(content))]);
				revisionRows.push([id, v + 1, parent, writerId, `Bench edit ${r}`, json, '', sha256, json.length, json.length - previousSize, 'seats,removal', new Date(now - (count - r) * 60_000)]);
				previousSize = json.length;
				parent = id;
			}
			vehicleRows.push([v + 1, slug, model[1], model[0], template.identity.yearFrom, template.identity.yearTo, template.identity.body, parent, new Date(), new Date()]);
		}
		await conn.batch('INSERT INTO vehicles (id, slug, make_id, model_id, year_from, year_to, body, latest_revision_id, created_at, updated_at) VALUES (?, ?, ?, ?, ?, ?, ?, NULL, ?, ?)', vehicleRows.map((r) => [r[0], r[1], r[2], r[3], r[4], r[5], r[6], r[8], r[9]]));
		for (let k = 0; k < revisionRows.length; k += 1000) {
			await conn.batch(
				'INSERT INTO revisions (id, vehicle_id, parent_id, author_id, summary, content, rendered, sha256, size, size_delta, sections, created_at) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)',
				revisionRows.slice(k, k + 1000)
			);
		}
		for (let k = 0; k < notesRows.length; k += 1000) {
			await conn.batch('INSERT IGNORE INTO rendered_notes (sha256, renderer_version, notes) VALUES (?, ?, ?)', notesRows.slice(k, k + 1000));
		}
		await conn.batch('UPDATE vehicles SET latest_revision_id = ? WHERE id = ?', vehicleRows.map((r) => [r[7], r[0]]));
	}
	console.log(`[bench] data ready in ${((performance.now() - t0) / 1000).toFixed(1)} s (${revisionId} revisions)`);
}