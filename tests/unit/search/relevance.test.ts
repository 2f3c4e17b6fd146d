import { readFileSync } from 'node:fs';
import { beforeEach, describe, expect, it } from 'vitest';
import { emptyContent, parseContent, type VehicleContent } from '../../../src/lib/domain/content/schema';
import { vehicleSearchSections } from '../../../src/lib/domain/search/document';
import type { SearchFilters } from '../../../src/lib/domain/search/filters';
import { vehicleSlug } from '../../../src/lib/domain/slug';
import { VehicleSearchEngine } from '../../../src/lib/server/search/engine';
import { withNoteSnippet } from '../../../src/lib/server/search/hits';
import type { IndexInput } from '../../../src/lib/server/search/types';

// Sample data: the invented sample pages plus a few invented neighbours that compete for the same words.
const samples: VehicleContent[] = JSON.parse(readFileSync(new URL('../../../content-seed/vehicles.json', import.meta.url), 'utf8')).vehicles.map(
	(v: unknown) => parseContent(v).data!
);

function page(identity: Parameters<typeof emptyContent>[0], edit: (c: VehicleContent) => void = () => {}): VehicleContent {
	const c = emptyContent(identity);
	edit(c);
	return c;
}

const extras: VehicleContent[] = [
	page({ make: 'Veldra', model: 'Tarn', yearFrom: 2014, yearTo: 2019, body: 'sedan' }, (c) => {
		c.dash.notes = 'Second generation: the dash kit changed to an integrated screen.';
	}),
	page({ make: 'Veldra', model: 'Tarnock', yearFrom: 2010, yearTo: 2015, body: 'hatchback' }),
	page({ make: 'Korvane', model: 'Ettle', yearFrom: 2011, yearTo: 2014, body: 'wagon' }, (c) => {
		c.harness.notes = 'Shares its harness plugs with the Veldra Tarn of the same years.';
	})
];

let engine: VehicleSearchEngine;
const contentById = new Map<number, VehicleContent>();

function inputs(): IndexInput[] {
	return [...samples, ...extras].map((content, i) => {
		contentById.set(i + 1, content);
		return { id: i + 1, slug: vehicleSlug(content.identity), revisionId: 100 + i, content };
	});
}

beforeEach(() => {
	engine = new VehicleSearchEngine();
	engine.putMany(inputs());
	engine.warm();
});

const search = (q: string, more: Partial<SearchFilters> = {}, limit = 20) => {
	const out = engine.search({ q, conditions: [], ...more }, { limit, referenceYear: 2026 });
	out.items = out.items.map((h) => withNoteSnippet(h, vehicleSearchSections(contentById.get(h.id)!)));
	return out;
};
const slugs = (q: string, more: Partial<SearchFilters> = {}) => search(q, more).items.map((h) => h.slug);

