import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
	canonicalJson,
	emptyContent,
	FIELD_INFO,
	formatZodIssues,
	newItemId,
	parseContent,
	SECTION_KEYS,
	SECTION_NAMES,
	vehicleContentSchema,
	type VehicleContent
} from '../../../src/lib/domain/content/schema';

const identity = { make: 'Veldra', model: 'Tarn', yearFrom: 2009, yearTo: 2013, body: 'sedan' } as const;

function page(patch: (c: Record<string, any>) => void = () => {}): Record<string, any> {
	const c = structuredClone(emptyContent(identity)) as Record<string, any>;
	patch(c);
	return c;
}

function issues(input: unknown): Record<string, string> {
	const r = parseContent(input);
	if (r.success) throw new Error('expected the content to be refused');
	return formatZodIssues(r.error);
}

const seat = (id: string, over: Record<string, unknown> = {}) => ({
	id,
	seat: 'passenger',
	lengthMm: 500,
	widthMm: 380,
	heightMm: 95,
	obstacles: '',
	boardNeeded: false,
	travelNotes: '',
	...over
});

describe('sections', () => {
	it('names every section as a person reads it', () => {
		expect(SECTION_KEYS).toEqual(['identity', 'power', 'firewall', 'seats', 'dash', 'harness', 'boot', 'speakers', 'camera', 'removal']);
		expect(SECTION_KEYS.map((k) => SECTION_NAMES[k])).toEqual([
			'Identity',
			'Power & ground',
			'Firewall pass-through',
			'Seat space',
			'Dash & head unit',
			'Harness & integration',
			'Boot & cargo',
			'Speakers',
			'Camera & accessories',
			'Removal & surprises'
		]);
	});
});

describe('emptyContent', () => {
	it('makes a valid page with every section empty', () => {
		const c = emptyContent(identity);
		expect(vehicleContentSchema.safeParse(c).success).toBe(true);
		expect(c.schemaVersion).toBe(1);
		expect(c.identity).toMatchObject({ ...identity, market: '', aliases: [], vinPatterns: [], notes: '' });
		expect(c.seats.spaces).toEqual([]);
		expect(c.harness.ladder.lines).toEqual([]);
		expect(c.harness.factoryAmp).toBeNull();
		expect(c.power.batteryLocation).toBeNull();
		expect(c.dash.opening).toBeNull();
		expect(c.photos).toEqual([]);
		for (const key of SECTION_KEYS) expect(c[key]).toHaveProperty('notes', '');
	});

	it('refuses a bad identity', () => {
		expect(() => emptyContent({ ...identity, make: '' })).toThrow(/Make is required/);
		expect(() => emptyContent({ ...identity, yearTo: 2001 })).toThrow(/before the first/);
	});
});

