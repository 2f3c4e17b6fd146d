// npm run bench:boot — the reverse boot query ("which vehicles take this box in the boot") over
// 50,000 invented boots: the typed-column BootSpaceIndex, checked against enclosureFit on every boot
// for a few boxes.
//   BENCH_VEHICLES  how many vehicles (default 50000)
//   BENCH_QUERIES   how many random boxes (default 500)
import { fmt, summarize, writeResults, seededRandom } from './lib';
import { BootSpaceIndex, checkedEnclosureFit, type BootSpace, type EnclosureBox, type LoadOpening } from '../../src/lib/domain/bootFit';
import { DEFAULT_CLEARANCE_MM, DEFAULT_TIGHT_MM } from '../../src/lib/domain/sizeRules';

const VEHICLES = Number(process.env.BENCH_VEHICLES ?? 50_000);
const QUERIES = Number(process.env.BENCH_QUERIES ?? 500);
const TARGET_P95_MS = 5;

const random = seededRandom(0x626f6f74);
const between = (lo: number, hi: number) => lo + random() * (hi - lo);
// Invented boots; about one figure in ten is not measured yet.
const figure = (lo: number, hi: number) => (random() < 0.1 ? null : Math.round(between(lo, hi)));

const boots: { space: BootSpace; opening: LoadOpening }[] = Array.from({ length: VEHICLES }, () => ({
	space: { l: figure(600, 1200), lTop: figure(400, 1000), w: figure(900, 1300), archW: figure(850, 1100), h: figure(380, 800) },
	opening: { w: figure(800, 1200), h: figure(350, 800) }
}));
const boxes: EnclosureBox[] = Array.from({ length: QUERIES }, () => {
	const l = Math.round(between(250, 600));
	return { l, w: Math.round(between(300, 950)), h: Math.round(between(250, 500)), lTop: random() < 0.3 ? Math.round(l * between(0.5, 0.9)) : null };
});

const index = new BootSpaceIndex(boots);
const scan = (box: EnclosureBox) => index.query(box, DEFAULT_CLEARANCE_MM, DEFAULT_TIGHT_MM).rows.length;

// The per-boot check is slow (it allocates its answer); a few boxes confirm the index agrees with it.
for (const box of boxes.slice(0, 5)) {
	let want = 0;
	for (const b of boots) {
		const v = checkedEnclosureFit(box, b.space, b.opening, DEFAULT_CLEARANCE_MM, DEFAULT_TIGHT_MM).verdict;
		if (v === 'fits' || v === 'tight') want++;
	}
	if (want !== scan(box)) throw new Error(`index and enclosureFit disagree for box ${JSON.stringify(box)}`);
}

for (let i = 0; i < 50; i++) scan(boxes[i % boxes.length]);
const ms: number[] = [];
let matched = 0;
for (const box of boxes) {
	const start = performance.now();
	matched += scan(box);
	ms.push(performance.now() - start);
}
const s = summarize(ms);
const results = { when: new Date().toISOString(), node: process.version, vehicles: VEHICLES, queries: QUERIES, meanMatchesPerQuery: Math.round(matched / QUERIES), targetP95Ms: TARGET_P95_MS, bootScan: s, meetsTarget: s.p95 <= TARGET_P95_MS };
writeResults('boot', results);
console.log(`\nReverse boot query: ${VEHICLES.toLocaleString('en')} boots, ${results.meanMatchesPerQuery.toLocaleString('en')} matches a query on average`);
console.log(`p50 ${fmt(s.p50)} · p95 ${fmt(s.p95)} · p99 ${fmt(s.p99)} · max ${fmt(s.max)}`);
console.log(`Target p95 ≤ ${TARGET_P95_MS} ms: ${results.meetsTarget ? 'met' : 'NOT met'} · bench-results/boot.json`);
