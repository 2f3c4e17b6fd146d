import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { safeNext } from '$lib/server/auth/redirects';
import { asHttpError } from '$lib/server/http';
import { ServiceError } from '$lib/server/errors';
import { currentRevision, requireVehicle } from '$lib/server/services/vehicles';
import { confirmPage, flaggableFields, flagField, trustSummary } from '$lib/server/services/trust';

/** Back to the page the form was on, never off the site. */
function backTo(form: FormData, slug: string, mark: string): string {
	const wanted = form.get('redirectTo');
	const url = new URL(safeNext(typeof wanted === 'string' ? wanted : null, `/vehicles/${slug}`), 'http://kickpanel.invalid');
	url.searchParams.set('marked', mark);
	return `${url.pathname}${url.search}${url.hash}`;
}

export const load: PageServerLoad = async ({ locals, params }) => {
	requireRole(locals, 'viewer');
	try {
		const vehicle = await requireVehicle(params.slug);
		const [trust, current] = await Promise.all([
			trustSummary(vehicle, locals.units),
			currentRevision(vehicle)
		]);
		return { vehicle: { slug: vehicle.slug, title: vehicle.title }, trust, fields: current ? flaggableFields(current.content) : [] };
	} catch (err) {
		asHttpError(err);
	}
};

export const actions: Actions = {
	confirm: async ({ locals, params, request }) => {
		const user = requireRole(locals, 'viewer');
		const form = await request.formData();
		let slug: string;
		try {
			const vehicle = await requireVehicle(params.slug);
			slug = vehicle.slug;
			await confirmPage(vehicle.id, { revisionId: form.get('revisionId') || undefined, note: String(form.get('note') ?? '') }, user);
		} catch (err) {
			if (err instanceof ServiceError) return fail(err.status, { action: 'confirm', message: err.message, errors: err.fieldErrors ?? {} });
			throw err;
		}
		redirect(303, backTo(form, slug, 'confirmed'));
	},
	flag: async ({ locals, params, request }) => {
		const user = requireRole(locals, 'viewer');
		const form = await request.formData();
		const values = { fieldPath: String(form.get('fieldPath') ?? ''), note: String(form.get('note') ?? '') };
		let slug: string;
		try {
			const vehicle = await requireVehicle(params.slug);
			slug = vehicle.slug;
			await flagField(vehicle.id, { ...values, revisionId: form.get('revisionId') || undefined }, user);
		} catch (err) {
			if (err instanceof ServiceError) return fail(err.status, { action: 'flag', message: err.message, values, errors: err.fieldErrors ?? {} });
			throw err;
		}
		redirect(303, backTo(form, slug, 'flagged'));
	}
};
