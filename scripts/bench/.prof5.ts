// npm run bench:search — the in-process vehicle search at 50,000 invented vehicles, against MariaDB
// InnoDB FULLTEXT on the same data in the same run.
//   BENCH_VEHICLES  how many vehicles (default 50000)
//   BENCH_SKIP_SQL=1  only the in-process index (quick runs while tuning)
import { execFileSync } from 'node:child_process';
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';
import mariadb from 'mariadb';
import { fmt, summarize, writeResults } from './lib';
import { BODY_STYLE_NAMES, BODY_STYLES, emptyContent, type BodyStyle, type VehicleContent } from '../../src/lib/domain/content/schema';
import { vehicleSearchText } from '../../src/lib/domain/search/document';
import { vehicleSlug } from '../../src/lib/domain/slug';
import { VehicleSearchEngine, type IndexInput } from '../../src/lib/server/search/engine';
import type { SearchFilters } from '../../src/lib/domain/search/filters';

const VEHICLES = Number(process.env.N ?? 10000);
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

let seed = 0x6b69636b;
function random(): number {
	// mulberry32
	seed = (seed + 0x6d2b79f5) | 0;
	let t = seed;
	t = Math.imul(t ^ (t >>> 15), t | 1);
	t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
	return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
}
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
const averageText = inputs.slice(0, 1000).reduce((n, v) => n + vehicleSearchText(v.content).sections.reduce((m, s) => m + s.text.length, 0), 0) / 1000;
console.log(`[bench] ${VEHICLES} vehicles, ${MAKES.length} makes, ${MAKES.length * MODELS_PER_MAKE} models, ~${averageText.toFixed(0)} characters of section text each`);


import { searchWords } from '../../src/lib/domain/search/words';
import { Document, Encoder } from 'flexsearch';
const distinct = (texts: string[]) => { const s = new Set<string>(); for (const t of texts) for (const w of searchWords(t)) s.add(w); return [...s].join(' '); };
const docs = inputs.map((v, i) => { const t = vehicleSearchText(v.content); return { id: i + 1, name: distinct([t.name]), text: distinct(t.sections.map((s) => s.text)) }; });
async function trial(label: string, opts: any) {
  await settle(); const m0 = process.memoryUsage(); const t = performance.now();
  const d = new Document(opts);
  for (const doc of docs) d.add(doc);
  const ms = performance.now() - t; await settle(); const m1 = process.memoryUsage();
  const tu = performance.now();
  for (let i = 0; i < 20; i++) { const doc = docs[i * 37]; d.update({ ...doc, text: doc.text + ' extra' + i }); }
  const up = (performance.now() - tu) / 20;
  const tc = performance.now(); d.cleanup(); const cl = performance.now() - tc;
  const tq = performance.now(); let n = 0; for (let i = 0; i < 200; i++) n += (d.search('grommet', { index: 'text', limit: 100000 }) as any)[0]?.result.length ?? 0; const q = (performance.now() - tq) / 200;
  console.log(label.padEnd(36), (ms / 1000).toFixed(2), 's heap', ((m1.heapUsed - m0.heapUsed) / 1e6).toFixed(0), 'MB rss', ((m1.rss - m0.rss) / 1e6).toFixed(0), 'MB update', up.toFixed(2), 'ms cleanup', cl.toFixed(1), 'ms grommet-all', q.toFixed(3), 'ms', n / 200);
}
const enc = () => new Encoder({ normalize: false, numeric: false, dedupe: false, cache: false, split: ' ' });
const split = (s: string) => s.split(' ');
const opts = (fu: boolean, res: number, custom: boolean) => ({ document: { id: 'id', index: [
  { field: 'name', tokenize: 'forward', resolution: 9, ...(custom ? { encode: split } : { encoder: enc() }) },
  { field: 'text', tokenize: 'strict', resolution: res, ...(custom ? { encode: split } : { encoder: enc() }) } ] }, fastupdate: fu });
for (const [fu, res, custom] of [[true, 3, false], [true, 1, false], [true, 1, true], [false, 1, true], [true, 3, true]] as const) await trial(`fastupdate=${fu} res=${res} encode=${custom}`, opts(fu, res, custom));
