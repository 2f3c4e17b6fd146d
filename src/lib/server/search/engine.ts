import { Document } from 'flexsearch';
import { BODY_STYLE_NAMES, BODY_STYLES, SECTION_NAMES, type BodyStyle, type SectionKey, type VehicleContent } from '../../domain/content/schema';
import { slugify, vehicleTitle } from '../../domain/slug';
import { identityWords, noteWords, vehicleHeadline, type SearchSection } from '../../domain/search/document';
import { closestName, type Correction } from '../../domain/search/didYouMean';
import type { SearchFilters } from '../../domain/search/filters';
import { MEASUREMENTS, measurementByKey, measurementRanges, type MeasureCondition } from '../../domain/search/measurements';
import { parseSearchQuery } from '../../domain/search/query';
import { findSnippet, type Snippet } from '../../domain/search/snippet';
import { vinPatternMatches, vinPatternSpecificity } from '../../domain/search/vinPattern';
import { searchWords } from '../../domain/search/words';

/** One page as the index takes it: the latest revision's content. */
export type IndexInput = { id: number; slug: string; revisionId: number; content: VehicleContent };

export type SearchHit = {
	id: number;
	slug: string;
	revisionId: number;
	title: string;
	make: string;
	model: string;
	yearFrom: number;
	yearTo: number;
	body: BodyStyle;
	section: SectionKey;
	sectionName: string;
	snippet: string;
	highlights: [number, number][];
	score: number;
	/** Words that matched in the notes; the snippet is cut from the page text for these (see withNoteSnippet). */
	noteWords: string[];
};

export type SearchOutcome = {
	items: SearchHit[];
	total: number;
	/** Words read as slips for a known name ("tarm" → "tarn"). */
	corrections: Correction[];
	/** Model years the results were held to, typed or as filter. */
	years: number[];
};

export type VinCandidate = { id: number; slug: string; title: string; yearFrom: number; yearTo: number; body: BodyStyle; reason: 'vin-pattern' | 'decoded' };

type Entry = {
	id: number;
	slug: string;
	revisionId: number;
	make: string;
	model: string;
	yearFrom: number;
	yearTo: number;
	body: BodyStyle;
	aliases: readonly string[];
	makeKey: string;
	modelKey: string;
	aliasKeys: readonly string[];
	names: NameWords;
	vinPatterns: readonly string[];
	sortKey: string;
};

type FieldDoc = { id: number; name: string; text: string };
type FieldResult = { field: string; result: number[] }[];

const M = MEASUREMENTS.length;
const BODY_CODE = new Map(BODY_STYLES.map((b, i) => [b, i + 1]));
const NONE: readonly string[] = [];
const RANK_BITS = 2 ** 22;

// Text reaches FlexSearch already folded and split by searchWords (the same function reads queries),
// so FlexSearch only splits on spaces: both sides agree on every word, and building skips re-encoding.
const splitOnSpaces = (text: string) => text.split(' ');

/** A page's identity words; one object is shared by every page with the same make, model, aliases and body. */
type NameWords = { id: number; makeWords: readonly string[]; modelWords: readonly string[]; aliasWords: readonly string[]; bodyWords: readonly string[] };

// Plain loops: these run for every identity match of every keystroke.
function has(list: readonly string[], w: string): boolean {
	for (let i = 0; i < list.length; i++) if (list[i] === w) return true;
	return false;
}
function begins(list: readonly string[], w: string): boolean {
	for (let i = 0; i < list.length; i++) if (list[i].startsWith(w)) return true;
	return false;
}

/** The forward-tokenised name field's test: the word begins one of the page's identity words. */
const startsAWord = (n: NameWords, w: string) => begins(n.makeWords, w) || begins(n.modelWords, w) || begins(n.aliasWords, w) || begins(n.bodyWords, w);

/** Identity matches rank by how exactly each word names the car: model, then make, then another name. */
function identityScore(n: NameWords, named: string[]): number {
	let score = 100;
	for (let i = 0; i < named.length; i++) {
		const w = named[i];
		if (has(n.modelWords, w)) score += 30;
		else if (has(n.makeWords, w)) score += 20;
		else if (has(n.aliasWords, w)) score += 15;
		else if (begins(n.modelWords, w)) score += 8;
		else if (begins(n.makeWords, w)) score += 6;
		else if (begins(n.aliasWords, w)) score += 4;
	}
	return score;
}

