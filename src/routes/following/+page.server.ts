import type { Actions, PageServerLoad } from './$types';
import { z } from 'zod';
import { requireRole } from '$lib/server/auth/guard';
import { formAction } from '$lib/server/forms';
import { unwatchPage, watchlist, noticePreferences } from '$lib/server/services/watch';

export const load: PageServerLoad = async ({ locals }) => {
	const user = requireRole(locals, 'viewer');
	const [items, prefs] = await Promise.all([watchlist(user), noticePreferences(user.id)]);
	return { items, prefs };
};

const pageRef = z.object({ vehicleId: z.coerce.number().int().positive('Pick a car.') });

export const actions: Actions = {
	unfollow: async ({ locals, request }) => {
		const user = requireRole(locals, 'viewer');
		return formAction(request, async (posted) => {
			await unwatchPage(user.id, pageRef.parse(Object.fromEntries(posted)).vehicleId);
			return { message: 'You no longer follow that car.' };
		});
	}
};
