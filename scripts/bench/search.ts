// npm run bench:search — the in-process vehicle search at 50,000 invented vehicles, against MariaDB
// InnoDB FULLTEXT on the same data in the same run.
//   BENCH_VEHICLES  how many vehicles (default 50000)
//   BENCH_SKIP_SQL=1  only the in-process index (quick runs while tuning)
import { execFileSync } from 'node:child_process';
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';
import mariadb from 'mariadb';
import { fmt, summarize, writeResults, seededRandom } from './lib';
import { BODY_STYLES, emptyContent, type BodyStyle, type VehicleContent } from '../../src/lib/domain/content/schema';
import { identityWords, vehicleSearchSections, type SearchSection } from '../../src/lib/domain/search/document';
import { vehicleSlug } from '../../src/lib/domain/slug';
import { VehicleSearchEngine } from '../../src/lib/server/search/engine';
import { withNoteSnippet } from '../../src/lib/server/search/hits';
import type { IndexInput } from '../../src/lib/server/search/types';
import type { SearchFilters } from '../../src/lib/domain/search/filters';
import { withinOneEdit } from '../../src/lib/domain/search/didYouMean';

const VEHICLES = Number(process.env.BENCH_VEHICLES ?? 50_000);
const SKIP_SQL = process.env.BENCH_SKIP_SQL === '1';
const DB_PORT = 3327;
const DB_ENV = { ...process.env, DB_DATA_DIR: '.data/bench-mariadb', DB_PORT: String(DB_PORT), DB_BUFFER_POOL: '1G', DB_FAST: '1' };
const REFERENCE_YEAR = 2026;
const QUERIES_PER_KIND = 200;
const ROUNDS = 5;

setFlagsFromString('--expose-gc');
const gc = runInNewContext('gc') as () => void;
const settle = async () => {
	for (let i = 0; i < 4; i++) {
		gc();
		await new Promise((r) => setTimeout(r, 50));
	}
};
const mb = (bytes: number) => bytes / 1024 / 1024;

// ---------- invented data: seeded, so every run indexes the same vehicles ----------

const random = seededRandom(0x6b69636b);
const pick = <T>(list: readonly T[]): T => list[Math.floor(random() * list.length)];
const between = (lo: number, hi: number) => lo + Math.floor(random() * (hi - lo + 1));
const capital = (s: string) => s[0].toUpperCase() + s.slice(1);

const ONSETS = ['b', 'br', 'c', 'd', 'dr', 'f', 'g', 'gr', 'h', 'k', 'kr', 'l', 'm', 'n', 'p', 'pr', 'qu', 'r', 's', 'st', 't', 'tr', 'v', 'w', 'z'];
const VOWELS = ['a', 'e', 'i', 'o', 'u', 'ae', 'ei', 'ou'];
const CODAS = ['', 'n', 'r', 'l', 'rn', 'nd', 'st', 'x', 'm', 'th', 'ck', 'ss'];
const syllable = () => pick(ONSETS) + pick(VOWELS) + pick(CODAS);

function uniqueNames(count: number, syllables: [number, number], taken: Set<string>): string[] {
	const out: string[] = [];
	while (out.length < count) {
		let name = '';
		const n = between(syllables[0], syllables[1]);
		for (let i = 0; i < n; i++) name += syllable();
		if (name.length < 4 || name.length > 11 || taken.has(name)) continue;
		taken.add(name);
		out.push(capital(name));
	}
	return out;
}

const taken = new Set<string>();
const MAKES = uniqueNames(60, [2, 3], taken);
const MODELS_PER_MAKE = 40;
const MODELS = MAKES.map((make) => ({ make, models: uniqueNames(MODELS_PER_MAKE, [1, 3], taken) }));

