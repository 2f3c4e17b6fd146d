import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { applyResolution, mergeContent, mergeText, type MergeConflict } from '../../../src/lib/domain/content/merge';
import { parsePath, valueAtPath, formatPath, type PathSegment } from '../../../src/lib/domain/content/fieldDiff';
import { canonicalJson, FIELD_INFO, vehicleContentSchema, type VehicleContent } from '../../../src/lib/domain/content/schema';

const seed = JSON.parse(readFileSync(new URL('../../../content-seed/vehicles.json', import.meta.url), 'utf8')) as {
	vehicles: unknown[];
};
const pages = seed.vehicles.map((v) => vehicleContentSchema.parse(v));
const tarn = pages.find((p) => p.identity.model === 'Tarn')!;

function sides(edits: { theirs?: (c: VehicleContent) => void; yours?: (c: VehicleContent) => void }) {
	const base = structuredClone(tarn);
	const theirs = structuredClone(tarn);
	const yours = structuredClone(tarn);
	edits.theirs?.(theirs);
	edits.yours?.(yours);
	return { base, theirs, yours, ...mergeContent(base, theirs, yours) };
}

const space = (c: VehicleContent, id: string) => c.seats.spaces.find((s) => s.id === id)!;

describe('mergeContent, fields', () => {
	it('takes different fields from each side', () => {
		const r = sides({
			theirs: (c) => (space(c, 'seat-pass').heightMm = 90),
			yours: (c) => (c.dash.depthMm = 170)
		});
		expect(r.conflicts).toEqual([]);
		expect(space(r.merged, 'seat-pass').heightMm).toBe(90);
		expect(r.merged.dash.depthMm).toBe(170);
	});

	it('takes two fields of one entry from each side', () => {
		const r = sides({
			theirs: (c) => (space(c, 'seat-pass').heightMm = 90),
			yours: (c) => (space(c, 'seat-pass').obstacles = 'Duct on the tunnel side')
		});
		expect(r.conflicts).toEqual([]);
		expect(space(r.merged, 'seat-pass')).toMatchObject({ heightMm: 90, obstacles: 'Duct on the tunnel side' });
	});

	it('asks when both changed one field differently, keeping yours', () => {
		const r = sides({
			theirs: (c) => (space(c, 'seat-pass').heightMm = 90),
			yours: (c) => (space(c, 'seat-pass').heightMm = 88)
		});
		expect(r.conflicts).toEqual([
			{ path: 'seats.spaces[seat-pass].heightMm', label: 'Passenger seat space, height', base: 95, theirs: 90, yours: 88 }
		]);
		expect(space(r.merged, 'seat-pass').heightMm).toBe(88);
	});

	it('does not ask when both made the same change', () => {
		const r = sides({
			theirs: (c) => ((space(c, 'seat-pass').heightMm = 90), (c.dash.trimSteps = ['One step'])),
			yours: (c) => ((space(c, 'seat-pass').heightMm = 90), (c.dash.trimSteps = ['One step']))
		});
		expect(r.conflicts).toEqual([]);
		expect(space(r.merged, 'seat-pass').heightMm).toBe(90);
	});

	it('treats a text list as one value', () => {
		const r = sides({
			theirs: (c) => c.removal.surprises.push('Clip A breaks.'),
			yours: (c) => c.removal.surprises.push('Clip B breaks.')
		});
		expect(r.conflicts.map((c) => [c.path, c.label])).toEqual([['removal.surprises', 'Surprises']]);
		expect(r.merged.removal.surprises).toEqual(r.yours.removal.surprises);
	});

	it('asks about a null set against a number', () => {
		const r = sides({ theirs: (c) => (c.dash.depthMm = null), yours: (c) => (c.dash.depthMm = 170) });
		expect(r.conflicts).toMatchObject([{ path: 'dash.depthMm', base: 225, theirs: null, yours: 170 }]);
	});

	it('keeps a year range whole when the two ends would cross', () => {
		const r = sides({
			theirs: (c) => (c.identity.yearFrom = 2011),
			yours: (c) => (c.identity.yearTo = 2010)
		});
		expect(r.merged.identity).toMatchObject({ yearFrom: 2009, yearTo: 2010 });
		expect(r.conflicts.map((c) => [c.path, c.base, c.theirs, c.yours])).toEqual([
			['identity.yearFrom', 2009, 2011, 2009],
			['identity.yearTo', 2013, 2013, 2010]
		]);
		expect(vehicleContentSchema.safeParse(r.merged).success).toBe(true);
	});
});