type Columns = {
	live: Uint8Array;
	bodyCode: Uint8Array;
	makeCode: Uint16Array;
	yearFrom: Uint16Array;
	yearTo: Uint16Array;
	photos: Uint8Array;
	measureMin: Float32Array;
	measureMax: Float32Array;
};

/** One query's filters, read against the typed-array columns (scanSlots repeats test() inline for speed). */
class SlotFilter {
	readonly live: Uint8Array;
	readonly bodyCode: Uint8Array;
	readonly makeCode: Uint16Array;
	readonly yearFrom: Uint16Array;
	readonly yearTo: Uint16Array;
	readonly photoFlags: Uint8Array;
	readonly measureMin: Float32Array;
	readonly measureMax: Float32Array;
	readonly body: number;
	readonly make: number;
	readonly photos: boolean;
	readonly years: Int32Array;
	readonly condAt: Int32Array;
	readonly condAtLeast: Uint8Array;
	readonly condMm: Float64Array;
	/** No filter at all: every live slot passes. */
	readonly open: boolean;

	constructor(c: Columns, want: { make: number; body: number; photos: boolean; years: number[]; conditions: MeasureCondition[] }) {
		this.live = c.live;
		this.bodyCode = c.bodyCode;
		this.makeCode = c.makeCode;
		this.yearFrom = c.yearFrom;
		this.yearTo = c.yearTo;
		this.photoFlags = c.photos;
		this.measureMin = c.measureMin;
		this.measureMax = c.measureMax;
		this.body = want.body;
		this.make = want.make;
		this.photos = want.photos;
		this.years = Int32Array.from(want.years);
		this.condAt = Int32Array.from(want.conditions, (x) => measurementByKey.get(x.measure)?.index ?? -1);
		this.condAtLeast = Uint8Array.from(want.conditions, (x) => (x.op === 'gte' ? 1 : 0));
		this.condMm = Float64Array.from(want.conditions, (x) => x.mm);
		this.open = !want.body && !want.make && !want.photos && !want.years.length && !want.conditions.length;
	}

	test(slot: number): boolean {
		if (this.live[slot] !== 1) return false;
		if (this.body !== 0 && this.bodyCode[slot] !== this.body) return false;
		if (this.make !== 0 && this.makeCode[slot] !== this.make) return false;
		const years = this.years;
		for (let i = 0; i < years.length; i++) if (this.yearFrom[slot] > years[i] || this.yearTo[slot] < years[i]) return false;
		if (this.photos && this.photoFlags[slot] !== 1) return false;
		const condAt = this.condAt;
		for (let i = 0; i < condAt.length; i++) {
			const at = condAt[i];
			if (at < 0) return false;
			if (this.condAtLeast[i] === 1 ? !(this.measureMax[slot * M + at] >= this.condMm[i]) : !(this.measureMin[slot * M + at] <= this.condMm[i])) return false;
		}
		return true;
	}
}