describe('identity rules', () => {
	it('wants the last year not before the first, on the yearTo field', () => {
		const e = issues(page((c) => (c.identity.yearTo = 2005)));
		expect(e['identity.yearTo']).toBe('The last model year (2005) is before the first (2009).');
		expect(parseContent(page((c) => (c.identity.yearTo = 2009))).success).toBe(true);
	});

	it.each([
		[1949, 'First model year must be 1950 or later.'],
		[2101, 'First model year must be 2100 or earlier.'],
		[2010.5, 'First model year must be a whole year, for example 2012.'],
		['2010', 'First model year must be a year, for example 2012.']
	])('year %s is refused with a message', (value, message) => {
		const e = issues(page((c) => ((c.identity.yearFrom = value), (c.identity.yearTo = 2100))));
		expect(e['identity.yearFrom']).toBe(message);
	});

	it('accepts the year bounds 1950 and 2100', () => {
		expect(parseContent(page((c) => ((c.identity.yearFrom = 1950), (c.identity.yearTo = 2100)))).success).toBe(true);
	});

	it('says which body styles exist', () => {
		const e = issues(page((c) => (c.identity.body = 'limousine')));
		expect(e['identity.body']).toMatch(/^Body style must be one of: Sedan, Hatchback, .*SUV, Pickup, Van, Other body\.$/);
	});

	it('asks for make and model', () => {
		const e = issues({ schemaVersion: 1, identity: { yearFrom: 2009, yearTo: 2013, body: 'sedan' } });
		expect(e['identity.make']).toBe('Make is required.');
		expect(e['identity.model']).toBe('Model is required.');
		expect(issues({ schemaVersion: 1 })['identity']).toBe('Identity is required.');
	});

	it('trims names and keeps aliases', () => {
		const r = parseContent(page((c) => ((c.identity.make = '  Veldra  '), (c.identity.aliases = [' Veldra Tarnis ']))));
		expect(r.success && r.data.identity.make).toBe('Veldra');
		expect(r.success && r.data.identity.aliases).toEqual(['Veldra Tarnis']);
	});

	// ISO 3779 (from memory): a VIN uses 0-9 and A-Z except I, O and Q, in 17 positions.
	it('reads VIN patterns in capitals and refuses I, O, Q', () => {
		const ok = parseContent(page((c) => (c.identity.vinPatterns = ['vd1tn*', 'VD1T?5'])));
		expect(ok.success && ok.data.identity.vinPatterns).toEqual(['VD1TN*', 'VD1T?5']);
		for (const bad of ['VD1TO*', 'VIN*', 'Q1', 'A'.repeat(18), 'VD-1']) {
			expect(issues(page((c) => (c.identity.vinPatterns = [bad])))['identity.vinPatterns.0']).toMatch(/without I, O, Q/);
		}
	});
});

describe('measurements', () => {
	it.each([
		[0, 'Height must be more than 0 mm.'],
		[-5, 'Height must be more than 0 mm.'],
		[3000.1, 'Height must be at most 3000 mm; check the unit.'],
		['95', 'Height must be a number in mm, or leave it empty if not measured.'],
		[Number.NaN, 'Height must be a number in mm, or leave it empty if not measured.'],
		[Number.POSITIVE_INFINITY, 'Height must be a number in mm, or leave it empty if not measured.']
	])('seat height %s is refused', (value, message) => {
		const e = issues(page((c) => (c.seats.spaces = [seat('s1', { heightMm: value })])));
		expect(e['seats.spaces.0.heightMm']).toBe(message);
	});

	it.each([0.5, 1, 95, 3000, null])('seat height %s is accepted', (value) => {
		expect(parseContent(page((c) => (c.seats.spaces = [seat('s1', { heightMm: value })]))).success).toBe(true);
	});

	it('treats a missing measurement as not measured', () => {
		const r = parseContent(page((c) => (c.seats.spaces = [{ id: 's1', seat: 'rear' }])));
		expect(r.success && r.data.seats.spaces[0]).toEqual({
			id: 's1',
			seat: 'rear',
			lengthMm: null,
			widthMm: null,
			heightMm: null,
			obstacles: '',
			boardNeeded: false,
			travelNotes: ''
		});
	});

	it('lets a steering button read 0 Ω but not below', () => {
		const ladder = (ohms: unknown) =>
			page((c) => (c.harness.ladder.lines = [{ id: 'l1', name: 'Line 1', buttons: [{ id: 'b1', name: 'Vol +', ohms }] }]));
		expect(parseContent(ladder(0)).success).toBe(true);
		expect(issues(ladder(-1))['harness.ladder.lines.0.buttons.0.ohms']).toBe('Resistance must be at least 0 Ω.');
	});

	it('bounds the other measurements with their own units', () => {
		const e = issues(
			page((c) => {
				c.power.runs = [{ id: 'r1', to: 'boot', lengthM: 31 }];
				c.firewall.passages = [{ id: 'p1', location: 'x', kind: 'drilled', pushFrom: 'cabin', holeMm: 101 }];
				c.speakers.locations = [{ id: 'k1', location: 'Front door', impedanceOhm: 0 }];
				c.camera.feeds = [{ id: 'f1', name: 'Dash camera', kind: 'constant', fuseA: 401 }];
				c.dash.depthMm = -1;
			})
		);
		expect(e).toMatchObject({
			'power.runs.0.lengthM': 'Length must be at most 30 m; check the unit.',
			'firewall.passages.0.holeMm': 'Hole size must be at most 100 mm; check the unit.',
			'speakers.locations.0.impedanceOhm': 'Impedance must be more than 0 Ω.',
			'camera.feeds.0.fuseA': 'Fuse must be at most 400 A; check the unit.',
			'dash.depthMm': 'Usable chassis depth must be more than 0 mm.'
		});
	});
});