describe('mergeContent, list entries', () => {
	const rear = (id: string, heightMm: number) => ({
		id,
		seat: 'rear' as const,
		lengthMm: 600,
		widthMm: 400,
		heightMm,
		obstacles: '',
		boardNeeded: false,
		travelNotes: ''
	});

	it('keeps entries added on either side', () => {
		const r = sides({ theirs: (c) => c.seats.spaces.push(rear('t1', 60)), yours: (c) => c.seats.spaces.push(rear('y1', 70)) });
		expect(r.conflicts).toEqual([]);
		expect(r.merged.seats.spaces.map((s) => s.id)).toEqual(['seat-drv', 'seat-pass', 'seat-rear', 't1', 'y1']);
	});

	it('puts their new entry after the one it followed', () => {
		const r = sides({
			theirs: (c) => c.seats.spaces.splice(1, 0, rear('t1', 60)),
			yours: (c) => c.seats.spaces.push(rear('y1', 70))
		});
		expect(r.merged.seats.spaces.map((s) => s.id)).toEqual(['seat-drv', 't1', 'seat-pass', 'seat-rear', 'y1']);
	});

	it('keeps their reorder when you did not reorder', () => {
		const r = sides({ theirs: (c) => c.seats.spaces.reverse(), yours: (c) => (space(c, 'seat-drv').heightMm = 80) });
		expect(r.merged.seats.spaces.map((s) => s.id)).toEqual(['seat-rear', 'seat-pass', 'seat-drv']);
		expect(space(r.merged, 'seat-drv').heightMm).toBe(80);
	});

	it('removes an entry removed on one side and untouched on the other', () => {
		for (const side of ['theirs', 'yours'] as const) {
			const r = sides({ [side]: (c: VehicleContent) => c.firewall.passages.splice(1, 1), [side === 'theirs' ? 'yours' : 'theirs']: (c: VehicleContent) => (c.dash.kit = 'New kit') });
			expect(r.conflicts).toEqual([]);
			expect(r.merged.firewall.passages.map((p) => p.id)).toEqual(['fw-drv']);
			expect(r.merged.dash.kit).toBe('New kit');
		}
	});

	it('asks when you changed an entry they removed, keeping yours', () => {
		const r = sides({
			theirs: (c) => c.firewall.passages.splice(1, 1),
			yours: (c) => (c.firewall.passages[1].holeMm = 22)
		});
		expect(r.conflicts).toHaveLength(1);
		expect(r.conflicts[0]).toMatchObject({
			path: 'firewall.passages[fw-pass]',
			label: 'Firewall passage “Passenger side, behind the glovebox, beside the…”',
			theirs: null,
			yours: expect.objectContaining({ holeMm: 22 })
		});
		expect(r.merged.firewall.passages.map((p) => p.id)).toEqual(['fw-drv', 'fw-pass']);
	});

	it('asks when you removed an entry they changed', () => {
		const r = sides({
			theirs: (c) => (c.firewall.passages[1].holeMm = 22),
			yours: (c) => c.firewall.passages.splice(1, 1)
		});
		expect(r.conflicts).toMatchObject([{ path: 'firewall.passages[fw-pass]', yours: null, theirs: expect.objectContaining({ holeMm: 22 }) }]);
		expect(r.merged.firewall.passages.map((p) => p.id)).toEqual(['fw-drv']);
	});

	it('merges steering buttons inside their lines', () => {
		const r = sides({
			theirs: (c) => (c.harness.ladder.lines[0].buttons[1].ohms = 390),
			yours: (c) => {
				c.harness.ladder.lines[0].buttons[2].ohms = 1200;
				c.harness.ladder.lines[1].buttons.push({ id: 'b-new', name: 'Camera', ohms: 6800 });
			}
		});
		expect(r.conflicts).toEqual([]);
		const [l1, l2] = r.merged.harness.ladder.lines;
		expect(l1.buttons.map((b) => b.ohms)).toEqual([0, 390, 1200, 2200, 4700]);
		expect(l2.buttons.at(-1)).toEqual({ id: 'b-new', name: 'Camera', ohms: 6800 });
	});

	it('labels a button conflict by line and button', () => {
		const r = sides({
			theirs: (c) => (c.harness.ladder.lines[0].buttons[1].ohms = 390),
			yours: (c) => (c.harness.ladder.lines[0].buttons[1].ohms = 360)
		});
		expect(r.conflicts).toMatchObject([
			{ path: 'harness.ladder.lines[swc-1].buttons[b-voldn].ohms', label: 'Steering control “Line 1 (B9)”, button “Volume −”, resistance' }
		]);
	});
});

