import type { MeasureCondition } from '../../domain/search/measurements';
import type { SlotColumns } from './columns';
import { groupByPlace, placeMeets, singlesMeet, type MeasureColumns, type PlaceConditions, type SingleConditions } from './measureColumns';
import type { PageWindow } from './pageWindow';

/** One query's filters, read against the typed-array columns (scanSlots repeats test() inline for speed). */
export class SlotFilter {
	readonly live: Uint8Array;
	readonly bodyCode: Uint8Array;
	readonly makeCode: Uint16Array;
	readonly yearFrom: Uint16Array;
	readonly yearTo: Uint16Array;
	readonly photoFlags: Uint8Array;
	readonly high: Int32Array;
	readonly low: Int32Array;
	readonly placeAt: Uint32Array;
	readonly pool: Int32Array;
	readonly body: number;
	readonly make: number;
	readonly photos: boolean;
	readonly years: Int32Array;
	/** Measurement conditions alone on their place, and places with several (met by one entry). */
	readonly single: SingleConditions;
	readonly joint: PlaceConditions[];
	/** A condition names no known measurement: nothing passes. */
	readonly impossible: boolean;
	/** No filter at all: every live slot passes. */
	readonly open: boolean;

	constructor(c: SlotColumns, m: MeasureColumns, want: { make: number; body: number; photos: boolean; years: number[]; conditions: MeasureCondition[] }) {
		this.live = c.live;
		this.bodyCode = c.bodyCode;
		this.makeCode = c.makeCode;
		this.yearFrom = c.yearFrom;
		this.yearTo = c.yearTo;
		this.photoFlags = c.photos;
		this.high = m.high;
		this.low = m.low;
		this.placeAt = m.placeAt;
		this.pool = m.pool;
		this.body = want.body;
		this.make = want.make;
		this.photos = want.photos;
		this.years = Int32Array.from(want.years);
		const grouped = groupByPlace(want.conditions);
		this.impossible = grouped === null;
		this.single = grouped?.single ?? { measure: new Int32Array(0), atLeast: new Uint8Array(0), um: new Int32Array(0) };
		this.joint = grouped?.joint ?? [];
		this.open = !want.body && !want.make && !want.photos && !want.years.length && !want.conditions.length;
	}

	test(slot: number): boolean {
		if (this.live[slot] !== 1) return false;
		if (this.body !== 0 && this.bodyCode[slot] !== this.body) return false;
		if (this.make !== 0 && this.makeCode[slot] !== this.make) return false;
		const years = this.years;
		for (let i = 0; i < years.length; i++) if (this.yearFrom[slot] > years[i] || this.yearTo[slot] < years[i]) return false;
		if (this.photos && this.photoFlags[slot] !== 1) return false;
		if (this.impossible) return false;
		if (this.single.measure.length && !singlesMeet(this.high, this.low, slot, this.single)) return false;
		const joint = this.joint;
		for (let i = 0; i < joint.length; i++) if (!placeMeets(this.placeAt, this.pool, slot, joint[i])) return false;
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
	const { live, bodyCode, makeCode, yearFrom, yearTo, photoFlags, high, low, placeAt, pool, body, make, photos, years, single, joint } = f;
	if (f.impossible) return;
	const ny = years.length;
	const ns = single.measure.length;
	const nj = joint.length;
	next: for (let i = 0; i < list.length; i++) {
		const slot = list[i];
		if (stamp[slot] === skip || live[slot] !== 1) continue;
		if (body !== 0 && bodyCode[slot] !== body) continue;
		if (make !== 0 && makeCode[slot] !== make) continue;
		for (let k = 0; k < ny; k++) if (yearFrom[slot] > years[k] || yearTo[slot] < years[k]) continue next;
		if (photos && photoFlags[slot] !== 1) continue;
		if (ns !== 0 && !singlesMeet(high, low, slot, single)) continue;
		for (let k = 0; k < nj; k++) if (!placeMeets(placeAt, pool, slot, joint[k])) continue next;
		page.add(slot);
	}
}
