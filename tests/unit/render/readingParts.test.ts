import { describe, expect, it } from 'vitest';
import { emptyContent, SECTION_KEYS } from '../../../src/lib/domain/content/schema';
import { renderNotes } from '../../../src/lib/server/services/rendering';
import { bodyFragments, bodyOf, spliceFragments } from '../../../src/lib/server/render/vehicleBody';
import { packParts, unpackParts } from '../../../src/lib/server/render/storedParts';
import { partsOf } from '../../../src/lib/server/render/readingPage';
import { seatSpace } from '../../helpers/places';

const bytes = (fragments: Record<string, string>) => Object.fromEntries(Object.entries(fragments).map(([k, v]) => [k, new TextEncoder().encode(v)]));
const text = (b: Uint8Array) => new TextDecoder().decode(b);

function sample() {
	const content = emptyContent({ make: 'Ostrel', model: 'Carrow', yearFrom: 2011, yearTo: 2016, body: 'wagon' });
	content.identity.notes = 'Trim clips are **brittle** in the cold.';
	// 254 mm is exactly 10 in: the inch is 25.4 mm by definition (international yard and pound, 1959).
	content.seats.spaces = [seatSpace('s1', 'driver', 254, 300, 100)];
	return { content, rendered: renderNotes(content) };
}

describe('the stored parts of a reading view', () => {
	it('hold the figures in the unit system they were rendered for', () => {
		const metric = JSON.stringify(partsOf(sample(), 'metric').body);
		const imperial = JSON.stringify(partsOf(sample(), 'imperial').body);
		expect(metric).toContain('254 mm');
		expect(imperial).toContain('10.00 in');
		expect(imperial).not.toContain('254 mm');
	});

	it('keep the header’s names and photos but leave the identity notes to the body', () => {
		const parts = partsOf(sample(), 'metric');
		expect(parts.identity.make).toBe('Ostrel');
		expect('notes' in parts.identity).toBe(false);
		expect(parts.photos).toEqual([]);
		expect(parts.body.sections.identity.notes).toContain('<strong>brittle</strong>');
		expect(parts.outline.identity).toEqual({ empty: false, notes: true });
		expect(parts.outline.power.empty).toBe(true);
		// The address its names give, as the vehicle list spells it: make, model, years, body.
		expect(parts.slug).toBe('ostrel-carrow-2011-2016-wagon');
	});

	it('read back from their stored form exactly as rendered', () => {
		const rendered = partsOf(sample(), 'imperial');
		const { fragments, tag, ...data } = unpackParts(new TextEncoder().encode(packParts(rendered)), 't');
		const { body, ...renderedData } = rendered;
		expect(tag).toBe('t');
		expect(data).toEqual(renderedData);
		expect(Object.fromEntries(Object.entries(fragments).map(([k, v]) => [k, text(v)]))).toEqual(bodyFragments(body));
		expect(bodyOf(fragments, data.outline)).toEqual(body);
	});

	it('keep text in any script and HTML with newlines and quotes intact in the stored form', () => {
		const rendered = partsOf(sample(), 'metric');
		rendered.identity.model = 'Tärn “Ω” 2\n';
		rendered.body.sections.identity.notes = '<p>Line one\nline “two” — 12 mm × 3 · 🔧</p>\n';
		rendered.body.quickFacts = '';
		const stored = new TextEncoder().encode(packParts(rendered));
		const back = unpackParts(stored, 't');
		expect(back.identity.model).toBe('Tärn “Ω” 2\n');
		expect(text(back.fragments['notes-identity'])).toBe('<p>Line one\nline “two” — 12 mm × 3 · 🔧</p>\n');
		expect(back.fragments['quick-facts'].length).toBe(0);
		// The fragments are views into the stored bytes, not copies.
		expect(back.fragments['notes-identity'].buffer).toBe(stored.buffer);
	});

	it('refuse a stored form whose lengths do not add up', () => {
		const packed = packParts(partsOf(sample(), 'metric'));
		expect(() => unpackParts(new TextEncoder().encode(packed + 'x'), 't')).toThrow(/length/);
		expect(() => unpackParts(new TextEncoder().encode('no head line'), 't')).toThrow(/head/);
	});

	it('fill every placeholder of a full page view and leave the rest of the page alone', () => {
		const { body } = partsOf(sample(), 'metric');
		const fragments = bodyFragments(body);
		expect(Object.keys(fragments).sort()).toEqual(
			['quick-facts', 'quick-facts-columns', ...SECTION_KEYS.flatMap((k) => [`section-${k}`, `notes-${k}`])].sort()
		);
		const page = '<main><div data-kp-fragment="notes-identity"></div><p>kept — 12 mm × 3</p><div data-kp-fragment="unknown"></div></main>';
		const filled = spliceFragments(new TextEncoder().encode(page), bytes(fragments)).toString('utf8');
		expect(filled).toBe(
			`<main><div data-kp-fragment="notes-identity">${fragments['notes-identity']}</div><p>kept — 12 mm × 3</p><div data-kp-fragment="unknown"></div></main>`
		);
	});

	it('leave a placeholder that already holds markup, and a page without placeholders, as they are', () => {
		const fragments = bytes({ 'quick-facts': '<p>facts</p>' });
		const held = '<div data-kp-fragment="quick-facts"><p>client</p></div><div data-kp-fragment="quick-facts"></div>';
		expect(spliceFragments(new TextEncoder().encode(held), fragments).toString('utf8')).toBe(
			'<div data-kp-fragment="quick-facts"><p>client</p></div><div data-kp-fragment="quick-facts"><p>facts</p></div>'
		);
		const plain = new TextEncoder().encode('<p>Ω · no placeholders</p>');
		expect(spliceFragments(plain, fragments).toString('utf8')).toBe('<p>Ω · no placeholders</p>');
	});
});
