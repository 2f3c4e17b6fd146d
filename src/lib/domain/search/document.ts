import {
	BATTERY_LOCATION_NAMES,
	BODY_STYLE_NAMES,
	DASH_OPENING_NAMES,
	FEED_KIND_NAMES,
	PASSAGE_KIND_NAMES,
	SEAT_NAMES,
	type Identity,
	type SectionKey,
	type VehicleContent
} from '../content/schema';
import { vehicleTitle } from '../slug';
import { plainText, searchWords } from './words';

export type SearchSection = { key: SectionKey; text: string };

/**
 * One piece of a section: free text, or a labelled value. Labels ("Avoid", "Tools") are shown in
 * snippets but not indexed, so a word every page carries as a label does not match every page.
 */
type Part = string | readonly [label: string, value: string | number | null];
type Markdown = { markdown: string };

const BOARD_NEEDED = 'Mounting board needed';

function sectionParts(content: VehicleContent): { key: SectionKey; parts: (Part | Markdown)[] }[] {
	const { identity, power, firewall, seats, dash, harness, speakers, camera, removal } = content;
	const captions = (key: SectionKey) => content.photos.filter((p) => p.section === key).map((p) => p.caption);
	return [
		{ key: 'identity', parts: [identity.market, { markdown: identity.notes }, ...captions('identity')] },
		{
			key: 'power',
			parts: [
				['Battery', power.batteryLocation ? BATTERY_LOCATION_NAMES[power.batteryLocation].toLowerCase() : null],
				...power.runs.map((r) => ['Run to', r.to] as const),
				...power.groundPoints.flatMap((g) => [['Ground', g.location] as const, g.notes]),
				['Fuse holder', power.fuseHolderSpot],
				{ markdown: power.notes },
				...captions('power')
			]
		},
		{
			key: 'firewall',
			parts: [
				...firewall.passages.flatMap((p) => [
					`${PASSAGE_KIND_NAMES[p.kind]}: ${p.location}`,
					['Hole', p.holeMm === null ? null : `${p.holeMm} mm`] as const,
					['Avoid', p.avoid] as const,
					['Tools', p.tools] as const
				]),
				{ markdown: firewall.notes },
				...captions('firewall')
			]
		},
		{
			key: 'seats',
			parts: [
				...seats.spaces.flatMap((s) => [
					['Seat', SEAT_NAMES[s.seat]] as const,
					s.obstacles,
					s.travelNotes,
					s.boardNeeded ? BOARD_NEEDED : ''
				]),
				{ markdown: seats.notes },
				...captions('seats')
			]
		},
		{
			key: 'dash',
			parts: [
				['Opening', dash.opening ? DASH_OPENING_NAMES[dash.opening] : null],
				['Kit', dash.kit],
				...dash.trimSteps,
				...dash.featuresKept,
				{ markdown: dash.notes },
				...captions('dash')
			]
		},
		{
			key: 'harness',
			parts: [
				harness.connectors,
				...harness.wires.flatMap((w) => [`${w.function} ${w.colour}`, ['Pin', w.pin] as const]),
				['Reverse trigger', harness.reverseTrigger],
				['Illumination', harness.illumination],
				harness.can,
				...harness.ladder.lines.flatMap((l) => l.buttons.map((b) => b.name)),
				{ markdown: harness.notes },
				...captions('harness')
			]
		},
		{
			key: 'speakers',
			parts: [
				...speakers.locations.flatMap((s) => [`${s.location} ${s.nominalSize}`, s.grille]),
				{ markdown: speakers.notes },
				...captions('speakers')
			]
		},
		{
			key: 'camera',
			parts: [
				['Camera', camera.mounting],
				['Trigger', camera.triggerSource],
				...camera.feeds.map((f) => `${f.name} (${FEED_KIND_NAMES[f.kind].toLowerCase()}) ${f.location}`),
				{ markdown: camera.notes },
				...captions('camera')
			]
		},
		{
			key: 'removal',
			parts: [...removal.steps, ...removal.surprises, { markdown: removal.notes }, ...captions('removal')]
		}
	];
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
export function vehicleSearchSections(content: VehicleContent): SearchSection[] {
	return sectionParts(content)
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
 * Every distinct word of the section values (not their labels), for the notes field. Walks the page
 * directly rather than through the snippet text: it runs for every page at start-up.
 */
export function noteWords(content: VehicleContent): string[] {
	const seen = new Set<string>();
	const add = (text: string | null | undefined) => {
		if (text) for (const w of searchWords(text)) seen.add(w);
	};
	const markdown = (text: string) => add(text.includes('](') ? text.replace(/\]\([^)]*\)/g, ']') : text);
	const { identity, power, firewall, seats, dash, harness, speakers, camera, removal } = content;
	add(identity.market);
	markdown(identity.notes);
	if (power.batteryLocation) add(BATTERY_LOCATION_NAMES[power.batteryLocation]);
	for (const r of power.runs) add(r.to);
	for (const g of power.groundPoints) {
		add(g.location);
		add(g.notes);
	}
	add(power.fuseHolderSpot);
	markdown(power.notes);
	for (const p of firewall.passages) {
		add(PASSAGE_KIND_NAMES[p.kind]);
		add(p.location);
		if (p.holeMm !== null) add(`${p.holeMm} mm`);
		add(p.avoid);
		add(p.tools);
	}
	markdown(firewall.notes);
	for (const sp of seats.spaces) {
		add(SEAT_NAMES[sp.seat]);
		add(sp.obstacles);
		add(sp.travelNotes);
		if (sp.boardNeeded) add(BOARD_NEEDED);
	}
	markdown(seats.notes);
	if (dash.opening) add(DASH_OPENING_NAMES[dash.opening]);
	add(dash.kit);
	dash.trimSteps.forEach(add);
	dash.featuresKept.forEach(add);
	markdown(dash.notes);
	add(harness.connectors);
	for (const w of harness.wires) {
		add(w.function);
		add(w.colour);
		add(w.pin);
	}
	add(harness.reverseTrigger);
	add(harness.illumination);
	add(harness.can);
	for (const line of harness.ladder.lines) for (const b of line.buttons) add(b.name);
	markdown(harness.notes);
	for (const l of speakers.locations) {
		add(l.location);
		add(l.nominalSize);
		add(l.grille);
	}
	markdown(speakers.notes);
	add(camera.mounting);
	add(camera.triggerSource);
	for (const f of camera.feeds) {
		add(f.name);
		add(FEED_KIND_NAMES[f.kind]);
		add(f.location);
	}
	markdown(camera.notes);
	removal.steps.forEach(add);
	removal.surprises.forEach(add);
	markdown(removal.notes);
	for (const photo of content.photos) add(photo.caption);
	return [...seen];
}
