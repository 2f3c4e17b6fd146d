import { render } from 'svelte/server';
import SectionBody from '$lib/components/vehicle/SectionBody.svelte';
import SectionNotes from '$lib/components/vehicle/SectionNotes.svelte';
import QuickFacts from '$lib/components/vehicle/QuickFacts.svelte';
import { sectionIsEmpty } from '$lib/components/vehicle/display';
import { SECTION_KEYS, type SectionKey } from '$lib/domain/content/schema';
import type { UnitSystem } from '$lib/domain/units';
import type { StoredRevision } from '../services/revisions';

export type VehicleBody = {
	/** Per section: its figures and tables, its notes, and whether anything is recorded at all. */
	sections: Record<SectionKey, { html: string; notes: string; empty: boolean }>;
	quickFacts: string;
	quickFactsColumns: string;
};

export type Outline = Record<SectionKey, { empty: boolean; notes: boolean }>;

/** A body with its outline: the same for every reader of one content in one unit system. */
export type RenderedBody = { body: VehicleBody; outline: Outline };

/** Renders a revision's figures, tables, notes and quick facts in one unit system. */
export function renderBody(revision: Pick<StoredRevision, 'content' | 'rendered'>, units: UnitSystem): RenderedBody {
	const { content, rendered } = revision;
	const sections = {} as VehicleBody['sections'];
	for (const section of SECTION_KEYS) {
		const empty = sectionIsEmpty(content, section) && !rendered[section] && !content.photos.some((p) => p.section === section);
		const notes = rendered[section];
		sections[section] = {
			html: empty ? '' : render(SectionBody, { props: { section, content, units } }).body,
			notes: notes ? render(SectionNotes, { props: { html: notes } }).body : '',
			empty
		};
	}
	const body: VehicleBody = {
		sections,
		quickFacts: render(QuickFacts, { props: { content, units } }).body,
		quickFactsColumns: render(QuickFacts, { props: { content, units, columns: true } }).body
	};
	const outline = Object.fromEntries(SECTION_KEYS.map((k) => [k, { empty: sections[k].empty, notes: sections[k].notes !== '' }])) as Outline;
	return { body, outline };
}

/** The named placeholders of a full page view and the HTML that fills each. */
export function bodyFragments(body: VehicleBody): Record<string, string> {
	const fragments: Record<string, string> = { 'quick-facts': body.quickFacts, 'quick-facts-columns': body.quickFactsColumns };
	for (const k of SECTION_KEYS) {
		fragments[`section-${k}`] = body.sections[k].html;
		fragments[`notes-${k}`] = body.sections[k].notes;
	}
	return fragments;
}

/** Client navigations get the body as data; a full page view gets it spliced into the HTML by the handle hook. */
export function deliverBody(locals: App.Locals, { body, outline }: RenderedBody, isDataRequest: boolean) {
	if (isDataRequest) return { outline, body };
	locals.fragments = bodyFragments(body);
	return { outline, body: null };
}

const MARK = '<div data-kp-fragment="';

/** Fills the empty fragment placeholders of a rendered page with their cached HTML, in one pass. */
export function spliceFragments(html: string, fragments: Record<string, string>): string {
	const parts: string[] = [];
	let from = 0;
	for (let at = html.indexOf(MARK); at !== -1; at = html.indexOf(MARK, from)) {
		const nameEnd = html.indexOf('"', at + MARK.length);
		const name = html.slice(at + MARK.length, nameEnd);
		const close = nameEnd + 2; // past `">`
		if (!(name in fragments) || !html.startsWith('</div>', close)) {
			parts.push(html.slice(from, close));
			from = close;
			continue;
		}
		parts.push(html.slice(from, close), fragments[name]);
		from = close;
	}
	parts.push(html.slice(from));
	return parts.join('');
}
