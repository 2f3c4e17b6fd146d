import { redirect } from '@sveltejs/kit';
import { CredentialsSignin } from '@auth/sveltekit';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { signIn } from '../../auth';
import { safeNext } from '$lib/server/auth/redirects';
import { ServiceError } from '$lib/server/errors';
import { formAction } from '$lib/server/forms';

const MESSAGES: Record<string, string> = {
	credentials: 'That e-mail and password do not match an active account. Check both and try again.',
	locked: 'Too many failed sign-ins for this account or from this device. Wait a little (at most 15 minutes) and try again, or ask an admin to reset your password.'
};

export const load: PageServerLoad = async ({ locals, url }) => {
	const next = safeNext(url.searchParams.get('next'));
	if (locals.user) redirect(303, next);
	const code = url.searchParams.get('code') ?? (url.searchParams.get('error') ? 'credentials' : null);
	return { next, message: code ? (MESSAGES[code] ?? MESSAGES.credentials) : null };
};

const signInForm = z.object({
	email: z.string().trim().min(1, 'Enter your e-mail address.'),
	password: z.string().min(1, 'Enter your password.')
});

export const actions: Actions = {
	// Auth.js reads the same body again, so the form is read from a copy.
	default: async (event) =>
		formAction(
			event.request.clone(),
			async (posted) => {
				signInForm.parse(Object.fromEntries(posted));
				try {
					await signIn(event);
				} catch (err) {
					if (err instanceof CredentialsSignin) throw new ServiceError(MESSAGES[err.code] ?? MESSAGES.credentials, 400);
					throw err;
				}
			},
			{ values: ['email'] }
		)
};