const PLACES = ['driver kick panel', 'passenger kick panel', 'A-pillar', 'B-pillar', 'door sill', 'centre console', 'glovebox', 'boot floor', 'spare wheel well', 'parcel shelf', 'seat cross-member', 'dash frame', 'steering column shroud', 'headliner', 'tail lamp housing', 'wheel arch liner', 'transmission tunnel', 'rear quarter panel'];
const PARTS = ['grommet', 'loom', 'harness', 'relay', 'fuse box', 'junction block', 'body control module', 'CAN gateway', 'blower housing', 'heater core', 'airbag module', 'seat-belt pretensioner', 'occupant sensor', 'washer bottle', 'ABS unit', 'brake booster', 'fuel filler neck', 'antenna amplifier'];
const TOOLS = ['trim tool', 'fish wire', 'step drill', '10 mm socket', 'T25 Torx bit', 'inspection mirror', 'silicone spray', 'panel popper', 'right-angle drill', 'hook pick'];
const COLOURS = ['blue/white', 'green', 'violet/yellow', 'grey/red', 'brown', 'white/black', 'orange', 'pink/blue', 'yellow/green', 'red/black'];
const FUNCTIONS = ['constant 12 V', 'accessory', 'ground', 'illumination', 'reverse signal', 'speed pulse', 'parking brake', 'CAN high', 'CAN low', 'amp remote', 'steering control', 'front left +', 'front left -', 'rear right +', 'mic input'];
const SIZES = ['6.5 in', '6x9', '5.25 in', '4 in', '3.5 in', '8 in', '6x8', '1 in tweeter'];
const KITS = ['double-DIN fascia with side brackets', 'single-DIN pocket kit', 'oversize trim ring', 'integrated screen bezel', 'gloss black surround with climate pod'];
const SURPRISES = ['a hidden screw behind the ashtray', 'clips that break below freezing', 'a second ground strap behind the glovebox', 'an extra connector for the heated seats', 'a factory amplifier under the driver seat', 'the airbag loom runs beside the passage', 'foam tape that must be replaced', 'a rivet instead of a screw on one bracket'];

const sentence = (): string =>
	pick([
		() => `Route the cable along the ${pick(PLACES)} and past the ${pick(PARTS)}; ${between(2, 6)} clips hold the ${pick(PARTS)}.`,
		() => `Remove the ${pick(PLACES)} trim with a ${pick(TOOLS)} before reaching the ${pick(PARTS)}.`,
		() => `Keep clear of the ${pick(PARTS)} behind the ${pick(PLACES)}; it sits ${between(10, 80)} mm from the edge.`,
		() => `A ${pick(TOOLS)} helps at the ${pick(PLACES)}, where the ${pick(PARTS)} blocks the view.`,
		() => `Later builds moved the ${pick(PARTS)} to the ${pick(PLACES)}, so check which one this car has.`,
		() => `Watch for ${pick(SURPRISES)}.`
	])();
const paragraph = (lo: number, hi: number) => Array.from({ length: between(lo, hi) }, sentence).join(' ');

