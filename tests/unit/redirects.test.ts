import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { safeNext, sameSitePath } from '../../src/lib/server/auth/redirects';

// How a browser resolves a Location header: the WHATWG URL standard's parser (Node's URL implements
// it), relative to the page that answered. A target is safe when the browser lands on the same origin.
const SITE = 'https://shop.example';
const landsOnSite = (location: string) => new URL(location, `${SITE}/signin`).origin === SITE;

describe('sameSitePath', () => {
	it.each([
		['/', '/'],
		['/vehicles/veldra-tarn-2009-2013-hatchback', '/vehicles/veldra-tarn-2009-2013-hatchback'],
		['/search?q=tarn%202012#results', '/search?q=tarn%202012#results'],
		['/vehicles/a/../b', '/vehicles/b']
	])('keeps the same-site path %s', (input, expected) => {
		expect(sameSitePath(input)).toBe(expected);
	});

	// Each of these is followed off-site by a browser (WHATWG URL: tab/newline removal, "\" as "/"
	// in special schemes, scheme-relative "//"), or hides such a form behind percent-encoding.
	it.each([
		'/\t/evil.example/',
		'/\n/evil.example',
		'/\r\n/evil.example',
		'//evil.example',
		'/\\evil.example',
		'\\\\evil.example',
		'/.//evil.example',
		'/..//evil.example',
		'https://evil.example/',
		'javascript:alert(1)',
		'evil.example',
		'%2F%2Fevil.example',
		'/%2F/evil.example',
		'/%5Cevil.example',
		'/%09/evil.example',
		'/%252F%252Fevil.example',
		'/\u0000',
		'',
		'/'.padEnd(3000, 'a')
	])('refuses %j', (input) => {
		expect(sameSitePath(input)).toBeNull();
	});

	it('falls back when the target is refused or missing', () => {
		expect(safeNext('//evil.example')).toBe('/');
		expect(safeNext(null, '/vehicles/x')).toBe('/vehicles/x');
		expect(safeNext(undefined)).toBe('/');
	});

	it('whatever it is given, what it returns keeps a browser on the site', () => {
		const piece = fc.constantFrom('/', '//', '\\', '\t', '\n', '.', '..', '%2F', '%5C', '%09', '%25', ':', '@', 'evil.example', 'a', '?', '#', ' ');
		const crafted = fc.array(piece, { maxLength: 8 }).map((parts) => parts.join(''));
		fc.assert(
			fc.property(fc.oneof(crafted, fc.string(), fc.webUrl(), fc.webPath()), (input) => {
				const out = safeNext(input);
				expect(landsOnSite(out)).toBe(true);
				expect(out.startsWith('/')).toBe(true);
			}),
			{ numRuns: 3000 }
		);
	});
});
