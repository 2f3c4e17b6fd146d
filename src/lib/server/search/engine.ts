import { slugify } from '../../domain/slug';
import { identityWords, noteWords } from '../../domain/search/document';
import { closestName, type Correction } from '../../domain/search/didYouMean';
import type { SearchFilters } from '../../domain/search/filters';
import { measurementByKey, type MeasureCondition } from '../../domain/search/measurements';
import { parseSearchQuery } from '../../domain/search/query';
import { figuresSnippet, headlineSnippet } from '../../domain/search/snippet';
import { startsAWord } from '../../domain/search/nameScore';
import { BODY_CODE, SlotColumns } from './columns';
import { FieldIndex, type Field } from './fieldIndex';
import { toHit } from './hits';
import { MeasureColumns, groupByPlace } from './measureColumns';
import { NameTable } from './names';
import { PageWindow, SmallestKeys } from './pageWindow';
import { scanSlots, SlotFilter } from './slotFilter';
import { TitleOrder } from './titleOrder';
import type { Entry, IndexInput, SearchHit, SearchOutcome, VinCandidate } from './types';
import { vinCandidates } from './vinCandidates';

const RANK_BITS = 2 ** 22;
const NO_PATTERNS: readonly string[] = [];

/**
 * The in-memory vehicle search: the words of every page in a FlexSearch field index (identity
 * words ranked first), beside typed-array columns for what is filtered rather than searched: years,
 * make, body, photos and measurements. It does no I/O; the live index in ./index.ts fills it.
 *
 * A changed page takes a fresh slot and its old slot is retired rather than removed from FlexSearch:
 * removing scans the whole index, and FlexSearch's fast-update register would cost about half as much
 * memory again. Queries skip retired slots; the live index rebuilds once enough have piled up.
 * Page text is not held here (at 50,000 pages it would double the memory); snippets from the notes are
 * cut afterwards from the text the caller has (withNoteSnippet).
 */
export class VehicleSearchEngine {
	private words = new FieldIndex();
	private entries: (Entry | undefined)[] = [undefined];
	private slotOf = new Map<number, number>();
	private cols = new SlotColumns();
	private measures = new MeasureColumns();
	private names = new NameTable();
	private titles = new TitleOrder((slot) => this.entries[slot]!.sortKey);
	private generation = 0;
	private makeCodes = new Map<string, number>();
	private makes = new Map<string, { name: string; pages: number }>();
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

	private retire(slot: number) {
		const old = this.entries[slot];
		if (!old) return;
		this.names.count(old.names, -1);
		const make = this.makes.get(old.makeKey);
		if (make && --make.pages === 0) this.makes.delete(old.makeKey);
		this.titles.remove(slot, old.sortKey);
		this.entries[slot] = undefined;
		this.cols.live[slot] = 0;
		this.slotOf.delete(old.id);
		this.retiredSlots++;
	}

	/** Many pages at once (the start-up build): the title order is sorted once when next needed, not kept up per page. */
	putMany(inputs: Iterable<IndexInput>): number {
		this.titles.forget();
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
		const names = this.names;
		const makeKey = names.intern(slugify(identity.make));
		const modelKey = names.intern(slugify(identity.model));
		const entry: Entry = {
			id: input.id,
			slug: input.slug,
			revisionId: input.revisionId,
			make: names.intern(identity.make),
			model: names.intern(identity.model),
			yearFrom: identity.yearFrom,
			yearTo: identity.yearTo,
			body: identity.body,
			aliases: names.internAll(identity.aliases),
			makeKey,
			modelKey,
			aliasKeys: names.internAll(identity.aliases, slugify),
			names: names.namesOf(identity),
			vinPatterns: identity.vinPatterns.length ? identity.vinPatterns : NO_PATTERNS,
			sortKey: `${makeKey} ${modelKey} ${identity.yearFrom} ${input.id}`
		};
		if (existing !== undefined) this.retire(existing);
		const slot = this.entries.length;
		const grown = this.cols.grow(slot);
		if (grown !== null) this.measures.grow(grown);
		this.entries.push(entry);
		this.slotOf.set(input.id, slot);
		const cols = this.cols;
		cols.live[slot] = 1;
		cols.yearFrom[slot] = identity.yearFrom;
		cols.yearTo[slot] = identity.yearTo;
		cols.bodyCode[slot] = BODY_CODE.get(identity.body) ?? 0;
		let makeCode = this.makeCodes.get(makeKey);
		if (makeCode === undefined) this.makeCodes.set(makeKey, (makeCode = this.makeCodes.size + 1));
		cols.makeCode[slot] = makeCode;
		const make = this.makes.get(makeKey);
		if (make) make.pages++;
		else this.makes.set(makeKey, { name: entry.make, pages: 1 });
		cols.photos[slot] = input.content.photos.length > 0 ? 1 : 0;
		this.measures.put(slot, input.content);
		names.count(entry.names, +1);
		// Each word once: whole-word matching needs no repeats, and the build and memory shrink by half.
		this.words.add(slot, identityWords(identity), noteWords(input.content));
		this.titles.insert(slot, entry.sortKey);
		return true;
	}

