import { describe, expect, it } from 'vitest';
import { all, create } from 'mathjs';
import { emptyContent, type VehicleContent } from '../../../src/lib/domain/content/schema';
import { parseSearchFilters } from '../../../src/lib/domain/search/filters';
import { vehicleSlug } from '../../../src/lib/domain/slug';
import { VehicleSearchEngine } from '../../../src/lib/server/search/engine';
import { seatSpace as space } from '../../helpers/places';

// Measurement filters against invented pages (sample data). Figures are hand-worked; inch figures use
// the international inch, 25.4 mm exactly, with mathjs in exact decimal arithmetic as the reference.
const exact = create(all, { number: 'BigNumber', precision: 64 });
const inchesToMm = (inches: string) => Number(exact.evaluate(`${inches} inch`).toNumeric('mm').toString());


function page(model: string, edit: (c: VehicleContent) => void): VehicleContent {
	const c = emptyContent({ make: 'Sampleworks', model, yearFrom: 2012, yearTo: 2016, body: 'sedan' });
	edit(c);
	return c;
}

function engineWith(pages: VehicleContent[]): VehicleSearchEngine {
	const engine = new VehicleSearchEngine();
	engine.putMany(pages.map((content, i) => ({ id: i + 1, slug: vehicleSlug(content.identity), revisionId: i + 1, content })));
	return engine;
}

/** Models matching a query string as the search form sends it. */
function models(engine: VehicleSearchEngine, query: string): string[] {
	const parsed = parseSearchFilters(new URLSearchParams(query));
	if (!parsed.ok) throw new Error(parsed.message);
	return engine
		.search(parsed.filters, { limit: 50, referenceYear: 2026 })
		.items.map((h) => h.model)
		.sort();
}

describe('a page that records exactly the typed value matches', () => {
	// Single precision keeps 115.3 as 115.30000305… (above) and 115.7 as 115.69999694… (below); both must still match.
	const engine = engineWith([
		page('Alder', (c) => (c.seats.spaces = [space('p', 'passenger', 400, 300, 115.3)])),
		page('Birch', (c) => (c.seats.spaces = [space('p', 'passenger', 400, 300, 115.7)])),
		// typed on the page as 4.54 in, kept to the micrometre as the editor does: 115.316 mm
		page('Cedar', (c) => (c.seats.spaces = [space('p', 'passenger', 400, 300, inchesToMm('4.54'))])),
		page('Damson', (c) => {
			c.dash.depthMm = 150;
			c.firewall.passages = [{ id: 'f', location: 'Left of the pedals', kind: 'factory-grommet', pushFrom: 'cabin', holeMm: 22.2, avoid: '', tools: '' }];
		})
	]);

	it('in millimetres, at least and at most', () => {
		expect(models(engine, 'measure=passenger-seat-height&op=lte&value=115.3')).toEqual(['Alder']);
		expect(models(engine, 'measure=passenger-seat-height&op=gte&value=115.7')).toEqual(['Birch']);
		// 115.316 ≥ 115.3 and ≤ 115.7: only Cedar between them
		expect(models(engine, 'measure=passenger-seat-height&op=gte&value=115.316&measure=passenger-seat-height&op=lte&value=115.316')).toEqual(['Cedar']);
		expect(models(engine, 'measure=firewall-hole&op=gte&value=22.2&measure=dash-depth&op=lte&value=150')).toEqual(['Damson']);
	});

	it('in inches: 4.54 in is 115.316 mm', () => {
		expect(inchesToMm('4.54')).toBe(115.316);
		expect(models(engine, 'unit=in&measure=passenger-seat-height&op=gte&value=4.54&measure=passenger-seat-height&op=lte&value=4.54')).toEqual(['Cedar']);
		// 5.905 in = 149.987 mm, just under Damson's 150 mm dash; 5.906 in = 150.0124 mm, just over
		expect(inchesToMm('5.905')).toBe(149.987);
		expect(inchesToMm('5.906')).toBe(150.0124);
		expect(models(engine, 'unit=in&measure=dash-depth&op=gte&value=5.905')).toEqual(['Damson']);
		expect(models(engine, 'unit=in&measure=dash-depth&op=lte&value=5.905')).toEqual([]);
		expect(models(engine, 'unit=in&measure=dash-depth&op=lte&value=5.906')).toEqual(['Damson']);
		expect(models(engine, 'unit=in&measure=dash-depth&op=gte&value=5.906')).toEqual([]);
	});

	it('shows the figure that matched', () => {
		const parsed = parseSearchFilters(new URLSearchParams('measure=passenger-seat-height&op=lte&value=115.3'));
		const hit = parsed.ok ? engine.search(parsed.filters, { limit: 5, referenceYear: 2026 }).items[0] : null;
		expect(hit?.snippet).toBe('Passenger seat space clearance height: 115.3 mm');
	});
});

