import { error } from '@sveltejs/kit';
import { z } from 'zod';
import type { PageServerLoad } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { asHttpError } from '$lib/server/http';
import { requireVehicle } from '$lib/server/services/vehicles';
import { readableRevision } from '$lib/server/services/visibility';

const asked = z.object({
	do: z.enum(['restore', 'hide', 'show'], { error: 'Say what to do: restore, hide or show.' }),
	revision: z.coerce.number({ error: 'Name a revision.' }).int().positive('Name a revision.')
});

// Restore and hide ask first; without scripts the question is this page.
export const load: PageServerLoad = async ({ locals, params, url }) => {
	const user = requireRole(locals, 'moderator');
	const parsed = asked.safeParse(Object.fromEntries(url.searchParams));
	if (!parsed.success) error(400, parsed.error.issues[0].message);
	const vehicle = await requireVehicle(params.slug).catch(asHttpError);
	const revision = await readableRevision(vehicle.id, parsed.data.revision, user);
	if (!revision) error(404, 'That revision is not part of this page.');
	return {
		act: parsed.data.do,
		vehicle: { slug: vehicle.slug, title: vehicle.title },
		revision: { id: revision.id, author: revision.authorName, createdAt: revision.createdAt.toISOString(), summary: revision.summary }
	};
};
