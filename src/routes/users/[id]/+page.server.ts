import { shopSettings } from '$lib/server/services/settings';
import { formatWhen } from '$lib/domain/shopTime';
import { error } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { hasRole, requireRole } from '$lib/server/auth/guard';
import { listRevisions } from '$lib/server/services/revisions';
import { withTallies } from '$lib/server/services/revisionTally';
import { changesFilter } from '$lib/server/services/changes';
import { activeBlockFor, blockUser, liftBlock } from '$lib/server/services/blocks';
import { formAction } from '$lib/server/forms';
import { User } from '$lib/server/db/models';

function personId(raw: string): number {
	const id = Number(raw);
	if (!Number.isInteger(id) || id < 1) error(404, 'No such person.');
	return id;
}

export const load: PageServerLoad = async ({ locals, params, url }) => {
	const viewer = requireRole(locals, 'viewer');
	const id = personId(params.id);
	const person = await User.findByPk(id, { attributes: ['id', 'name', 'role'] });
	if (!person) error(404, 'No such person.');
	const filter = changesFilter(url);
	if (!filter.success) error(400, filter.error.issues[0].message);
	const moderating = hasRole(viewer, 'moderator') && !viewer.block && viewer.id !== id;
	const [revisions, block] = await Promise.all([
		listRevisions(viewer, { authorId: id, section: filter.data.section, page: filter.data.page }),
		// Everyone may see that someone's editing is paused; the reason is for moderators and the person themselves.
		activeBlockFor(id)
	]);
	const showReason = moderating || viewer.id === id;
	return {
		person: { id: person.id, name: person.name, role: person.role },
		revisions: { ...revisions, items: await withTallies(revisions.items) },
		block: block ? { until: block.until, reason: showReason ? block.reason : null } : null,
		moderating
	};
};

export const actions: Actions = {
	pause: async ({ locals, params, request }) => {
		const moderator = requireRole(locals, 'moderator');
		return formAction(
			request,
			async (posted) => {
				const pause = await blockUser(personId(params.id), Object.fromEntries(posted), moderator);
				return { message: `Editing paused until ${formatWhen(pause.until, (await shopSettings()).timeZone)}.` };
			},
			{ values: ['reason', 'until'] }
		);
	},
	end: async ({ locals, params, request }) => {
		const moderator = requireRole(locals, 'moderator');
		return formAction(request, async () => {
			const lifted = await liftBlock(personId(params.id), moderator);
			return { message: lifted ? 'Pause ended; they can edit again.' : 'There was no pause in force.' };
		});
	}
};