function vehicleContent(make: string, model: string, yearFrom: number, yearTo: number, body: BodyStyle, i: number): VehicleContent {
	const c = emptyContent({ make, model, yearFrom, yearTo, body });
	c.identity.aliases = random() < 0.3 ? [`${make} ${model} ${pick(['GL', 'Sport', 'Touring', 'LWB', 'Crew', 'Hybrid'])}`] : [];
	c.identity.vinPatterns = [`${make.slice(0, 2).toUpperCase().replace(/[IOQ]/g, 'X')}${between(1, 9)}${model.slice(0, 2).toUpperCase().replace(/[IOQ]/g, 'X')}*`];
	c.identity.notes = `Benchmark page ${i}, invented. ${paragraph(1, 2)}`;
	c.power.batteryLocation = pick(['engine-bay', 'boot', 'under-seat'] as const);
	c.power.runs = [{ id: 'run-boot', to: `boot, behind the ${pick(PLACES)}`, lengthM: between(30, 60) / 10 }];
	c.power.groundPoints = [{ id: 'gp1', location: `M8 stud at the ${pick(PLACES)}`, notes: 'Scrape the paint back to metal.' }];
	c.power.notes = paragraph(1, 3);
	c.firewall.passages = [
		{ id: 'fw1', location: `${pick(['Driver', 'Passenger'])} side, behind the ${pick(PARTS)}`, kind: pick(['factory-grommet', 'added-grommet', 'drilled'] as const), pushFrom: pick(['cabin', 'engine-bay', 'either'] as const), holeMm: between(8, 30), avoid: `The ${pick(PARTS)} and its loom.`, tools: `${capital(pick(TOOLS))}, ${pick(TOOLS)}.` }
	];
	c.firewall.notes = paragraph(1, 2);
	c.seats.spaces = (['driver', 'passenger'] as const).map((seat) => ({
		id: seat,
		seat,
		lengthMm: between(250, 450),
		widthMm: between(200, 400),
		heightMm: random() < 0.1 ? null : between(50, 130),
		obstacles: `The ${pick(PARTS)} near the ${pick(PLACES)}.`,
		boardNeeded: random() < 0.3,
		travelNotes: random() < 0.5 ? `Seat fully forward gives ${between(10, 60)} mm more length.` : ''
	}));
	c.seats.notes = paragraph(0, 2);
	c.dash.opening = pick(['single-din', 'double-din', 'oversize', 'integrated'] as const);
	c.dash.depthMm = random() < 0.2 ? null : between(100, 190);
	c.dash.kit = `Sample ${pick(KITS)}`;
	c.dash.trimSteps = [`Unclip the ${pick(PLACES)} trim.`, `Remove ${between(2, 4)} screws under the ${pick(PARTS)}.`];
	c.dash.notes = paragraph(1, 2);
	c.harness.wires = Array.from({ length: between(4, 8) }, (_, k) => ({ id: `w${k}`, function: pick(FUNCTIONS), colour: pick(COLOURS), pin: String(between(1, 24)) }));
	c.harness.connectors = `${between(2, 4)} connectors behind the ${pick(PARTS)}.`;
	c.harness.notes = paragraph(0, 2);
	c.speakers.locations = [
		{ id: 'fd', location: 'Front doors', nominalSize: pick(SIZES), cutoutMm: between(100, 160), depthMm: between(40, 80), impedanceOhm: pick([2, 4]), grille: '' },
		{ id: 'rd', location: 'Rear deck', nominalSize: pick(SIZES), cutoutMm: between(100, 230), depthMm: between(40, 90), impedanceOhm: 4, grille: 'Grille clips from below.' }
	];
	c.camera.mounting = `Camera above the number plate, cable through the ${pick(PLACES)}.`;
	c.removal.surprises = [capital(pick(SURPRISES)) + '.'];
	c.removal.notes = paragraph(0, 2);
	if (random() < 0.4) c.photos = [{ id: `photo${i}`, section: 'firewall', itemId: 'fw1', caption: 'Passage seen from the cabin', alt: 'Firewall passage' }];
	return c;
}

console.log(`[bench] generating ${VEHICLES} invented vehicles…`);
const inputs: IndexInput[] = [];
for (let i = 0; i < VEHICLES; i++) {
	const family = MODELS[i % MODELS.length];
	const model = family.models[Math.floor(i / MODELS.length) % MODELS_PER_MAKE];
	const yearFrom = 1990 + ((i * 7) % 34);
	const yearTo = Math.min(2025, yearFrom + between(2, 8));
	const body = BODY_STYLES[(i >> 3) % BODY_STYLES.length];
	const content = vehicleContent(family.make, model, yearFrom, yearTo, body, i);
	inputs.push({ id: i + 1, slug: `${vehicleSlug(content.identity)}-${i + 1}`, revisionId: i + 1, content });
}
const averageText = inputs.slice(0, 1000).reduce((n, v) => n + vehicleSearchSections(v.content).reduce((m, s) => m + s.text.length, 0), 0) / 1000;
console.log(`[bench] ${VEHICLES} vehicles, ${MAKES.length} makes, ${MAKES.length * MODELS_PER_MAKE} models, ~${averageText.toFixed(0)} characters of section text each`);

