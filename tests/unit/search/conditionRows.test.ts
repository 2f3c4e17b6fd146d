import { describe, expect, it } from 'vitest';
import { conditionRows, MAX_CONDITION_ROWS, tidiedRows } from '../../../src/lib/domain/search/conditionRows';

// The rows of the search form, worked by hand from the address each button sends.
const rowsOf = (query: string) => conditionRows(new URLSearchParams(query));
const tidy = (query: string) => tidiedRows(new URLSearchParams(query));

describe('measured-space rows in the address', () => {
	it('reads each row from the parallel lists, and offers one blank row when there are none', () => {
		expect(rowsOf('q=tarn')).toEqual([{ measure: '', op: 'gte', value: '' }]);
		expect(rowsOf('measure=dash-depth&op=lte&value=150&measure=firewall-hole&op=&value=22')).toEqual([
			{ measure: 'dash-depth', op: 'lte', value: '150' },
			{ measure: 'firewall-hole', op: 'gte', value: '22' }
		]);
	});

	it('leaves an address sent by the Search button alone', () => {
		expect(tidy('q=tarn&measure=dash-depth&op=gte&value=90')).toBeNull();
	});

	it('"Add a condition" keeps every row and the other filters, and adds a blank one', () => {
		expect(tidy('q=tarn&make=veldra&measure=dash-depth&op=gte&value=90&add=1')).toBe('q=tarn&make=veldra&measure=dash-depth&op=gte&value=90&measure=&op=gte&value=&rows=2');
	});

	it('adds no seventh row', () => {
		const six = Array.from({ length: MAX_CONDITION_ROWS }, () => 'measure=dash-depth&op=gte&value=90').join('&');
		expect(rowsOf(tidy(`${six}&add=1`)!)).toHaveLength(6);
	});

	it('"Remove" takes out that row only (counted from 0), and goes back to the first page of results', () => {
		const sent = 'measure=dash-depth&op=gte&value=90&measure=firewall-hole&op=lte&value=25&measure=boot-width&op=gte&value=900&drop=1&page=3';
		expect(tidy(sent)).toBe('measure=dash-depth&op=gte&value=90&measure=boot-width&op=gte&value=900&rows=2');
	});

	it('ignores a Remove that names no row', () => {
		expect(tidy('measure=dash-depth&op=gte&value=90&drop=7')).toBe('measure=dash-depth&op=gte&value=90&rows=1');
		expect(tidy('measure=dash-depth&op=gte&value=90&drop=x')).toBe('measure=dash-depth&op=gte&value=90&rows=1');
	});

	it('shows as many rows as the address asks for, blank ones included, up to six', () => {
		// Two blank rows and a third: the count changes the address even though the blanks read alike.
		expect(rowsOf('measure=&op=gte&value=&measure=&op=gte&value=&rows=3')).toHaveLength(3);
		expect(rowsOf('rows=40')).toHaveLength(6);
		expect(rowsOf('rows=-2')).toHaveLength(1);
	});
});
