import { error, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { hasRole, requireRole, requireRoleInForm } from '$lib/server/auth/guard';
import { formAction } from '$lib/server/forms';
import { asHttpError } from '$lib/server/http';
import { vehicleBySlug } from '$lib/server/services/vehicles';
import { editableVehicle, editorStart, editorValuesAfter, editorVehicle, submitEditor, submitSuggestion } from '$lib/server/services/vehicleEditor';
import type { LengthUnit } from '$lib/domain/units';

export const load: PageServerLoad = async ({ locals, params, url }) => {
	// A paused writer still opens the form (it says why saving is refused), so a refused save shows it again.
	const user = requireRole(locals, 'viewer');
	if (!hasRole(user, 'editor')) error(403, `Editing needs the editor role or higher; you are signed in as ${user.role}.`);
	const found = await vehicleBySlug(params.slug);
	if (found && 'redirectTo' in found) redirect(301, `/vehicles/${found.redirectTo}/edit`);
	const { vehicle, mode } = await editorVehicle(params.slug, user).catch(asHttpError);
	const unit: LengthUnit = locals.units === 'imperial' ? 'in' : 'mm';
	const start = await editorStart(vehicle, unit).catch(asHttpError);
	return { vehicle, ...start, unit, mode, paused: user.block ?? null, created: url.searchParams.has('created') };
};

export const actions: Actions = {
	save: async ({ locals, request, params }) => {
		// Inside the form action: a page locked or gone meanwhile, a pause or an ended sign-in hands the form back with what was typed.
		return formAction(
			request,
			async (posted) => {
				const user = requireRoleInForm(locals, 'editor');
				const vehicle = await editableVehicle(params.slug, user, true);
				const outcome = await submitEditor(vehicle, posted, user);
				if (!outcome.saved) return { values: outcome.values, errors: outcome.errors, message: outcome.message };
				redirect(303, `/vehicles/${outcome.saved.slug}?saved=${outcome.saved.revisionId}${outcome.saved.merged ? '&merged=1' : ''}`);
			},
			{ values: editorValuesAfter }
		);
	},
	suggest: async ({ locals, request, params }) => {
		return formAction(
			request,
			async (posted) => {
				const user = requireRoleInForm(locals, 'editor');
				const { vehicle } = await editorVehicle(params.slug, user);
				const outcome = await submitSuggestion(vehicle, posted, user);
				if (!outcome.suggested) return { values: outcome.values, errors: outcome.errors, message: outcome.message };
				redirect(303, `/vehicles/${outcome.suggested.slug}/suggestions/${outcome.suggested.id}?kept=1`);
			},
			{ values: editorValuesAfter }
		);
	}
};