// ---------- build ----------

await settle();
const before = process.memoryUsage();
const t0 = performance.now();
const engine = new VehicleSearchEngine();
engine.putMany(inputs);
engine.warm();
const buildMs = performance.now() - t0;
await settle();
const after = process.memoryUsage();
const memory = { rssMb: mb(after.rss - before.rss), heapMb: mb(after.heapUsed - before.heapUsed) };
console.log(`[bench] index built in ${(buildMs / 1000).toFixed(2)} s; RSS +${memory.rssMb.toFixed(0)} MB, heap +${memory.heapMb.toFixed(0)} MB`);

// ---------- the fixed query mix ----------

type Kind = 'prefix' | 'two words' | 'year' | 'typo' | 'filter';
// Each query's FULLTEXT twin asks what the in-process search answers: identity words as prefixes on
// the identity column's own index, notes words whole on the identity + notes index.
type BenchQuery = {
	kind: Kind;
	filters: SearchFilters;
	expect?: { make: string; model: string };
	sql: { columns: 'name_text' | 'name_text, notes_text'; match: string; where: string; params: unknown[] };
};
const KINDS: Kind[] = ['prefix', 'two words', 'year', 'typo', 'filter'];
const sample = () => inputs[Math.floor(random() * inputs.length)].content.identity;
const vocabulary = new Set([...taken]);

// A typo with one right answer: not one edit from another name, and not the start of one (someone typing it).
let ambiguousTypos = 0;
function typo(word: string): string {
	const letters = 'abcdefghiklmnprstuvwy'.split('');
	const w = word.toLowerCase();
	for (;;) {
		const at = between(1, w.length - 2);
		const kind = between(0, 3);
		const out =
			kind === 0
				? w.slice(0, at) + pick(letters) + w.slice(at + 1)
				: kind === 1
					? w.slice(0, at) + w.slice(at + 1)
					: kind === 2
						? w.slice(0, at) + pick(letters) + w.slice(at)
						: w.slice(0, at) + w[at + 1] + w[at] + w.slice(at + 2);
		if (out === w || vocabulary.has(out)) continue;
		if ([...vocabulary].some((v) => v !== w && (v.startsWith(out) || withinOneEdit(out, v)))) {
			ambiguousTypos++;
			continue;
		}
		return out;
	}
}

const booleanWords = (words: string[], prefix = true) => words.map((w) => `+${w}${prefix ? '*' : ''}`).join(' ');
const NAME = 'name_text' as const;
const ALL = 'name_text, notes_text' as const;
const queries: BenchQuery[] = [];
for (let k = 0; k < QUERIES_PER_KIND; k++) {
	const a = sample();
	const prefix = a.model.slice(0, between(3, 4)).toLowerCase();
	queries.push({ kind: 'prefix', filters: { q: prefix, conditions: [] }, sql: { columns: NAME, match: booleanWords([prefix]), where: '', params: [] } });

	const b = sample();
	queries.push({
		kind: 'two words',
		filters: { q: `${b.make} ${b.model}`.toLowerCase(), conditions: [] },
		expect: b,
		sql: { columns: NAME, match: booleanWords([b.make.toLowerCase(), b.model.toLowerCase()]), where: '', params: [] }
	});

	const c = sample();
	const year = between(c.yearFrom, c.yearTo);
	const q = k % 2 ? `${year} ${c.model.toLowerCase()}` : `${c.model.toLowerCase()} ${String(year).slice(2)}`;
	queries.push({
		kind: 'year',
		filters: { q, conditions: [] },
		expect: c,
		sql: { columns: NAME, match: booleanWords([c.model.toLowerCase()]), where: 'AND year_from <= ? AND year_to >= ?', params: [year, year] }
	});

	let d = sample();
	while (d.model.length < 5) d = sample();
	const slip = typo(d.model);
	queries.push({ kind: 'typo', filters: { q: slip, conditions: [] }, expect: d, sql: { columns: NAME, match: booleanWords([slip]), where: '', params: [] } });

	const word = pick(['grommet', 'harness', 'relay', 'loom', 'pillar', 'airbag', 'socket', 'console']);
	const body = pick(BODY_STYLES);
	const mm = between(70, 110);
	queries.push({
		kind: 'filter',
		filters: { q: word, body, conditions: [{ measure: 'passenger-seat-height', op: 'gte', mm }] },
		sql: { columns: ALL, match: booleanWords([word], false), where: 'AND body = ? AND passenger_height >= ?', params: [body, mm] }
	});
}