describe('mergeContent, notes', () => {
	const notes = ['Line one.', 'Line two.', 'Line three.', 'Line four.'].join('\n');

	it('merges changes to different lines', () => {
		const b = structuredClone(tarn);
		b.seats.notes = notes;
		const t = structuredClone(b);
		t.seats.notes = notes.replace('Line one.', 'Line 1.');
		const y = structuredClone(b);
		y.seats.notes = notes.replace('Line four.', 'Line 4.');
		const m = mergeContent(b, t, y);
		expect(m.conflicts).toEqual([]);
		expect(m.merged.seats.notes).toBe('Line 1.\nLine two.\nLine three.\nLine 4.');
	});

	it('asks when both rewrote the whole text', () => {
		const r = sides({
			theirs: (c) => (c.seats.notes = notes.replace('Line one.', 'Line 1.')),
			yours: (c) => (c.seats.notes = notes.replace('Line four.', 'Line 4.'))
		});
		expect(r.conflicts.map((c) => [c.path, c.label])).toEqual([['seats.notes', 'Seat space notes']]);
		expect(r.merged.seats.notes).toBe(r.yours.seats.notes);
	});

	it('asks when the same line changed, keeping your text', () => {
		const b = structuredClone(tarn);
		b.seats.notes = notes;
		const t = structuredClone(b);
		t.seats.notes = notes.replace('Line two.', 'Line 2.');
		const y = structuredClone(b);
		y.seats.notes = notes.replace('Line two.', 'Line II.');
		const m = mergeContent(b, t, y);
		expect(m.conflicts).toEqual([{ path: 'seats.notes', label: 'Seat space notes', base: notes, theirs: t.seats.notes, yours: y.seats.notes }]);
		expect(m.merged.seats.notes).toBe(y.seats.notes);
	});
});

