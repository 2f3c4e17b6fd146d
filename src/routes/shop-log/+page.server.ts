import { error } from '@sveltejs/kit';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { hasRole, requireRole } from '$lib/server/auth/guard';
import { formAction } from '$lib/server/forms';
import { listRevisions } from '$lib/server/services/revisions';
import { withTallies } from '$lib/server/services/revisionTally';
import { changesFilter } from '$lib/server/services/changes';
import { listUsers } from '$lib/server/services/users';
import { markReviewed } from '$lib/server/services/review';
import { listSuggestions } from '$lib/server/services/suggestions';

export const load: PageServerLoad = async ({ locals, url }) => {
	const user = requireRole(locals, 'viewer');
	const filter = changesFilter(url);
	if (!filter.success) error(400, filter.error.issues[0].message);
	const [revisions, users, suggestions] = await Promise.all([
		listRevisions(user, { authorId: filter.data.user, section: filter.data.section, unreviewed: filter.data.awaiting === '1', page: filter.data.page }),
		listUsers(),
		listSuggestions(user, { status: 'open' })
	]);
	return {
		revisions: { ...revisions, items: await withTallies(revisions.items) },
		filter: filter.data,
		people: users.map((u) => ({ id: u.id, name: u.name })),
		// Moderators see every suggestion waiting; a writer sees their own.
		suggestions,
		answersSuggestions: hasRole(user, 'moderator'),
		canSignOff: hasRole(user, 'moderator') && !user.block
	};
};

const revisionRef = z.object({ revisionId: z.coerce.number().int().positive('Pick a revision.') });

export const actions: Actions = {
	signoff: async ({ locals, request }) => {
		const moderator = requireRole(locals, 'moderator');
		return formAction(request, async (posted) => {
			const { revisionId } = revisionRef.parse(Object.fromEntries(posted));
			const { alreadyReviewed } = await markReviewed(revisionId, moderator);
			return { message: alreadyReviewed ? `#${revisionId} was already signed off.` : `#${revisionId} signed off.` };
		});
	}
};
