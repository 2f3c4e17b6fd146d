import type { Actions, PageServerLoad } from './$types';
import { formAction } from '$lib/server/forms';
import { resetLinkWorks, resetPassword } from '$lib/server/services/passwordReset';

export const load: PageServerLoad = async ({ params }) => ({ works: await resetLinkWorks(params.token) });

export const actions: Actions = {
	default: async ({ params, request }) =>
		formAction(request, async (posted) => {
			const { email } = await resetPassword(params.token, Object.fromEntries(posted));
			return { done: email };
		})
};
