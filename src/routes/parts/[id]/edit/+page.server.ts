import { error, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { asHttpError } from '$lib/server/http';
import { formAction } from '$lib/server/forms';
import { deletePart, partFromForm, postedPartForm, requirePart, updatePart } from '$lib/server/services/parts';
import { partFormValues } from '$lib/domain/part';

function partId(raw: string): number {
	const id = Number(raw);
	if (!Number.isInteger(id) || id <= 0) error(404, 'No part with that number in the catalogue.');
	return id;
}

export const load: PageServerLoad = async ({ locals, params }) => {
	requireRole(locals, 'moderator');
	const unit = locals.units === 'imperial' ? ('in' as const) : ('mm' as const);
	try {
		const part = await requirePart(partId(params.id));
		return { part: { id: part.id, name: part.name, sku: part.sku }, values: partFormValues(part, unit), unit };
	} catch (err) {
		asHttpError(err);
	}
};

export const actions: Actions = {
	save: async ({ locals, params, request }) => {
		const user = requireRole(locals, 'moderator');
		const id = partId(params.id);
		return formAction(
			request,
			async (posted) => {
				await updatePart(id, partFromForm(posted), user);
				redirect(303, `/parts/${id}?saved=1`);
			},
			{ action: 'save', values: postedPartForm }
		);
	},
	delete: async ({ locals, params, request }) => {
		const user = requireRole(locals, 'moderator');
		return formAction(
			request,
			async () => {
				await deletePart(partId(params.id), user);
				redirect(303, '/parts?deleted=1');
			},
			{ action: 'delete' }
		);
	}
};