// Cases follow the diff3 merge rules described in the GNU diffutils manual
// ("Comparing Three Files"): unchanged, one-sided, identical and overlapping changes.
describe('mergeText', () => {
	const L = (...lines: string[]) => lines.join('\n');

	it.each([
		['one side changed', L('a', 'b', 'c'), L('a', 'B', 'c'), L('a', 'b', 'c'), L('a', 'B', 'c'), true],
		['both changed the same way', L('a', 'b', 'c'), L('a', 'B', 'c'), L('a', 'B', 'c'), L('a', 'B', 'c'), true],
		['neighbouring lines', L('a', 'b', 'c'), L('A', 'b', 'c'), L('a', 'B', 'c'), L('A', 'B', 'c'), true],
		['far apart lines', L('a', 'b', 'c', 'd', 'e'), L('A', 'b', 'c', 'd', 'e'), L('a', 'b', 'c', 'd', 'E'), L('A', 'b', 'c', 'd', 'E'), true],
		['insert and delete elsewhere', L('a', 'b', 'c'), L('a', 'b', 'x', 'c'), L('b', 'c'), L('b', 'x', 'c'), true],
		['insert at both ends', L('a', 'b'), L('top', 'a', 'b'), L('a', 'b', 'end'), L('top', 'a', 'b', 'end'), true],
		['same insert at one spot', L('a', 'b'), L('a', 'x', 'b'), L('a', 'x', 'b'), L('a', 'x', 'b'), true],
		['different inserts at one spot', L('a', 'b'), L('a', 'x', 'b'), L('a', 'y', 'b'), L('a', 'y', 'b'), false],
		['same line changed differently', L('a', 'b', 'c'), L('a', 'B', 'c'), L('a', 'b2', 'c'), L('a', 'b2', 'c'), false],
		['deleted against edited', L('a', 'b', 'c'), L('a', 'c'), L('a', 'b!', 'c'), L('a', 'b!', 'c'), false],
		['overlapping ranges', L('a', 'b', 'c', 'd'), L('a', 'X', 'Y', 'd'), L('a', 'b', 'Z', 'd'), L('a', 'b', 'Z', 'd'), false],
		['insert inside a replaced range', L('a', 'b', 'c', 'd'), L('a', 'Q', 'd'), L('a', 'b', 'n', 'c', 'd'), L('a', 'b', 'n', 'c', 'd'), false],
		['from empty', '', 'new text', '', 'new text', true]
	])('%s', (_name, base, theirs, yours, text, clean) => {
		expect(mergeText(base, theirs, yours)).toEqual({ text, clean });
	});

	const lineArb = fc.constantFrom('fuse', 'loom', 'grommet', '', '> caution', 'bolt 10 mm');
	const doc = fc.array(lineArb, { minLength: 0, maxLength: 12 });

	it('returns the other side when one side did nothing', () => {
		fc.assert(
			fc.property(doc, doc, (b, x) => {
				const base = b.join('\n');
				const other = x.join('\n');
				expect(mergeText(base, other, base)).toEqual({ text: other, clean: true });
				expect(mergeText(base, base, other)).toEqual({ text: other, clean: true });
				expect(mergeText(base, other, other)).toEqual({ text: other, clean: true });
			})
		);
	});

	it('applies edits to separate lines from both sides', () => {
		// Each line of the base is edited by one side at most, and edits are spaced by an untouched line.
		fc.assert(
			fc.property(fc.array(fc.tuple(lineArb, fc.constantFrom(0, 1, 2), fc.constantFrom('T', 'Y')), { minLength: 1, maxLength: 12 }), (rows) => {
				const base: string[] = [];
				const theirs: string[] = [];
				const yours: string[] = [];
				const both: string[] = [];
				rows.forEach(([line, action, who], i) => {
					const original = `${i}:${line}`;
					base.push(original, `keep ${i}`);
					const edited = action === 0 ? [original] : action === 1 ? [`${original}!`] : [];
					theirs.push(...(who === 'T' ? edited : [original]), `keep ${i}`);
					yours.push(...(who === 'Y' ? edited : [original]), `keep ${i}`);
					both.push(...edited, `keep ${i}`);
				});
				expect(mergeText(base.join('\n'), theirs.join('\n'), yours.join('\n'))).toEqual({ text: both.join('\n'), clean: true });
			})
		);
	});

	it('never loses a line only you added', () => {
		fc.assert(
			fc.property(doc, doc, doc, (b, t, y) => {
				const r = mergeText(b.join('\n'), t.join('\n'), y.join('\n'));
				const out = r.text.split('\n');
				const baseLines = b.join('\n').split('\n');
				for (const line of y) if (!baseLines.includes(line)) expect(out).toContain(line);
				if (!r.clean) expect(r.text).toBe(y.join('\n'));
			})
		);
	});
});

describe('applyResolution', () => {
	it('settles each conflict as chosen', () => {
		const r = sides({
			theirs: (c) => {
				space(c, 'seat-pass').heightMm = 90;
				c.firewall.passages[1].holeMm = 22;
				c.dash.kit = 'Their kit';
			},
			yours: (c) => {
				space(c, 'seat-pass').heightMm = 88;
				c.firewall.passages.splice(1, 1);
				c.dash.kit = 'Your kit';
			}
		});
		expect(r.conflicts.map((c) => c.path).sort()).toEqual(['dash.kit', 'firewall.passages[fw-pass]', 'seats.spaces[seat-pass].heightMm']);
		const settled = applyResolution(r.merged, r.conflicts, {
			'seats.spaces[seat-pass].heightMm': 'theirs',
			'firewall.passages[fw-pass]': 'theirs',
			'dash.kit': 'base'
		});
		expect(space(settled, 'seat-pass').heightMm).toBe(90);
		expect(settled.firewall.passages.find((p) => p.id === 'fw-pass')?.holeMm).toBe(22);
		expect(settled.dash.kit).toBe(tarn.dash.kit);
		expect(vehicleContentSchema.safeParse(settled).success).toBe(true);
		const yoursKept = applyResolution(r.merged, r.conflicts, {});
		expect(canonicalJson(yoursKept)).toBe(canonicalJson(r.merged));
		expect(space(r.merged, 'seat-pass').heightMm).toBe(88);
	});

	it('removes an entry when the chosen side removed it', () => {
		const r = sides({
			theirs: (c) => c.firewall.passages.splice(1, 1),
			yours: (c) => (c.firewall.passages[1].holeMm = 22)
		});
		const settled = applyResolution(r.merged, r.conflicts, { 'firewall.passages[fw-pass]': 'theirs' });
		expect(settled.firewall.passages.map((p) => p.id)).toEqual(['fw-drv']);
		expect(r.merged.firewall.passages).toHaveLength(2);
	});
});

