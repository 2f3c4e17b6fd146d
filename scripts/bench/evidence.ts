// npm run bench:evidence — "measured by whom, in which revision" on pages with a 500-revision history.
// The pages are written through the real save path (so everything a save records is there), then
// fresh processes answer the look-up: the first call per page starts with no revision in memory
// (what a reader meets after a restart or once the page fell out of the cache), later calls are warm.
//   BENCH_PAGES      how many long-history pages (default 4)
//   BENCH_HISTORY    revisions per page (default 500)
//   BENCH_REPEATS    warm look-ups per page (default 200)
//   BENCH_COLD_RUNS  fresh processes, each timing one first look-up per page (default 5)
//   BENCH_DB_PORT    the benchmark's private MariaDB (default 3341)
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { benchDatabase, fmt, seededRandom, summarize, writeResults } from './lib';
import type { VehicleContent } from '../../src/lib/domain/content/schema';

const PAGES = Number(process.env.BENCH_PAGES ?? 4);
const HISTORY = Number(process.env.BENCH_HISTORY ?? 500);
const REPEATS = Number(process.env.BENCH_REPEATS ?? 200);
const COLD_RUNS = Number(process.env.BENCH_COLD_RUNS ?? 5);
const DB_PORT = Number(process.env.BENCH_DB_PORT ?? 3341);
const HIDDEN_PER_PAGE = 5;

const db = benchDatabase('evidence', DB_PORT);
process.env.DB_PORT = String(DB_PORT);
process.env.DB_NAME = 'kickpanel';

type Measured = { cold: number[]; warm: number[]; keys: number };

if (process.argv[2] === 'measure') {
	process.stdout.write(JSON.stringify(await measure()));
	process.exit(0);
}

db.start();
try {
	const slugs = await build();
	// Each process starts with nothing in memory; the first also times the warm repeats.
	const measured: Measured = { cold: [], warm: [], keys: 0 };
	for (let run = 0; run < COLD_RUNS; run++) {
		const child = spawnSync('npx', ['tsx', 'scripts/bench/evidence.ts', 'measure', ...slugs], {
			env: { ...process.env, ...db.env, DB_NAME: 'kickpanel', BENCH_REPEATS: String(run === 0 ? REPEATS : 0) },
			encoding: 'utf8',
			stdio: ['ignore', 'pipe', 'inherit'],
			maxBuffer: 64 * 1024 * 1024
		});
		if (child.status !== 0) throw new Error(`the measuring process failed (${child.status})`);
		const one = JSON.parse(child.stdout) as Measured;
		measured.cold.push(...one.cold);
		measured.warm.push(...one.warm);
		measured.keys = one.keys;
	}
	const cold = summarize(measured.cold);
	const warm = summarize(measured.warm);
	writeResults('evidence', { when: new Date().toISOString(), node: process.version, pages: PAGES, history: HISTORY, placesPerLookup: measured.keys, cold, warm });
	const line = (name: string, s: ReturnType<typeof summarize>) =>
		`${name.padEnd(34)}${String(s.n).padStart(6)}  ${fmt(s.p50).padStart(9)}  ${fmt(s.p95).padStart(9)}  ${fmt(s.max).padStart(9)}`;
	console.log(`\nEvidence look-up: ${PAGES} pages × ${HISTORY} revisions (${HIDDEN_PER_PAGE} hidden each), ${measured.keys} places a look-up\n`);
	console.log(`${'look-up'.padEnd(34)}${'runs'.padStart(6)}  ${'p50'.padStart(9)}  ${'p95'.padStart(9)}  ${'max'.padStart(9)}`);
	console.log(line('first, nothing in memory', cold));
	console.log(line('repeat, revisions in memory', warm));
	console.log('\nbench-results/evidence.json');
} finally {
	const { closeDb } = await import('../../src/lib/server/db');
	await closeDb();
	db.stop();
}

