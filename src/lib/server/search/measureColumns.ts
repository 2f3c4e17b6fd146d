import type { VehicleContent } from '../../domain/content/schema';
import { MEASURE_PLACES, MEASUREMENTS, measurementByKey, toMicrometres, type MeasureCondition } from '../../domain/search/measurements';

const PLACES = MEASURE_PLACES.length;
/** Figures per entry of each place (a seat space has three). */
const WIDTHS = Int32Array.from(MEASURE_PLACES, (_, p) => MEASUREMENTS.filter((m) => m.place === p).length);
export const NOT_MEASURED = -1;

/** One place's conditions, read against one entry's figures. */
export type PlaceConditions = { place: number; column: Int32Array; atLeast: Uint8Array; um: Int32Array };

/**
 * Every slot's measured places, in whole micrometres (exact in an Int32Array, unlike single
 * precision): `pool[placeAt[slot * PLACES + p]]` is how many entries the page records of place p,
 * followed by each entry's figures (NOT_MEASURED where empty). A replaced page leaves its figures
 * behind; the live index's rebuild drops them with the retired slots.
 */
export class MeasureColumns {
	placeAt = new Uint32Array(0);
	pool = new Int32Array(1024);
	private used = 0;

	grow(capacity: number) {
		const fresh = new Uint32Array(capacity * PLACES);
		fresh.set(this.placeAt);
		this.placeAt = fresh;
	}

	put(slot: number, content: VehicleContent) {
		for (let p = 0; p < PLACES; p++) {
			const entries = MEASURE_PLACES[p].entries(content);
			this.reserve(1 + entries.length * WIDTHS[p]);
			this.placeAt[slot * PLACES + p] = this.used;
			this.pool[this.used++] = entries.length;
			for (const entry of entries) {
				for (let k = 0; k < WIDTHS[p]; k++) {
					const mm = entry[k];
					this.pool[this.used++] = mm === null || mm === undefined ? NOT_MEASURED : toMicrometres(mm);
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

/** Some entry of the place on this slot meets all its conditions. */
export function placeMeets(placeAt: Uint32Array, pool: Int32Array, slot: number, c: PlaceConditions): boolean {
	let at = placeAt[slot * PLACES + c.place];
	const n = pool[at++];
	const width = WIDTHS[c.place];
	for (let e = 0; e < n; e++, at += width) if (entryMeets(pool, at, c)) return true;
	return false;
}

/**
 * A query's measurement conditions grouped by place, so that conditions on one place are met by one
 * entry (the same seat space, the same passage). Null when a condition names no known measurement.
 */
export function groupByPlace(conditions: readonly MeasureCondition[]): PlaceConditions[] | null {
	const byPlace = new Map<number, { column: number; atLeast: number; um: number }[]>();
	for (const cond of conditions) {
		const m = measurementByKey.get(cond.measure);
		if (!m) return null;
		const list = byPlace.get(m.place) ?? [];
		list.push({ column: m.column, atLeast: cond.op === 'gte' ? 1 : 0, um: toMicrometres(cond.mm) });
		byPlace.set(m.place, list);
	}
	return [...byPlace].map(([place, list]) => ({
		place,
		column: Int32Array.from(list, (x) => x.column),
		atLeast: Uint8Array.from(list, (x) => x.atLeast),
		um: Int32Array.from(list, (x) => x.um)
	}));
}
