import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { createPart } from '$lib/server/services/parts';
import { ServiceError } from '$lib/server/errors';
import { emptyPartForm, PART_KINDS, partFieldsFromForm, readPartForm, type PartKind } from '$lib/domain/part';

export const load: PageServerLoad = async ({ locals, url }) => {
	requireRole(locals, 'moderator');
	const kind = url.searchParams.get('kind') ?? '';
	return { values: emptyPartForm((PART_KINDS as readonly string[]).includes(kind) ? (kind as PartKind) : 'amplifier'), unit: locals.units === 'imperial' ? ('in' as const) : ('mm' as const) };
};

export const actions: Actions = {
	default: async ({ locals, request }) => {
		const user = requireRole(locals, 'moderator');
		const form = await request.formData();
		const unit = form.get('unit') === 'in' ? 'in' : 'mm';
		const fields = partFieldsFromForm(form.entries());
		const values = { ...emptyPartForm(), ...fields };
		const read = readPartForm(fields, unit);
		if (!read.ok) return fail(400, { values, errors: read.errors });
		let id: number;
		try {
			id = (await createPart(read.part, user)).id;
		} catch (err) {
			if (err instanceof ServiceError) return fail(err.status, { values, errors: { form: err.message, ...(err.fieldErrors ?? {}) } });
			throw err;
		}
		redirect(303, `/parts/${id}?saved=1`);
	}
};
