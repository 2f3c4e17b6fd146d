import type { LayoutServerLoad } from './$types';
import { shopSettings } from '$lib/server/services/settings';

export const load: LayoutServerLoad = async ({ locals }) => {
	const shop = await shopSettings();
	return { user: locals.user, units: locals.units, shop };
};
