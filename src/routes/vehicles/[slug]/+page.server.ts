import { error, fail, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { vehicleBySlug } from '$lib/server/services/vehicles';
import { visibleRevision } from '$lib/server/services/review';
import { isWatching } from '$lib/server/services/watch';
import { trustSummary } from '$lib/server/services/trust';
import { canEditVehicle } from '$lib/server/services/revisions';
import { setUnits } from '$lib/server/services/preferences';
import { deliverBody, vehicleBody } from '$lib/server/render/vehicleBody';

export const load: PageServerLoad = async ({ locals, params, url, isDataRequest }) => {
	const user = requireRole(locals, 'viewer');
	const found = await vehicleBySlug(params.slug);
	if (!found) error(404, 'No vehicle page at this address.');
	if ('redirectTo' in found) redirect(301, `/vehicles/${found.redirectTo}`);
	const { vehicle } = found;
	const [{ revision, newerAwaitingReview }, watching, trust] = await Promise.all([
		visibleRevision(vehicle, user),
		isWatching(user.id, vehicle.id),
		trustSummary(vehicle.id, locals.units)
	]);
	if (!revision) {
		error(404, newerAwaitingReview ? 'This new page is waiting for a moderator to review it.' : 'This vehicle page has no saved revision yet.');
	}
	const saved = Number(url.searchParams.get('saved'));
	return {
		vehicle,
		identity: revision.content.identity,
		photos: revision.content.photos,
		rendered: revision.rendered,
		// A full page view gets the cached figures spliced into its HTML (see hooks.server.ts) instead of
		// serialising them twice; a client-side navigation receives them as data.
		...deliverBody(locals, vehicleBody(revision, locals.units), isDataRequest),
		revision: { id: revision.id, authorName: revision.authorName, createdAt: revision.createdAt.toISOString(), summary: revision.summary },
		canEdit: canEditVehicle(user, vehicle),
		watching,
		trust,
		newerAwaitingReview,
		units: locals.units,
		flash: Number.isInteger(saved) && saved > 0 ? { revisionId: saved, merged: url.searchParams.get('merged') === '1' } : null
	};
};

const unitsSchema = z.object({ units: z.enum(['metric', 'imperial'], { error: 'Choose metric or imperial.' }) });

const YEAR_SECONDS = 365 * 24 * 60 * 60;

export const actions: Actions = {
	units: async ({ locals, request, cookies }) => {
		const user = requireRole(locals, 'viewer');
		const parsed = unitsSchema.safeParse(Object.fromEntries(await request.formData()));
		if (!parsed.success) return fail(400, { message: parsed.error.issues[0].message });
		await setUnits(user.id, parsed.data.units);
		cookies.set('units', parsed.data.units, { path: '/', maxAge: YEAR_SECONDS, sameSite: 'lax', httpOnly: false });
		// The page is rendered again in this same request after the action.
		locals.units = parsed.data.units;
		return { units: parsed.data.units };
	}
};
