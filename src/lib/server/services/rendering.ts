import { SECTION_KEYS, type SectionKey, type VehicleContent } from '../../domain/content/schema';
import { renderMarkdown } from '../markdown';

export type RenderedNotes = Partial<Record<SectionKey, string>>;

/** Markdown notes of every section as safe HTML; done once when a revision is written, since revisions never change. */
export function renderNotes(content: VehicleContent): RenderedNotes {
	const out: RenderedNotes = {};
	for (const key of SECTION_KEYS) {
		const section = (content as Record<string, unknown>)[key] as { notes?: string } | undefined;
		if (section?.notes?.trim()) out[key] = renderMarkdown(section.notes);
	}
	return out;
}
