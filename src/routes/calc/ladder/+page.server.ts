import type { PageServerLoad } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { ServiceError } from '$lib/server/errors';
import { requireVehicle } from '$lib/server/services/vehicles';
import { requirePageRevision } from '$lib/server/services/visibility';

/** With ?vehicle=slug the form starts from that page's recorded control lines. */
export const load: PageServerLoad = async ({ locals, url }) => {
	const user = requireRole(locals, 'viewer');
	const slug = url.searchParams.get('vehicle');
	if (!slug) return { vehicle: null };
	try {
		const vehicle = await requireVehicle(slug);
		const rev = await requirePageRevision(vehicle, user);
		const lines = (rev.content.harness.ladder.lines ?? []).map((l) => ({
			name: l.name || 'Unnamed line',
			buttons: l.buttons.flatMap((b) => (b.ohms === null ? [] : [{ name: b.name || 'Unnamed button', ohms: b.ohms }]))
		}));
		return { vehicle: { slug: vehicle.slug, title: vehicle.title, lines } };
	} catch (err) {
		if (err instanceof ServiceError) return { vehicle: null, missing: err.message };
		throw err;
	}
};
