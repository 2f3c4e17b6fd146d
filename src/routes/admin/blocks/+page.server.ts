import { fail } from '@sveltejs/kit';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { config } from '$lib/server/config';
import { liftBlock, listBlocks } from '$lib/server/services/blocks';
import { ServiceError } from '$lib/server/errors';

export const load: PageServerLoad = async ({ locals }) => {
	const user = requireRole(locals, 'moderator');
	return { blocks: await listBlocks(), role: user.role, outbox: !config.production };
};

export const actions: Actions = {
	lift: async ({ locals, request }) => {
		const moderator = requireRole(locals, 'moderator');
		const parsed = z.object({ userId: z.coerce.number().int().positive('Pick a person.') }).safeParse(Object.fromEntries(await request.formData()));
		if (!parsed.success) return fail(400, { message: parsed.error.issues[0].message });
		try {
			const lifted = await liftBlock(parsed.data.userId, moderator);
			return { message: lifted ? 'Block lifted; they can edit again.' : 'That block had already ended.' };
		} catch (err) {
			if (err instanceof ServiceError) return fail(err.status, { message: err.message });
			throw err;
		}
	}
};
