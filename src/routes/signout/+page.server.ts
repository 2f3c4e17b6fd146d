import type { Actions } from './$types';
import { signOut } from '../../auth';
import { sessionClaims } from '$lib/server/auth/session';
import { endSession } from '$lib/server/services/users';

export const actions: Actions = {
	// Clearing the cookie is not enough: a copy of it must stop working too.
	default: async (event) => {
		const claims = await sessionClaims(event.cookies);
		if (claims) await endSession(claims);
		return signOut(event);
	}
};
