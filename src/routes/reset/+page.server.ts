import type { Actions, PageServerLoad } from './$types';
import { ServiceError } from '$lib/server/errors';
import { formAction } from '$lib/server/forms';
import { requestPasswordReset } from '$lib/server/services/passwordReset';

export const load: PageServerLoad = async ({ locals }) => ({ email: locals.user?.email ?? '' });

export const actions: Actions = {
	default: async ({ request, getClientAddress }) =>
		formAction(
			request,
			async (posted) => {
				const email = String(posted.get('email') ?? '');
				const result = await requestPasswordReset(email, getClientAddress());
				if (!result.ok) throw new ServiceError(result.message, result.status);
				// The mail goes out in the background; the answer is the same whether or not the address has an account.
				return { email, sent: result.message };
			},
			{ values: ['email'] }
		)
};
