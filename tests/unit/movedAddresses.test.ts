import { describe, expect, it } from 'vitest';
import { movedAddress } from '../../src/lib/server/movedAddresses';

// Expected addresses are written out by hand from the list of renamed pages; the query string is
// parsed by Node's WHATWG URL, as a browser would send it.
const at = (path: string) => movedAddress(new URL(path, 'https://shop.example'));

describe('movedAddress', () => {
	it.each([
		['/changes', '/shop-log'],
		['/changes?user=3&section=seats&page=2', '/shop-log?user=3&section=seats&page=2'],
		['/watchlist', '/following'],
		['/vehicles/veldra-tarn-2009-2013-sedan/watch', '/vehicles/veldra-tarn-2009-2013-sedan/follow'],
		['/admin/blocks', '/admin/pauses']
	])('sends %s to %s', (from, to) => {
		expect(at(from)).toBe(to);
	});

	it.each([
		['/vehicles/veldra-tarn-2009-2013-sedan/watch?/watch', '/vehicles/veldra-tarn-2009-2013-sedan/follow?/follow'],
		['/vehicles/veldra-tarn-2009-2013-sedan/watch?/unwatch', '/vehicles/veldra-tarn-2009-2013-sedan/follow?/unfollow'],
		['/watchlist?/unwatch', '/following?/unfollow'],
		['/changes?/review&user=3', '/shop-log?/signoff&user=3'],
		['/changes?user=3&/review', '/shop-log?user=3&/signoff'],
		['/admin/blocks?/lift', '/admin/pauses?/end']
	])('renames the form action on the way: %s', (from, to) => {
		expect(at(from)).toBe(to);
	});

	it.each(['/', '/shop-log', '/following', '/vehicles/changes', '/vehicles/a/watch/extra', '/changes-log', '/admin/blockset'])('leaves %s alone', (path) => {
		expect(at(path)).toBeNull();
	});
});
