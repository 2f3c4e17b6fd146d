import { error, fail } from '@sveltejs/kit';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { hasRole, requireRole } from '$lib/server/auth/guard';
import { listRevisions } from '$lib/server/services/revisions';
import { changesFilter } from '$lib/server/services/changes';
import { listUsers } from '$lib/server/services/users';
import { markReviewed } from '$lib/server/services/review';
import { ServiceError } from '$lib/server/errors';

export const load: PageServerLoad = async ({ locals, url }) => {
	const user = requireRole(locals, 'viewer');
	const filter = changesFilter(url);
	if (!filter.success) error(400, filter.error.issues[0].message);
	const [revisions, users] = await Promise.all([
		listRevisions({ authorId: filter.data.user, section: filter.data.section, unreviewed: filter.data.unreviewed === '1', page: filter.data.page }),
		listUsers()
	]);
	return {
		revisions,
		filter: filter.data,
		people: users.map((u) => ({ id: u.id, name: u.name })),
		canReview: hasRole(user, 'moderator') && !user.block
	};
};

export const actions: Actions = {
	review: async ({ locals, request }) => {
		const moderator = requireRole(locals, 'moderator');
		const parsed = z.object({ revisionId: z.coerce.number().int().positive('Pick a revision.') }).safeParse(Object.fromEntries(await request.formData()));
		if (!parsed.success) return fail(400, { message: parsed.error.issues[0].message });
		try {
			const { alreadyReviewed } = await markReviewed(parsed.data.revisionId, moderator);
			return { message: alreadyReviewed ? `Revision ${parsed.data.revisionId} was already reviewed.` : `Revision ${parsed.data.revisionId} marked reviewed.` };
		} catch (err) {
			if (err instanceof ServiceError) return fail(err.status, { message: err.message });
			throw err;
		}
	}
};
