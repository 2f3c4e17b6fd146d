import { BODY_STYLES } from '../../domain/content/schema';

/** Body styles as small numbers for the body column; 0 means "no filter". */
export const BODY_CODE = new Map(BODY_STYLES.map((b, i) => [b, i + 1]));

/**
 * What search filters rather than searches, one typed-array column per fact, indexed by slot: cheap
 * to scan tens of thousands of times per query. `stamp` marks slots seen by the current query
 * (compared with its generation), `rank` is each slot's place in title order.
 */
export class SlotColumns {
	capacity = 0;
	live = new Uint8Array(0);
	yearFrom = new Uint16Array(0);
	yearTo = new Uint16Array(0);
	bodyCode = new Uint8Array(0);
	makeCode = new Uint16Array(0);
	photos = new Uint8Array(0);
	stamp = new Uint32Array(0);
	rank = new Uint32Array(0);

	/** Room for `slot`; returns the new capacity when the columns grew, else null. */
	grow(slot: number): number | null {
		if (slot < this.capacity) return null;
		const next = Math.max(64, this.capacity * 2, slot + 1);
		const widen = <T extends Uint16Array | Uint8Array | Uint32Array>(old: T, fresh: T): T => {
			fresh.set(old);
			return fresh;
		};
		this.live = widen(this.live, new Uint8Array(next));
		this.yearFrom = widen(this.yearFrom, new Uint16Array(next));
		this.yearTo = widen(this.yearTo, new Uint16Array(next));
		this.bodyCode = widen(this.bodyCode, new Uint8Array(next));
		this.makeCode = widen(this.makeCode, new Uint16Array(next));
		this.photos = widen(this.photos, new Uint8Array(next));
		this.stamp = widen(this.stamp, new Uint32Array(next));
		this.rank = widen(this.rank, new Uint32Array(next));
		this.capacity = next;
		return next;
	}
}
