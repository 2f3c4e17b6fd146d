/**
 * Live slots in title order (make, model, first year): the order of equal scores and of filter-only
 * lists. Kept up page by page once sorted; a bulk load drops it and it is sorted once when next needed.
 */
export class TitleOrder {
	private order: number[] | null = null;
	private ranked = false;

	constructor(private readonly sortKeyOf: (slot: number) => string) {}

	forget() {
		this.order = null;
		this.ranked = false;
	}

	insert(slot: number, sortKey: string) {
		if (!this.order) return;
		this.order.splice(this.indexOf(sortKey), 0, slot);
		this.ranked = false;
	}

	remove(slot: number, sortKey: string) {
		if (!this.order) return;
		const at = this.indexOf(sortKey);
		if (this.order[at] === slot) this.order.splice(at, 1);
		this.ranked = false;
	}

	/** The order, sorted from `live` if it was dropped; each slot's position is written to `rank`. */
	slots(live: () => Iterable<number>, rank: Uint32Array): number[] {
		if (!this.order) {
			this.order = [...live()].sort((a, b) => {
				const ka = this.sortKeyOf(a);
				const kb = this.sortKeyOf(b);
				return ka < kb ? -1 : ka > kb ? 1 : 0;
			});
			this.ranked = false;
		}
		if (!this.ranked) {
			const order = this.order;
			for (let i = 0; i < order.length; i++) rank[order[i]] = i;
			this.ranked = true;
		}
		return this.order;
	}

	private indexOf(sortKey: string): number {
		const order = this.order!;
		let lo = 0;
		let hi = order.length;
		while (lo < hi) {
			const mid = (lo + hi) >>> 1;
			if (this.sortKeyOf(order[mid]) < sortKey) lo = mid + 1;
			else hi = mid;
		}
		return lo;
	}
}
