import { redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { formAction } from '$lib/server/forms';
import { createPart, partFromForm, postedPartForm } from '$lib/server/services/parts';
import { emptyPartForm, PART_KINDS, type PartKind } from '$lib/domain/part';

export const load: PageServerLoad = async ({ locals, url }) => {
	requireRole(locals, 'moderator');
	const kind = url.searchParams.get('kind') ?? '';
	return { values: emptyPartForm((PART_KINDS as readonly string[]).includes(kind) ? (kind as PartKind) : 'amplifier'), unit: locals.units === 'imperial' ? ('in' as const) : ('mm' as const) };
};

export const actions: Actions = {
	default: async ({ locals, request }) => {
		const user = requireRole(locals, 'moderator');
		return formAction(
			request,
			async (posted) => {
				const { id } = await createPart(partFromForm(posted), user);
				redirect(303, `/parts/${id}?saved=1`);
			},
			{ values: postedPartForm }
		);
	}
};
