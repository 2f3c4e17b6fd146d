import type { Actions, PageServerLoad } from './$types';
import { formAction } from '$lib/server/forms';
import { acceptInvite, invitationFor } from '$lib/server/services/invites';
import { countLinkPost } from '$lib/server/services/accountTokens';

// Open without signing in: the token in the address is the proof.
export const load: PageServerLoad = async ({ params, locals }) => {
	const invitation = await invitationFor(params.token);
	return { invitation, signedInAs: locals.user?.email ?? null };
};

export const actions: Actions = {
	default: async ({ params, request, getClientAddress }) =>
		formAction(
			request,
			async (posted) => {
				await countLinkPost(getClientAddress());
				const { email } = await acceptInvite(params.token, Object.fromEntries(posted));
				return { accepted: email };
			},
			{ values: ['name'] }
		)
};