// ---------- properties ----------

type Op =
	| { t: 'set'; path: string; value: unknown }
	| { t: 'notes'; section: 'power' | 'seats' | 'dash' | 'removal'; value: string }
	| { t: 'item'; list: string; index: number; field: string; value: unknown }
	| { t: 'button'; line: number; button: number; ohms: number | null }
	| { t: 'remove'; list: string; index: number }
	| { t: 'add'; list: string; n: number };

const word = fc.stringMatching(/^[a-z0-9]{1,10}$/);
const mmValue = (max: number) => fc.oneof(fc.constant(null), fc.integer({ min: 1, max }));

const SETS: [string, fc.Arbitrary<unknown>][] = [
	['identity.make', word],
	['identity.market', word],
	// Any first year here is before any last year, on every seed page.
	['identity.yearFrom', fc.integer({ min: 1950, max: 1987 })],
	['identity.yearTo', fc.integer({ min: 2026, max: 2100 })],
	['identity.body', fc.constantFrom('sedan', 'wagon', 'suv')],
	['identity.aliases', fc.array(word, { maxLength: 3 })],
	['power.batteryLocation', fc.constantFrom(null, 'boot', 'engine-bay')],
	['power.fuseHolderSpot', word],
	['dash.opening', fc.constantFrom(null, 'single-din', 'double-din')],
	['dash.depthMm', mmValue(3000)],
	['dash.trimSteps', fc.array(word, { maxLength: 3 })],
	['harness.factoryAmp', fc.constantFrom(null, true, false)],
	['harness.can', word],
	['camera.mounting', word],
	['removal.surprises', fc.array(word, { maxLength: 3 })]
];

const ITEM_FIELDS: Record<string, [string, fc.Arbitrary<unknown>][]> = {
	'power.runs': [
		['to', word],
		['lengthM', fc.oneof(fc.constant(null), fc.integer({ min: 1, max: 300 }).map((n) => n / 10))]
	],
	'firewall.passages': [
		['location', word],
		['holeMm', mmValue(100)],
		['kind', fc.constantFrom('drilled', 'factory-grommet')]
	],
	'seats.spaces': [
		['heightMm', mmValue(3000)],
		['lengthMm', mmValue(3000)],
		['obstacles', word],
		['boardNeeded', fc.boolean()]
	],
	'harness.wires': [
		['colour', word],
		['pin', word]
	],
	'speakers.locations': [
		['cutoutMm', mmValue(500)],
		['impedanceOhm', fc.constantFrom(null, 2, 4, 8)]
	],
	'harness.ladder.lines': [['name', word]]
};
const LISTS = Object.keys(ITEM_FIELDS);

const opArb: fc.Arbitrary<Op> = fc.oneof(
	fc.constantFrom(...SETS).chain(([path, value]) => value.map((v) => ({ t: 'set' as const, path, value: v }))),
	fc.record({
		t: fc.constant('notes' as const),
		section: fc.constantFrom('power' as const, 'seats' as const, 'dash' as const, 'removal' as const),
		value: fc.array(word, { maxLength: 4 }).map((w) => w.join('\n'))
	}),
	fc
		.constantFrom(...LISTS)
		.chain((list) =>
			fc
				.constantFrom(...ITEM_FIELDS[list])
				.chain(([field, value]) => fc.record({ t: fc.constant('item' as const), list: fc.constant(list), index: fc.nat(10), field: fc.constant(field), value }))
		),
	fc.record({ t: fc.constant('button' as const), line: fc.nat(3), button: fc.nat(8), ohms: fc.oneof(fc.constant(null), fc.integer({ min: 0, max: 100_000 })) }),
	fc.record({ t: fc.constant('remove' as const), list: fc.constantFrom(...LISTS), index: fc.nat(10) }),
	fc.record({ t: fc.constant('add' as const), list: fc.constantFrom(...LISTS), n: fc.nat(1_000_000) })
);

