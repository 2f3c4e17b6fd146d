import { companionsOf, localDay, SHELF } from '../domain/offlineShelf';
import { dropPage, keepPage } from './shelf';
import { phoneStore, type Pin } from './phoneStore';

// Pages pinned "for today": kept whole on the phone (page, flag form, job sheet, editor, photos) until the
// day is over, whatever else the phone reads meanwhile.

const pageAddress = (slug: string) => `/vehicles/${slug}`;

export async function isPinned(slug: string): Promise<boolean> {
	return !!(await (await phoneStore()).get('pins', slug));
}

/** Fetches and keeps a page with everything it links to (its editor too for a writer); false when the network failed. */
export async function pinPage(slug: string, title: string, writer: boolean, now = new Date()): Promise<boolean> {
	const address = pageAddress(slug);
	const companions = companionsOf(slug, true, writer);
	if (!(await keepPage(SHELF.pinned, address, null, companions))) return false;
	const pin: Pin = { slug, title, day: localDay(now), addresses: [address, ...companions] };
	await (await phoneStore()).put('pins', pin);
	return true;
}

export async function unpinPage(slug: string): Promise<void> {
	const db = await phoneStore();
	const pin = await db.get('pins', slug);
	await dropPage(SHELF.pinned, pin?.addresses ?? [pageAddress(slug), ...companionsOf(slug, true, true)]);
	await db.delete('pins', slug);
}

/** Lets go of pins from earlier days. */
export async function dropPastPins(now = new Date()): Promise<void> {
	const today = localDay(now);
	for (const pin of await (await phoneStore()).getAll('pins')) {
		if (pin.day !== today) await unpinPage(pin.slug);
	}
}