/** Counts matches and keeps only those that fall on the requested page of results. */
class PageWindow {
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
class SmallestKeys {
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

/**
 * Passes every slot of `list` not stamped `skip` through the filter into the window. SlotFilter.test's
 * checks are written out on locals: this loop runs over tens of thousands of slots per query.
 */
function scanSlots(list: readonly number[], f: SlotFilter, page: PageWindow, stamp: Uint32Array, skip: number, allLive: boolean) {
	if (allLive && f.open && skip < 0) {
		// Nothing to leave out: the count is the list's length and the page a slice of it.
		page.addAll(list);
		return;
	}
	const { live, bodyCode, makeCode, yearFrom, yearTo, photoFlags, measureMin, measureMax, body, make, photos, years, condAt, condAtLeast, condMm } = f;
	const ny = years.length;
	const nc = condAt.length;
	next: for (let i = 0; i < list.length; i++) {
		const slot = list[i];
		if (stamp[slot] === skip || live[slot] !== 1) continue;
		if (body !== 0 && bodyCode[slot] !== body) continue;
		if (make !== 0 && makeCode[slot] !== make) continue;
		for (let k = 0; k < ny; k++) if (yearFrom[slot] > years[k] || yearTo[slot] < years[k]) continue next;
		if (photos && photoFlags[slot] !== 1) continue;
		for (let k = 0; k < nc; k++) {
			const at = condAt[k];
			if (at < 0) continue next;
			if (condAtLeast[k] === 1 ? !(measureMax[slot * M + at] >= condMm[k]) : !(measureMin[slot * M + at] <= condMm[k])) continue next;
		}
		page.add(slot);
	}
}

/**
 * The in-memory vehicle search: a FlexSearch document index with two fields — identity (make, model,
 * aliases, body; prefix-indexed and ranked first) and notes (every distinct word of the sections,
 * whole) — beside typed arrays for what is filtered rather than searched: years, make, body, photos
 * and measurements. It does no I/O; the live index in ./index.ts fills it from the database.
 *
 * A changed page takes a fresh slot and its old slot is retired rather than removed from FlexSearch:
 * removing scans the whole index, and FlexSearch's fast-update register would cost about half as much
 * memory again. Queries skip retired slots; the live index rebuilds once enough have piled up.
 * Page text is not held here (at 50,000 pages it would double the memory); snippets from the notes are
 * cut afterwards from the text the caller has (withNoteSnippet).
 */
export class VehicleSearchEngine {
	private doc = new Document<FieldDoc>({
		document: {
			id: 'id',
			index: [
				{ field: 'name', tokenize: 'forward', encode: splitOnSpaces, resolution: 9 },
				// Words are indexed once per page, so positions carry no rank; one slot keeps the lists whole.
				{ field: 'text', tokenize: 'strict', encode: splitOnSpaces, resolution: 1 }
			]
		}
	});
	private entries: (Entry | undefined)[] = [undefined];
	private slotOf = new Map<number, number>();
	private capacity = 0;
	private live = new Uint8Array(0);
	private yearFrom = new Uint16Array(0);
	private yearTo = new Uint16Array(0);
	private bodyCode = new Uint8Array(0);
	private makeCode = new Uint16Array(0);
	private photos = new Uint8Array(0);
	private measureMin = new Float32Array(0);
	private measureMax = new Float32Array(0);
	private stamp = new Uint32Array(0);
	private rank = new Uint32Array(0);
	private generation = 0;
	private makeCodes = new Map<string, number>();
	private makes = new Map<string, { name: string; pages: number }>();
	/** Identity words and how many pages use each: what "did you mean" may suggest. */
	private vocabulary = new Map<string, number>();
	/** Make and model names repeat across thousands of pages; one copy of each string and word list. */
	private strings = new Map<string, string>();
	private wordLists = new Map<string, readonly string[]>();
	private nameSets = new Map<string, NameWords>();
	/** Per query, the score of each name set already worked out (stamped with the query's generation). */
	private nameScoreGen = new Uint32Array(256);
	private nameScore = new Uint16Array(256);
	private titleOrder: number[] | null = null;
	private ranked = false;
	private retiredSlots = 0;

	/** Pages held. */
	get size(): number {
		return this.slotOf.size;
	}

	/** Slots of replaced pages still inside FlexSearch; the live index rebuilds when these pile up. */
	get retired(): number {
		return this.retiredSlots;
	}

	revisionOf(id: number): number | null {
		const slot = this.slotOf.get(id);
		return slot === undefined ? null : this.entries[slot]!.revisionId;
	}

	private intern(s: string): string {
		const known = this.strings.get(s);
		if (known !== undefined) return known;
		this.strings.set(s, s);
		return s;
	}

	private wordsOf(text: string): readonly string[] {
		let list = this.wordLists.get(text);
		if (!list) this.wordLists.set(text, (list = searchWords(text).map((w) => this.intern(w))));
		return list;
	}

	private namesOf(identity: VehicleContent['identity']): NameWords {
		const key = [identity.make, identity.model, identity.body, ...identity.aliases].join('\u0000');
		let names = this.nameSets.get(key);
		if (!names) {
			names = {
				id: this.nameSets.size,
				makeWords: this.wordsOf(identity.make),
				modelWords: this.wordsOf(identity.model),
				aliasWords: identity.aliases.length ? [...new Set(identity.aliases.flatMap((a) => this.wordsOf(a)))] : NONE,
				bodyWords: this.wordsOf(BODY_STYLE_NAMES[identity.body])
			};
			this.nameSets.set(key, names);
			if (names.id >= this.nameScoreGen.length) {
				const gen = new Uint32Array(this.nameScoreGen.length * 2);
				gen.set(this.nameScoreGen);
				this.nameScoreGen = gen;
				const score = new Uint16Array(this.nameScore.length * 2);
				score.set(this.nameScore);
				this.nameScore = score;
			}
		}
		return names;
	}