type Entry = { id: string } & Record<string, unknown>;

const listOf = (c: VehicleContent, list: string) => valueAtPath(c, list) as Entry[];

function pick(base: VehicleContent, list: string, index: number): string | null {
	const items = listOf(base, list);
	return items.length ? items[index % items.length].id : null;
}

function newEntry(list: string, id: string): Entry {
	switch (list) {
		case 'power.runs':
			return { id, to: 'new spot', lengthM: 2 };
		case 'firewall.passages':
			return { id, location: 'new hole', kind: 'drilled', pushFrom: 'cabin', holeMm: 16, avoid: '', tools: '' };
		case 'seats.spaces':
			return { id, seat: 'rear', lengthMm: 500, widthMm: 300, heightMm: 60, obstacles: '', boardNeeded: false, travelNotes: '' };
		case 'harness.wires':
			return { id, function: 'Spare', colour: 'Pink', pin: 'X1' };
		case 'speakers.locations':
			return { id, location: 'Rear deck', nominalSize: '6.5 in', cutoutMm: 142, depthMm: 60, impedanceOhm: 4, grille: '' };
		default:
			return { id, name: 'New line', buttons: [{ id: `${id}-b`, name: 'Mute', ohms: 100 }] };
	}
}

/** Which part of the page an op touches; two sides touching different slots never conflict. */
function slot(base: VehicleContent, op: Op): string {
	switch (op.t) {
		case 'set':
			return op.path;
		case 'notes':
			return `${op.section}.notes`;
		case 'item':
		case 'remove':
			return `entry ${op.list} ${pick(base, op.list, op.index)}`;
		case 'button':
			return `entry harness.ladder.lines ${pick(base, 'harness.ladder.lines', op.line)}`;
		case 'add':
			return `add ${op.list}`;
	}
}

function apply(base: VehicleContent, c: VehicleContent, op: Op, side: string, k: number): void {
	const setField = (path: string, value: unknown) => {
		const segs = parsePath(path);
		const parent = valueAtPath(c, formatPath(segs.slice(0, -1) as PathSegment[])) as Record<string, unknown> | undefined;
		if (parent) parent[segs.at(-1) as string] = structuredClone(value);
	};
	switch (op.t) {
		case 'set':
			return setField(op.path, op.value);
		case 'notes':
			c[op.section].notes = op.value;
			return;
		case 'item': {
			const id = pick(base, op.list, op.index);
			if (id) setField(`${op.list}[${id}].${op.field}`, op.value);
			return;
		}
		case 'button': {
			const lineId = pick(base, 'harness.ladder.lines', op.line);
			const line = lineId && (valueAtPath(c, `harness.ladder.lines[${lineId}]`) as { buttons: Entry[] } | undefined);
			if (line && line.buttons.length) line.buttons[op.button % line.buttons.length].ohms = op.ohms;
			return;
		}
		case 'remove': {
			const id = pick(base, op.list, op.index);
			const items = listOf(c, op.list);
			const at = items.findIndex((e) => e.id === id);
			if (at >= 0) items.splice(at, 1);
			return;
		}
		case 'add': {
			const items = listOf(c, op.list);
			if (op.list === 'harness.ladder.lines' && items.length >= 8) return;
			items.push(newEntry(op.list, `${side}${k}-${op.n}`));
			return;
		}
	}
}

function run(base: VehicleContent, ops: Op[], side: string): VehicleContent {
	const c = structuredClone(base);
	ops.forEach((op, k) => apply(base, c, op, side, k));
	return c;
}

const baseArb = fc.constantFrom(...pages);

/** Leaves with entry-id paths: "seats.spaces[seat-pass].heightMm" → value. */
function leaves(value: unknown, segs: PathSegment[] = [], pattern = '', out = new Map<string, unknown>()): Map<string, unknown> {
	if (FIELD_INFO[pattern]) out.set(formatPath(segs), value);
	else if (Array.isArray(value)) for (const e of value as Entry[]) leaves(e, [...segs, { id: e.id }], `${pattern}[]`, out);
	else if (value && typeof value === 'object')
		for (const [k, v] of Object.entries(value)) if (k !== 'id' && k !== 'schemaVersion') leaves(v, [...segs, k], pattern ? `${pattern}.${k}` : k, out);
	return out;
}

