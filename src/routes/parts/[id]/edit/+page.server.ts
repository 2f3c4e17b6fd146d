import { error, fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { asHttpError } from '$lib/server/http';
import { deletePart, requirePart, updatePart } from '$lib/server/services/parts';
import { ServiceError } from '$lib/server/errors';
import { emptyPartForm, partFieldsFromForm, partFormValues, readPartForm } from '$lib/domain/part';

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
		const form = await request.formData();
		const unit = form.get('unit') === 'in' ? 'in' : 'mm';
		const fields = partFieldsFromForm(form.entries());
		const values = { ...emptyPartForm(), ...fields };
		const read = readPartForm(fields, unit);
		if (!read.ok) return fail(400, { values, errors: read.errors });
		try {
			await updatePart(id, read.part, user);
		} catch (err) {
			if (err instanceof ServiceError) return fail(err.status, { values, errors: { form: err.message, ...(err.fieldErrors ?? {}) } });
			throw err;
		}
		redirect(303, `/parts/${id}?saved=1`);
	},
	delete: async ({ locals, params }) => {
		const user = requireRole(locals, 'moderator');
		try {
			await deletePart(partId(params.id), user);
		} catch (err) {
			if (err instanceof ServiceError) return fail(err.status, { message: err.message });
			throw err;
		}
		redirect(303, '/parts?deleted=1');
	}
};
