import { fail } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requestPasswordReset } from '$lib/server/services/passwordReset';

export const load: PageServerLoad = async ({ locals }) => ({ email: locals.user?.email ?? '' });

export const actions: Actions = {
	default: async ({ request, getClientAddress }) => {
		const form = await request.formData();
		const email = String(form.get('email') ?? '');
		const result = await requestPasswordReset(email, getClientAddress());
		if (!result.ok) return fail(result.status, { email, error: result.message });
		// The mail goes out in the background; the answer is the same whether or not the address has an account.
		return { email, sent: result.message };
	}
};
