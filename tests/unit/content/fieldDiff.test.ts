import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { unit } from 'mathjs';
import {
	describePath,
	fieldChanges,
	formatFieldValue,
	formatPath,
	notesChanges,
	parsePath,
	patternOf,
	valueAtPath,
	type FieldChange
} from '../../../src/lib/domain/content/fieldDiff';
import { emptyContent, type VehicleContent } from '../../../src/lib/domain/content/schema';

function base(): VehicleContent {
	const c = emptyContent({ make: 'Veldra', model: 'Tarn', yearFrom: 2009, yearTo: 2013, body: 'sedan' });
	c.power.batteryLocation = 'engine-bay';
	c.power.runs = [{ id: 'run1', to: 'boot', lengthM: 4.5 }];
	c.power.groundPoints = [{ id: 'gp1', location: 'M8 stud behind the left boot trim', notes: '' }];
	c.firewall.passages = [
		{
			id: 'fw1',
			location: 'Driver side grommet',
			kind: 'factory-grommet',
			pushFrom: 'engine-bay',
			holeMm: 12,
			avoid: 'Brake lines',
			tools: 'Fish wire'
		}
	];
	c.seats.spaces = [
		{ id: 'drv', seat: 'driver', lengthMm: 480, widthMm: 360, heightMm: 85, obstacles: '', boardNeeded: false, travelNotes: '' },
		{ id: 'pas', seat: 'passenger', lengthMm: 505, widthMm: 380, heightMm: 95, obstacles: '', boardNeeded: false, travelNotes: '' }
	];
	c.harness.wires = [{ id: 'w1', function: 'Reverse signal', colour: 'Green/purple', pin: 'B2' }];
	c.harness.ladder.lines = [
		{
			id: 'l1',
			name: 'Line 1',
			buttons: [
				{ id: 'b1', name: 'Volume +', ohms: 0 },
				{ id: 'b2', name: 'Volume −', ohms: 2200 }
			]
		}
	];
	c.speakers.locations = [
		{ id: 'k1', location: 'front door', nominalSize: '6.5 in', cutoutMm: 142, depthMm: 62, impedanceOhm: 4, grille: '' }
	];
	c.camera.feeds = [{ id: 'f1', name: 'Dash camera', kind: 'constant', fuseA: 5, location: 'Slot 14' }];
	c.power.notes = 'Disconnect the battery first.';
	return c;
}

function edit(fn: (c: VehicleContent) => void): [VehicleContent, VehicleContent] {
	const before = base();
	const after = structuredClone(before);
	fn(after);
	return [before, after];
}

const only = (changes: FieldChange[]) => {
	expect(changes).toHaveLength(1);
	return changes[0];
};