describe('relevance', () => {
	it('puts the exact model first, then longer models it begins, then pages that only mention it', () => {
		const got = slugs('tarn');
		expect(got.slice(0, 2).sort()).toEqual(['veldra-tarn-2009-2013-sedan', 'veldra-tarn-2014-2019-sedan']);
		expect(got.indexOf('veldra-tarnock-2010-2015-hatchback')).toBe(2);
		expect(got.at(-1)).toBe('korvane-ettle-2011-2014-wagon');
		const mention = search('tarn').items.at(-1)!;
		expect(mention.section).toBe('harness');
		expect(mention.snippet).toContain('Veldra Tarn');
	});

	it('keeps a four-digit year inside each page’s year range', () => {
		expect(slugs('2012 tarn')).toEqual(['veldra-tarn-2009-2013-sedan', 'veldra-tarnock-2010-2015-hatchback', 'korvane-ettle-2011-2014-wagon']);
		expect(slugs('tarn 2016')).toEqual(['veldra-tarn-2014-2019-sedan']);
		expect(slugs('tarn 2009')[0]).toBe('veldra-tarn-2009-2013-sedan');
	});

	it('reads a two-digit year the same way, in either order', () => {
		expect(slugs('tarn 12')).toEqual(slugs('2012 tarn'));
		expect(slugs('12 tarn')).toEqual(slugs('2012 tarn'));
		expect(search('tarn 12').years).toEqual([2012]);
	});

	it('lets go of a two-digit year no matching page has', () => {
		// 99 reads as 1999, which no Tarn page covers, so the words alone decide
		const out = search('tarn 99');
		expect(out.years).toEqual([]);
		expect(out.items.map((h) => h.slug)).toEqual(slugs('tarn'));
	});

	it('reads a two-digit number that cannot be a year as a word', () => {
		// 30 would be 1930 (before 1950) or 2030 (too far ahead); the Tarn notes mention 30 mm
		expect(search('tarn 30').years).toEqual([]);
		expect(slugs('tarn 30')).toEqual(['veldra-tarn-2009-2013-sedan']);
	});

	it('finds the page from a prefix while typing', () => {
		expect(slugs('tar')).toEqual(expect.arrayContaining(['veldra-tarn-2009-2013-sedan', 'veldra-tarnock-2010-2015-hatchback']));
		expect(slugs('veldra ta')[0]).toMatch(/^veldra-tarn/);
		expect(slugs('brist')).toEqual(['korvane-bristle-2016-2022-suv']);
	});

	it('corrects one slip in a model name of four letters or more, and says so', () => {
		const out = search('tarm');
		expect(out.corrections).toEqual([{ from: 'tarm', to: 'tarn' }]);
		expect(out.items[0].slug).toMatch(/^veldra-tarn-/);
		expect(search('bristel').items[0].slug).toBe('korvane-bristle-2016-2022-suv');
		expect(search('2012 taarn').items[0].slug).toBe('veldra-tarn-2009-2013-sedan');
	});

	it('does not fuzz very short words', () => {
		expect(search('trn')).toMatchObject({ total: 0, corrections: [] });
	});

	it('finds a page by another name it is sold under', () => {
		const out = search('tarnis');
		expect(out.items.map((h) => h.slug)).toEqual(['veldra-tarn-2009-2013-sedan']);
		expect(out.items[0].snippet).toContain('Also sold as Veldra Tarnis');
	});

	it('finds words in the notes and shows the section they are in', () => {
		const out = search('occupant sensor');
		expect(out.total).toBeGreaterThan(0);
		for (const h of out.items) {
			expect(h.section).toBe('seats');
			expect(h.highlights.map(([a, b]) => h.snippet.slice(a, b).toLowerCase())).toEqual(expect.arrayContaining(['occupant', 'sensor']));
		}
	});

	it('combines identity words with notes words', () => {
		const out = search('tarn grommet');
		expect(out.items.map((h) => h.slug)).toEqual(['veldra-tarn-2009-2013-sedan']);
		expect(out.items[0].section).toBe('firewall');
	});

	it('weights identity above notes', () => {
		const out = search('tarn');
		const identity = out.items.filter((h) => h.section === 'identity').map((h) => h.score);
		const notes = out.items.filter((h) => h.section !== 'identity').map((h) => h.score);
		expect(Math.min(...identity)).toBeGreaterThan(Math.max(...notes));
	});
});

