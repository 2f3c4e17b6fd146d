import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { config } from '$lib/server/config';
import { formAction } from '$lib/server/forms';
import { liftBlock, listBlocks } from '$lib/server/services/blocks';

export const load: PageServerLoad = async ({ locals }) => {
	const user = requireRole(locals, 'moderator');
	return { pauses: await listBlocks(), role: user.role, outbox: !config.production };
};

const personRef = z.object({ userId: z.coerce.number().int().positive('Pick a person.') });

export const actions: Actions = {
	end: async ({ locals, request }) => {
		const moderator = requireRole(locals, 'moderator');
		return formAction(request, async (posted) => {
			const lifted = await liftBlock(personRef.parse(Object.fromEntries(posted)).userId, moderator);
			return { message: lifted ? 'Pause ended; they can edit again.' : 'That pause had already ended.' };
		});
	}
};
