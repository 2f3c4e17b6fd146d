import type { Transaction } from 'sequelize';
import { SECTION_KEYS, type SectionKey, type VehicleContent } from '../../domain/content/schema';
import { RenderedNotesRow } from '../db/models';
import { renderMarkdown } from '../markdown';

export type RenderedNotes = Partial<Record<SectionKey, string>>;

/**
 * Which renderer made a stored rendering. Raise it whenever the HTML for the same Markdown changes
 * (markdown.ts, its sanitizer rules, or renderNotes): every revision's notes are then rendered again on first read.
 */
export const NOTES_RENDERER_VERSION = 2;

/** Markdown notes of every section as safe HTML. */
export function renderNotes(content: VehicleContent): RenderedNotes {
	const out: RenderedNotes = {};
	for (const key of SECTION_KEYS) {
		const section = (content as Record<string, unknown>)[key] as { notes?: string } | undefined;
		if (section?.notes?.trim()) out[key] = renderMarkdown(section.notes);
	}
	return out;
}

/** Renders and keeps the notes of a content (by its sha256) for this renderer; an existing row is left as it is. */
export async function storeRenderedNotes(sha256: string, content: VehicleContent, transaction?: Transaction): Promise<RenderedNotes> {
	const notes = renderNotes(content);
	await RenderedNotesRow.bulkCreate([{ sha256, rendererVersion: NOTES_RENDERER_VERSION, notes: JSON.stringify(notes) }], {
		ignoreDuplicates: true,
		transaction
	});
	return notes;
}

/** Renders and keeps the notes unless this content already has them from this renderer (a restore, an undone edit). */
export async function ensureRenderedNotes(sha256: string, content: VehicleContent, transaction?: Transaction): Promise<void> {
	const kept = await RenderedNotesRow.findOne({ where: { sha256, rendererVersion: NOTES_RENDERER_VERSION }, attributes: ['sha256'], transaction });
	if (!kept) await storeRenderedNotes(sha256, content, transaction);
}
