import { fail } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { resetLinkWorks, resetPassword } from '$lib/server/services/passwordReset';
import { countLinkPost } from '$lib/server/services/accountTokens';
import { ServiceError } from '$lib/server/errors';

export const load: PageServerLoad = async ({ params }) => ({ works: await resetLinkWorks(params.token) });

export const actions: Actions = {
	default: async ({ params, request, getClientAddress }) => {
		try {
			await countLinkPost(getClientAddress());
			const { email } = await resetPassword(params.token, Object.fromEntries(await request.formData()));
			return { done: email };
		} catch (err) {
			if (err instanceof ServiceError) return fail(err.status, { errors: err.fieldErrors ?? { form: err.message } });
			throw err;
		}
	}
};
