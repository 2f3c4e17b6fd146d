import { fail } from '@sveltejs/kit';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { config } from '$lib/server/config';
import { shopSettings } from '$lib/server/services/settings';
import { setReviewBeforeShow } from '$lib/server/services/review';
import { ServiceError } from '$lib/server/errors';

export const load: PageServerLoad = async ({ locals }) => {
	requireRole(locals, 'admin');
	const settings = await shopSettings();
	return { reviewBeforeShow: settings.reviewBeforeShow, since: settings.reviewBeforeShowSince, outbox: !config.production };
};

export const actions: Actions = {
	review: async ({ locals, request }) => {
		const admin = requireRole(locals, 'admin');
		const parsed = z.object({ reviewBeforeShow: z.enum(['on', 'off'], { error: 'Choose on or off.' }) }).safeParse(Object.fromEntries(await request.formData()));
		if (!parsed.success) return fail(400, { message: parsed.error.issues[0].message });
		try {
			await setReviewBeforeShow(parsed.data.reviewBeforeShow === 'on', admin);
		} catch (err) {
			if (err instanceof ServiceError) return fail(err.status, { message: err.message });
			throw err;
		}
		return {
			message:
				parsed.data.reviewBeforeShow === 'on'
					? 'Review before it shows is on: viewers see a change once a moderator has reviewed it.'
					: 'Review before it shows is off: everyone sees the latest revision.'
		};
	}
};
