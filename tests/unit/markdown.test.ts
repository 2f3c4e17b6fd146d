import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { renderMarkdown } from '../../src/lib/server/markdown';

// Vectors grouped by the categories of the OWASP "XSS Filter Evasion Cheat Sheet",
// written as they would arrive in a Markdown notes field.
const XSS: [string, string][] = [
	// Basic script tags and case/quote variants
	['script tag', '<script>alert(1)</script>'],
	['script with src', '<SCRIPT SRC=https://xss.example/xss.js></SCRIPT>'],
	['script split by a tag', '<scr<script>ipt>alert(1)</scr</script>ipt>'],
	['script in a list item', '- <script>alert(1)</script>'],
	['script in a heading', '# <script>alert(1)</script>'],
	['script in a table cell', '| a |\n|---|\n| <script>alert(1)</script> |'],
	// Image and event handler vectors
	['img onerror', '<img src=x onerror=alert(1)>'],
	['img onerror with slash', '<img/src="x"/onerror="alert(1)">'],
	['img with grave accents', '<IMG SRC=`javascript:alert("XSS")`>'],
	['body onload', '<BODY ONLOAD=alert(1)>'],
	['svg onload', '<svg onload=alert(1)>'],
	['svg with script', '<svg><script>alert(1)</script></svg>'],
	['details ontoggle', '<details open ontoggle=alert(1)>'],
	['malformed a tag', '\\<a onmouseover="alert(document.cookie)"\\>xxs link\\</a\\>'],
	// javascript: URLs with encoding and whitespace tricks
	['markdown javascript link', '[x](javascript:alert(1))'],
	['markdown javascript link, mixed case', '[x](JaVaScRiPt:alert(1))'],
	['markdown javascript link, tab inside', '[x](java\tscript:alert(1))'],
	['markdown javascript link, entity', '[x](&#106;avascript:alert(1))'],
	['markdown javascript link, hex entity', '[x](&#x6A;avascript:alert(1))'],
	['markdown javascript link, encoded colon', '[x](javascript&#58;alert(1))'],
	['markdown javascript link, leading space', '[x]( javascript:alert(1))'],
	['markdown javascript link, newline', '[x](javascript:\nalert(1))'],
	['markdown javascript link, comment trick', '[x](javascript://%0Aalert(1))'],
	['markdown javascript link in angle brackets', '[x](<javascript:alert(1)>)'],
	['reference-style javascript link', '[x][1]\n\n[1]: javascript:alert(1)'],
	['markdown image javascript', '![x](javascript:alert(1))'],
	['vbscript link', '[x](vbscript:msgbox(1))'],
	['html a javascript', '<a href="javascript:alert(1)">x</a>'],
	['html a with tab and entity', '<a href="jav&#x09;ascript:alert(1)">x</a>'],
	// data: URLs
	['data html link', '[x](data:text/html;base64,PHNjcmlwdD5hbGVydCgxKTwvc2NyaXB0Pg==)'],
	['data svg image', '![x](data:image/svg+xml;base64,PHN2ZyBvbmxvYWQ9YWxlcnQoMSk+)'],
	['data png image', '![x](data:image/png;base64,iVBORw0KGgo=)'],
	// Style vectors
	['style expression', '<div style="width: expression(alert(1))">x</div>'],
	['style tag', '<style>body{background:url("javascript:alert(1)")}</style>'],
	// Frames, objects, meta refresh, base
	['iframe', '<iframe src="javascript:alert(1)"></iframe>'],
	['iframe srcdoc', '<iframe srcdoc="<script>alert(1)</script>"></iframe>'],
	['object', '<object data="javascript:alert(1)"></object>'],
	['embed', '<embed src="data:image/svg+xml;base64,PHN2Zz4=">'],
	['meta refresh', '<meta http-equiv="refresh" content="0;url=javascript:alert(1);">'],
	['base href', '<base href="javascript:alert(1)//">'],
	['form action', '<form action="javascript:alert(1)"><button>x</button></form>'],
	// Autolinks and bare URLs
	['autolink javascript', '<javascript:alert(1)>'],
	['autolink data', '<data:text/html,<script>alert(1)</script>>'],
	['bare javascript text', 'javascript:alert(1)'],
	['protocol-relative link', '[x](//xss.example/a.js)'],
	['title attribute with handler', '[x](https://ok.example "onmouseover=alert(1)")'],
	['inline code with script', '`<script>alert(1)</script>`'],
	['fenced code with script', '```html\n<script>alert(1)</script>\n```']
];