const patternOfPath = (path: string) => path.replace(/\[[^\]]+\]/g, '[]');

function covered(conflicts: MergeConflict[], path: string, value: unknown): boolean {
	return conflicts.some((c) => {
		if (c.path === path) return canonicalJson(c.yours) === canonicalJson(value);
		if (!path.startsWith(c.path) || !/^[.[]/.test(path.slice(c.path.length))) return false;
		const rest = path.slice(c.path.length).replace(/^\./, '');
		const inner = rest.startsWith('[') ? valueAtPath({ x: c.yours }, `x${rest}`) : valueAtPath(c.yours, rest);
		return canonicalJson(inner) === canonicalJson(value);
	});
}

describe('mergeContent properties', () => {
	it('merging disjoint changes equals applying both', () => {
		fc.assert(
			fc.property(baseArb, fc.array(fc.tuple(opArb, fc.boolean()), { maxLength: 10 }), (base, tagged) => {
				const owner = new Map<string, boolean>();
				const theirOps: Op[] = [];
				const yourOps: Op[] = [];
				for (const [op, mine] of tagged) {
					const s = slot(base, op);
					if (owner.has(s) && owner.get(s) !== mine) continue;
					owner.set(s, mine);
					(mine ? yourOps : theirOps).push(op);
				}
				const theirs = run(base, theirOps, 't');
				const yours = run(base, yourOps, 'y');
				const both = structuredClone(theirs);
				yourOps.forEach((op, k) => apply(base, both, op, 'y', k));
				const r = mergeContent(base, theirs, yours);
				expect(r.conflicts).toEqual([]);
				expect(canonicalJson(r.merged)).toBe(canonicalJson(both));
			}),
			{ numRuns: 300 }
		);
	});

	it('merging with an unchanged side returns the other side', () => {
		fc.assert(
			fc.property(baseArb, fc.array(opArb, { maxLength: 8 }), (base, ops) => {
				const edited = run(base, ops, 'x');
				for (const [t, y] of [
					[edited, base],
					[base, edited],
					[edited, edited]
				]) {
					const r = mergeContent(base, t, y);
					expect(r.conflicts).toEqual([]);
					expect(canonicalJson(r.merged)).toBe(canonicalJson(edited));
				}
			}),
			{ numRuns: 200 }
		);
	});

	it('drops nothing you typed: each value is merged or waits in a conflict', () => {
		fc.assert(
			fc.property(baseArb, fc.array(opArb, { maxLength: 8 }), fc.array(opArb, { maxLength: 8 }), (base, tOps, yOps) => {
				const theirs = run(base, tOps, 't');
				const yours = run(base, yOps, 'y');
				const { merged, conflicts } = mergeContent(base, theirs, yours);
				const before = leaves(base);
				for (const [path, value] of leaves(yours)) {
					if (before.has(path) && canonicalJson(before.get(path)) === canonicalJson(value)) continue;
					if (covered(conflicts, path, value)) continue;
					const now = valueAtPath(merged, path);
					if (FIELD_INFO[patternOfPath(path)]?.kind === 'markdown') {
						const baseLines = String(before.get(path) ?? '').split('\n');
						const mergedLines = String(now).split('\n');
						for (const line of String(value).split('\n')) if (!baseLines.includes(line)) expect(mergedLines).toContain(line);
					} else {
						expect({ path, value: now }).toEqual({ path, value });
					}
				}
				// Until settled, a conflict shows your value in the merged page.
				for (const c of conflicts) {
					expect(c.label.length).toBeGreaterThan(2);
					expect(canonicalJson(valueAtPath(merged, c.path) ?? null)).toBe(canonicalJson(c.yours));
				}
			}),
			{ numRuns: 300 }
		);
	});

	it('always gives a page the schema accepts', () => {
		fc.assert(
			fc.property(baseArb, fc.array(opArb, { maxLength: 8 }), fc.array(opArb, { maxLength: 8 }), (base, tOps, yOps) => {
				const r = mergeContent(base, run(base, tOps, 't'), run(base, yOps, 'y'));
				const parsed = vehicleContentSchema.safeParse(r.merged);
				expect(parsed.success ? [] : parsed.error.issues).toEqual([]);
			}),
			{ numRuns: 200 }
		);
	});
});
