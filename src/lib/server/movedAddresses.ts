// Addresses that moved when the screens took the shop's words. Old bookmarks, mails already sent and
// forms still open in a browser keep working: a permanent redirect (308 keeps a form's POST a POST),
// with the form action renamed the same way.

type Move = { from: RegExp; to: (m: RegExpMatchArray) => string; actions?: Readonly<Record<string, string>> };

const MOVED: readonly Move[] = [
	{ from: /^\/changes\/?$/, to: () => '/shop-log', actions: { review: 'signoff' } },
	{ from: /^\/watchlist\/?$/, to: () => '/following', actions: { unwatch: 'unfollow' } },
	{ from: /^\/vehicles\/([^/]+)\/watch\/?$/, to: (m) => `/vehicles/${m[1]}/follow`, actions: { watch: 'follow', unwatch: 'unfollow' } },
	{ from: /^\/admin\/blocks\/?$/, to: () => '/admin/pauses', actions: { lift: 'end' } }
];

/** A SvelteKit form action rides in the query as "?/name" (or "&/name" after other parameters). */
function renameAction(search: string, actions: Readonly<Record<string, string>> = {}): string {
	return search.replace(/([?&])\/([A-Za-z]+)(?=&|$)/, (whole, sep: string, name: string) => (actions[name] ? `${sep}/${actions[name]}` : whole));
}

/** The new address of a moved page, keeping its query, or null when the page did not move. */
export function movedAddress(url: URL): string | null {
	for (const { from, to, actions } of MOVED) {
		const m = url.pathname.match(from);
		if (m) return to(m) + renameAction(url.search, actions);
	}
	return null;
}
