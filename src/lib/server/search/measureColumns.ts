import type { VehicleContent } from '../../domain/content/schema';
import { MEASURE_PLACES, MEASUREMENTS, measurementByKey, toMicrometres, type MeasureCondition } from '../../domain/search/measurements';

const PLACES = MEASURE_PLACES.length;
const M = MEASUREMENTS.length;
const NOTHING_BELOW = 0x7fffffff;
/** Figures per entry of each place (a seat space has three), and the measurement each figure is. */
const WIDTHS = Int32Array.from(MEASURE_PLACES, (_, p) => MEASUREMENTS.filter((m) => m.place === p).length);
const MEASURE_AT: readonly Int32Array[] = MEASURE_PLACES.map((_, p) => {
	const at = new Int32Array(WIDTHS[p]);
	MEASUREMENTS.forEach((m, i) => {
		if (m.place === p) at[m.column] = i;
	});
	return at;
});
export const NOT_MEASURED = -1;

/** One place's conditions, read against one entry's figures. */
export type PlaceConditions = { place: number; column: Int32Array; atLeast: Uint8Array; um: Int32Array };

/** Conditions alone on their place, read against the largest and smallest figure of each measurement. */
export type SingleConditions = { measure: Int32Array; atLeast: Uint8Array; um: Int32Array };

/**
 * Every slot's measured places, in whole micrometres (exact in an Int32Array, unlike single
 * precision): `pool[placeAt[slot * PLACES + p]]` is how many entries the page records of place p,
 * followed by each entry's figures (NOT_MEASURED where empty); `high` and `low` hold each
 * measurement's largest and smallest figure. A replaced page leaves its figures behind in `pool`;
 * the live index's rebuild drops them with the retired slots.
 */
export class MeasureColumns {
	/** Largest and smallest figure of each measurement per slot (slot * M + measure): a condition alone on its place needs no more. */
	high = new Int32Array(0);
	low = new Int32Array(0);
	placeAt = new Uint32Array(0);
	pool = new Int32Array(1024);
	private used = 0;

	grow(capacity: number) {
		const placeAt = new Uint32Array(capacity * PLACES);
		placeAt.set(this.placeAt);
		this.placeAt = placeAt;
		const high = new Int32Array(capacity * M).fill(NOT_MEASURED);
		high.set(this.high);
		this.high = high;
		const low = new Int32Array(capacity * M).fill(NOTHING_BELOW);
		low.set(this.low);
		this.low = low;
	}

	put(slot: number, content: VehicleContent) {
		this.high.fill(NOT_MEASURED, slot * M, slot * M + M);
		this.low.fill(NOTHING_BELOW, slot * M, slot * M + M);
		for (let p = 0; p < PLACES; p++) {
			const entries = MEASURE_PLACES[p].entries(content);
			this.reserve(1 + entries.length * WIDTHS[p]);
			this.placeAt[slot * PLACES + p] = this.used;
			this.pool[this.used++] = entries.length;
			for (const entry of entries) {
				for (let k = 0; k < WIDTHS[p]; k++) {
					const mm = entry[k];
					const um = mm === null || mm === undefined ? NOT_MEASURED : toMicrometres(mm);
					this.pool[this.used++] = um;
					if (um === NOT_MEASURED) continue;
					const at = slot * M + MEASURE_AT[p][k];
					if (um > this.high[at]) this.high[at] = um;
					if (um < this.low[at]) this.low[at] = um;
				}
			}
		}
	}

	private reserve(n: number) {
		if (this.used + n <= this.pool.length) return;
		const fresh = new Int32Array(Math.max(this.pool.length * 2, this.used + n));
		fresh.set(this.pool);
		this.pool = fresh;
	}

	/**
	 * The entry of a place that meets all its conditions, as its offset in `pool`, or −1. Of several,
	 * the one furthest past the first condition (the largest for "at least"), as a person would quote it.
	 */
	bestEntry(slot: number, c: PlaceConditions): number {
		const pool = this.pool;
		let at = this.placeAt[slot * PLACES + c.place];
		const n = pool[at++];
		const width = WIDTHS[c.place];
		let best = -1;
		for (let e = 0; e < n; e++, at += width) {
			if (!entryMeets(pool, at, c)) continue;
			if (best < 0 || (c.atLeast[0] === 1 ? pool[at + c.column[0]] > pool[best + c.column[0]] : pool[at + c.column[0]] < pool[best + c.column[0]])) best = at;
		}
		return best;
	}
}


/** Every condition of the place holds on the entry whose figures start at `at`. */
export function entryMeets(pool: Int32Array, at: number, c: PlaceConditions): boolean {
	for (let k = 0; k < c.column.length; k++) {
		const v = pool[at + c.column[k]];
		if (v === NOT_MEASURED || (c.atLeast[k] === 1 ? v < c.um[k] : v > c.um[k])) return false;
	}
	return true;
}

/** Some entry of the place on this slot meets all its conditions (entryMeets written out: it runs per slot scanned). */
export function placeMeets(placeAt: Uint32Array, pool: Int32Array, slot: number, c: PlaceConditions): boolean {
	let at = placeAt[slot * PLACES + c.place];
	const n = pool[at++];
	const width = WIDTHS[c.place];
	const { column, atLeast, um } = c;
	const k = column.length;
	entries: for (let e = 0; e < n; e++, at += width) {
		for (let i = 0; i < k; i++) {
			const v = pool[at + column[i]];
			if (v === NOT_MEASURED || (atLeast[i] === 1 ? v < um[i] : v > um[i])) continue entries;
		}
		return true;
	}
	return false;
}

/**
 * A query's measurement conditions grouped by place, so that conditions on one place are met by one
 * entry (the same seat space, the same passage). A place with one condition is read from its
 * largest or smallest figure. Null when a condition names no known measurement.
 */
export function groupByPlace(conditions: readonly MeasureCondition[]): { single: SingleConditions; joint: PlaceConditions[]; places: PlaceConditions[] } | null {
	const byPlace = new Map<number, { measure: number; column: number; atLeast: number; um: number }[]>();
	for (const cond of conditions) {
		const m = measurementByKey.get(cond.measure);
		if (!m) return null;
		const list = byPlace.get(m.place) ?? [];
		list.push({ measure: m.index, column: m.column, atLeast: cond.op === 'gte' ? 1 : 0, um: toMicrometres(cond.mm) });
		byPlace.set(m.place, list);
	}
	const alone = [...byPlace.values()].filter((l) => l.length === 1).map((l) => l[0]);
	const places = [...byPlace].map(([place, list]) => ({
		place,
		column: Int32Array.from(list, (x) => x.column),
		atLeast: Uint8Array.from(list, (x) => x.atLeast),
		um: Int32Array.from(list, (x) => x.um)
	}));
	return {
		single: { measure: Int32Array.from(alone, (x) => x.measure), atLeast: Uint8Array.from(alone, (x) => x.atLeast), um: Int32Array.from(alone, (x) => x.um) },
		joint: places.filter((p) => p.column.length > 1),
		places
	};
}

/** Every condition alone on its place holds: at least → the largest figure does, at most → the smallest. */
export function singlesMeet(high: Int32Array, low: Int32Array, slot: number, c: SingleConditions): boolean {
	const { measure, atLeast, um } = c;
	for (let i = 0; i < measure.length; i++) {
		if (atLeast[i] === 1 ? !(high[slot * M + measure[i]] >= um[i]) : !(low[slot * M + measure[i]] <= um[i])) return false;
	}
	return true;
}