	private grow(slot: number) {
		if (slot < this.capacity) return;
		const next = Math.max(64, this.capacity * 2, slot + 1);
		const widen = <T extends Uint16Array | Uint8Array | Uint32Array | Float32Array>(old: T, fresh: T): T => {
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
		this.measureMin = widen(this.measureMin, new Float32Array(next * M).fill(NaN));
		this.measureMax = widen(this.measureMax, new Float32Array(next * M).fill(NaN));
		this.capacity = next;
	}

	private count(words: readonly string[], delta: number) {
		for (const w of new Set(words)) {
			const n = (this.vocabulary.get(w) ?? 0) + delta;
			if (n > 0) this.vocabulary.set(w, n);
			else this.vocabulary.delete(w);
		}
	}

	private retire(slot: number) {
		const old = this.entries[slot];
		if (!old) return;
		this.count([...old.names.makeWords, ...old.names.modelWords, ...old.names.aliasWords], -1);
		const make = this.makes.get(old.makeKey);
		if (make && --make.pages === 0) this.makes.delete(old.makeKey);
		if (this.titleOrder) {
			const at = this.titleIndex(old.sortKey);
			if (this.titleOrder[at] === slot) this.titleOrder.splice(at, 1);
			this.ranked = false;
		}
		this.entries[slot] = undefined;
		this.live[slot] = 0;
		this.slotOf.delete(old.id);
		this.retiredSlots++;
	}

	/** Many pages at once (the start-up build): the title order is sorted once when next needed, not kept up per page. */
	putMany(inputs: Iterable<IndexInput>): number {
		this.titleOrder = null;
		this.ranked = false;
		let changed = 0;
		for (const input of inputs) if (this.put(input)) changed++;
		return changed;
	}

	/** Sorts what putMany left unsorted, so the first query after a build does not pay for it. */
	warm(): void {
		this.byTitle();
	}

	/**
	 * Adds or replaces a page. An older revision than the one held is ignored, so a slow reader
	 * (the start-up build, a poll) can never undo a newer save.
	 */
	put(input: IndexInput): boolean {
		const existing = this.slotOf.get(input.id);
		if (existing !== undefined && this.entries[existing]!.revisionId >= input.revisionId) return false;
		const { identity } = input.content;
		const makeKey = this.intern(slugify(identity.make));
		const modelKey = this.intern(slugify(identity.model));
		const entry: Entry = {
			id: input.id,
			slug: input.slug,
			revisionId: input.revisionId,
			make: this.intern(identity.make),
			model: this.intern(identity.model),
			yearFrom: identity.yearFrom,
			yearTo: identity.yearTo,
			body: identity.body,
			aliases: identity.aliases.length ? identity.aliases.map((a) => this.intern(a)) : NONE,
			makeKey,
			modelKey,
			aliasKeys: identity.aliases.length ? identity.aliases.map((a) => this.intern(slugify(a))) : NONE,
			names: this.namesOf(identity),
			vinPatterns: identity.vinPatterns.length ? identity.vinPatterns : NONE,
			sortKey: `${makeKey} ${modelKey} ${identity.yearFrom} ${input.id}`
		};
		if (existing !== undefined) this.retire(existing);
		const slot = this.entries.length;
		this.grow(slot);
		this.entries.push(entry);
		this.slotOf.set(input.id, slot);
		this.live[slot] = 1;
		this.yearFrom[slot] = identity.yearFrom;
		this.yearTo[slot] = identity.yearTo;
		this.bodyCode[slot] = BODY_CODE.get(identity.body) ?? 0;
		let makeCode = this.makeCodes.get(makeKey);
		if (makeCode === undefined) this.makeCodes.set(makeKey, (makeCode = this.makeCodes.size + 1));
		this.makeCode[slot] = makeCode;
		const make = this.makes.get(makeKey);
		if (make) make.pages++;
		else this.makes.set(makeKey, { name: entry.make, pages: 1 });
		this.photos[slot] = input.content.photos.length > 0 ? 1 : 0;
		measurementRanges(input.content).forEach((r, i) => {
			this.measureMin[slot * M + i] = r.min;
			this.measureMax[slot * M + i] = r.max;
		});
		this.count([...entry.names.makeWords, ...entry.names.modelWords, ...entry.names.aliasWords], +1);
		// Each word once: whole-word matching needs no repeats, and the build and memory shrink by half.
		this.doc.add({ id: slot, name: identityWords(identity).join(' '), text: noteWords(input.content).join(' ') });
		if (this.titleOrder) {
			this.titleOrder.splice(this.titleIndex(entry.sortKey), 0, slot);
			this.ranked = false;
		}
		return true;
	}

	remove(id: number): void {
		const slot = this.slotOf.get(id);
		if (slot !== undefined) this.retire(slot);
	}

	private titleIndex(sortKey: string): number {
		const order = this.titleOrder!;
		let lo = 0;
		let hi = order.length;
		while (lo < hi) {
			const mid = (lo + hi) >>> 1;
			if (this.entries[order[mid]]!.sortKey < sortKey) lo = mid + 1;
			else hi = mid;
		}
		return lo;
	}

	/** Live slots by make, model, first year: the order of equal scores and of filter-only lists. */
	private byTitle(): number[] {
		if (!this.titleOrder) {
			this.titleOrder = [...this.slotOf.values()].sort((a, b) => {
				const ka = this.entries[a]!.sortKey;
				const kb = this.entries[b]!.sortKey;
				return ka < kb ? -1 : ka > kb ? 1 : 0;
			});
			this.ranked = false;
		}
		if (!this.ranked) {
			const order = this.titleOrder;
			for (let i = 0; i < order.length; i++) this.rank[order[i]] = i;
			this.ranked = true;
		}
		return this.titleOrder;
	}

	/** Slots matching a query in one field, best first; may include retired slots. Never mutate: FlexSearch's own list. */
	private field(field: 'name' | 'text', query: string, limit: number): readonly number[] {
		const found = this.doc.search(query, { index: field, limit: Math.max(1, limit) }) as unknown as FieldResult;
		return found.length ? found[0].result : [];
	}

	/** Whether some live page has the word in that field. */
	private fieldHas(field: 'name' | 'text', word: string): boolean {
		const slots = this.field(field, word, 1 + Math.min(this.retiredSlots, 1000));
		return slots.some((s) => this.live[s] === 1);
	}

	makeList(): { key: string; name: string; pages: number }[] {
		return [...this.makes].map(([key, m]) => ({ key, ...m })).sort((a, b) => a.name.localeCompare(b.name));
	}

	search(filters: SearchFilters, opts: { limit: number; offset?: number; referenceYear: number }): SearchOutcome {
		const parsed = parseSearchQuery(filters.q, opts.referenceYear);
		const corrections: Correction[] = [];
		const inName = new Map<string, boolean>();
		const words: string[] = [];
		for (const w of parsed.words) {
			if (inName.has(w)) continue;
			const named = this.fieldHas('name', w);
			if (named || this.fieldHas('text', w)) {
				inName.set(w, named);
				words.push(w);
				continue;
			}
			const to = closestName(w, this.vocabulary);
			if (to) corrections.push({ from: w, to });
			inName.set(to ?? w, !!to);
			words.push(to ?? w);
		}
		const years = [...parsed.years, ...(filters.year ? [filters.year] : [])];
		const limit = Math.max(0, opts.limit);
		const offset = Math.max(0, opts.offset ?? 0);
		if (parsed.shortYears.length) {
			const withShort = [...years, ...parsed.shortYears.map((s) => s.year)];
			const first = this.run(words, inName, withShort, filters, limit, offset);
			if (first.total > 0) return { ...first, corrections, years: withShort };
		}
		return { ...this.run(words, inName, years, filters, limit, offset), corrections, years };
	}

	private run(
		words: string[],
		inName: Map<string, boolean>,
		years: number[],
		filters: SearchFilters,
		limit: number,
		offset: number
	): { items: SearchHit[]; total: number } {
		const passes = new SlotFilter(this.columns(), {
			make: filters.make ? (this.makeCodes.get(slugify(filters.make)) ?? -1) : 0,
			body: filters.body ? (BODY_CODE.get(filters.body) ?? -1) : 0,
			photos: !!filters.photos,
			years,
			conditions: filters.conditions
		});

		const named = words.filter((w) => inName.get(w));
		const rest = words.filter((w) => !inName.get(w));
		const all = this.entries.length;
		this.byTitle();

		// Identity tier: every identity word in the name field, any other words in the notes. FlexSearch's own
		// AND would intersect long lists (every page of a make); the rarest word's list is checked instead.
		// Nothing here builds a list of every match: broad words match most pages, and copying tens of
		// thousands of slots per keystroke costs more than the search. Matches are counted; only the
		// requested page of them is kept.
		let aCount = 0;
		let aKeys: Float64Array = new Float64Array(0);
		let aGen = -1;
		if (named.length) {
			let list: readonly number[] = [];
			let rarest = '';
			for (const w of named) {
				const found = this.field('name', w, all);
				if (!rarest || found.length < list.length) [list, rarest] = [found, w];
			}
			const others = named.filter((w) => w !== rarest);
			const gen = rest.length && list.length ? this.mark(this.field('text', rest.join(' '), all)) : 0;
			const best = new SmallestKeys(offset + limit);
			const genA = this.nextGeneration();
			for (let i = 0; i < list.length; i++) {
				const slot = list[i];
				if ((gen && this.stamp[slot] !== gen) || !passes.test(slot)) continue;
				const e = this.entries[slot]!;
				if (others.length && !others.every((w) => startsAWord(e.names, w))) continue;
				this.stamp[slot] = genA;
				aCount++;
				// Pages of one model share their name words, so each set is scored once per query.
				const id = e.names.id;
				let score: number;
				if (this.nameScoreGen[id] === genA) score = this.nameScore[id];
				else {
					score = this.nameScore[id] = identityScore(e.names, named);
					this.nameScoreGen[id] = genA;
				}
				// Higher score first, then title order: one number compares both.
				best.offer((1000 - score) * RANK_BITS + this.rank[slot]);
			}
			aKeys = best.sorted();
			aGen = genA;
		}
		const order = this.titleOrder!;
		const slotOfKey = (k: number) => order[k % RANK_BITS];

		// Notes tier: every word in the notes, in FlexSearch's order, leaving out pages already listed.
		const page = new PageWindow(aCount, offset, offset + limit);
		const allLive = this.retiredSlots === 0;
		if (words.length) {
			scanSlots(this.field('text', words.join(' '), all), passes, page, this.stamp, aCount ? aGen : -1, allLive);
		} else {
			// The title order holds live slots only.
			scanSlots(order, passes, page, this.stamp, -1, true);
		}
		const bCount = page.counted;
		const windowB = page.slots;
		const pageEnd = offset + limit;

		const total = aCount + bCount;
		const items: SearchHit[] = [];
		const firstB = Math.max(offset, aCount);
		for (let i = offset; i < Math.min(total, pageEnd); i++) {
			if (i < aCount) {
				const k = aKeys[i];
				items.push(this.hit(slotOfKey(k), named, rest, years, filters.conditions, 1000 - Math.floor(k / RANK_BITS)));
			} else {
				const score = words.length ? Math.round((10 - (5 * (i - aCount)) / Math.max(1, bCount)) * 100) / 100 : 1;
				items.push(this.hit(windowB[i - firstB], [], words, years, filters.conditions, score));
			}
		}
		return { items, total };
	}

	private columns(): Columns {
		const { live, bodyCode, makeCode, yearFrom, yearTo, photos, measureMin, measureMax } = this;
		return { live, bodyCode, makeCode, yearFrom, yearTo, photos, measureMin, measureMax };
	}

	private nextGeneration(): number {
		if (this.generation >= 0xfffffffe) {
			this.stamp.fill(0);
			this.nameScoreGen.fill(0);
			this.generation = 0;
		}
		return ++this.generation;
	}

	private markSome(n: number, slotAt: (i: number) => number): number {
		const gen = this.nextGeneration();
		for (let i = 0; i < n; i++) this.stamp[slotAt(i)] = gen;
		return gen;
	}

	private mark(slots: readonly number[]): number {
		return this.markSome(slots.length, (i) => slots[i]);
	}

	private hit(slot: number, named: string[], textWords: string[], years: number[], conditions: MeasureCondition[], score: number): SearchHit {
		const e = this.entries[slot]!;
		const snippet = !named.length && !textWords.length && conditions.length ? this.conditionSnippet(slot, conditions) : this.headlineSnippet(e, named, years);
		return {
			id: e.id,
			slug: e.slug,
			revisionId: e.revisionId,
			title: vehicleTitle(e),
			make: e.make,
			model: e.model,
			yearFrom: e.yearFrom,
			yearTo: e.yearTo,
			body: e.body,
			section: snippet.section,
			sectionName: SECTION_NAMES[snippet.section],
			snippet: snippet.text,
			highlights: snippet.highlights,
			score,
			noteWords: textWords
		};
	}

	private headlineSnippet(e: Entry, named: string[], years: number[]): Snippet {
		const headline = vehicleHeadline(e);
		const found = named.length ? findSnippet([{ key: 'identity', text: headline }], named, 240) : null;
		const snippet: Snippet = found ?? { section: 'identity', text: headline, highlights: [] };
		if (years.length) {
			const range = e.yearFrom === e.yearTo ? `${e.yearFrom}` : `${e.yearFrom}–${e.yearTo}`;
			const at = snippet.text.indexOf(range);
			if (at >= 0) snippet.highlights = [...snippet.highlights, [at, at + range.length] as [number, number]].sort((a, b) => a[0] - b[0]);
		}
		return snippet;
	}

	private conditionSnippet(slot: number, conditions: MeasureCondition[]): Snippet {
		const highlights: [number, number][] = [];
		let text = '';
		for (const c of conditions) {
			const m = measurementByKey.get(c.measure);
			if (!m) continue;
			const value = c.op === 'gte' ? this.measureMax[slot * M + m.index] : this.measureMin[slot * M + m.index];
			if (text) text += ' · ';
			text += `${m.label}: `;
			const figure = `${Math.round(value * 10) / 10} mm`;
			highlights.push([text.length, text.length + figure.length]);
			text += figure;
		}
		const first = measurementByKey.get(conditions[0].measure);
		return { section: first?.section ?? 'identity', text, highlights };
	}

	/**
	 * Pages a VIN leads to: those whose VIN patterns fit it, and those named by the decoder's make and
	 * model (or an alias), kept to pages whose years include the VIN's model year when it is known.
	 */
	vinCandidates(vin: string, decoded: { make: string; model: string } | null, modelYear: number | null): VinCandidate[] {
		const decodedMake = decoded ? slugify(decoded.make) : '';
		const decodedModel = decoded ? slugify(decoded.model) : '';
		const decodedFull = decoded ? slugify(`${decoded.make} ${decoded.model}`) : '';
		const found: (VinCandidate & { weight: number; sortKey: string })[] = [];
		for (const e of this.entries) {
			if (!e) continue;
			if (modelYear !== null && (modelYear < e.yearFrom || modelYear > e.yearTo)) continue;
			const patterns = e.vinPatterns.filter((p) => vinPatternMatches(p, vin));
			const byName =
				!!decoded &&
				((e.makeKey === decodedMake && (e.modelKey === decodedModel || e.aliasKeys.includes(decodedModel))) ||
					e.aliasKeys.includes(decodedFull));
			if (!patterns.length && !byName) continue;
			const weight = (patterns.length ? 100 + Math.max(...patterns.map(vinPatternSpecificity)) : 0) + (byName ? 50 : 0);
			found.push({
				id: e.id,
				slug: e.slug,
				title: vehicleTitle(e),
				yearFrom: e.yearFrom,
				yearTo: e.yearTo,
				body: e.body,
				reason: patterns.length ? 'vin-pattern' : 'decoded',
				weight,
				sortKey: e.sortKey
			});
		}
		found.sort((a, b) => b.weight - a.weight || (a.sortKey < b.sortKey ? -1 : 1));
		return found.slice(0, 20).map(({ weight: _w, sortKey: _s, ...c }) => c);
	}
}

/**
 * Replaces a hit's identity snippet with a passage from the notes when notes words matched.
 * `sections` is the page's text (vehicleSearchSections of the same revision); without it the hit keeps its line.
 */
export function withNoteSnippet(hit: SearchHit, sections: SearchSection[] | null): SearchHit {
	if (!hit.noteWords.length || !sections) return hit;
	const found = findSnippet(sections, hit.noteWords);
	return found
		? { ...hit, section: found.section, sectionName: SECTION_NAMES[found.section], snippet: found.text, highlights: found.highlights }
		: hit;
}
