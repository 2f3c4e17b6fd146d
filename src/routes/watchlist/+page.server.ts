import type { Actions, PageServerLoad } from './$types';
import { fail } from '@sveltejs/kit';
import { z } from 'zod';
import { requireRole } from '$lib/server/auth/guard';
import { unwatchPage, watchlist, noticePreferences } from '$lib/server/services/watch';

export const load: PageServerLoad = async ({ locals }) => {
	const user = requireRole(locals, 'viewer');
	const [items, prefs] = await Promise.all([watchlist(user), noticePreferences(user.id)]);
	return { items, prefs };
};

export const actions: Actions = {
	unwatch: async ({ locals, request }) => {
		const user = requireRole(locals, 'viewer');
		const parsed = z.object({ vehicleId: z.coerce.number().int().positive('Pick a page.') }).safeParse(Object.fromEntries(await request.formData()));
		if (!parsed.success) return fail(400, { message: parsed.error.issues[0].message });
		await unwatchPage(user.id, parsed.data.vehicleId);
		return { message: 'You no longer watch that page.' };
	}
};
