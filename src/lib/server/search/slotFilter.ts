import type { MeasureCondition } from '../../domain/search/measurements';
import type { SlotColumns } from './columns';
import { groupByPlace, placeMeets, type MeasureColumns, type PlaceConditions } from './measureColumns';
import type { PageWindow } from './pageWindow';

/** One query's filters, read against the typed-array columns (scanSlots repeats test() inline for speed). */
export class SlotFilter {
	readonly live: Uint8Array;
	readonly bodyCode: Uint8Array;
	readonly makeCode: Uint16Array;
	readonly yearFrom: Uint16Array;
	readonly yearTo: Uint16Array;
	readonly photoFlags: Uint8Array;
	readonly placeAt: Uint32Array;
	readonly pool: Int32Array;
	readonly body: number;
	readonly make: number;
	readonly photos: boolean;
	readonly years: Int32Array;
	/** Measurement conditions by place; null when one names no known measurement (nothing passes). */
	readonly places: PlaceConditions[] | null;
	/** No filter at all: every live slot passes. */
	readonly open: boolean;

	constructor(c: SlotColumns, m: MeasureColumns, want: { make: number; body: number; photos: boolean; years: number[]; conditions: MeasureCondition[] }) {
		this.live = c.live;
		this.bodyCode = c.bodyCode;
		this.makeCode = c.makeCode;
		this.yearFrom = c.yearFrom;
		this.yearTo = c.yearTo;
		this.photoFlags = c.photos;
		this.placeAt = m.placeAt;
		this.pool = m.pool;
		this.body = want.body;
		this.make = want.make;
		this.photos = want.photos;
		this.years = Int32Array.from(want.years);
		this.places = groupByPlace(want.conditions);
		this.open = !want.body && !want.make && !want.photos && !want.years.length && !want.conditions.length;
	}

	test(slot: number): boolean {
		if (this.live[slot] !== 1) return false;
		if (this.body !== 0 && this.bodyCode[slot] !== this.body) return false;
		if (this.make !== 0 && this.makeCode[slot] !== this.make) return false;
		const years = this.years;
		for (let i = 0; i < years.length; i++) if (this.yearFrom[slot] > years[i] || this.yearTo[slot] < years[i]) return false;
		if (this.photos && this.photoFlags[slot] !== 1) return false;
		const places = this.places;
		if (places === null) return false;
		for (let i = 0; i < places.length; i++) if (!placeMeets(this.placeAt, this.pool, slot, places[i])) return false;
		return true;
	}
}

/**
 * Passes every slot of `list` not stamped `skip` through the filter into the window. SlotFilter.test's
 * checks are written out on locals: this loop runs over tens of thousands of slots per query.
 */
export function scanSlots(list: readonly number[], f: SlotFilter, page: PageWindow, stamp: Uint32Array, skip: number, allLive: boolean) {
	if (allLive && f.open && skip < 0) {
		// Nothing to leave out: the count is the list's length and the page a slice of it.
		page.addAll(list);
		return;
	}
	const { live, bodyCode, makeCode, yearFrom, yearTo, photoFlags, placeAt, pool, body, make, photos, years, places } = f;
	if (places === null) return;
	const ny = years.length;
	const np = places.length;
	next: for (let i = 0; i < list.length; i++) {
		const slot = list[i];
		if (stamp[slot] === skip || live[slot] !== 1) continue;
		if (body !== 0 && bodyCode[slot] !== body) continue;
		if (make !== 0 && makeCode[slot] !== make) continue;
		for (let k = 0; k < ny; k++) if (yearFrom[slot] > years[k] || yearTo[slot] < years[k]) continue next;
		if (photos && photoFlags[slot] !== 1) continue;
		for (let k = 0; k < np; k++) if (!placeMeets(placeAt, pool, slot, places[k])) continue next;
		page.add(slot);
	}
}