describe('list entries', () => {
	it('refuses two entries with one id, pointing at the second', () => {
		const e = issues(page((c) => (c.seats.spaces = [seat('s1'), seat('s1', { seat: 'rear' })])));
		expect(e['seats.spaces.1.id']).toBe('Two seat spaces share the id "s1".');
	});

	it('refuses ids that could not sit in a field path', () => {
		for (const id of ['', 'a b', 'a.b', 'a[b]', 'x'.repeat(65)]) {
			expect(issues(page((c) => (c.seats.spaces = [seat(id)])))['seats.spaces.0.id']).toMatch(/^An entry id is 1 to 64/);
		}
	});

	it('takes a photo sha256 as its id and a section key', () => {
		const sha = 'ab'.repeat(32);
		const r = parseContent(page((c) => (c.photos = [{ id: sha, section: 'firewall', caption: 'Grommet', alt: 'Grommet' }])));
		expect(r.success && r.data.photos[0]).toEqual({ id: sha, section: 'firewall', itemId: null, caption: 'Grommet', alt: 'Grommet' });
		expect(issues(page((c) => (c.photos = [{ id: sha, section: 'trunk' }])))['photos.0.section']).toMatch(/^A photo belongs to one of: Identity, Power & ground/);
	});
});

describe('versions and unknown fields', () => {
	it('refuses another content version', () => {
		expect(issues(page((c) => (c.schemaVersion = 2)))['schemaVersion']).toBe(
			'This page uses a content version this app does not read (expected version 1).'
		);
	});

	it('names unknown fields instead of dropping them', () => {
		expect(issues(page((c) => (c.colour = 'red')))['']).toBe('The page has fields this version does not know: colour.');
		expect(issues(page((c) => (c.seats.heightMm = 3)))['seats']).toBe('Seat space has fields this page version does not know: heightMm.');
	});

	it('fills sections that are left out', () => {
		const r = parseContent({ schemaVersion: 1, identity });
		expect(r.success && canonicalJson(r.data)).toBe(canonicalJson(emptyContent(identity)));
	});

	it('reads JSON text and explains unreadable JSON', () => {
		expect(parseContent(JSON.stringify(page())).success).toBe(true);
		expect(issues('{"schemaVersion": 1,')['']).toMatch(/^The page is not readable JSON/);
		expect(issues('null')['']).toBe('A vehicle page must be a JSON object.');
	});

	it('never shows a bare library message', () => {
		const bad = [
			page((c) => (c.identity = 3)),
			page((c) => (c.seats.spaces = 'none')),
			page((c) => (c.seats.spaces = [3])),
			page((c) => (c.dash.trimSteps = [''])),
			page((c) => (c.dash.trimSteps = [4])),
			page((c) => (c.harness.factoryAmp = 'yes')),
			page((c) => (c.seats.spaces = [seat('s1', { boardNeeded: 'no' })])),
			page((c) => (c.power.notes = 7)),
			page((c) => (c.power.notes = 'x'.repeat(20_001))),
			page((c) => (c.identity.make = 'x'.repeat(81)))
		];
		for (const input of bad) {
			for (const message of Object.values(issues(input))) {
				expect(message).not.toMatch(/Invalid|expected|received/);
				expect(message).toMatch(/^[A-Z].*\.$/);
			}
		}
	});
});

describe('formatZodIssues', () => {
	it('keys messages by form path and keeps the first per field', () => {
		const r = vehicleContentSchema.safeParse(page((c) => (c.seats.spaces = [seat('s1', { heightMm: 0, widthMm: 'wide' })])));
		expect(r.success).toBe(false);
		const e = formatZodIssues(r.error!);
		expect(Object.keys(e).sort()).toEqual(['seats.spaces.0.heightMm', 'seats.spaces.0.widthMm']);
	});
});

