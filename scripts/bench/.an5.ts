// npm run bench:search — the in-process vehicle search at 50,000 invented vehicles, against MariaDB
// InnoDB FULLTEXT on the same data in the same run.
//   BENCH_VEHICLES  how many vehicles (default 50000)
//   BENCH_SKIP_SQL=1  only the in-process index (quick runs while tuning)
import { execFileSync } from 'node:child_process';
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';
import mariadb from 'mariadb';
import { fmt, summarize, writeResults } from './lib';
import { BODY_STYLES, emptyContent, type BodyStyle, type VehicleContent } from '../../src/lib/domain/content/schema';
import { identityWords, vehicleSearchSections, type SearchSection } from '../../src/lib/domain/search/document';
import { vehicleSlug } from '../../src/lib/domain/slug';
import { VehicleSearchEngine, withNoteSnippet, type IndexInput } from '../../src/lib/server/search/engine';
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
type BenchQuery = { kind: Kind; filters: SearchFilters; expect?: { make: string; model: string }; sql: { match: string; where: string; params: unknown[] } };
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

const booleanWords = (words: string[]) => words.map((w) => `+${w}*`).join(' ');
const queries: BenchQuery[] = [];
for (let k = 0; k < QUERIES_PER_KIND; k++) {
	const a = sample();
	const prefix = a.model.slice(0, between(3, 4)).toLowerCase();
	queries.push({ kind: 'prefix', filters: { q: prefix, conditions: [] }, sql: { match: booleanWords([prefix]), where: '', params: [] } });

	const b = sample();
	queries.push({
		kind: 'two words',
		filters: { q: `${b.make} ${b.model}`.toLowerCase(), conditions: [] },
		expect: b,
		sql: { match: booleanWords([b.make.toLowerCase(), b.model.toLowerCase()]), where: '', params: [] }
	});

	const c = sample();
	const year = between(c.yearFrom, c.yearTo);
	const q = k % 2 ? `${year} ${c.model.toLowerCase()}` : `${c.model.toLowerCase()} ${String(year).slice(2)}`;
	queries.push({
		kind: 'year',
		filters: { q, conditions: [] },
		expect: c,
		sql: { match: booleanWords([c.model.toLowerCase()]), where: 'AND year_from <= ? AND year_to >= ?', params: [year, year] }
	});

	let d = sample();
	while (d.model.length < 5) d = sample();
	const slip = typo(d.model);
	queries.push({ kind: 'typo', filters: { q: slip, conditions: [] }, expect: d, sql: { match: booleanWords([slip]), where: '', params: [] } });

	const word = pick(['grommet', 'harness', 'relay', 'loom', 'pillar', 'airbag', 'socket', 'console']);
	const body = pick(BODY_STYLES);
	const mm = between(70, 110);
	queries.push({
		kind: 'filter',
		filters: { q: word, body, conditions: [{ measure: 'passenger-seat-height', op: 'gte', mm }] },
		sql: { match: booleanWords([word]), where: 'AND body = ? AND passenger_height >= ?', params: [body, mm] }
	});
}


