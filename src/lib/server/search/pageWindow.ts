// Only the requested page of results is kept or ordered: broad words match most pages, and copying
// or sorting tens of thousands of slots per keystroke would cost more than the search.

/** Counts matches and keeps only those that fall on the requested page of results. */
export class PageWindow {
	counted = 0;
	readonly slots: number[] = [];
	constructor(
		private readonly before: number,
		private readonly from: number,
		private readonly to: number
	) {}

	add(slot: number) {
		const at = this.before + this.counted++;
		if (at >= this.from && at < this.to) this.slots.push(slot);
	}

	addAll(list: readonly number[]) {
		const start = Math.max(0, this.from - this.before);
		const end = Math.max(start, this.to - this.before);
		for (let i = start; i < Math.min(end, list.length); i++) this.slots.push(list[i]);
		this.counted += list.length;
	}
}

/** The k smallest of many numbers, kept sorted: only the requested page of identity matches is ordered. */
export class SmallestKeys {
	private readonly keys: Float64Array;
	private n = 0;
	constructor(private readonly k: number) {
		this.keys = new Float64Array(Math.max(0, k));
	}

	offer(key: number) {
		const { keys, k } = this;
		if (k === 0 || (this.n === k && key >= keys[k - 1])) return;
		let lo = 0;
		let hi = this.n;
		while (lo < hi) {
			const mid = (lo + hi) >>> 1;
			if (keys[mid] < key) lo = mid + 1;
			else hi = mid;
		}
		keys.copyWithin(lo + 1, lo, Math.min(this.n, k - 1));
		keys[lo] = key;
		if (this.n < k) this.n++;
	}

	sorted(): Float64Array {
		return this.keys.subarray(0, this.n);
	}
}
