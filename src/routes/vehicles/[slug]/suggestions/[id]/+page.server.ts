import { error, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { hasRole, requireRole } from '$lib/server/auth/guard';
import { formAction } from '$lib/server/forms';
import { asHttpError } from '$lib/server/http';
import { requireVehicle } from '$lib/server/services/vehicles';
import { applyRefusal, applySuggestion, declineSuggestion, suggestionDetail } from '$lib/server/services/suggestions';

const idSchema = z.coerce.number({ error: 'No suggested change with that number.' }).int().positive('No suggested change with that number.');
const applyForm = z.object({ changeNote: z.string().trim().max(500, 'Keep the change note under 500 characters.').default('') });
const declineForm = z.object({
	note: z.string({ error: 'Say why, in a few words: the writer reads it.' }).trim().min(3, 'Say why, in a few words: the writer reads it.').max(500, 'Keep the note under 500 characters.')
});

export const load: PageServerLoad = async ({ locals, params, url }) => {
	const user = requireRole(locals, 'editor');
	const vehicle = await requireVehicle(params.slug).catch(asHttpError);
	const id = idSchema.safeParse(params.id);
	if (!id.success) error(404, id.error.issues[0].message);
	const suggestion = await suggestionDetail(id.data, vehicle.id, user, locals.units).catch(asHttpError);
	return { vehicle: { slug: vehicle.slug, title: vehicle.title }, suggestion, mayAnswer: hasRole(user, 'moderator'), kept: url.searchParams.has('kept') };
};

export const actions: Actions = {
	apply: async ({ locals, params, request }) => {
		const user = requireRole(locals, 'moderator');
		return formAction(
			request,
			async (posted) => {
				const { changeNote } = applyForm.parse(Object.fromEntries(posted));
				const saved = await applySuggestion(idSchema.parse(params.id), user, changeNote);
				redirect(303, `/vehicles/${saved.slug}?saved=${saved.revisionId}${saved.merged ? '&merged=1' : ''}`);
			},
			{ action: 'apply', values: (posted, refusal) => ({ changeNote: String(posted.get('changeNote') ?? ''), ...applyRefusal(refusal, locals.units) }) }
		);
	},
	decline: async ({ locals, params, request }) => {
		const user = requireRole(locals, 'moderator');
		return formAction(
			request,
			async (posted) => {
				const { note } = declineForm.parse(Object.fromEntries(posted));
				await declineSuggestion(idSchema.parse(params.id), user, note);
				return { action: 'decline', message: 'Declined: the writer hears it by mail, with your note.' };
			},
			{ action: 'decline', values: ['note'] }
		);
	}
};
