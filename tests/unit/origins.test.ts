import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { emptyContent, SECTION_KEYS } from '../../src/lib/domain/content/schema';
import { deriveOrigins, placeFigures, sectionPart, type OriginRow } from '../../src/lib/domain/origins';

// Hand-worked histories of invented pages (sample data only).

const page = () => {
	const c = emptyContent({ make: 'Ostrel', model: 'Lumen', yearFrom: 2014, yearTo: 2019, body: 'wagon' });
	c.seats.spaces = [{ id: 'drv', seat: 'driver', lengthMm: 420, widthMm: 310, heightMm: 85, obstacles: 'loom', boardNeeded: false, travelNotes: '' }];
	c.speakers.locations = [{ id: 'fd', location: 'front door', nominalSize: '6.5 in', cutoutMm: 142, depthMm: 60, impedanceOhm: 4, grille: '' }];
	c.firewall.passages = [{ id: 'g1', location: 'behind the pedal box', kind: 'factory-grommet', pushFrom: 'cabin', holeMm: 20, avoid: 'brake line', tools: '' }];
	c.power.runs = [{ id: 'amp', to: 'boot', lengthM: 5 }];
	c.power.groundPoints = [{ id: 'gp', location: 'seat bolt', notes: 'scrape the paint' }];
	c.dash.opening = 'double-din';
	c.dash.depthMm = 160;
	return c;
};

const byPart = (rows: OriginRow[]) => Object.fromEntries(rows.map((r) => [r.part, r.originRevisionId]));

describe('placeFigures', () => {
	it('keys every place and reads only its figures', () => {
		expect(placeFigures(page())).toEqual({
			dash: ['double-din', 160],
			'seat:drv': ['driver', 420, 310, 85],
			'speaker:fd': [142, 60],
			'passage:g1': ['behind the pedal box', 'factory-grommet', 'cabin', 20],
			'run:amp': ['boot', 5],
			'ground:gp': ['seat bolt']
		});
	});

	it('a wording change leaves the figures as they were', () => {
		const c = page();
		c.seats.spaces[0].obstacles = 'loom and a heater duct';
		c.power.groundPoints[0].notes = 'use a star washer';
		expect(placeFigures(c)).toEqual(placeFigures(page()));
	});
});

describe('deriveOrigins', () => {
	const digests = { dash: 'd1', 'seat:drv': 's1' };

	it('a first revision originates everything', () => {
		const rows = byPart(deriveOrigins(1, null, [...SECTION_KEYS], digests));
		expect(Object.values(rows).every((o) => o === 1)).toBe(true);
		expect(Object.keys(rows)).toHaveLength(SECTION_KEYS.length + 2);
	});

	it('inherits what did not change and takes what did', () => {
		const first = deriveOrigins(1, null, [...SECTION_KEYS], digests);
		const second = deriveOrigins(2, first, ['removal'], digests);
		const third = deriveOrigins(3, second, ['seats'], { dash: 'd1', 'seat:drv': 's2', 'seat:pas': 'p1' });
		expect(byPart(third)).toMatchObject({
			[sectionPart('removal')]: 2,
			[sectionPart('seats')]: 3,
			[sectionPart('dash')]: 1,
			dash: 1,
			'seat:drv': 3,
			'seat:pas': 3
		});
		// A place the new revision lacks has no row.
		expect(byPart(deriveOrigins(4, third, ['seats'], { dash: 'd1' }))['seat:drv']).toBeUndefined();
	});

	it('a place’s origin is the latest revision where its digest changed (any history)', () => {
		fc.assert(
			fc.property(fc.array(fc.constantFrom('a', 'b', 'c'), { minLength: 1, maxLength: 30 }), (values) => {
				let rows: OriginRow[] | null = null;
				values.forEach((v, i) => (rows = deriveOrigins(i + 1, rows, [], { dash: v })));
				// Counted by hand: walk back from the end while the value stays the same.
				let start = values.length - 1;
				while (start > 0 && values[start - 1] === values[values.length - 1]) start--;
				expect(byPart(rows!).dash).toBe(start + 1);
			})
		);
	});
});
