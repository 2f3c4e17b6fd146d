import { describe, expect, it } from 'vitest';
import { unit } from 'mathjs';
import { fieldTree } from '../../../src/lib/domain/content/fieldRules';
import { fieldChanges } from '../../../src/lib/domain/content/fieldDiff';
import { contentFromForm, formEntries, formFromContent } from '../../../src/lib/domain/content/formCodec';
import { applyIntent } from '../../../src/lib/domain/content/editIntents';
import {
	emptyContent,
	entries,
	FIELD_INFO,
	mm,
	notes,
	pageSchema,
	pageSection,
	seatSpaceSchema,
	SECTION_KEYS,
	text,
	VEHICLE_FIELDS,
	vehicleContentSchema,
	type VehicleContent
} from '../../../src/lib/domain/content/schema';
import { noteWords, vehicleSearchSections } from '../../../src/lib/domain/search/document';
import { otherFacts } from '../../../src/lib/components/vehicle/display';

// A fixture page whose seat spaces carry two fields the vehicle page does not have: a text field
// and a length. Declaring them is all it takes; the form, the diff and the search text find them.
const spaceWithExtras = seatSpaceSchema.extend({
	matNotes: text('floor mat notes', 300),
	ventGapMm: mm('vent gap', { search: { label: 'Vent gap' } })
});
const fixtureSchema = pageSchema({
	...vehicleContentSchema.shape,
	seats: pageSection('seats', {
		spaces: entries(spaceWithExtras, 'seat spaces', { noun: 'seat space' }),
		notes: notes('seat space notes')
	}).prefault({})
});
const FIXTURE = fieldTree(fixtureSchema);

// Sample data: an invented vehicle with invented measurements.
function fixturePage(mat: string, gapMm: number | null): VehicleContent {
	const page = emptyContent({ make: 'Tarnell', model: 'Brisk', yearFrom: 2010, yearTo: 2014, body: 'hatchback' });
	const seats = {
		spaces: [{ id: 's1', seat: 'driver', lengthMm: 410, widthMm: 300, heightMm: 95, obstacles: '', travelNotes: '', boardNeeded: false, matNotes: mat, ventGapMm: gapMm }],
		notes: ''
	};
	return fixtureSchema.parse({ ...page, seats }) as unknown as VehicleContent;
}

const space = (page: VehicleContent) => page.seats.spaces[0] as (typeof page.seats.spaces)[number] & { matNotes: string; ventGapMm: number | null };

describe('the field tree', () => {
	it('lists the vehicle page sections in page order and every field with its kind', () => {
		expect(VEHICLE_FIELDS.sections.map((s) => s.key)).toEqual([...SECTION_KEYS]);
		expect(FIELD_INFO['seats.spaces[].heightMm']).toMatchObject({ label: 'height', kind: 'mm' });
		expect(FIELD_INFO['power.runs[].lengthM']).toMatchObject({ kind: 'm' });
		expect(FIELD_INFO['photos[].caption']).toMatchObject({ kind: 'text' });
		expect(VEHICLE_FIELDS.nodes.get('harness.ladder.lines[].buttons')).toMatchObject({ type: 'list', info: { noun: 'button' } });
	});

	it('reads a nullable choice and flag as "not recorded" allowed, a plain one as required', () => {
		expect(VEHICLE_FIELDS.nodes.get('power.batteryLocation')).toMatchObject({ nullable: true });
		expect(VEHICLE_FIELDS.nodes.get('harness.factoryAmp')).toMatchObject({ nullable: true });
		expect(VEHICLE_FIELDS.nodes.get('seats.spaces[].seat')).toMatchObject({ nullable: false });
		expect(VEHICLE_FIELDS.nodes.get('seats.spaces[].boardNeeded')).toMatchObject({ nullable: false });
	});

	it('keeps a fixture field in the fixture tree only', () => {
		expect(FIXTURE.info['seats.spaces[].matNotes']).toMatchObject({ label: 'floor mat notes', kind: 'text' });
		expect(FIXTURE.info['seats.spaces[].ventGapMm']).toMatchObject({ kind: 'mm' });
		expect(FIELD_INFO['seats.spaces[].matNotes']).toBeUndefined();
	});
});

