import { redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { safeNext } from '$lib/server/auth/redirects';
import { asHttpError } from '$lib/server/http';
import { formAction } from '$lib/server/forms';
import { requireVehicle } from '$lib/server/services/vehicles';
import { pageRevision } from '$lib/server/services/visibility';
import { confirmPage, flaggableFields, flagField, trustSummary } from '$lib/server/services/trust';

/** Back to the page the form was on, never off the site. */
function backTo(form: FormData, slug: string, mark: string): string {
	const wanted = form.get('redirectTo');
	const url = new URL(safeNext(typeof wanted === 'string' ? wanted : null, `/vehicles/${slug}`), 'http://kickpanel.invalid');
	url.searchParams.set('marked', mark);
	return `${url.pathname}${url.search}${url.hash}`;
}

export const load: PageServerLoad = async ({ locals, params }) => {
	const user = requireRole(locals, 'viewer');
	try {
		const vehicle = await requireVehicle(params.slug);
		const { revision: current } = await pageRevision(vehicle, user);
		const trust = await trustSummary(vehicle.id, current?.id ?? null, locals.units);
		return { vehicle: { slug: vehicle.slug, title: vehicle.title }, trust, fields: current ? flaggableFields(current.content) : [] };
	} catch (err) {
		asHttpError(err);
	}
};

export const actions: Actions = {
	confirm: async ({ locals, params, request }) => {
		const user = requireRole(locals, 'viewer');
		return formAction(
			request,
			async (posted) => {
				const vehicle = await requireVehicle(params.slug);
				await confirmPage(vehicle.id, { revisionId: posted.get('revisionId') || undefined, note: String(posted.get('note') ?? '') }, user);
				redirect(303, backTo(posted, vehicle.slug, 'confirmed'));
			},
			{ action: 'confirm' }
		);
	},
	flag: async ({ locals, params, request }) => {
		const user = requireRole(locals, 'viewer');
		return formAction(
			request,
			async (posted) => {
				const vehicle = await requireVehicle(params.slug);
				const flag = { fieldPath: String(posted.get('fieldPath') ?? ''), note: String(posted.get('note') ?? '') };
				await flagField(vehicle.id, { ...flag, revisionId: posted.get('revisionId') || undefined }, user);
				redirect(303, backTo(posted, vehicle.slug, 'flagged'));
			},
			{ action: 'flag', values: ['fieldPath', 'note'] }
		);
	}
};
