import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { config } from '$lib/server/config';
import { formAction } from '$lib/server/forms';
import { shopSettings } from '$lib/server/services/settings';
import { setReviewBeforeShow } from '$lib/server/services/review';

export const load: PageServerLoad = async ({ locals }) => {
	requireRole(locals, 'admin');
	const settings = await shopSettings();
	return { reviewBeforeShow: settings.reviewBeforeShow, since: settings.reviewBeforeShowSince, outbox: !config.production };
};

const reviewForm = z.object({ reviewBeforeShow: z.enum(['on', 'off'], { error: 'Choose on or off.' }) });

export const actions: Actions = {
	signoff: async ({ locals, request }) => {
		const admin = requireRole(locals, 'admin');
		return formAction(request, async (posted) => {
			const on = reviewForm.parse(Object.fromEntries(posted)).reviewBeforeShow === 'on';
			await setReviewBeforeShow(on, admin);
			return {
				message: on
					? 'Sign-off before viewers see it is on: viewers see a change once a moderator has signed it off.'
					: 'Sign-off before viewers see it is off: everyone sees the latest revision.'
			};
		});
	}
};