// ---------- in-process latency ----------

const perKind = new Map<Kind, number[]>(KINDS.map((k) => [k, []]));
const allSamples: number[] = [];
let typoFound = 0;
let typoTotal = 0;
let yearFound = 0;
let twoWordFound = 0;
// Snippets from the notes are cut from page text the app keeps per revision (its revision cache);
// here the warm-up round fills the same kind of cache, so timed rounds measure a warm app.
const sectionCache = new Map<number, SearchSection[]>();
const byId = new Map(inputs.map((v) => [v.id, v]));
function searchWithSnippets(filters: SearchFilters) {
	const out = engine.search(filters, { limit: 10, referenceYear: REFERENCE_YEAR });
	out.items = out.items.map((hit) => {
		if (!hit.noteWords.length) return hit;
		let sections = sectionCache.get(hit.revisionId);
		if (!sections) sectionCache.set(hit.revisionId, (sections = vehicleSearchSections(byId.get(hit.id)!.content)));
		return withNoteSnippet(hit, sections);
	});
	return out;
}
for (const query of queries) searchWithSnippets(query.filters);
for (let round = 0; round < ROUNDS; round++) {
	for (const query of queries) {
		const t = performance.now();
		const out = searchWithSnippets(query.filters);
		const ms = performance.now() - t;
		perKind.get(query.kind)!.push(ms);
		allSamples.push(ms);
		if (round === 0 && query.expect) {
			const top = out.items[0];
			const hit = !!top && top.make === query.expect.make && top.model === query.expect.model;
			if (query.kind === 'typo') {
				typoTotal++;
				if (hit) typoFound++;
			}
			if (query.kind === 'year' && hit && top.yearFrom <= Number(out.years[0]) && top.yearTo >= Number(out.years[0])) yearFound++;
			if (query.kind === 'two words' && hit) twoWordFound++;
		}
	}
}
const inProcess = { all: summarize(allSamples), byKind: Object.fromEntries(KINDS.map((k) => [k, summarize(perKind.get(k)!)])) };

// Updates: a save re-indexes one page in the request that saves it.
const updateSamples: number[] = [];
for (let i = 0; i < 200; i++) {
	const input = inputs[(i * 2477) % inputs.length];
	const content = structuredClone(input.content);
	content.dash.notes = `${content.dash.notes} Re-measured after job ${i}.`;
	const t = performance.now();
	engine.put({ ...input, revisionId: input.revisionId + 1_000_000 + i, content });
	engine.search({ q: 'grommet', conditions: [] }, { limit: 1, referenceYear: REFERENCE_YEAR });
	updateSamples.push(performance.now() - t);
}
const update = summarize(updateSamples);

// ---------- MariaDB InnoDB FULLTEXT on the same data ----------

