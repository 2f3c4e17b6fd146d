import { FEED_KIND_NAMES, PASSAGE_KIND_NAMES, type FeedKind, type PassageKind } from './vocabulary';

// The sentence a list entry opens with in the search document, made of several of its fields.
// Named here, not written inline, so the written-out field tree can point at them.

type Entry = Readonly<Record<string, unknown>>;

export const SEARCH_LINES = {
	passage: (p: Entry) => `${PASSAGE_KIND_NAMES[p.kind as PassageKind] ?? ''}: ${p.location}`,
	wire: (w: Entry) => `${w.function} ${w.colour}`,
	speakerLocation: (s: Entry) => `${s.location} ${s.nominalSize}`,
	feed: (f: Entry) => `${f.name} (${(FEED_KIND_NAMES[f.kind as FeedKind] ?? '').toLowerCase()}) ${f.location}`
} as const;