/** Long histories of invented edits: most touch notes, some re-measure one place, a few are hidden. */
async function build(): Promise<string[]> {
	const { migrateToLatest } = await import('../../src/lib/server/db/migrate');
	const { createUser, toSessionUser } = await import('../../src/lib/server/services/users');
	const { createVehicle, saveRevision, setRevisionHidden, revisionById } = await import('../../src/lib/server/services/revisions');
	await migrateToLatest();
	const writers = await Promise.all(
		[1, 2, 3].map(async (n) =>
			toSessionUser(await createUser({ email: `bench-writer${n}@kickpanel.test`, name: `Bench Writer ${n}`, password: 'bench-writer-pass', role: 'editor' }, null))
		)
	);
	const moderator = toSessionUser(
		await createUser({ email: 'bench-moderator@kickpanel.test', name: 'Bench Moderator', password: 'bench-moderator-pass', role: 'moderator' }, null)
	);
	const templates: VehicleContent[] = JSON.parse(readFileSync('content-seed/vehicles.json', 'utf8')).vehicles;
	const full = templates.filter((t) => t.seats.spaces.length >= 3 && t.speakers.locations.length >= 2);
	const random = seededRandom(0x65766964);
	const slugs: string[] = [];
	const t0 = performance.now();
	for (let p = 0; p < PAGES; p++) {
		const first = structuredClone(full[p % full.length]);
		first.identity = { ...first.identity, model: `${first.identity.model} Bench ${p}`, notes: `Bench page ${p} (sample data).` };
		const created = await createVehicle(first, writers[0], 'New page');
		slugs.push(created.slug);
		let latest = (await revisionById(created.revisionId))!;
		const hideAt = new Set(Array.from({ length: HIDDEN_PER_PAGE }, (_, i) => Math.floor(((i + 1) * HISTORY) / (HIDDEN_PER_PAGE + 2))));
		for (let r = 1; r < HISTORY; r++) {
			const content = structuredClone(latest.content);
			const roll = random();
			// One edit in twenty re-measures a seat or speaker; the dash keeps its first figures.
			if (roll < 0.03) content.seats.spaces[r % content.seats.spaces.length].heightMm = 60 + Math.floor(random() * 60);
			else if (roll < 0.05) content.speakers.locations[r % content.speakers.locations.length].depthMm = 40 + Math.floor(random() * 40);
			else content.removal.notes = `Revision ${r}: checked again after job ${p * 1000 + r}.`;
			const saved = await saveRevision(latest.vehicleId, { baseRevisionId: latest.id, content, summary: `Bench edit ${r}` }, writers[r % writers.length]);
			const previous = latest;
			latest = (await revisionById(saved.revisionId))!;
			if (hideAt.has(r)) await setRevisionHidden(previous.id, true, 'bench: hidden edit', moderator);
		}
	}
	console.log(`[bench] ${PAGES} pages × ${HISTORY} revisions written in ${((performance.now() - t0) / 1000).toFixed(1)} s`);
	return slugs;
}

async function measure(): Promise<Measured> {
	const slugs = process.argv.slice(3);
	const { db, closeDb } = await import('../../src/lib/server/db');
	db();
	const { requireVehicle, currentRevision } = await import('../../src/lib/server/services/vehicles');
	const { measurementOrigins, placeReaders } = await import('../../src/lib/server/services/evidence');
	const pages = await Promise.all(slugs.map((s) => requireVehicle(s)));
	const cold: number[] = [];
	const warm: number[] = [];
	let keys = 0;
	for (const vehicle of pages) {
		const content = (await currentRevision(vehicle))!.content;
		const places = placeReaders(content);
		keys = Object.keys(places).length;
		const t = performance.now();
		const first = await measurementOrigins(vehicle, places);
		cold.push(performance.now() - t);
		if (Object.keys(first).length !== keys) throw new Error('the look-up missed a place');
	}
	for (let i = 0; i < REPEATS; i++) {
		for (const vehicle of pages) {
			const places = placeReaders((await currentRevision(vehicle))!.content);
			const t = performance.now();
			await measurementOrigins(vehicle, places);
			warm.push(performance.now() - t);
		}
	}
	await closeDb();
	return { cold, warm, keys };
}
