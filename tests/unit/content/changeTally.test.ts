import { describe, expect, it } from 'vitest';
import { tallyChanges } from '../../../src/lib/domain/content/changeTally';
import { emptyContent, type VehicleContent } from '../../../src/lib/domain/content/schema';

// Expected counts are worked by hand from the edit each case makes: one field per changed value,
// one per list entry that came or went, and the measured figures (mm, m, Ω, A) among them.

function base(): VehicleContent {
	const c = emptyContent({ make: 'Veldra', model: 'Tarn', yearFrom: 2009, yearTo: 2013, body: 'sedan' });
	c.seats.spaces = [{ id: 'drv', seat: 'driver', lengthMm: 480, widthMm: 360, heightMm: 85, obstacles: '', boardNeeded: false, travelNotes: '' }];
	c.harness.ladder.lines = [{ id: 'l1', name: 'Line 1', buttons: [{ id: 'b1', name: 'Volume +', ohms: 0 }] }];
	c.power.notes = 'Disconnect the battery first.';
	return c;
}

function tally(fn: (c: VehicleContent) => void) {
	const before = base();
	const after = structuredClone(before);
	fn(after);
	return tallyChanges(before, after);
}

describe('tallyChanges', () => {
	it('counts nothing between equal pages', () => {
		expect(tally(() => {})).toEqual({ fields: 0, notes: 0, measurements: 0 });
	});

	it('counts a re-measured seat height as one field and one measurement', () => {
		expect(tally((c) => (c.seats.spaces[0].heightMm = 90))).toEqual({ fields: 1, notes: 0, measurements: 1 });
	});

	it('counts wording as a field but not a measurement', () => {
		expect(tally((c) => (c.seats.spaces[0].obstacles = 'Floor ridge at the front'))).toEqual({ fields: 1, notes: 0, measurements: 0 });
	});

	it('counts section notes apart from fields', () => {
		expect(tally((c) => (c.power.notes = 'Disconnect the battery and wait five minutes.'))).toEqual({ fields: 0, notes: 1, measurements: 0 });
	});

	it('counts an added seat space once, with each figure it brings (three sizes, none empty)', () => {
		const added = tally((c) =>
			c.seats.spaces.push({ id: 'pas', seat: 'passenger', lengthMm: 505, widthMm: 380, heightMm: 95, obstacles: '', boardNeeded: false, travelNotes: '' })
		);
		expect(added).toEqual({ fields: 1, notes: 0, measurements: 3 });
	});

	it('leaves unmeasured sizes of a new entry out of the measurements (one of three given)', () => {
		const added = tally((c) =>
			c.seats.spaces.push({ id: 'pas', seat: 'passenger', lengthMm: 505, widthMm: null, heightMm: null, obstacles: '', boardNeeded: false, travelNotes: '' } as never)
		);
		expect(added.measurements).toBe(1);
	});

	it('counts a removed control line with the resistance of its one button, nested inside it', () => {
		expect(tally((c) => (c.harness.ladder.lines = []))).toEqual({ fields: 1, notes: 0, measurements: 1 });
	});

	it('adds up several edits across sections (2 sizes + 1 wording + 1 note)', () => {
		const t = tally((c) => {
			c.seats.spaces[0].lengthMm = 470;
			c.seats.spaces[0].widthMm = 350;
			c.seats.spaces[0].travelNotes = 'Slide the seat fully back';
			c.power.notes = '';
		});
		expect(t).toEqual({ fields: 3, notes: 1, measurements: 2 });
	});
});