describe('fieldChanges', () => {
	it('speaks of the passenger seat height in mm', () => {
		const [b, a] = edit((c) => (c.seats.spaces[1].heightMm = 88));
		expect(only(fieldChanges(b, a))).toEqual({
			path: 'seats.spaces[pas].heightMm',
			section: 'seats',
			label: 'Passenger seat space, height',
			kind: 'changed',
			before: '95 mm',
			after: '88 mm'
		});
	});

	it('shows inches to the imperial reader', () => {
		const [b, a] = edit((c) => (c.seats.spaces[1].heightMm = 88));
		const change = only(fieldChanges(b, a, { units: 'imperial' }));
		// Reference conversion: mathjs units (1 in = 25.4 mm exactly).
		expect(change.before).toBe(`${unit(95, 'mm').toNumber('inch').toFixed(2)} in`);
		expect(change.after).toBe(`${unit(88, 'mm').toNumber('inch').toFixed(2)} in`);
		expect(change.before).toBe('3.74 in');
	});

	it('shows a cable run in m or ft', () => {
		const [b, a] = edit((c) => (c.power.runs[0].lengthM = 5.2));
		expect(only(fieldChanges(b, a))).toMatchObject({ label: 'Power run to “boot”, length', before: '4.5 m', after: '5.2 m' });
		const ft = only(fieldChanges(b, a, { units: 'imperial' }));
		// Reference conversion: mathjs units (1 ft = 0.3048 m exactly).
		expect(ft.after).toBe(`${unit(5.2, 'm').toNumber('ft').toFixed(1)} ft`);
	});

	it('says "not measured" for an empty measurement', () => {
		const [b, a] = edit((c) => (c.seats.spaces[0].heightMm = null));
		expect(only(fieldChanges(b, a))).toMatchObject({ label: 'Driver seat space, height', before: '85 mm', after: 'not measured' });
	});

	it('names a passage by its location', () => {
		const [b, a] = edit((c) => (c.firewall.passages[0].holeMm = 16));
		expect(only(fieldChanges(b, a))).toMatchObject({
			path: 'firewall.passages[fw1].holeMm',
			label: 'Firewall passage “Driver side grommet”, hole size',
			before: '12 mm',
			after: '16 mm'
		});
	});

	it('names a wire by its function', () => {
		const [b, a] = edit((c) => (c.harness.wires[0].colour = 'Green'));
		expect(only(fieldChanges(b, a))).toMatchObject({ label: 'Wire “Reverse signal”, colour', before: 'Green/purple', after: 'Green' });
	});

	it('names a speaker by its location', () => {
		const [b, a] = edit((c) => (c.speakers.locations[0].cutoutMm = 145));
		expect(only(fieldChanges(b, a))).toMatchObject({ label: 'Front door speaker, cut-out', before: '142 mm', after: '145 mm' });
	});

	it('names a steering button by its line and name, in Ω and kΩ', () => {
		const [b, a] = edit((c) => {
			c.harness.ladder.lines[0].buttons[0].ohms = 330;
			c.harness.ladder.lines[0].buttons[1].ohms = 4700;
		});
		const [first, second] = fieldChanges(b, a);
		expect(first).toMatchObject({
			path: 'harness.ladder.lines[l1].buttons[b1].ohms',
			section: 'harness',
			label: 'Steering control “Line 1”, button “Volume +”, resistance',
			before: '0 Ω',
			after: '330 Ω'
		});
		expect(second).toMatchObject({ before: '2.2 kΩ', after: '4.7 kΩ' });
	});

	it('names a ground point and an accessory feed', () => {
		const [b, a] = edit((c) => {
			c.power.groundPoints[0].notes = 'Scrape the paint';
			c.camera.feeds[0].fuseA = 10;
		});
		const [gp, feed] = fieldChanges(b, a);
		expect(gp).toMatchObject({ label: 'Ground point “M8 stud behind the left boot trim”, notes', before: 'not recorded', after: 'Scrape the paint' });
		expect(feed).toMatchObject({ label: 'Accessory feed “Dash camera”, fuse', before: '5 A', after: '10 A', section: 'camera' });
	});

	it('shuts long names at a word with an ellipsis', () => {
		const [b, a] = edit((c) => {
			c.firewall.passages[0].location = 'Passenger side, behind the glovebox, beside the blower housing';
			c.firewall.passages[0].tools = 'Step drill';
		});
		const tools = fieldChanges(b, a).find((ch) => ch.path.endsWith('.tools'));
		expect(tools?.label).toBe('Firewall passage “Passenger side, behind the glovebox, beside the…”, tools that help');
	});

	it('shows choices and yes/no in words', () => {
		const [b, a] = edit((c) => {
			c.power.batteryLocation = 'boot';
			c.harness.factoryAmp = true;
			c.seats.spaces[0].boardNeeded = true;
			c.identity.body = 'suv';
			c.dash.opening = 'double-din';
		});
		const byPath = Object.fromEntries(fieldChanges(b, a).map((ch) => [ch.path, ch]));
		expect(byPath['power.batteryLocation']).toMatchObject({ label: 'Battery location', before: 'Engine bay', after: 'Boot / trunk' });
		expect(byPath['harness.factoryAmp']).toMatchObject({ label: 'Factory amplifier', before: 'not known', after: 'yes' });
		expect(byPath['seats.spaces[drv].boardNeeded']).toMatchObject({ label: 'Driver seat space, mounting board needed', before: 'no', after: 'yes' });
		expect(byPath['identity.body']).toMatchObject({ section: 'identity', label: 'Body style', before: 'Sedan', after: 'SUV' });
		expect(byPath['dash.opening']).toMatchObject({ label: 'Dash opening', before: 'not recorded', after: 'Double DIN' });
	});

	it('lists text lists whole', () => {
		const [b, a] = edit((c) => (c.dash.trimSteps = ['Unclip the surround.', 'Remove four screws.']));
		expect(only(fieldChanges(b, a))).toMatchObject({ label: 'Trim removal steps', before: 'none', after: 'Unclip the surround.; Remove four screws.' });
	});

	it('lists added and removed entries as such', () => {
		const [b, a] = edit((c) => {
			c.seats.spaces.splice(0, 1);
			c.seats.spaces.push({
				id: 'rear',
				seat: 'rear',
				lengthMm: 620,
				widthMm: 410,
				heightMm: null,
				obstacles: 'Fuel sender cover',
				boardNeeded: true,
				travelNotes: ''
			});
		});
		const changes = fieldChanges(b, a);
		expect(changes).toEqual([
			{
				path: 'seats.spaces[rear]',
				section: 'seats',
				label: 'Rear seat space',
				kind: 'added',
				before: null,
				after: 'seat: Rear; length: 620 mm; width: 410 mm; obstacles: Fuel sender cover; mounting board needed: yes'
			},
			{
				path: 'seats.spaces[drv]',
				section: 'seats',
				label: 'Driver seat space',
				kind: 'removed',
				before: 'seat: Driver; length: 480 mm; width: 360 mm; height: 85 mm; mounting board needed: no',
				after: null
			}
		]);
	});

	it('counts the buttons of an added steering line', () => {
		const [b, a] = edit((c) =>
			c.harness.ladder.lines.push({ id: 'l2', name: 'Line 2', buttons: [{ id: 'x', name: 'Mute', ohms: 0 }] })
		);
		expect(only(fieldChanges(b, a))).toMatchObject({ label: 'Steering control “Line 2”', kind: 'added', after: 'name: Line 2; 1 entry' });
	});

	it('puts a photo change in the photo’s section', () => {
		const [b, a] = edit((c) => c.photos.push({ id: 'ab'.repeat(32), section: 'firewall', itemId: 'fw1', caption: 'Grommet', alt: '' }));
		expect(only(fieldChanges(b, a))).toMatchObject({ section: 'firewall', label: 'Photo “Grommet”', kind: 'added' });
	});

	it('matches entries by id, so a reorder is no change', () => {
		const [b, a] = edit((c) => c.seats.spaces.reverse());
		expect(fieldChanges(b, a)).toEqual([]);
	});

	it('leaves section notes to notesChanges', () => {
		const [b, a] = edit((c) => ((c.power.notes = 'Fuse near the battery.'), (c.identity.notes = 'Sample data.')));
		expect(fieldChanges(b, a)).toEqual([]);
		expect(notesChanges(b, a).map((n) => n.section)).toEqual(['identity', 'power']);
	});

	it('reports nothing for equal pages, whatever the key order', () => {
		const c = base();
		const reordered = JSON.parse(JSON.stringify(c, Object.keys(c).reverse()));
		expect(fieldChanges(c, structuredClone(c))).toEqual([]);
		expect(fieldChanges(c, { ...reordered, ...c })).toEqual([]);
	});

	it('is the mirror image when read backwards', () => {
		const [b, a] = edit((c) => {
			c.seats.spaces[1].heightMm = 88;
			c.seats.spaces.splice(0, 1);
			c.camera.feeds.push({ id: 'f2', name: 'Fridge', kind: 'ignition', fuseA: 15, location: '' });
		});
		const swap: Record<string, string> = { added: 'removed', removed: 'added', changed: 'changed' };
		const forward = fieldChanges(b, a).map((c) => `${c.path} ${swap[c.kind]} ${c.after}→${c.before}`).sort();
		const backward = fieldChanges(a, b).map((c) => `${c.path} ${c.kind} ${c.before}→${c.after}`).sort();
		expect(backward).toEqual(forward);
	});
});

