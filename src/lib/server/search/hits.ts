import { SECTION_NAMES } from '../../domain/content/schema';
import type { SearchSection } from '../../domain/search/document';
import { findSnippet, type Snippet } from '../../domain/search/snippet';
import { vehicleTitle } from '../../domain/slug';
import type { Entry, SearchHit } from './types';

/** A result line for a held page. */
export function toHit(e: Entry, snippet: Snippet, score: number, noteWords: string[]): SearchHit {
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
		noteWords
	};
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
