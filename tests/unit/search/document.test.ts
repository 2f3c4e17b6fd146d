import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { emptyContent, parseContent, type VehicleContent } from '../../../src/lib/domain/content/schema';
import { identityWords, noteWords, vehicleHeadline, vehicleSearchSections } from '../../../src/lib/domain/search/document';
import { MEASURE_PLACES, MEASUREMENTS, toMicrometres } from '../../../src/lib/domain/search/measurements';
import { searchWords } from '../../../src/lib/domain/search/words';

const samples: VehicleContent[] = JSON.parse(readFileSync(new URL('../../../content-seed/vehicles.json', import.meta.url), 'utf8')).vehicles.map(
	(v: unknown) => parseContent(v).data!
);
const tarn = samples.find((v) => v.identity.model === 'Tarn')!;

describe('what a page gives the index', () => {
	it('reads every sample page', () => {
		expect(samples.length).toBeGreaterThanOrEqual(15);
		expect(samples.every(Boolean)).toBe(true);
	});

	it('indexes only words the snippets can show, so every match can be explained', () => {
		for (const content of samples) {
			const shown = new Set(vehicleSearchSections(content).flatMap((s) => searchWords(s.text)));
			const missing = noteWords(content).filter((w) => !shown.has(w));
			expect(missing, content.identity.model).toEqual([]);
		}
	});

	it('leaves the labels out of the index, so a word every page carries does not match every page', () => {
		const content = emptyContent({ make: 'Sample', model: 'Labeltest', yearFrom: 2010, yearTo: 2012, body: 'sedan' });
		content.firewall.passages = [{ id: 'p1', location: 'behind the glovebox', kind: 'factory-grommet', pushFrom: 'cabin', holeMm: 12, avoid: 'brake lines', tools: 'fish wire' }];
		const text = vehicleSearchSections(content).find((s) => s.key === 'firewall')!.text;
		expect(text).toContain('Avoid: brake lines.');
		expect(text).toContain('Tools: fish wire.');
		const words = noteWords(content);
		expect(words).toEqual(expect.arrayContaining(['factory', 'grommet', 'glovebox', 'brake', 'fish', '12', 'mm']));
		expect(words).not.toContain('avoid');
		expect(words).not.toContain('tools');
	});

	it('puts make, model, aliases and body in the identity field', () => {
		expect(identityWords(tarn.identity)).toEqual(['veldra', 'tarn', 'tarnis', 'gl', 'sedan']);
	});

	it('strips Markdown for snippets and link targets for the index', () => {
		const content = emptyContent({ make: 'Sample', model: 'Marktest', yearFrom: 2010, yearTo: 2012, body: 'van' });
		content.removal.notes = '> **Caution:** read [the trim guide](https://example.test/hidden-word) first.';
		expect(vehicleSearchSections(content)).toEqual([{ key: 'removal', text: 'Caution: read the trim guide first.' }]);
		expect(noteWords(content)).not.toContain('hidden');
	});

	it('writes the identity line shown for a name match', () => {
		expect(vehicleHeadline(tarn.identity)).toBe('Veldra Tarn 2009–2013, sedan. Also sold as Veldra Tarnis, Veldra Tarn GL.');
	});
});

describe('measurement filters', () => {
	it('records each entry of each place with its figures, null where not measured', () => {
		const content = emptyContent({ make: 'Sample', model: 'Seats', yearFrom: 2010, yearTo: 2012, body: 'sedan' });
		const space = { obstacles: '', boardNeeded: false, travelNotes: '' };
		content.seats.spaces = [
			{ id: 'a', seat: 'passenger', lengthMm: 400, widthMm: 300, heightMm: 85, ...space },
			{ id: 'b', seat: 'passenger', lengthMm: 350, widthMm: 280, heightMm: 110, ...space },
			{ id: 'c', seat: 'driver', lengthMm: 380, widthMm: null, heightMm: 70, ...space }
		];
		const entries = Object.fromEntries(MEASURE_PLACES.map((p) => [p.key, p.entries(content)]));
		expect(entries['passenger-seat']).toEqual([
			[400, 300, 85],
			[350, 280, 110]
		]);
		expect(entries['driver-seat']).toEqual([[380, null, 70]]);
		expect(entries['rear-seat']).toEqual([]);
		expect(entries.dash).toEqual([[null]]);
		// each measurement names its place and its figure within an entry
		const height = MEASUREMENTS.find((m) => m.key === 'passenger-seat-height')!;
		expect(entries[MEASURE_PLACES[height.place].key][1][height.column]).toBe(110);
	});

	it('compares figures in whole micrometres', () => {
		// 4.54 in × 25.4 mm/in = 115.316 mm (international inch, exact); binary floating point gives 115.31599999999999
		expect(toMicrometres(4.54 * 25.4)).toBe(115_316);
		expect(toMicrometres(115.316)).toBe(115_316);
	});

	it('offers length, width and height for each seat, dash depth, firewall hole size and the boot', () => {
		expect(MEASUREMENTS.map((m) => m.key)).toEqual([
			'driver-seat-length',
			'driver-seat-width',
			'driver-seat-height',
			'passenger-seat-length',
			'passenger-seat-width',
			'passenger-seat-height',
			'rear-seat-length',
			'rear-seat-width',
			'rear-seat-height',
			'dash-depth',
			'firewall-hole',
			'boot-length',
			'boot-width',
			'boot-height',
			'boot-arch-width',
			'boot-opening-width',
			'boot-opening-height'
		]);
	});
});