describe('FIELD_INFO', () => {
	it('labels every leaf of a filled-in page', () => {
		const c = page((p) => {
			p.power.runs = [{ id: 'r', to: 'boot', lengthM: 4 }];
			p.power.groundPoints = [{ id: 'g', location: 'stud', notes: '' }];
			p.firewall.passages = [{ id: 'p', location: 'x', kind: 'drilled', pushFrom: 'cabin' }];
			p.seats.spaces = [seat('s')];
			p.harness.wires = [{ id: 'w', function: 'Ground', colour: 'Black', pin: '8' }];
			p.harness.ladder.lines = [{ id: 'l', name: 'L1', buttons: [{ id: 'b', name: 'Vol +', ohms: 0 }] }];
			p.speakers.locations = [{ id: 'k', location: 'Front door' }];
			p.camera.feeds = [{ id: 'f', name: 'Cam', kind: 'switched' }];
			p.photos = [{ id: 'ph', section: 'seats' }];
		});
		const parsed = vehicleContentSchema.parse(c);
		const patterns: string[] = [];
		const visit = (v: unknown, pattern: string) => {
			if (FIELD_INFO[pattern]) return patterns.push(pattern);
			if (Array.isArray(v)) return v.forEach((e) => visit(e, `${pattern}[]`));
			if (v && typeof v === 'object') {
				for (const [k, x] of Object.entries(v)) if (k !== 'id' && k !== 'schemaVersion') visit(x, pattern ? `${pattern}.${k}` : k);
				return;
			}
			throw new Error(`no label for ${pattern}`);
		};
		visit(parsed, '');
		expect(patterns.length).toBe(Object.keys(FIELD_INFO).length);
		for (const p of patterns) expect(FIELD_INFO[p].label.length).toBeGreaterThan(1);
	});
});

describe('newItemId', () => {
	it('makes short ids the schema accepts', () => {
		for (let i = 0; i < 200; i++) expect(newItemId()).toMatch(/^[a-z2-9]{10}$/);
		expect(parseContent(page((c) => (c.seats.spaces = [seat(newItemId())]))).success).toBe(true);
	});

	// 50 random bits: the birthday bound puts a repeat among 20 000 ids near 2e-7.
	it('does not repeat in 20 000 draws', () => {
		const ids = new Set(Array.from({ length: 20_000 }, newItemId));
		expect(ids.size).toBe(20_000);
	});
});

describe('canonicalJson', () => {
	const shuffleKeys = (v: unknown, seed: number): unknown => {
		if (Array.isArray(v)) return v.map((x, i) => shuffleKeys(x, seed + i));
		if (v && typeof v === 'object') {
			const keys = Object.keys(v);
			const order = keys.map((k, i) => [k, (i * 7919 + seed * 104729) % 101] as const).sort((a, b) => a[1] - b[1]);
			return Object.fromEntries(order.map(([k]) => [k, shuffleKeys((v as Record<string, unknown>)[k], seed + 1)]));
		}
		return v;
	};

	it('gives the same text whatever the key order', () => {
		fc.assert(
			fc.property(fc.jsonValue(), fc.integer({ min: 0, max: 1000 }), (value, seed) => {
				expect(canonicalJson(shuffleKeys(value, seed))).toBe(canonicalJson(value));
			})
		);
	});

	it('keeps list order and reads back to the same page', () => {
		const c = page((p) => (p.seats.spaces = [seat('b'), seat('a', { seat: 'rear' })]));
		const back = JSON.parse(canonicalJson(c)) as VehicleContent;
		expect(back).toEqual(c);
		expect(back.seats.spaces.map((s) => s.id)).toEqual(['b', 'a']);
		expect(canonicalJson({ b: 1, a: { d: 2, c: undefined } })).toBe('{"a":{"d":2},"b":1}');
	});

	it('changes when any value changes', () => {
		const a = page();
		const b = page((p) => (p.identity.yearTo = 2014));
		expect(canonicalJson(a)).not.toBe(canonicalJson(b));
	});
});
