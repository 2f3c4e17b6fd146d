import { redirect } from '@sveltejs/kit';
import { z } from 'zod';
import type { Actions } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { formAction } from '$lib/server/forms';
import { requireVehicle } from '$lib/server/services/vehicles';
import { restoreRevision, setProtection, setRevisionHidden } from '$lib/server/services/revisions';

// Restore and hide change what everyone reads: the post carries the answer to "are you sure?".
const revisionRef = z.object({
	revisionId: z.coerce.number().int().positive('Pick a revision.'),
	confirmed: z.literal('yes', { error: 'Confirm first: open the revision’s Restore or Hide again and answer the question.' })
});
const hideForm = revisionRef.extend({
	hidden: z.enum(['true', 'false']),
	reason: z.string().trim().max(300, 'Keep the reason under 300 characters.').default('')
});
const protectForm = z.object({ protection: z.enum(['none', 'moderators'], { error: 'Choose who may edit.' }) });

export const actions: Actions = {
	restore: async ({ locals, params, request }) => {
		const user = requireRole(locals, 'moderator');
		return formAction(request, async (posted) => {
			const { revisionId } = revisionRef.parse(Object.fromEntries(posted));
			const vehicle = await requireVehicle(params.slug);
			const saved = await restoreRevision(vehicle.id, revisionId, user);
			// To the history, from the compare screen and the confirmation page too, which says what happened.
			redirect(303, `/vehicles/${saved.slug}/history?restored=${saved.revisionId}&of=${revisionId}`);
		});
	},
	hide: async ({ locals, request }) => {
		const user = requireRole(locals, 'moderator');
		return formAction(request, async (posted) => {
			const { revisionId, hidden, reason } = hideForm.parse(Object.fromEntries(posted));
			await setRevisionHidden(revisionId, hidden === 'true', reason, user);
			return { message: hidden === 'true' ? `Revision ${revisionId} hidden.` : `Revision ${revisionId} shown again.` };
		});
	},
	lock: async ({ locals, params, request }) => {
		const user = requireRole(locals, 'moderator');
		return formAction(request, async (posted) => {
			const { protection } = protectForm.parse(Object.fromEntries(posted));
			const vehicle = await requireVehicle(params.slug);
			await setProtection(vehicle.id, protection, user);
			return { message: protection === 'moderators' ? 'Locked for moderators: only moderators can edit it now.' : 'Unlocked: any writer can edit again.' };
		});
	}
};
