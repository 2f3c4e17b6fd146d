import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { unit } from 'mathjs';
import { applyIntent, readIntent } from '../../../src/lib/domain/content/editIntents';
import { formFromContent } from '../../../src/lib/domain/content/formCodec';
import { samplePage } from './samplePage';

describe('form intents', () => {
	it('reads the pressed button', () => {
		expect(readIntent('add:seats.spaces')).toEqual({ kind: 'add', list: 'seats.spaces' });
		expect(readIntent('remove:harness.ladder.lines.0.buttons:3')).toEqual({ kind: 'remove', list: 'harness.ladder.lines.0.buttons', index: 3 });
		expect(readIntent('unit:in')).toEqual({ kind: 'unit', unit: 'in' });
		expect(readIntent(null)).toEqual({ kind: 'save' });
		expect(readIntent('unit:furlong')).toEqual({ kind: 'save' });
		expect(readIntent('move:removal.steps:2:up')).toEqual({ kind: 'move', list: 'removal.steps', index: 2, direction: 'up' });
		expect(readIntent('move:removal.steps:2:sideways')).toEqual({ kind: 'save' });
		expect(readIntent('move:removal.steps:x:down')).toEqual({ kind: 'save' });
	});

	it('moves an entry up or down by one, and nothing past either end', () => {
		const draft = formFromContent(samplePage(), 'mm');
		const ids = () => draft.seats.spaces.map((s) => s.id);
		const [a, b] = ids();
		applyIntent(draft, { kind: 'move', list: 'seats.spaces', index: 1, direction: 'up' }, 'mm');
		expect(ids()).toEqual([b, a]);
		applyIntent(draft, { kind: 'move', list: 'seats.spaces', index: 0, direction: 'up' }, 'mm');
		applyIntent(draft, { kind: 'move', list: 'seats.spaces', index: 1, direction: 'down' }, 'mm');
		applyIntent(draft, { kind: 'move', list: 'seats.spaces', index: 9, direction: 'up' }, 'mm');
		expect(ids()).toEqual([b, a]);
		draft.removal.steps = ['trim', 'screen', 'amplifier'];
		applyIntent(draft, { kind: 'move', list: 'removal.steps', index: 0, direction: 'down' }, 'mm');
		expect(draft.removal.steps).toEqual(['screen', 'trim', 'amplifier']);
	});

	it('keeps every entry when moves are pressed in any order (property)', () => {
		fc.assert(
			fc.property(fc.array(fc.tuple(fc.nat(6), fc.boolean()), { maxLength: 30 }), (presses) => {
				const draft = formFromContent(samplePage(), 'mm');
				draft.removal.steps = ['a', 'b', 'c', 'd', 'e'];
				for (const [index, up] of presses) applyIntent(draft, { kind: 'move', list: 'removal.steps', index, direction: up ? 'up' : 'down' }, 'mm');
				expect([...draft.removal.steps].sort()).toEqual(['a', 'b', 'c', 'd', 'e']);
			})
		);
	});

	it('adds a seat space on the next seat not yet recorded, and removes by position', () => {
		const draft = formFromContent(samplePage(), 'mm');
		applyIntent(draft, { kind: 'add', list: 'seats.spaces' }, 'mm');
		expect(draft.seats.spaces[2].seat).toBe('rear');
		expect(draft.seats.spaces[2].heightMm).toBe('');
		applyIntent(draft, { kind: 'remove', list: 'seats.spaces', index: 0 }, 'mm');
		expect(draft.seats.spaces.map((s) => s.id)).toEqual(['pas', draft.seats.spaces[1].id]);
	});

	it('adds a button to a nested ladder line and ignores a path that is not a list', () => {
		const draft = formFromContent(samplePage(), 'mm');
		applyIntent(draft, { kind: 'add', list: 'harness.ladder.lines.0.buttons' }, 'mm');
		expect(draft.harness.ladder.lines[0].buttons).toHaveLength(3);
		const before = JSON.stringify(draft);
		applyIntent(draft, { kind: 'add', list: 'identity.make' }, 'mm');
		applyIntent(draft, { kind: 'add', list: 'harness.ladder.lines.9.buttons' }, 'mm');
		expect(JSON.stringify(draft)).toBe(before);
	});

	it('switching the unit retypes readable lengths and leaves unreadable text alone', () => {
		const draft = formFromContent(samplePage(), 'mm');
		draft.seats.spaces[1].widthMm = 'wide';
		const now = applyIntent(draft, { kind: 'unit', unit: 'in' }, 'mm');
		expect(now).toBe('in');
		// 410 mm in inches to two decimals (mathjs reference).
		expect(Number(draft.seats.spaces[0].lengthMm)).toBeCloseTo(unit(410, 'mm').toNumber('inch'), 2);
		expect(Number(draft.power.runs[0].lengthM)).toBeCloseTo(unit(4.5, 'm').toNumber('ft'), 2);
		expect(draft.seats.spaces[1].widthMm).toBe('wide');
	});
});
