import { redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { formAction } from '$lib/server/forms';
import { asHttpError } from '$lib/server/http';
import { vehicleBySlug } from '$lib/server/services/vehicles';
import { editableVehicle, editorStart, editorValuesAfter, submitEditor } from '$lib/server/services/vehicleEditor';
import type { LengthUnit } from '$lib/domain/units';

export const load: PageServerLoad = async ({ locals, params, url }) => {
	const user = requireRole(locals, 'editor');
	const found = await vehicleBySlug(params.slug);
	if (found && 'redirectTo' in found) redirect(301, `/vehicles/${found.redirectTo}/edit`);
	const vehicle = await editableVehicle(params.slug, user).catch(asHttpError);
	const unit: LengthUnit = locals.units === 'imperial' ? 'in' : 'mm';
	const start = await editorStart(vehicle, unit).catch(asHttpError);
	return { vehicle, ...start, unit, created: url.searchParams.has('created') };
};

export const actions: Actions = {
	save: async ({ locals, request, params }) => {
		const user = requireRole(locals, 'editor');
		// Inside the form action: a page protected or gone meanwhile hands the form back with what was typed.
		return formAction(
			request,
			async (posted) => {
				const vehicle = await editableVehicle(params.slug, user, true);
				const outcome = await submitEditor(vehicle, posted, user);
				if (!outcome.saved) return { values: outcome.values, errors: outcome.errors, message: outcome.message };
				redirect(303, `/vehicles/${outcome.saved.slug}?saved=${outcome.saved.revisionId}${outcome.saved.merged ? '&merged=1' : ''}`);
			},
			{ values: editorValuesAfter }
		);
	}
};