describe('notesChanges', () => {
	it('marks the words that changed', () => {
		const [b, a] = edit((c) => (c.power.notes = 'Disconnect the negative battery lead first.'));
		const changes = notesChanges(b, a);
		expect(changes.map((c) => [c.section, c.label])).toEqual([['power', 'Power & ground notes']]);
		const parts = changes[0].parts;
		expect(parts.filter((p) => p.added).map((p) => p.value.trim()).sort()).toEqual(['lead', 'negative']);
		expect(parts.some((p) => p.removed)).toBe(false);
		for (const p of parts) expect(Object.keys(p).every((k) => k === 'value' || p[k as 'added'] === true)).toBe(true);
	});

	it('marks a replaced word as removed and added', () => {
		const [b, a] = edit((c) => (c.power.notes = 'Disconnect the alarm first.'));
		const parts = notesChanges(b, a)[0].parts;
		expect(parts.filter((p) => p.removed).map((p) => p.value)).toEqual(['battery']);
		expect(parts.filter((p) => p.added).map((p) => p.value)).toEqual(['alarm']);
	});

	// Word diff invariant: dropping added parts gives the old text, dropping removed parts the new.
	it('rebuilds both texts from its parts', () => {
		const words = fc.array(fc.constantFrom('fuse', 'battery', 'grommet', ' ', '  ', '\n', '**caution**', '-', 'loom', ','), { maxLength: 30 });
		fc.assert(
			fc.property(words, words, (x, y) => {
				const b = base();
				const a = base();
				b.removal.notes = x.join('');
				a.removal.notes = y.join('');
				const changes = notesChanges(b, a);
				expect(changes.length).toBe(b.removal.notes === a.removal.notes ? 0 : 1);
				for (const change of changes) {
					expect(change.section).toBe('removal');
					expect(change.parts.filter((p) => !p.added).map((p) => p.value).join('')).toBe(b.removal.notes);
					expect(change.parts.filter((p) => !p.removed).map((p) => p.value).join('')).toBe(a.removal.notes);
				}
			})
		);
	});

	it('is empty when no notes changed', () => {
		const [b, a] = edit((c) => (c.seats.spaces[0].heightMm = 70));
		expect(notesChanges(b, a)).toEqual([]);
	});
});

