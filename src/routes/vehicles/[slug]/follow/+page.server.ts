import { redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad, RequestEvent } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { safeNext } from '$lib/server/auth/redirects';
import { requireVehicle } from '$lib/server/services/vehicles';
import { isWatching, unwatchPage, watchPage } from '$lib/server/services/watch';
import { asHttpError } from '$lib/server/http';

export const load: PageServerLoad = async ({ locals, params }) => {
	const user = requireRole(locals, 'viewer');
	const vehicle = await requireVehicle(params.slug).catch(asHttpError);
	return { vehicle: { slug: vehicle.slug, title: vehicle.title }, following: await isWatching(user.id, vehicle.id) };
};

async function toggle(event: RequestEvent, follow: boolean) {
	const user = requireRole(event.locals, 'viewer');
	const vehicle = await requireVehicle(event.params.slug).catch(asHttpError);
	const form = await event.request.formData();
	if (follow) await watchPage(user.id, vehicle.id).catch(asHttpError);
	else await unwatchPage(user.id, vehicle.id);
	const back = form.get('returnTo');
	redirect(303, typeof back === 'string' && back ? safeNext(back) : `/vehicles/${vehicle.slug}`);
}

export const actions: Actions = {
	follow: (event) => toggle(event, true),
	unfollow: (event) => toggle(event, false)
};
