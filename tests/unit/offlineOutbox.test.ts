import { describe, expect, it } from 'vitest';
import { changeLabel, replacedBy, sentNotice, settleAt, textFields, type WaitingSummary } from '../../src/lib/domain/offlineOutbox';

// Hand-worked cases: the outbox's rules for marks and changes made with no signal.

const PENNICK = 'korvane-pennick-2003-2008-pickup';
const waiting: (WaitingSummary & { label: string })[] = [
	{ id: 1, kind: 'mark', by: 7, slug: PENNICK, label: 'Fitted as described' },
	{ id: 2, kind: 'edit', vehicleId: 4, by: 7, slug: PENNICK, label: 'Change to Korvane Pennick' },
	{ id: 3, kind: 'edit', vehicleId: 4, by: 9, slug: PENNICK, label: 'Change to Korvane Pennick' },
	{ id: 4, kind: 'edit', vehicleId: 5, by: 7, slug: 'halvik-corrin-1998-2004-coupe', label: 'Change to Halvik Corrin' },
	{ id: 5, by: 7, slug: PENNICK, label: 'Flag on Driver seat space, height' }
];

describe('replacedBy', () => {
	it('a newer change to a page takes the place of the same person’s older change to it', () => {
		const ids = replacedBy(waiting, { kind: 'edit', vehicleId: 4, by: 7, slug: PENNICK }).map((p) => p.id);
		expect(ids).toEqual([2]);
	});

	it('leaves another person’s change, another page’s change and every mark alone', () => {
		expect(replacedBy(waiting, { kind: 'edit', vehicleId: 4, by: 9, slug: PENNICK }).map((p) => p.id)).toEqual([3]);
		expect(replacedBy(waiting, { kind: 'edit', vehicleId: 6, by: 7, slug: 'x' })).toEqual([]);
	});

	it('a mark replaces nothing, nor does a change that names no page', () => {
		expect(replacedBy(waiting, { kind: 'mark', by: 7, slug: PENNICK })).toEqual([]);
		expect(replacedBy(waiting, { by: 7, slug: PENNICK })).toEqual([]);
		expect(replacedBy(waiting, { kind: 'edit', by: 7, slug: PENNICK })).toEqual([]);
	});

	it('a refused change is replaced too: the newer one holds the whole page again', () => {
		const refused = [{ ...waiting[1], refusal: 'Someone else saved this page while you were editing' }];
		expect(replacedBy(refused, { kind: 'edit', vehicleId: 4, by: 7, slug: PENNICK })).toEqual(refused);
	});
});

describe('words and places', () => {
	it('names a change by its page', () => {
		expect(changeLabel('Korvane Pennick 2003–2008 pickup')).toBe('Change to Korvane Pennick 2003–2008 pickup');
		expect(changeLabel('Korvane Pennick 2003–2008 pickup', true)).toBe('Suggested change to Korvane Pennick 2003–2008 pickup');
	});

	it('sends a refused change back to the editor and a refused mark to the page', () => {
		expect(settleAt({ kind: 'edit', slug: PENNICK })).toEqual({ href: `/vehicles/${PENNICK}/edit`, text: 'Open the editor' });
		expect(settleAt({ kind: 'mark', slug: PENNICK })).toEqual({ href: `/vehicles/${PENNICK}`, text: 'Read the page again' });
		expect(settleAt({ slug: PENNICK }).href).toBe(`/vehicles/${PENNICK}`);
	});

	it('says what went through, marks and changes alike, and nothing when nothing did', () => {
		expect(sentNotice(['Change to Halvik Corrin'])).toBe('Sent from this phone: Change to Halvik Corrin.');
		expect(sentNotice(['Fitted as described', 'Change to Halvik Corrin'])).toBe('Sent from this phone: Fitted as described; Change to Halvik Corrin.');
		expect(sentNotice([])).toBe('');
	});
});

describe('textFields', () => {
	it('keeps every text field in order, repeated names too, and drops files', () => {
		const file = { name: 'seat.jpg', size: 3 };
		const entries: [string, unknown][] = [
			['baseRevisionId', '12'],
			['intent', 'save'],
			['photo', file],
			['seats.spaces.0.heightMm', '74'],
			['speakers.0.notes', 'a'],
			['speakers.0.notes', 'b']
		];
		expect(textFields(entries)).toEqual([
			['baseRevisionId', '12'],
			['intent', 'save'],
			['seats.spaces.0.heightMm', '74'],
			['speakers.0.notes', 'a'],
			['speakers.0.notes', 'b']
		]);
	});
});
