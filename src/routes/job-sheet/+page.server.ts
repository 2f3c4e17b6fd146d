import { redirect } from '@sveltejs/kit';
import type { PageServerLoad } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { listVehicles } from '$lib/server/services/vehicles';
import { BODY_STYLE_NAMES, type BodyStyle } from '$lib/domain/content/schema';
import { slugify } from '$lib/domain/slug';

// A calculator's figures arrive here when it was not opened for a vehicle: pick one, and the
// figures go on to that vehicle's job sheet unchanged.
export const load: PageServerLoad = async ({ locals, url }) => {
	const user = requireRole(locals, 'viewer');
	const q = new URLSearchParams(url.searchParams);
	const picked = q.get('vehicle');
	q.delete('vehicle');
	if (picked && slugify(picked) === picked) redirect(303, `/vehicles/${picked}/job-sheet${q.size ? `?${q}` : ''}`);
	const { items } = await listVehicles(user, { pageSize: 200 });
	return {
		vehicles: items.map((v) => ({ slug: v.slug, title: `${v.title} · ${BODY_STYLE_NAMES[v.body as BodyStyle] ?? v.body}` })),
		carried: [...q.entries()].map(([name, value]) => ({ name, value }))
	};
};
