import type { SectionKey } from '../../domain/content/vocabulary';
import type { ChangeTally } from '../../domain/content/changeTally';

export type RevisionRow = {
	id: number;
	vehicleSlug?: string;
	vehicleTitle?: string;
	author: { id: number; name: string };
	summary: string;
	createdAt: string;
	sections: SectionKey[];
	/** What the revision changed against its parent; null for a new page or a hidden revision. */
	tally: ChangeTally | null;
	hidden: boolean;
	restoresRevisionId: number | null;
	parentId: number | null;
};

const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/** "3 fields · 1 note", or what a row without a count is. */
export function tallyWords(row: Pick<RevisionRow, 'tally' | 'parentId' | 'hidden'>): string {
	if (row.parentId === null) return 'New page';
	if (!row.tally) return '';
	const { fields, notes } = row.tally;
	const parts = [fields ? plural(fields, 'field', 'fields') : '', notes ? plural(notes, 'note', 'notes') : ''].filter(Boolean);
	return parts.join(' · ') || 'No field changes';
}
