import { describe, expect, it } from 'vitest';
import { unit } from 'mathjs';
import { parseSearchFilters } from '../../../src/lib/domain/search/filters';

const parse = (query: string) => parseSearchFilters(new URLSearchParams(query));

describe('parseSearchFilters', () => {
	it('reads the words and the filters', () => {
		expect(parse('q=2012+tarn&make=veldra&year=2012&body=sedan&photos=1')).toEqual({
			ok: true,
			filters: { q: '2012 tarn', make: 'veldra', year: 2012, body: 'sedan', photos: true, conditions: [] }
		});
	});

	it('treats empty fields from a submitted form as not given', () => {
		expect(parse('q=&make=&year=&body=&measure=&op=gte&value=')).toEqual({ ok: true, filters: { q: '', conditions: [] } });
	});

	it('reads measurement rows, skipping empty ones', () => {
		const r = parse('measure=passenger-seat-height&op=gte&value=90&measure=&op=gte&value=&measure=dash-depth&op=lte&value=160,5');
		expect(r).toEqual({
			ok: true,
			filters: {
				q: '',
				conditions: [
					{ measure: 'passenger-seat-height', op: 'gte', mm: 90 },
					{ measure: 'dash-depth', op: 'lte', mm: 160.5 }
				]
			}
		});
	});

	it('converts inches to millimetres', () => {
		const r = parse('measure=passenger-seat-height&op=gte&value=3.5&unit=in');
		// mathjs as the unit reference (1 in = 25.4 mm exactly)
		const expected = unit(3.5, 'inch').toNumber('mm');
		expect(r.ok && r.filters.conditions[0].mm).toBeCloseTo(expected, 10);
	});

	it.each([
		['year=12', 'year', /1950 or later/],
		['year=twenty', 'year', /must be a number/],
		['year=2012.5', 'year', /whole year/],
		['body=limo', 'body', /body style must be one of: Sedan, Hatchback/],
		['photos=maybe', 'photos', /only pages with photos/],
		['measure=boot-depth&value=90', 'measure', /measurement must be one of/],
		['measure=dash-depth&op=more&value=90', 'op', /"gte" \(at least\) or "lte" \(at most\)/],
		['measure=dash-depth&value=-3', 'value', /Dash usable chassis depth: A measurement value must be more than 0/],
		['measure=dash-depth&value=deep', 'value', /must be a number/],
		['measure=dash-depth&value=9000', 'value', /at most 3000 mm .* check the unit/],
		[`q=${'x'.repeat(201)}`, 'q', /too long: keep it under 200 characters/]
	])('answers %s with a message a person understands', (query, field, message) => {
		const r = parse(query);
		expect(r.ok).toBe(false);
		if (!r.ok) {
			expect(r.field).toBe(field);
			expect(r.message).toMatch(message);
		}
	});

	it('takes up to six conditions, as many as the form has rows, and refuses a seventh', () => {
		const rows = (n: number) => Array.from({ length: n }, (_, i) => `measure=dash-depth&op=gte&value=${100 + i}`).join('&');
		const six = parse(rows(6));
		expect(six.ok && six.filters.conditions.map((c) => c.mm)).toEqual([100, 101, 102, 103, 104, 105]);
		expect(parse(rows(7))).toMatchObject({ ok: false, message: 'At most 6 measurement conditions at a time.' });
	});
});