	remove(id: number): void {
		const slot = this.slotOf.get(id);
		if (slot !== undefined) this.retire(slot);
	}

	private byTitle(): number[] {
		return this.titles.slots(() => this.slotOf.values(), this.cols.rank);
	}

	/** Whether some live page has the word in that field. */
	private fieldHas(field: Field, word: string): boolean {
		const slots = this.words.find(field, word, 1 + Math.min(this.retiredSlots, 1000));
		return slots.some((s) => this.cols.live[s] === 1);
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
			const to = closestName(w, this.names.vocabulary);
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
		const passes = new SlotFilter(this.cols, this.measures, {
			make: filters.make ? (this.makeCodes.get(slugify(filters.make)) ?? -1) : 0,
			body: filters.body ? (BODY_CODE.get(filters.body) ?? -1) : 0,
			photos: !!filters.photos,
			years,
			conditions: filters.conditions
		});

		const named = words.filter((w) => inName.get(w));
		const rest = words.filter((w) => !inName.get(w));
		const all = this.entries.length;
		const order = this.byTitle();
		const { stamp, rank } = this.cols;

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
				const found = this.words.find('name', w, all);
				if (!rarest || found.length < list.length) [list, rarest] = [found, w];
			}
			const others = named.filter((w) => w !== rarest);
			const gen = rest.length && list.length ? this.mark(this.words.find('text', rest.join(' '), all)) : 0;
			const best = new SmallestKeys(offset + limit);
			const genA = this.nextGeneration();
			for (let i = 0; i < list.length; i++) {
				const slot = list[i];
				if ((gen && stamp[slot] !== gen) || !passes.test(slot)) continue;
				const e = this.entries[slot]!;
				if (others.length && !others.every((w) => startsAWord(e.names, w))) continue;
				stamp[slot] = genA;
				aCount++;
				const score = this.names.score(e.names, named, genA);
				// Higher score first, then title order: one number compares both.
				best.offer((1000 - score) * RANK_BITS + rank[slot]);
			}
			aKeys = best.sorted();
			aGen = genA;
		}
		const slotOfKey = (k: number) => order[k % RANK_BITS];

		// Notes tier: every word in the notes, in FlexSearch's order, leaving out pages already listed.
		const page = new PageWindow(aCount, offset, offset + limit);
		const allLive = this.retiredSlots === 0;
		if (words.length) {
			scanSlots(this.words.find('text', words.join(' '), all), passes, page, stamp, aCount ? aGen : -1, allLive);
		} else {
			// The title order holds live slots only.
			scanSlots(order, passes, page, stamp, -1, true);
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

	private nextGeneration(): number {
		if (this.generation >= 0xfffffffe) {
			this.cols.stamp.fill(0);
			this.names.forgetScores();
			this.generation = 0;
		}
		return ++this.generation;
	}

	private mark(slots: readonly number[]): number {
		const gen = this.nextGeneration();
		const stamp = this.cols.stamp;
		for (let i = 0; i < slots.length; i++) stamp[slots[i]] = gen;
		return gen;
	}

	private hit(slot: number, named: string[], textWords: string[], years: number[], conditions: MeasureCondition[], score: number): SearchHit {
		const e = this.entries[slot]!;
		const snippet =
			!named.length && !textWords.length && conditions.length ? this.figures(slot, conditions) : headlineSnippet(e, named, years);
		return toHit(e, snippet, score, textWords);
	}

	/** The filtered figures of the entry that met them: each place's conditions were met by one entry. */
	private figures(slot: number, conditions: MeasureCondition[]) {
		const figures: { label: string; mm: number }[] = [];
		const entryOf = new Map<number, number>();
		for (const c of groupByPlace(conditions)?.places ?? []) entryOf.set(c.place, this.measures.bestEntry(slot, c));
		for (const cond of conditions) {
			const m = measurementByKey.get(cond.measure);
			const at = m ? (entryOf.get(m.place) ?? -1) : -1;
			if (m && at >= 0) figures.push({ label: m.label, mm: this.measures.pool[at + m.column] / 1000 });
		}
		return figuresSnippet(figures, measurementByKey.get(conditions[0].measure)?.section ?? 'identity');
	}

	vinCandidates(vin: string, decoded: { make: string; model: string } | null, modelYear: number | null): VinCandidate[] {
		return vinCandidates(this.entries, vin, decoded, modelYear);
	}
}
