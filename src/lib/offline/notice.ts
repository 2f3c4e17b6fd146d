import { keptView, SHELF } from '../domain/offlineShelf';

// What the phone shows for an address it has no copy of while there is no network: a plain
// notice and the vehicle pages it does hold.

const escape = (text: string) => text.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

async function keptPages(): Promise<{ address: string; title: string }[]> {
	const out = new Map<string, string>();
	for (const name of [SHELF.pinned, SHELF.recent]) {
		const cache = await caches.open(name);
		for (const request of await cache.keys()) {
			const address = new URL(request.url).pathname;
			if (keptView(address)?.view !== 'page' || out.has(address)) continue;
			const html = (await (await cache.match(request))?.text()) ?? '';
			const title = /<title>([^<]*)<\/title>/.exec(html)?.[1]?.replace(/ · Kickpanel$/, '') ?? address;
			out.set(address, title);
		}
	}
	return [...out].map(([address, title]) => ({ address, title }));
}

export async function offlineNotice(): Promise<Response> {
	const pages = await keptPages();
	const list = pages.length
		? `<p>Vehicle pages kept on this phone:</p><ul>${pages.map((p) => `<li><a href="${escape(p.address)}">${p.title}</a></li>`).join('')}</ul>`
		: '<p>No vehicle pages are kept on this phone yet. Open a page, or pin it for today, while there is signal.</p>';
	const body = `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>Offline · Kickpanel</title><style>body{font:1.05rem/1.5 system-ui,sans-serif;margin:0 auto;max-width:40rem;padding:1rem;color:#1c1a17;background:#f7f6f4}
a{color:#773c1b;display:inline-block;min-height:44px;line-height:44px}@media (prefers-color-scheme:dark){body{color:#eceae6;background:#1c1a17}a{color:#eabf98}}</style></head>
<body><main><h1>No network</h1><p>This phone is offline and has no copy of this screen. Nothing was sent.</p>${list}</main></body></html>`;
	return new Response(body, { status: 503, headers: { 'content-type': 'text/html; charset=utf-8', 'cache-control': 'no-store' } });
}