describe('paths', () => {
	it('reads and writes entry paths', () => {
		expect(parsePath('harness.ladder.lines[l1].buttons[b2].ohms')).toEqual(['harness', 'ladder', 'lines', { id: 'l1' }, 'buttons', { id: 'b2' }, 'ohms']);
		expect(patternOf('harness.ladder.lines[l1].buttons[b2].ohms')).toBe('harness.ladder.lines[].buttons[].ohms');
		expect(() => parsePath('seats..x')).toThrow(/Cannot read/);
		expect(() => parsePath('seats[a b]')).toThrow(/Cannot read/);
	});

	it('round-trips any path', () => {
		const seg = fc.oneof(fc.stringMatching(/^[a-zA-Z_][a-zA-Z0-9_]{0,8}$/), fc.stringMatching(/^[A-Za-z0-9_-]{1,8}$/).map((id) => ({ id })));
		fc.assert(
			fc.property(fc.stringMatching(/^[a-z]{1,8}$/), fc.array(seg, { maxLength: 6 }), (head, rest) => {
				const segs = [head, ...rest];
				expect(parsePath(formatPath(segs))).toEqual(segs);
			})
		);
	});

	it('finds values by entry id', () => {
		const c = base();
		expect(valueAtPath(c, 'seats.spaces[pas].heightMm')).toBe(95);
		expect(valueAtPath(c, 'harness.ladder.lines[l1].buttons[b2].ohms')).toBe(2200);
		expect(valueAtPath(c, 'seats.spaces[gone].heightMm')).toBeUndefined();
	});

	it('names a path from whichever page still has the entry', () => {
		const c = base();
		const empty = emptyContent(c.identity);
		expect(describePath('seats.spaces[pas].heightMm', empty, c)).toBe('Passenger seat space, height');
		expect(describePath('seats.spaces[pas]', c)).toBe('Passenger seat space');
		expect(describePath('power.notes', c)).toBe('Power & ground notes');
		expect(describePath('identity.yearTo', c)).toBe('Last model year');
		expect(describePath('seats', c)).toBe('Seat space');
		expect(describePath('seats.spaces[zz].heightMm', c)).toBe('Entry zz, height');
	});

	it('formats values it does not know plainly', () => {
		expect(formatFieldValue('nowhere', 3)).toBe('3');
		expect(formatFieldValue('harness.ladder.lines[].buttons[].ohms', 1_500_000)).toBe('1.5 MΩ');
		expect(formatFieldValue('harness.ladder.lines[].buttons[].ohms', 4.7)).toBe('4.7 Ω');
		expect(formatFieldValue('identity.vinPatterns', [])).toBe('none');
	});
});
