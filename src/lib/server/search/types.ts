import type { BodyStyle, SectionKey, VehicleContent } from '../../domain/content/schema';
import type { Correction } from '../../domain/search/didYouMean';
import type { NameWords } from '../../domain/search/nameScore';

/** One page as the index takes it: the latest revision's content. */
export type IndexInput = { id: number; slug: string; revisionId: number; content: VehicleContent };

/** One page as the index holds it, in its slot. */
export type Entry = {
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