describe('several conditions hold on one and the same seat space', () => {
	// Each page has two passenger spaces: a long, low one and a short, tall one.
	const engine = engineWith([
		page('Elm', (c) => (c.seats.spaces = [space('a', 'passenger', 400, 300, 50), space('b', 'passenger', 200, 300, 120)])),
		page('Fir', (c) => (c.seats.spaces = [space('a', 'passenger', 400, 300, 120)])),
		page('Gum', (c) => (c.seats.spaces = [space('a', 'driver', 400, 300, 50), space('b', 'passenger', 200, 300, 120)]))
	]);

	it('a long and tall space: Elm has each only in a different space, so only Fir matches', () => {
		expect(models(engine, 'measure=passenger-seat-length&op=gte&value=300&measure=passenger-seat-height&op=gte&value=100')).toEqual(['Fir']);
		// one condition alone: any space may meet it
		expect(models(engine, 'measure=passenger-seat-height&op=gte&value=100')).toEqual(['Elm', 'Fir', 'Gum']);
	});

	it('a range on one figure is met by one space, not by the smallest and the largest of two', () => {
		// Elm's lengths are 200 and 400: neither lies in 250–350
		expect(models(engine, 'measure=passenger-seat-length&op=gte&value=250&measure=passenger-seat-length&op=lte&value=350')).toEqual([]);
		expect(models(engine, 'measure=passenger-seat-length&op=gte&value=150&measure=passenger-seat-length&op=lte&value=250')).toEqual(['Elm', 'Gum']);
	});

	it('conditions on different seats are met by each seat on its own', () => {
		expect(models(engine, 'measure=driver-seat-length&op=gte&value=300&measure=passenger-seat-height&op=gte&value=100')).toEqual(['Gum']);
	});

	it('quotes the figures of the space that met them', () => {
		const parsed = parseSearchFilters(new URLSearchParams('measure=passenger-seat-length&op=lte&value=250&measure=passenger-seat-height&op=gte&value=100'));
		const hits = parsed.ok ? engine.search(parsed.filters, { limit: 5, referenceYear: 2026 }).items : [];
		expect(hits.find((h) => h.model === 'Elm')?.snippet).toBe('Passenger seat space length: 200 mm · Passenger seat space clearance height: 120 mm');
	});

	it('a space missing a figure does not meet a condition on it', () => {
		const withGap = engineWith([page('Hazel', (c) => (c.seats.spaces = [space('a', 'passenger', 400, null, 120)]))]);
		expect(models(withGap, 'measure=passenger-seat-width&op=lte&value=1000')).toEqual([]);
		expect(models(withGap, 'measure=passenger-seat-length&op=gte&value=400&measure=passenger-seat-height&op=gte&value=120')).toEqual(['Hazel']);
	});
});

describe('seat height', () => {
	// Ash has a passenger space with no height measured; Beech one 120 mm high (invented sample figures).
	const engine = engineWith([
		page('Ash', (c) => (c.seats.spaces = [space('a', 'passenger', 400, 300, null)])),
		page('Beech', (c) => (c.seats.spaces = [space('b', 'passenger', 400, 300, 120)]))
	]);

	it('leaves out a seat with no height measured, for at most and at least alike', () => {
		expect(models(engine, 'measure=passenger-seat-height&op=lte&value=2000')).toEqual(['Beech']);
		expect(models(engine, 'measure=passenger-seat-height&op=gte&value=1')).toEqual(['Beech']);
		// Joined with a condition the unmeasured space meets, still out.
		expect(models(engine, 'measure=passenger-seat-length&op=gte&value=400&measure=passenger-seat-height&op=lte&value=2000')).toEqual(['Beech']);
	});

	it('takes six conditions at once, all on one space', () => {
		// 400 × 300 × 120 mm meets 399–401, 299–301 and 119–121 on the same space.
		const six = 'measure=passenger-seat-length&op=gte&value=399&measure=passenger-seat-length&op=lte&value=401&measure=passenger-seat-width&op=gte&value=299&measure=passenger-seat-width&op=lte&value=301&measure=passenger-seat-height&op=gte&value=119&measure=passenger-seat-height&op=lte&value=121';
		expect(models(engine, six)).toEqual(['Beech']);
		expect(models(engine, six.replace('value=121', 'value=119.9'))).toEqual([]);
	});
});

describe('boot measurements', () => {
	// invented boots: a 36 in opening is 914.4 mm (international inch, exact)
	const engine = engineWith([
		page('Elm', (c) => Object.assign(c.boot, { floorLengthMm: 950, floorWidthMm: 1050, heightMm: 480, openingWidthMm: inchesToMm('36'), openingHeightMm: 520 })),
		page('Fir', (c) => Object.assign(c.boot, { floorLengthMm: 700, floorWidthMm: 980, heightMm: 420, archWidthMm: 900 })),
		page('Gum', () => {})
	]);

	it('filters on the floor, the arches and the load opening, in mm and inches', () => {
		expect(models(engine, 'measure=boot-length&op=gte&value=800')).toEqual(['Elm']);
		expect(models(engine, 'measure=boot-arch-width&op=gte&value=900')).toEqual(['Fir']);
		expect(models(engine, 'unit=in&measure=boot-opening-width&op=gte&value=36&measure=boot-opening-width&op=lte&value=36')).toEqual(['Elm']);
		// a boot that records no height is not taken for one that meets the condition
		expect(models(engine, 'measure=boot-height&op=lte&value=500')).toEqual(['Elm', 'Fir']);
	});
});
