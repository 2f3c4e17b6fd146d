import { Document } from 'flexsearch';

type FieldDoc = { id: number; name: string; text: string };
type FieldResult = { field: string; result: number[] }[];
export type Field = 'name' | 'text';

// Text reaches FlexSearch already folded and split by searchWords (the same function reads queries),
// so FlexSearch only splits on spaces: both sides agree on every word, and building skips re-encoding.
const splitOnSpaces = (text: string) => text.split(' ');

/**
 * The words of every slot in two FlexSearch fields: identity (make, model, aliases, body;
 * prefix-indexed) and notes (every distinct word of the sections, whole). Slots are never removed
 * from it (removing scans the whole index); callers skip retired slots.
 */
export class FieldIndex {
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

	add(slot: number, nameWords: readonly string[], textWords: readonly string[]) {
		this.doc.add({ id: slot, name: nameWords.join(' '), text: textWords.join(' ') });
	}

	/** Slots matching a query in one field, best first; may include retired slots. Never mutate: FlexSearch's own list. */
	find(field: Field, query: string, limit: number): readonly number[] {
		const found = this.doc.search(query, { index: field, limit: Math.max(1, limit) }) as unknown as FieldResult;
		return found.length ? found[0].result : [];
	}
}
