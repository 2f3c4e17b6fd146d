import { CredentialsSignin } from '@auth/sveltekit';
import type { Actions, PageServerLoad, RequestEvent } from './$types';
import { signIn } from '../../../auth';
import { formAction } from '$lib/server/forms';
import { acceptInvite, invitationFor } from '$lib/server/services/invites';
import { countLinkPost } from '$lib/server/services/accountTokens';

// Open without signing in: the token in the address is the proof.
export const load: PageServerLoad = async ({ params, locals }) => {
	const invitation = await invitationFor(params.token);
	return { invitation, signedInAs: locals.user?.email ?? null };
};

/** The same event, posting the new person's e-mail and password to the sign-in, which sets the session cookie. */
function signInAs(event: RequestEvent, email: string, password: string): RequestEvent {
	const body = new URLSearchParams({ providerId: 'credentials', email, password, redirectTo: '/' });
	// The sign-in builds its addresses from the request's host headers, so they go along.
	const headers = new Headers(event.request.headers);
	headers.set('content-type', 'application/x-www-form-urlencoded');
	headers.delete('content-length');
	const request = new Request(event.request.url, { method: 'POST', headers, body });
	return { ...event, request };
}

export const actions: Actions = {
	// A new person lands signed in on the home page; a sign-in that fails still leaves the account made.
	default: async (event) =>
		formAction(
			event.request,
			async (posted) => {
				await countLinkPost(event.getClientAddress());
				const { email } = await acceptInvite(event.params.token, Object.fromEntries(posted));
				try {
					await signIn(signInAs(event, email, String(posted.get('password') ?? '')));
				} catch (err) {
					// Refused sign-in (too many attempts from this device): the page says the account is ready to sign in to.
					if (!(err instanceof CredentialsSignin)) throw err;
				}
				return { accepted: email };
			},
			{ values: ['name'] }
		)
};
