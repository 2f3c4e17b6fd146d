import { BODY_STYLE_NAMES, type VehicleContent } from '../../domain/content/schema';
import { identityScore, type NameWords } from '../../domain/search/nameScore';
import { searchWords } from '../../domain/search/words';

const NONE: readonly string[] = [];

/**
 * The names the search holds. Make and model names repeat across thousands of pages, so each string,
 * word list and set of identity words is kept once; the words are counted for the search's "Read as" correction.
 */
export class NameTable {
	private strings = new Map<string, string>();
	private wordLists = new Map<string, readonly string[]>();
	private sets = new Map<string, NameWords>();
	/** Identity words and how many pages use each: what a "Read as" correction may suggest. */
	readonly vocabulary = new Map<string, number>();
	/** Per query, the score of each name set already worked out (stamped with the query's generation). */
	private scoreGen = new Uint32Array(256);
	private scores = new Uint16Array(256);

	intern(s: string): string {
		const known = this.strings.get(s);
		if (known !== undefined) return known;
		this.strings.set(s, s);
		return s;
	}

	/** Interned copies, or one shared empty list. */
	internAll(list: readonly string[], map: (s: string) => string = (s) => s): readonly string[] {
		return list.length ? list.map((s) => this.intern(map(s))) : NONE;
	}

	private wordsOf(text: string): readonly string[] {
		let list = this.wordLists.get(text);
		if (!list) this.wordLists.set(text, (list = searchWords(text).map((w) => this.intern(w))));
		return list;
	}

	namesOf(identity: VehicleContent['identity']): NameWords {
		const key = [identity.make, identity.model, identity.body, ...identity.aliases].join('\u0000');
		let names = this.sets.get(key);
		if (!names) {
			names = {
				id: this.sets.size,
				makeWords: this.wordsOf(identity.make),
				modelWords: this.wordsOf(identity.model),
				aliasWords: identity.aliases.length ? [...new Set(identity.aliases.flatMap((a) => this.wordsOf(a)))] : NONE,
				bodyWords: this.wordsOf(BODY_STYLE_NAMES[identity.body])
			};
			this.sets.set(key, names);
			if (names.id >= this.scoreGen.length) {
				const gen = new Uint32Array(this.scoreGen.length * 2);
				gen.set(this.scoreGen);
				this.scoreGen = gen;
				const scores = new Uint16Array(this.scores.length * 2);
				scores.set(this.scores);
				this.scores = scores;
			}
		}
		return names;
	}

	/** A page came in (+1) or left (−1): its make, model and alias words count towards the vocabulary. */
	count(names: NameWords, delta: number) {
		for (const w of new Set([...names.makeWords, ...names.modelWords, ...names.aliasWords])) {
			const n = (this.vocabulary.get(w) ?? 0) + delta;
			if (n > 0) this.vocabulary.set(w, n);
			else this.vocabulary.delete(w);
		}
	}

	/** identityScore, worked out once per name set and query (pages of one model share their name words). */
	score(names: NameWords, named: string[], generation: number): number {
		const id = names.id;
		if (this.scoreGen[id] === generation) return this.scores[id];
		this.scoreGen[id] = generation;
		return (this.scores[id] = identityScore(names, named));
	}

	/** The query generation wrapped around: forget every stamp. */
	forgetScores() {
		this.scoreGen.fill(0);
	}
}
