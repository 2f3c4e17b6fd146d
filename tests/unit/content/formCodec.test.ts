import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { unit } from 'mathjs';
import { contentFromDraft, contentFromForm, draftFromEntries, formEntries, formFromContent } from '../../../src/lib/domain/content/formCodec';
import { applyIntent, convertDraftUnits } from '../../../src/lib/domain/content/editIntents';
import { samplePage } from './samplePage';

const mm = (value: number, from: string) => unit(value, from).toNumber('mm');

describe('form ↔ content', () => {
	it('posting an untouched form gives back the same page', () => {
		const page = samplePage();
		const result = contentFromForm(formEntries(formFromContent(page, 'mm')), 'mm', page);
		expect(result.errors).toEqual({});
		expect(result.content).toEqual(page);
	});

	it('keeps exact stored figures when the form is in inches and nothing was retyped', () => {
		const page = samplePage();
		const draft = formFromContent(page, 'in');
		// 95 mm = 3.74 in to two decimals (mathjs reference).
		expect(Number(draft.seats.spaces[0].heightMm)).toBeCloseTo(unit(95, 'mm').toNumber('inch'), 2);
		const result = contentFromDraft(draft, 'in', page);
		expect(result.content?.seats.spaces[0].heightMm).toBe(95);
		expect(result.content?.power.runs[0].lengthM).toBe(4.5);
	});

	it('reads lengths typed with or without a unit', () => {
		const draft = formFromContent(samplePage(), 'mm');
		draft.seats.spaces[0].heightMm = '3.75 in';
		draft.seats.spaces[0].lengthMm = '41 cm';
		draft.seats.spaces[0].widthMm = '301';
		draft.power.runs[0].lengthM = '15 ft';
		const result = contentFromDraft(draft, 'mm');
		expect(result.errors).toEqual({});
		// mathjs reference conversions
		expect(result.content?.seats.spaces[0].heightMm).toBeCloseTo(mm(3.75, 'inch'), 9);
		expect(result.content?.seats.spaces[0].lengthMm).toBeCloseTo(mm(41, 'cm'), 9);
		expect(result.content?.seats.spaces[0].widthMm).toBe(301);
		expect(result.content?.power.runs[0].lengthM).toBeCloseTo(unit(15, 'ft').toNumber('m'), 9);
	});

	it('stores a converted length to the micrometre, without float noise', () => {
		const draft = formFromContent(samplePage(), 'mm');
		draft.seats.spaces[1].heightMm = '3.5 in';
		draft.seats.spaces[1].widthMm = '1 ft';
		const space = contentFromDraft(draft, 'mm').content!.seats.spaces[1];
		// mathjs reference, to the micrometre: 3.5 in = 88.9 mm, 1 ft = 304.8 mm.
		expect(space.heightMm).toBe(Number(unit(3.5, 'inch').toNumber('mm').toFixed(3)));
		expect(space.widthMm).toBe(Number(unit(1, 'ft').toNumber('mm').toFixed(3)));
	});

	it('reads a bare number in the form unit: inches for spaces, feet for runs', () => {
		const draft = formFromContent(samplePage(), 'in');
		draft.seats.spaces[1].widthMm = '12';
		draft.power.runs[0].lengthM = '20';
		const result = contentFromDraft(draft, 'in');
		// mathjs reference conversions
		expect(result.content?.seats.spaces[1].widthMm).toBeCloseTo(mm(12, 'inch'), 9);
		expect(result.content?.power.runs[0].lengthM).toBeCloseTo(unit(20, 'ft').toNumber('m'), 9);
	});

	it('any length in mm survives a trip through an inch form to within 0.128 mm', () => {
		fc.assert(
			fc.property(fc.double({ min: 1, max: 3000, noNaN: true }), (value) => {
				const draft = formFromContent(samplePage(), 'mm');
				draft.dash.depthMm = String(value);
				convertDraftUnits(draft, 'mm', 'in');
				const back = contentFromDraft(draft, 'in').content!.dash.depthMm!;
				// Half a step of 0.01 in is 0.127 mm (25.4 mm per inch, mathjs reference), plus half a micrometre of storage rounding.
				expect(Math.abs(back - value)).toBeLessThanOrEqual(unit(0.005, 'inch').toNumber('mm') + 0.0005 + 1e-9);
			})
		);
	});

	it('keeps every typed value and names the field when a length cannot be read', () => {
		const draft = formFromContent(samplePage(), 'mm');
		draft.seats.spaces[1].heightMm = 'about ninety';
		draft.identity.market = 'Sample market';
		const entries = formEntries(draft);
		const result = contentFromForm(entries, 'mm');
		expect(result.content).toBeNull();
		expect(result.errors['seats.spaces.1.heightMm']).toMatch(/^Height: could not read "about ninety"/);
		expect(result.draft.seats.spaces[1].heightMm).toBe('about ninety');
		expect(result.draft.identity.market).toBe('Sample market');
	});

	it('reports schema errors by form field, counting rows that were left empty', () => {
		const draft = formFromContent(samplePage(), 'mm');
		applyIntent(draft, { kind: 'add', list: 'seats.spaces' }, 'mm');
		// Move the blank row first: the bad row is form row 2 but content entry 1.
		draft.seats.spaces.unshift(draft.seats.spaces.pop()!);
		draft.seats.spaces[2].lengthMm = '4000';
		draft.identity.yearTo = '2008';
		const result = contentFromDraft(draft, 'mm');
		expect(result.errors['seats.spaces.2.lengthMm']).toMatch(/at most 3000 mm/);
		expect(result.errors['identity.yearTo']).toMatch(/before the first/);
		expect(result.formPath('seats.spaces.1.lengthMm')).toBe('seats.spaces.2.lengthMm');
	});

	it('drops rows nobody typed into, and empty list lines', () => {
		const draft = formFromContent(samplePage(), 'mm');
		applyIntent(draft, { kind: 'add', list: 'firewall.passages' }, 'mm');
		applyIntent(draft, { kind: 'add', list: 'dash.trimSteps' }, 'mm');
		applyIntent(draft, { kind: 'add', list: 'harness.ladder.lines.0.buttons' }, 'mm');
		const result = contentFromDraft(draft, 'mm', samplePage());
		expect(result.content).toEqual(samplePage());
	});

	it('reads a missing required year as "required" and a word as not a year', () => {
		const draft = formFromContent(samplePage(), 'mm');
		draft.identity.yearFrom = '';
		draft.identity.yearTo = 'soon';
		const { errors } = contentFromDraft(draft, 'mm');
		expect(errors['identity.yearFrom']).toBe('First model year is required.');
		expect(errors['identity.yearTo']).toMatch(/must be a year/);
	});

	it('ignores names the form does not have, including prototype keys', () => {
		const draft = draftFromEntries([
			['__proto__.polluted', 'yes'],
			['constructor.x', '1'],
			['identity.make', 'Tarnell'],
			['seats.spaces.0.id', 'bad id!'],
			['seats.spaces.0.seat', 'rear']
		]);
		expect(({} as Record<string, unknown>).polluted).toBeUndefined();
		expect(draft.identity.make).toBe('Tarnell');
		expect(draft.seats.spaces[0].id).toMatch(/^[a-z0-9]{10}$/);
		expect(draft.seats.spaces[0].seat).toBe('rear');
	});

	it('reads an unticked box as no and a ticked one as yes', () => {
		const page = samplePage();
		const entries = formEntries(formFromContent(page, 'mm'));
		expect(entries.some(([name]) => name === 'seats.spaces.1.boardNeeded')).toBe(false);
		expect(entries).toContainEqual(['seats.spaces.0.boardNeeded', 'yes']);
		const content = contentFromForm(entries, 'mm', page).content!;
		expect(content.seats.spaces.map((s) => s.boardNeeded)).toEqual([true, false]);
	});
});