/** Every href/src value of a real tag, entities decoded and the characters browsers skip removed. */
function urls(html: string): string[] {
	const tags = html.match(/<[a-z][^>]*>/gi) ?? [];
	return tags.flatMap((tag) => [...tag.matchAll(/\s(?:href|src)\s*=\s*("([^"]*)"|'([^']*)'|([^\s>]+))/gi)]).map((m) =>
		(m[2] ?? m[3] ?? m[4] ?? '')
			.replace(/&#x([0-9a-f]+);?/gi, (_, h) => String.fromCodePoint(parseInt(h, 16)))
			.replace(/&#(\d+);?/g, (_, d) => String.fromCodePoint(Number(d)))
			.replace(/&colon;/gi, ':')
			.replace(/&tab;|&newline;/gi, '')
			.replace(/[\u0000-\u0020]/g, '')
	);
}

function expectHarmless(html: string): void {
	expect(html).not.toMatch(/<script/i);
	expect(html).not.toMatch(/\bon\w+\s*=/i);
	expect(html).not.toMatch(/javascript:/i);
	expect(html).not.toMatch(/<(iframe|object|embed|style|svg|meta|base|form|body|details)\b/i);
	// Inside a tag only: the same words shown as escaped text in a code block are harmless.
	expect(html).not.toMatch(/<[^>]*\sstyle\s*=\s*"[^"]*expression/i);
	for (const url of urls(html)) {
		expect(url).toMatch(/^(https?:|mailto:|[^:]*$|[^:]*[/?#])/i);
		expect(url).not.toMatch(/^(javascript|vbscript|data):/i);
		expect(url).not.toMatch(/^\/\//);
	}
}

describe('renderMarkdown keeps pages safe', () => {
	it.each(XSS)('%s', (_name, md) => {
		expectHarmless(renderMarkdown(md));
	});

	it('keeps every XSS vector harmless inside a note, in any combination', () => {
		fc.assert(
			fc.property(fc.array(fc.constantFrom(...XSS.map((x) => x[1])), { minLength: 1, maxLength: 4 }), fc.constantFrom('\n\n', ' ', '\n'), (parts, glue) => {
				expectHarmless(renderMarkdown(`Caution: ${parts.join(glue)} done.`));
			}),
			{ numRuns: 200 }
		);
	});

	it('keeps arbitrary text harmless', () => {
		const chars = fc.constantFrom('<', '>', '"', "'", '=', ':', '(', ')', '[', ']', '!', ' ', '\n', 'a', 'j', 'on', 'javascript', 'script', 'img', 'src', 'href', '&', '#', ';', '/');
		fc.assert(
			fc.property(fc.array(chars, { maxLength: 60 }), (bits) => {
				expectHarmless(renderMarkdown(bits.join('')));
			}),
			{ numRuns: 500 }
		);
	});
});

describe('renderMarkdown formats notes', () => {
	it('links http, https and mailto with noopener nofollow', () => {
		expect(renderMarkdown('[shop](https://shop.example/a?b=1)')).toBe(
			'<p><a href="https://shop.example/a?b=1" rel="noopener nofollow">shop</a></p>\n'
		);
		expect(renderMarkdown('[x](http://a.example)')).toContain('href="http://a.example"');
		expect(renderMarkdown('<mailto:bay@kickpanel.test>')).toContain('<a href="mailto:bay@kickpanel.test" rel="noopener nofollow">');
	});

	it('turns bare URLs into links', () => {
		expect(renderMarkdown('See https://kickpanel.test/vehicles for more.')).toBe(
			'<p>See <a href="https://kickpanel.test/vehicles" rel="noopener nofollow">https://kickpanel.test/vehicles</a> for more.</p>\n'
		);
	});

	it('keeps links to other pages of the wiki', () => {
		expect(renderMarkdown('[the Tarn](/vehicles/veldra-tarn-2009-2013)')).toContain('href="/vehicles/veldra-tarn-2009-2013"');
	});

	it('drops link targets outside http, https and mailto but keeps the text', () => {
		expect(renderMarkdown('[x](ftp://files.example/a)')).toBe('<p><a rel="noopener nofollow">x</a></p>\n');
	});

	it('shows raw HTML as text, not markup', () => {
		expect(renderMarkdown('<b>bold</b>')).toBe('<p>&lt;b&gt;bold&lt;/b&gt;</p>\n');
	});

	it('keeps headings, emphasis, lists, quotes and code', () => {
		const html = renderMarkdown('## Grommet\n\n**Cut the tip** only, *not* the membrane.\n\n1. Pull\n2. Push\n\n> Caution\n\n`10 mm`\n\n```sh\nls\n```');
		expect(html).toContain('<h2>Grommet</h2>');
		expect(html).toContain('<strong>Cut the tip</strong>');
		expect(html).toContain('<em>not</em>');
		expect(html).toContain('<ol>\n<li>Pull</li>');
		expect(html).toContain('<blockquote>\n<p>Caution</p>\n</blockquote>');
		expect(html).toContain('<code>10 mm</code>');
		expect(html).toContain('<pre><code class="language-sh">ls\n</code></pre>');
	});

	it('keeps table alignment and nothing else from style', () => {
		const html = renderMarkdown('| pin | colour |\n|--:|:--|\n| A4 | Yellow |');
		expect(html).toContain('<th style="text-align:right">pin</th>');
		expect(html).toContain('<td style="text-align:left">Yellow</td>');
	});

	it('sets quotes and dashes the typographer way', () => {
		expect(renderMarkdown('"Tarn" -- 2009...2013')).toBe('<p>“Tarn” – 2009…2013</p>\n');
	});

	it('keeps images from the app\'s own photo store', () => {
		const id = 'a'.repeat(64);
		expect(renderMarkdown(`![grommet](/photos/${id}/display)`)).toBe(`<p><img src="/photos/${id}/display" alt="grommet" /></p>\n`);
		expect(renderMarkdown(`![grommet](/photos/${id}/thumb)`)).toBe(`<p><img src="/photos/${id}/thumb" alt="grommet" /></p>\n`);
	});

	it('writes any other image as its alt text, so reading a page fetches nothing from elsewhere', () => {
		const id = 'a'.repeat(64);
		for (const src of [
			'https://img.example/g.jpg',
			'http://img.example/g.jpg',
			'//img.example/g.jpg',
			'data:image/png;base64,iVBORw0KGgo=',
			`https://img.example/photos/${id}/display`,
			`/photos/${id}/display/../../../elsewhere`,
			`/photos/${id}/original`,
			'/photos/abc/display',
			`/\\img.example/photos/${id}/display`
		]) {
			expect(renderMarkdown(`![grommet](${src})`), src).toBe('<p>grommet</p>\n');
		}
		expect(renderMarkdown('![<b>loud</b> grommet](https://img.example/g.jpg)')).toBe('<p>&lt;b&gt;loud&lt;/b&gt; grommet</p>\n');
	});

	it('still reads javascript: and onclick= in prose, as entities', () => {
		expect(renderMarkdown('Never type javascript: or onclick= here.')).toBe('<p>Never type javascript&#58; or onclick&#61; here.</p>\n');
	});

	it('renders empty notes as nothing', () => {
		expect(renderMarkdown('')).toBe('');
	});
});
