import { describe, expect, it } from 'vitest';
import { unit } from 'mathjs';
import { conflictViews } from '../../../src/lib/domain/content/conflictViews';

describe('conflicts shown to the writer', () => {
	it('shows lengths in the reader’s units and notes as long text', () => {
		const [height, notes] = conflictViews(
			[
				{ path: 'seats.spaces[drv].heightMm', label: 'Driver seat space, height', base: 95, theirs: 90, yours: null },
				{ path: 'seats.notes', label: 'Seat space notes', base: 'a', theirs: 'b', yours: 'c' }
			],
			'imperial'
		);
		// 95 mm and 90 mm in inches to two decimals (mathjs reference).
		expect(height).toEqual({
			path: 'seats.spaces[drv].heightMm',
			label: 'Driver seat space, height',
			base: `${unit(95, 'mm').toNumber('inch').toFixed(2)} in`,
			theirs: `${unit(90, 'mm').toNumber('inch').toFixed(2)} in`,
			yours: 'not measured',
			long: false
		});
		expect(notes).toMatchObject({ base: 'a', theirs: 'b', yours: 'c', long: true });
	});

	it('says whether a whole entry was removed or kept with changes', () => {
		const [entry] = conflictViews(
			[{ path: 'power.runs[r1]', label: 'Power run to “Boot”', base: { id: 'r1', to: 'Boot', lengthM: 4 }, theirs: null, yours: { id: 'r1', to: 'Boot', lengthM: 5 } }],
			'metric'
		);
		expect(entry).toMatchObject({ theirs: 'removed', yours: 'kept, with changes', long: false });
	});
});
