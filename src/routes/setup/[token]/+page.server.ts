import type { Actions, PageServerLoad } from './$types';
import { formAction } from '$lib/server/forms';
import { completeSetup, setupLinkWorks } from '$lib/server/services/setup';
import { countLinkPost } from '$lib/server/services/accountTokens';

// Open without signing in: the token printed at start is the proof.
export const load: PageServerLoad = async ({ params }) => ({ works: await setupLinkWorks(params.token) });

export const actions: Actions = {
	default: async ({ params, request, getClientAddress }) =>
		formAction(
			request,
			async (posted) => {
				await countLinkPost(getClientAddress());
				const { email } = await completeSetup(params.token, Object.fromEntries(posted));
				return { created: email };
			},
			{ values: ['name', 'email'] }
		)
};