describe('filters', () => {
	it('by make, body, year and photos', () => {
		expect(slugs('', { make: 'Veldra' }).every((s) => s.startsWith('veldra-'))).toBe(true);
		expect(slugs('', { make: 'veldra', body: 'hatchback' })).toEqual(['veldra-mirrow-2014-2019-hatchback', 'veldra-tarnock-2010-2015-hatchback']);
		expect(slugs('', { year: 1990 })).toEqual(['marrowby-scree-1988-1995-other']);
		expect(slugs('', { make: 'No Such Make' })).toEqual([]);
		// no sample page records a photo yet
		expect(slugs('', { photos: true })).toEqual([]);
	});

	it('by a measured space, answered with the figure that matched', () => {
		const out = search('', { conditions: [{ measure: 'passenger-seat-height', op: 'gte', mm: 90 }] });
		expect(out.total).toBeGreaterThan(0);
		for (const h of out.items) {
			const content = contentById.get(h.id)!;
			const heights = content.seats.spaces.filter((s) => s.seat === 'passenger').map((s) => s.heightMm ?? -1);
			expect(Math.max(...heights)).toBeGreaterThanOrEqual(90);
			expect(h.section).toBe('seats');
			expect(h.snippet).toMatch(/^Passenger seat space clearance height: \d+ mm$/);
		}
		const below = search('', { conditions: [{ measure: 'passenger-seat-height', op: 'lte', mm: 89 }] });
		expect(below.items.map((h) => h.slug)).not.toEqual(expect.arrayContaining(out.items.map((h) => h.slug)));
	});

	it('lists filter-only results by make, model and year', () => {
		const got = search('', { year: 2012 }).items.map((h) => `${h.make} ${h.model} ${h.yearFrom}`);
		expect(got).toEqual([...got].sort((a, b) => a.toLowerCase().localeCompare(b.toLowerCase())));
	});

	it('counts every match and pages through them', () => {
		const all = engine.search({ q: 'grommet', conditions: [] }, { limit: 100, referenceYear: 2026 });
		const first = engine.search({ q: 'grommet', conditions: [] }, { limit: 3, referenceYear: 2026 });
		const second = engine.search({ q: 'grommet', conditions: [] }, { limit: 3, offset: 3, referenceYear: 2026 });
		expect(first.total).toBe(all.total);
		expect([...first.items, ...second.items].map((h) => h.slug)).toEqual(all.items.slice(0, 6).map((h) => h.slug));
	});
});

describe('keeping the index up to date', () => {
	it('replaces a page with a newer revision and ignores an older one', () => {
		const id = [...contentById].find(([, c]) => c.identity.model === 'Mirrow')![0];
		const renamed = structuredClone(contentById.get(id)!);
		renamed.identity.model = 'Mirrowen';
		renamed.dash.notes = 'Zanderquill clips behind the fascia.';
		expect(engine.put({ id, slug: 'veldra-mirrowen-2014-2019-hatchback', revisionId: 999, content: renamed })).toBe(true);
		expect(slugs('zanderquill')).toEqual(['veldra-mirrowen-2014-2019-hatchback']);
		expect(slugs('mirrowen')).toEqual(['veldra-mirrowen-2014-2019-hatchback']);
		expect(slugs('veldra mirrow')).toEqual(['veldra-mirrowen-2014-2019-hatchback']);
		expect(engine.put({ id, slug: 'veldra-mirrow-2014-2019-hatchback', revisionId: 998, content: contentById.get(id)! })).toBe(false);
		expect(engine.revisionOf(id)).toBe(999);
		expect(engine.retired).toBe(1);
		expect(engine.size).toBe(samples.length + extras.length);
	});

	it('forgets a removed page, its words and its make', () => {
		const id = [...contentById].find(([, c]) => c.identity.model === 'Scree')![0];
		engine.remove(id);
		expect(slugs('scree')).toEqual([]);
		expect(search('screa').corrections).toEqual([]);
		expect(engine.makeList().find((m) => m.name === 'Marrowby')!.pages).toBe(1);
	});
});

describe('VIN candidates', () => {
	it('finds pages by VIN pattern, kept to the model year', () => {
		expect(engine.vinCandidates('VD1TN5A78CX123456', null, 2012).map((c) => c.slug)).toEqual(['veldra-tarn-2009-2013-sedan']);
		expect(engine.vinCandidates('VD1TN5A78CX123456', null, 2016)).toEqual([]);
		expect(engine.vinCandidates('VD1TN5A78CX123456', null, null).map((c) => c.reason)).toEqual(['vin-pattern']);
	});

	it('finds pages by the decoded make and model when the page records no pattern', () => {
		const found = engine.vinCandidates('KV7PN5A78CX123456', { make: 'Korvane', model: 'Pennick' }, 2005);
		expect(found.map((c) => [c.slug, c.reason])).toEqual([['korvane-pennick-2003-2008-pickup', 'decoded']]);
		expect(engine.vinCandidates('KV7PN5A78CX123456', { make: 'korvane', model: 'PENNICK' }, 2012)).toEqual([]);
	});

	it('answers nothing for an unknown VIN', () => {
		expect(engine.vinCandidates('ZZ9ZZ5A78CX123456', null, 2012)).toEqual([]);
	});
});