let fulltext: { loadMs: number; indexMs: number; all: ReturnType<typeof summarize>; byKind: Record<string, ReturnType<typeof summarize>> } | null = null;
if (!SKIP_SQL) {
	console.log('[bench] starting a private MariaDB for FULLTEXT on 127.0.0.1:3327…');
	execFileSync('bash', ['scripts/db.sh', 'reset'], { env: DB_ENV, stdio: 'inherit' });
	const conn = await mariadb.createConnection({ host: '127.0.0.1', port: DB_PORT, user: 'kickpanel', password: 'kickpanel-local', database: 'kickpanel' });
	try {
		await conn.query('DROP TABLE IF EXISTS bench_vehicles');
		await conn.query(`CREATE TABLE bench_vehicles (
			id INT UNSIGNED PRIMARY KEY,
			make VARCHAR(80) NOT NULL,
			model VARCHAR(80) NOT NULL,
			year_from SMALLINT UNSIGNED NOT NULL,
			year_to SMALLINT UNSIGNED NOT NULL,
			body VARCHAR(20) NOT NULL,
			has_photos TINYINT(1) NOT NULL,
			passenger_height FLOAT NULL,
			name_text VARCHAR(600) NOT NULL,
			notes_text MEDIUMTEXT NOT NULL,
			KEY bench_years (year_from, year_to)
		) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
		const tl = performance.now();
		for (let i = 0; i < inputs.length; i += 1000) {
			await conn.batch(
				'INSERT INTO bench_vehicles VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?)',
				inputs.slice(i, i + 1000).map((v) => {
					const id = v.content.identity;
					const sections = vehicleSearchSections(v.content);
					const heights = v.content.seats.spaces.filter((s) => s.seat === 'passenger' && s.heightMm !== null).map((s) => s.heightMm as number);
					return [v.id, id.make, id.model, id.yearFrom, id.yearTo, id.body, v.content.photos.length ? 1 : 0, heights.length ? Math.max(...heights) : null, identityWords(id).join(' '), sections.map((s) => s.text).join('\n')];
				})
			);
		}
		const loadMs = performance.now() - tl;
		const ti = performance.now();
		await conn.query('ALTER TABLE bench_vehicles ADD FULLTEXT ft_name (name_text), ADD FULLTEXT ft_all (name_text, notes_text)');
		const indexMs = performance.now() - ti;
		console.log(`[bench] FULLTEXT: rows loaded in ${(loadMs / 1000).toFixed(1)} s, index built in ${(indexMs / 1000).toFixed(1)} s`);
		const run = (q: BenchQuery) =>
			conn.query(
				`SELECT id, MATCH(${q.sql.columns}) AGAINST(? IN BOOLEAN MODE) AS score
				 FROM bench_vehicles WHERE MATCH(${q.sql.columns}) AGAINST(? IN BOOLEAN MODE) ${q.sql.where}
				 ORDER BY score DESC LIMIT 10`,
				[q.sql.match, q.sql.match, ...q.sql.params]
			);
		for (const q of queries) await run(q); // warm the buffer pool
		const sqlKind = new Map<Kind, number[]>(KINDS.map((k) => [k, []]));
		const sqlAll: number[] = [];
		for (let round = 0; round < 2; round++) {
			for (const q of queries) {
				const t = performance.now();
				await run(q);
				const ms = performance.now() - t;
				sqlKind.get(q.kind)!.push(ms);
				sqlAll.push(ms);
			}
		}
		fulltext = { loadMs, indexMs, all: summarize(sqlAll), byKind: Object.fromEntries(KINDS.map((k) => [k, summarize(sqlKind.get(k)!)])) };
	} finally {
		await conn.end();
		execFileSync('bash', ['scripts/db.sh', 'stop'], { env: DB_ENV, stdio: 'inherit' });
		execFileSync('rm', ['-rf', DB_ENV.DB_DATA_DIR]);
	}
}

// ---------- report ----------

const targets = { p95Ms: 1, p99Ms: 2, buildS: 20, memoryMb: 250, speedup: 10 };
const ratio = fulltext ? fulltext.all.p95 / inProcess.all.p95 : null;
const pass = (ok: boolean) => (ok ? 'ok' : 'MISSED');
const pad = (s: string, n: number) => s.padEnd(n);
const row = (label: string, s: ReturnType<typeof summarize>, sql?: ReturnType<typeof summarize>) =>
	`  ${pad(label, 11)} ${pad(fmt(s.p50), 9)} ${pad(fmt(s.p95), 9)} ${pad(fmt(s.p99), 9)}` +
	(sql ? ` │ ${pad(fmt(sql.p50), 9)} ${pad(fmt(sql.p95), 9)} ${pad(fmt(sql.p99), 9)} ${(sql.p95 / s.p95).toFixed(0)}×` : '');

console.log(`
Vehicle search, ${VEHICLES.toLocaleString('en')} invented vehicles (${queries.length} queries × ${ROUNDS} rounds in process${fulltext ? ', × 2 rounds FULLTEXT' : ''})

  build        ${(buildMs / 1000).toFixed(2)} s             target ≤ ${targets.buildS} s      ${pass(buildMs / 1000 <= targets.buildS)}
  memory       RSS +${memory.rssMb.toFixed(0)} MB (heap +${memory.heapMb.toFixed(0)} MB)  target ≤ ${targets.memoryMb} MB   ${pass(memory.rssMb <= targets.memoryMb)}
  update       one page re-indexed, then searched: p50 ${fmt(update.p50)}, p95 ${fmt(update.p95)}

               FlexSearch in process         │ MariaDB InnoDB FULLTEXT       │ p95 ratio
  query        p50       p95       p99       │ p50       p95       p99       │
${KINDS.map((k) => row(k, inProcess.byKind[k], fulltext?.byKind[k])).join('\n')}
${row('all', inProcess.all, fulltext?.all)}

  in-process p95 ${fmt(inProcess.all.p95)} (target ≤ ${targets.p95Ms} ms) ${pass(inProcess.all.p95 <= targets.p95Ms)};  p99 ${fmt(inProcess.all.p99)} (target ≤ ${targets.p99Ms} ms) ${pass(inProcess.all.p99 <= targets.p99Ms)}
  ${ratio === null ? 'FULLTEXT skipped (BENCH_SKIP_SQL=1)' : `FULLTEXT p95 / in-process p95 = ${ratio.toFixed(1)}× (target ≥ ${targets.speedup}×) ${pass(ratio >= targets.speedup)}`}
  relevance: typo → intended model first ${((100 * typoFound) / typoTotal).toFixed(1)} % (${ambiguousTypos} generated typos set aside as ambiguous: one edit from another name), "make model" first ${((100 * twoWordFound) / QUERIES_PER_KIND).toFixed(1)} %, year query → model with that year first ${((100 * yearFound) / QUERIES_PER_KIND).toFixed(1)} %
  (FULLTEXT: identity words as prefixes on the identity column, notes words whole on identity + notes; no typo tolerance, so its typo queries find nothing; it fetches the top 10 only, while the in-process search also counts every match and cuts snippets.)
`);

writeResults('search', {
	vehicles: VEHICLES,
	makes: MAKES.length,
	models: MAKES.length * MODELS_PER_MAKE,
	averageSectionTextChars: Math.round(averageText),
	queries: queries.length,
	rounds: ROUNDS,
	buildMs,
	memory,
	updateMs: update,
	inProcessMs: inProcess,
	fulltextMs: fulltext,
	p95Ratio: ratio,
	relevance: { typoFirstPct: (100 * typoFound) / typoTotal, ambiguousTyposSetAside: ambiguousTypos, twoWordsFirstPct: (100 * twoWordFound) / QUERIES_PER_KIND, yearFirstPct: (100 * yearFound) / QUERIES_PER_KIND },
	targets
});
