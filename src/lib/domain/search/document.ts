import { fieldName, type FieldNode, type FieldTree, type LeafNode } from '../content/fieldTree';
import type { Identity, VehicleContent } from '../content/schema';
import { VEHICLE_FIELDS } from '../content/vehicleFields';
import { BODY_STYLE_NAMES, type SectionKey } from '../content/vocabulary';
import { vehicleTitle } from '../slug';
import { plainText, searchWords } from './words';

export type SearchSection = { key: SectionKey; text: string };

/**
 * One piece of a section: free text, or a labelled value. Labels ("Avoid", "Tools") are shown in
 * snippets but not indexed, so a word every page carries as a label does not match every page.
 */
type Part = string | readonly [label: string, value: string | null];
type Markdown = { markdown: string };
type Parts = (Part | Markdown)[];

const UNIT_OF: Partial<Record<string, string>> = { mm: 'mm', m: 'm', ohm: 'Ω', amp: 'A' };

/** A value as the search document writes it; null when there is none. */
function valueText(leaf: LeafNode, value: unknown, lowerCase: boolean): string | null {
	if (value === null || value === undefined || value === '') return null;
	const { kind, choices } = leaf.info;
	let text = String(value);
	if (kind === 'choice') text = choices?.[text] ?? text;
	else if (kind === 'flag') text = value === true ? 'yes' : 'no';
	else if (UNIT_OF[kind]) text = `${text} ${UNIT_OF[kind]}`;
	return lowerCase ? text.toLowerCase() : text;
}

// Written text (text, lists, notes) and ticked boxes are searched unless the field says otherwise;
// figures and choices only where the field gives them a label.
function leafParts(leaf: LeafNode, value: unknown, out: Parts): void {
	const hint = leaf.info.search;
	if (hint === false) return;
	const kind = leaf.info.kind;
	if (hint) {
		const items = kind === 'textList' && Array.isArray(value) ? value : [value];
		for (const item of items) out.push([hint.label, valueText(leaf, item, !!hint.lowerCase)]);
		return;
	}
	if (kind === 'markdown') out.push({ markdown: typeof value === 'string' ? value : '' });
	else if (kind === 'textList') out.push(...(Array.isArray(value) ? value.map(String) : []));
	else if (kind === 'text') out.push(typeof value === 'string' ? value : '');
	else if (kind === 'flag' && value === true) out.push(fieldName(leaf.info));
}

function nodeParts(node: FieldNode, value: unknown, out: Parts): void {
	if (node.type === 'field') return leafParts(node, value, out);
	if (node.type === 'list') {
		for (const entry of Array.isArray(value) ? value : []) {
			if (node.info.searchLine) out.push(node.info.searchLine(entry));
			nodeParts(node.entry, entry, out);
		}
		return;
	}
	const v = (value ?? {}) as Record<string, unknown>;
	for (const child of node.children) nodeParts(child, v[child.key], out);
}

function sectionParts(content: VehicleContent, fields: FieldTree): { key: SectionKey; parts: Parts }[] {
	const page = content as unknown as Record<string, unknown>;
	return fields.sections.map((section) => {
		const parts: Parts = [];
		nodeParts(section, page[section.key], parts);
		for (const photo of content.photos) if (photo.section === section.key) parts.push(photo.caption);
		return { key: section.key as SectionKey, parts };
	});
}

const sentence = (text: string) => {
	const t = text.trim();
	return !t ? '' : /[.!?:;]$/.test(t) ? t : `${t}.`;
};

function shown(part: Part | Markdown): string {
	if (typeof part === 'string') return sentence(part);
	if ('markdown' in part) return part.markdown ? plainText(part.markdown) : '';
	const [label, value] = part;
	return value === null || value === '' ? '' : sentence(`${label}: ${value}`);
}

/** Plain text of every section that has any, in page order: what snippets are cut from. */
export function vehicleSearchSections(content: VehicleContent, fields: FieldTree = VEHICLE_FIELDS): SearchSection[] {
	return sectionParts(content, fields)
		.map(({ key, parts }) => ({ key, text: parts.map(shown).filter(Boolean).join(' ') }))
		.filter((s) => s.text.length > 0);
}

/** The identity line shown when a page matched by name, make or years. */
export function vehicleHeadline(
	identity: Pick<Identity, 'make' | 'model' | 'yearFrom' | 'yearTo' | 'body'> & { aliases: readonly string[] }
): string {
	const line = `${vehicleTitle(identity)}, ${BODY_STYLE_NAMES[identity.body].toLowerCase()}.`;
	return identity.aliases.length ? `${line} Also sold as ${identity.aliases.join(', ')}.` : line;
}

/** Identity words: make, model, aliases, body style — the field weighted above the notes. */
export function identityWords(identity: Pick<Identity, 'make' | 'model' | 'aliases' | 'body'>): string[] {
	const seen = new Set<string>();
	for (const t of [identity.make, identity.model, ...identity.aliases, BODY_STYLE_NAMES[identity.body]]) {
		for (const w of searchWords(t)) seen.add(w);
	}
	return [...seen];
}

/**
 * Every distinct word of the section values (not their labels), for the notes field. Skips the
 * snippet text's Markdown reading: it runs for every page at start-up.
 */
export function noteWords(content: VehicleContent, fields: FieldTree = VEHICLE_FIELDS): string[] {
	const seen = new Set<string>();
	const add = (text: string | null | undefined) => {
		if (text) for (const w of searchWords(text)) seen.add(w);
	};
	for (const { parts } of sectionParts(content, fields)) {
		for (const part of parts) {
			if (typeof part === 'string') add(part);
			else if ('markdown' in part) add(part.markdown.includes('](') ? part.markdown.replace(/\]\([^)]*\)/g, ']') : part.markdown);
			else add(part[1]);
		}
	}
	return [...seen];
}
