import { shopSettings } from '../services/settings';

/** What every page's layout shows: who is signed in, their units, and the shop's settings. */
export async function layoutData(locals: App.Locals) {
	const shop = await shopSettings();
	return { user: locals.user, units: locals.units, shop };
}
