import { fail } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { acceptInvite, invitationFor } from '$lib/server/services/invites';
import { countLinkPost } from '$lib/server/services/accountTokens';
import { ServiceError } from '$lib/server/errors';

// Open without signing in: the token in the address is the proof.
export const load: PageServerLoad = async ({ params, locals }) => {
	const invitation = await invitationFor(params.token);
	return { invitation, signedInAs: locals.user?.email ?? null };
};

export const actions: Actions = {
	default: async ({ params, request, getClientAddress }) => {
		const form = Object.fromEntries(await request.formData());
		const values = { name: String(form.name ?? '') };
		try {
			await countLinkPost(getClientAddress());
			const { email } = await acceptInvite(params.token, form);
			return { accepted: email };
		} catch (err) {
			if (err instanceof ServiceError) return fail(err.status, { values, errors: err.fieldErrors ?? { form: err.message } });
			throw err;
		}
	}
};
