import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { config } from '$lib/server/config';
import { formAction } from '$lib/server/forms';
import { setShopTimeZone, shopSettings } from '$lib/server/services/settings';
import { setReviewBeforeShow } from '$lib/server/services/review';
import { knownTimeZones } from '$lib/domain/shopTime';

export const load: PageServerLoad = async ({ locals }) => {
	requireRole(locals, 'admin');
	const settings = await shopSettings();
	return { reviewBeforeShow: settings.reviewBeforeShow, since: settings.reviewBeforeShowSince, timeZone: settings.timeZone, zones: knownTimeZones(), outbox: !config.production };
};

const reviewForm = z.object({ reviewBeforeShow: z.enum(['on', 'off'], { error: 'Choose on or off.' }) });

export const actions: Actions = {
	signoff: async ({ locals, request }) => {
		const admin = requireRole(locals, 'admin');
		return formAction(
			request,
			async (posted) => {
				const on = reviewForm.parse(Object.fromEntries(posted)).reviewBeforeShow === 'on';
				await setReviewBeforeShow(on, admin);
				return {
					action: 'signoff',
					message: on
						? 'Sign-off before viewers see it is on: viewers see a change once a moderator has signed it off.'
						: 'Sign-off before viewers see it is off: everyone sees the latest revision.'
				};
			},
			{ action: 'signoff' }
		);
	},
	timezone: async ({ locals, request }) => {
		const admin = requireRole(locals, 'admin');
		return formAction(
			request,
			async (posted) => {
				const zone = await setShopTimeZone(posted.get('timeZone'), admin);
				return { action: 'timezone', message: `Times are now shown in ${zone}.` };
			},
			{ action: 'timezone', values: ['timeZone'] }
		);
	}
};