describe('a field added to a fixture schema', () => {
	it('goes through the form and back unchanged, its length typed in inches', () => {
		const page = fixturePage('Rubber mat lifts at the rear', 40);
		const draft = formFromContent(page, 'in', FIXTURE);
		const row = draft.seats.spaces[0] as unknown as Record<string, string>;
		expect(row.matNotes).toBe('Rubber mat lifts at the rear');
		// 40 mm in inches to two decimals (mathjs reference).
		expect(Number(row.ventGapMm)).toBeCloseTo(unit(40, 'mm').toNumber('inch'), 2);
		const posted = formEntries(draft, FIXTURE);
		expect(posted).toContainEqual(['seats.spaces.0.matNotes', 'Rubber mat lifts at the rear']);
		const back = contentFromForm(posted, 'in', page, FIXTURE);
		expect(back.errors).toEqual({});
		expect(back.content).toEqual(page);
	});

	it('reads a retyped length and names the field when it cannot be read', () => {
		const page = fixturePage('', null);
		const posted = formEntries(formFromContent(page, 'mm', FIXTURE), FIXTURE).map(([k, v]): [string, string] =>
			k === 'seats.spaces.0.ventGapMm' ? [k, '2 in'] : [k, v]
		);
		// 2 in = 50.8 mm (international inch, mathjs reference).
		expect(space(contentFromForm(posted, 'mm', page, FIXTURE).content!).ventGapMm).toBeCloseTo(unit(2, 'inch').toNumber('mm'), 6);
		const bad = posted.map(([k, v]): [string, string] => (k === 'seats.spaces.0.ventGapMm' ? [k, 'wide'] : [k, v]));
		const result = contentFromForm(bad, 'mm', page, FIXTURE);
		expect(result.content).toBeNull();
		expect(result.errors['seats.spaces.0.ventGapMm']).toMatch(/^Vent gap: could not read "wide"/);
	});

	it('is checked by its own rule', () => {
		const page = fixturePage('', null);
		const posted = formEntries(formFromContent(page, 'mm', FIXTURE), FIXTURE).map(([k, v]): [string, string] =>
			k === 'seats.spaces.0.matNotes' ? [k, 'x'.repeat(301)] : [k, v]
		);
		expect(contentFromForm(posted, 'mm', page, FIXTURE).errors['seats.spaces.0.matNotes']).toBe('Floor mat notes is too long: keep it under 300 characters.');
	});

	it('starts empty in a new entry', () => {
		const draft = formFromContent(fixturePage('', null), 'mm', FIXTURE);
		applyIntent(draft, { kind: 'add', list: 'seats.spaces' }, 'mm', FIXTURE);
		expect(draft.seats.spaces[1]).toMatchObject({ seat: 'passenger', matNotes: '', ventGapMm: '' });
	});

	it('shows in the field diff with its label and unit', () => {
		const changes = fieldChanges(fixturePage('', 40), fixturePage('Rubber mat lifts at the rear', 45), { fields: FIXTURE });
		expect(changes).toContainEqual({
			path: 'seats.spaces[s1].matNotes',
			section: 'seats',
			label: 'Driver seat space, floor mat notes',
			kind: 'changed',
			before: 'not recorded',
			after: 'Rubber mat lifts at the rear'
		});
		expect(changes).toContainEqual(expect.objectContaining({ label: 'Driver seat space, vent gap', before: '40 mm', after: '45 mm' }));
		// Without the fixture tree the diff knows nothing of them.
		expect(fieldChanges(fixturePage('', 40), fixturePage('Rubber mat lifts at the rear', 45)).map((c) => c.label)).not.toContain('Driver seat space, floor mat notes');
	});

	it('reaches the search text and the indexed words', () => {
		const page = fixturePage('Rubber mat lifts at the rear', 40);
		const seats = vehicleSearchSections(page, FIXTURE).find((s) => s.key === 'seats')!.text;
		expect(seats).toContain('Rubber mat lifts at the rear.');
		expect(seats).toContain('Vent gap: 40 mm.');
		const words = noteWords(page, FIXTURE);
		expect(words).toEqual(expect.arrayContaining(['rubber', 'mat', '40', 'mm']));
		expect(words).not.toContain('vent');
	});
});

describe('a field added to a fixture schema, on the reading page', () => {
	it('is listed among the facts of its entry until a component gives it a place of its own', () => {
		const page = fixturePage('Rubber mat lifts at the rear', 40);
		const shownByComponent = ['seat', 'lengthMm', 'widthMm', 'heightMm', 'boardNeeded', 'obstacles', 'travelNotes'];
		expect(otherFacts('seats.spaces[]', space(page), shownByComponent, 'metric', FIXTURE)).toEqual([
			{ label: 'Floor mat notes', value: 'Rubber mat lifts at the rear' },
			{ label: 'Vent gap', value: '40 mm' }
		]);
		// 40 mm = 1.57 in to two decimals (mathjs reference: 40 / 25.4).
		expect(otherFacts('seats.spaces[]', space(page), [...shownByComponent, 'matNotes'], 'imperial', FIXTURE)).toEqual([
			{ label: 'Vent gap', value: `${unit(40, 'mm').toNumber('inch').toFixed(2)} in` }
		]);
		expect(otherFacts('seats.spaces[]', space(page), shownByComponent, 'metric')).toEqual([]);
	});
});
