import type { ContentDraft } from '../../domain/content/formCodec';
import type { LengthUnit } from '../../domain/units';

/** What the editor keeps on the device while someone types: enough to open the form as it was. */
export interface KeptDraft {
	vehicleId: number;
	baseRevisionId: number;
	draft: ContentDraft;
	unit: LengthUnit;
	summary: string;
	/** ISO time it was last kept. */
	keptAt: string;
}

/** The part of the Web Storage interface the drafts need, so tests can hand in their own. */
export type DraftShelf = Pick<Storage, 'getItem' | 'setItem' | 'removeItem' | 'key' | 'length'>;

const PREFIX = 'kickpanel.draft.';
const pagePrefix = (vehicleId: number) => `${PREFIX}${vehicleId}.`;

/** One draft per page and base revision: a draft started from an older revision is kept apart. */
export const draftKey = (vehicleId: number, baseRevisionId: number) => `${pagePrefix(vehicleId)}${baseRevisionId}`;

function readKept(shelf: DraftShelf, key: string): KeptDraft | null {
	try {
		const raw = shelf.getItem(key);
		if (!raw) return null;
		const kept = JSON.parse(raw) as KeptDraft;
		return kept && typeof kept === 'object' && kept.draft && typeof kept.keptAt === 'string' ? kept : null;
	} catch {
		return null;
	}
}

/** Keeps the draft; a full or blocked storage only means nothing is kept, never a broken editor. */
export function keepDraft(shelf: DraftShelf, kept: KeptDraft): boolean {
	try {
		shelf.setItem(draftKey(kept.vehicleId, kept.baseRevisionId), JSON.stringify(kept));
		return true;
	} catch {
		return false;
	}
}

function pageKeys(shelf: DraftShelf, vehicleId: number): string[] {
	const keys: string[] = [];
	for (let i = 0; i < shelf.length; i++) {
		const key = shelf.key(i);
		if (key?.startsWith(pagePrefix(vehicleId))) keys.push(key);
	}
	return keys;
}

/**
 * The draft to offer back when the editor opens: the one started from this base revision, else the
 * newest one kept for the page (started from an older revision, so saving it merges with what changed).
 */
export function draftToOffer(shelf: DraftShelf, vehicleId: number, baseRevisionId: number): KeptDraft | null {
	const same = readKept(shelf, draftKey(vehicleId, baseRevisionId));
	if (same) return same;
	const older = pageKeys(shelf, vehicleId)
		.map((key) => readKept(shelf, key))
		.filter((k): k is KeptDraft => k !== null && k.baseRevisionId < baseRevisionId);
	older.sort((a, b) => b.keptAt.localeCompare(a.keptAt));
	return older[0] ?? null;
}

/** Forgets every draft kept for the page: after a save, or when the writer discards it. */
export function forgetDrafts(shelf: DraftShelf, vehicleId: number): void {
	try {
		for (const key of pageKeys(shelf, vehicleId)) shelf.removeItem(key);
	} catch {
		// Storage that cannot be read holds nothing to forget.
	}
}

/** Whether two editor states hold the same typed work (what decides "unsaved changes"). */
export const sameWork = (a: { draft: ContentDraft; summary: string }, b: { draft: ContentDraft; summary: string }) =>
	a.summary.trim() === b.summary.trim() && JSON.stringify(a.draft) === JSON.stringify(b.draft);