const E = engine as any;
const all = E.entries.length;
const time = (label: string, fn: () => unknown, n = 200) => { for (let i = 0; i < 20; i++) fn(); const t = performance.now(); for (let i = 0; i < n; i++) fn(); console.log(label.padEnd(40), ((performance.now() - t) / n * 1000).toFixed(1), 'µs'); };
const list = E.field('text', 'grommet', all);
const { live, bodyCode, makeCode, yearFrom, yearTo, photos, stamp } = E;
function make(years: number[], wantBody: number) {
  return (slot: number) => {
    if (live[slot] !== 1) return false;
    if (wantBody && bodyCode[slot] !== wantBody) return false;
    for (let i = 0; i < years.length; i++) if (yearFrom[slot] > years[i] || yearTo[slot] < years[i]) return false;
    return true;
  };
}
time('closure+push', () => { const p = make([], 0); const out: number[] = []; for (let i = 0; i < list.length; i++) if (stamp[list[i]] !== 7 && p(list[i])) out.push(list[i]); return out; });
time('closure count', () => { const p = make([], 0); let n = 0; for (let i = 0; i < list.length; i++) if (stamp[list[i]] !== 7 && p(list[i])) n++; return n; });
time('inline push', () => { const out: number[] = []; for (let i = 0; i < list.length; i++) { const s = list[i]; if (stamp[s] !== 7 && live[s] === 1) out.push(s); } return out; });
time('slice copy', () => list.slice());
time('Int32Array from', () => Int32Array.from(list));
console.log(typeof list[0], list.length, Object.getPrototypeOf(list) === Array.prototype);
const { getHeapStatistics } = await import('node:v8');
const filters = [{ q: 'grommet', body: 'sedan' as const, conditions: [{ measure: 'passenger-seat-height', op: 'gte' as const, mm: 90 }] }, { q: 'grommet', conditions: [] }];
for (const f of filters) time('engine.search ' + JSON.stringify(f).slice(0, 60), () => engine.search(f, { limit: 10, referenceYear: 2026 }));
time('fieldHas name grommet', () => E.fieldHas('name', 'grommet'));
time('10 hits', () => { for (let i = 0; i < 10; i++) E.hit(i + 1, [], ['grommet'], [], [], 1); });
{
  const filt = { q: 'grommet', body: 'sedan' as const, conditions: [{ measure: 'passenger-seat-height', op: 'gte' as const, mm: 90 }] };
  const listG = E.field('text', 'grommet', all);
  const bc = E.bodyCode, lv = E.live, mx = E.measureMax, st = E.stamp;
  time('manual filter loop', () => { let n = 0; for (let i = 0; i < listG.length; i++) { const s = listG[i]; if (st[s] !== 5 && lv[s] === 1 && bc[s] === 1 && mx[s * 11 + 5] >= 90) n++; } return n; });
  time('manual body only', () => { let n = 0; for (let i = 0; i < listG.length; i++) { const s = listG[i]; if (bc[s] === 1) n++; } return n; });
  time('manual stamp only', () => { let n = 0; for (let i = 0; i < listG.length; i++) { const s = listG[i]; if (st[s] !== 5) n++; } return n; });
  time('manual iterate only', () => { let n = 0; for (let i = 0; i < listG.length; i++) { n += listG[i]; } return n; });
  time('engine filter', () => engine.search(filt, { limit: 10, referenceYear: 2026 }));
}
{
  const listG = E.field('text', 'grommet', all);
  class F { live: Uint8Array; bodyCode: Uint8Array; mx: Float32Array; body: number; years: Int32Array; condAt: Int32Array; condMm: Float64Array; condAtLeast: Uint8Array; constructor() { this.live = E.live; this.bodyCode = E.bodyCode; this.mx = E.measureMax; this.body = 1; this.years = new Int32Array(0); this.condAt = Int32Array.from([5]); this.condMm = Float64Array.from([90]); this.condAtLeast = Uint8Array.from([1]); }
    test(slot: number) { if (this.live[slot] !== 1) return false; if (this.body !== 0 && this.bodyCode[slot] !== this.body) return false; const y = this.years; for (let i = 0; i < y.length; i++) return false; const c = this.condAt; for (let i = 0; i < c.length; i++) { if (this.condAtLeast[i] === 1 ? !(this.mx[slot * 11 + c[i]] >= this.condMm[i]) : false) return false; } return true; } }
  const st = E.stamp;
  time('class filter loop', () => { const f = new F(); let n = 0; for (let i = 0; i < listG.length; i++) { const s = listG[i]; if (st[s] !== 5 && f.test(s)) n++; } return n; });
  const t0 = performance.now(); for (let i = 0; i < 200; i++) (E as any).run(['grommet'], new Map([['grommet', false]]), [], { q: 'grommet', body: 'sedan', conditions: [{ measure: 'passenger-seat-height', op: 'gte', mm: 90 }] }, 10, 0); console.log('run only', ((performance.now() - t0) / 200 * 1000).toFixed(1));
}
{
(globalThis as any).TS = 0;
const filt = { q: 'grommet', body: 'sedan' as const, conditions: [{ measure: 'passenger-seat-height', op: 'gte' as const, mm: 90 }] };
const t0 = performance.now(); for (let i = 0; i < 200; i++) engine.search(filt, { limit: 10, referenceYear: 2026 });
console.log('search', ((performance.now() - t0) / 200 * 1000).toFixed(1), 'scan', ((globalThis as any).TS / 200 * 1000).toFixed(1), (globalThis as any).LN);
}
{
  const listG = E.field('text', 'grommet', all);
  const Mx = 11;
  function scan(list: readonly number[], f: any, stamp: Uint32Array, skip: number) {
    const { live, bodyCode, makeCode, yearFrom, yearTo, photoFlags, measureMin, measureMax, body, make, photos, years, condAt, condAtLeast, condMm } = f;
    const ny = years.length; const nc = condAt.length; let n = 0;
    next: for (let i = 0; i < list.length; i++) {
      const slot = list[i];
      if (stamp[slot] === skip || live[slot] !== 1) continue;
      if (body !== 0 && bodyCode[slot] !== body) continue;
      if (make !== 0 && makeCode[slot] !== make) continue;
      for (let k = 0; k < ny; k++) if (yearFrom[slot] > years[k] || yearTo[slot] < years[k]) continue next;
      if (photos && photoFlags[slot] !== 1) continue;
      for (let k = 0; k < nc; k++) { const at = condAt[k]; if (at < 0) continue next; if (condAtLeast[k] === 1 ? !(measureMax[slot * Mx + at] >= condMm[k]) : !(measureMin[slot * Mx + at] <= condMm[k])) continue next; }
      n++;
    }
    return n;
  }
  const f = { live: E.live, bodyCode: E.bodyCode, makeCode: E.makeCode, yearFrom: E.yearFrom, yearTo: E.yearTo, photoFlags: E.photos, measureMin: E.measureMin, measureMax: E.measureMax, body: 1, make: 0, photos: false, years: new Int32Array(0), condAt: Int32Array.from([5]), condAtLeast: Uint8Array.from([1]), condMm: Float64Array.from([90]) };
  time('copied scan', () => scan(listG, f, E.stamp, -1));
  time('copied scan skip 5', () => scan(listG, f, E.stamp, 5));
  const f2 = { ...f, condAt: new Int32Array(0), condAtLeast: new Uint8Array(0), condMm: new Float64Array(0) };
  time('copied scan no cond', () => scan(listG, f2, E.stamp, 5));
}
