// npm run bench:fit — the reverse fit query ("which vehicles and seats take this box") over
// 50,000 invented vehicles × 3 seat spaces: the typed-array SeatSpaceIndex against a plain scan
// over an array of objects with the same rule, and against calling fitVerdict on every row.
//   BENCH_VEHICLES  how many vehicles (default 50000)
//   BENCH_QUERIES   how many random boxes (default 2000)
import { fmt, summarize, writeResults, seededRandom } from './lib';
import { DEFAULT_CLEARANCE_MM, DEFAULT_TIGHT_MM, fitVerdict, SeatSpaceIndex, verdictForRoom, type Box, type SeatSpaceRow } from '../../src/lib/domain/fit';

const VEHICLES = Number(process.env.BENCH_VEHICLES ?? 50_000);
const QUERIES = Number(process.env.BENCH_QUERIES ?? 2_000);
const SEATS = ['driver', 'passenger', 'rear'] as const;
const TARGET_P95_MS = 5;
// fitVerdict validates its input on every call, so a full pass is slow; a few queries show the gap.
const VERDICT_QUERIES = 20;

const random = seededRandom(0x66697421);
const between = (lo: number, hi: number) => lo + random() * (hi - lo);
// Invented seat spaces; about one in ten figures is not measured yet.
const figure = (lo: number, hi: number) => (random() < 0.1 ? null : Math.round(between(lo, hi)));

const rows: SeatSpaceRow[] = [];
for (let v = 0; v < VEHICLES; v++) {
	for (const seat of SEATS) {
		rows.push(seat === 'rear' ? { vehicleIndex: v, seat, l: figure(400, 900), w: figure(250, 500), h: figure(50, 200) } : { vehicleIndex: v, seat, l: figure(350, 600), w: figure(250, 450), h: figure(50, 130) });
	}
}
const boxes: Box[] = Array.from({ length: QUERIES }, () => ({ l: Math.round(between(120, 450)), w: Math.round(between(80, 350)), h: Math.round(between(30, 120)) }));

const t0 = performance.now();
const index = new SeatSpaceIndex(rows);
const buildMs = performance.now() - t0;
const indexBytes = index.vehicleIndex.byteLength + index.seatCode.byteLength + index.l.byteLength + index.w.byteLength + index.h.byteLength;

type Plain = { vehicleIndex: number; seat: string; l: number; w: number; h: number };
const plain: Plain[] = rows.map((r) => ({ vehicleIndex: r.vehicleIndex, seat: r.seat, l: r.l ?? NaN, w: r.w ?? NaN, h: r.h ?? NaN }));

/** The same rule as the index, over objects: turn on the floor, height stays vertical. */
function plainScan(box: Box, c = DEFAULT_CLEARANCE_MM, tightMm = DEFAULT_TIGHT_MM): { rows: number[]; tight: number[] } {
	const bl = box.l + c;
	const bw = box.w + c;
	const bh = box.h + c;
	const hits: number[] = [];
	const tight: number[] = [];
	for (let i = 0; i < plain.length; i++) {
		const r = plain[i];
		const m = Math.min(Math.max(Math.min(r.l - bl, r.w - bw), Math.min(r.l - bw, r.w - bl)), r.h - bh);
		const verdict = m === m ? verdictForRoom(m, tightMm) : 'no-fit';
		if (verdict !== 'no-fit') {
			hits.push(i);
			tight.push(verdict === 'tight' ? 1 : 0);
		}
	}
	return { rows: hits, tight };
}

function verdictScan(box: Box): number[] {
	const hits: number[] = [];
	for (let i = 0; i < rows.length; i++) {
		const v = fitVerdict(box, index.space(i)).verdict;
		if (v === 'fits' || v === 'tight') hits.push(i);
	}
	return hits;
}

function time<T>(run: () => T): { ms: number; result: T } {
	const start = performance.now();
	const result = run();
	return { ms: performance.now() - start, result };
}

// Warm both loops so the JIT has compiled them before timing.
for (let i = 0; i < 50; i++) {
	index.query(boxes[i % boxes.length]);
	plainScan(boxes[i % boxes.length]);
}

// Interleaved, so both see the same machine load; every answer is checked against the other.
const indexMs: number[] = [];
const plainMs: number[] = [];
let matched = 0;
for (const box of boxes) {
	const a = time(() => index.query(box));
	const b = time(() => plainScan(box));
	indexMs.push(a.ms);
	plainMs.push(b.ms);
	if (a.result.rows.length !== b.result.rows.length || a.result.rows.some((r, i) => r !== b.result.rows[i] || a.result.tight[i] !== b.result.tight[i])) {
		throw new Error(`index and plain scan disagree for box ${JSON.stringify(box)}`);
	}
	matched += a.result.rows.length;
}
const verdictMs: number[] = [];
for (const box of boxes.slice(0, VERDICT_QUERIES)) {
	const c = time(() => verdictScan(box));
	verdictMs.push(c.ms);
	if (c.result.length !== index.query(box).rows.length) throw new Error(`fitVerdict and the index disagree for box ${JSON.stringify(box)}`);
}

const idx = summarize(indexMs);
const pln = summarize(plainMs);
const vrd = summarize(verdictMs);
const results = {
	when: new Date().toISOString(),
	node: process.version,
	vehicles: VEHICLES,
	seatSpaces: rows.length,
	queries: QUERIES,
	meanMatchesPerQuery: Math.round(matched / QUERIES),
	buildMs: Number(buildMs.toFixed(1)),
	indexBytes,
	targetP95Ms: TARGET_P95_MS,
	seatSpaceIndex: idx,
	plainObjectScan: pln,
	fitVerdictPerRow: vrd,
	speedupP50: Number((pln.p50 / idx.p50).toFixed(2)),
	meetsTarget: idx.p95 <= TARGET_P95_MS
};
writeResults('fit', results);

const line = (name: string, s: ReturnType<typeof summarize>) =>
	`${name.padEnd(28)}${String(s.n).padStart(6)}  ${fmt(s.p50).padStart(9)}  ${fmt(s.p95).padStart(9)}  ${fmt(s.p99).padStart(9)}  ${fmt(s.max).padStart(9)}`;
console.log(`\nReverse fit query: ${VEHICLES.toLocaleString('en')} vehicles × ${SEATS.length} seats = ${rows.length.toLocaleString('en')} spaces, ${results.meanMatchesPerQuery.toLocaleString('en')} matches a query on average`);
console.log(`Index built in ${fmt(buildMs)}, ${(indexBytes / 1024 / 1024).toFixed(1)} MB of typed arrays\n`);
console.log(`${'method'.padEnd(28)}${'runs'.padStart(6)}  ${'p50'.padStart(9)}  ${'p95'.padStart(9)}  ${'p99'.padStart(9)}  ${'max'.padStart(9)}`);
console.log(line('SeatSpaceIndex.query', idx));
console.log(line('plain array-of-objects scan', pln));
console.log(line('fitVerdict on every row', vrd));
console.log(`\nTarget p95 ≤ ${TARGET_P95_MS} ms: ${results.meetsTarget ? 'met' : 'NOT met'} · index ${results.speedupP50}× the plain scan at p50 · bench-results/fit.json`);
