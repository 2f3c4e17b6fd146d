import type { Actions, PageServerLoad } from './$types';
import { formAction } from '$lib/server/forms';
import { resetLinkWorks, resetPassword } from '$lib/server/services/passwordReset';
import { countLinkPost } from '$lib/server/services/accountTokens';

export const load: PageServerLoad = async ({ params }) => ({ works: await resetLinkWorks(params.token) });

export const actions: Actions = {
	default: async ({ params, request, getClientAddress }) =>
		formAction(request, async (posted) => {
			await countLinkPost(getClientAddress());
			const { email } = await resetPassword(params.token, Object.fromEntries(posted));
			return { done: email };
		})
};
