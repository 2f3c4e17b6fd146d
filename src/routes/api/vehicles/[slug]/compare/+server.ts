import { error, json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { apiCall, queryInt } from '$lib/server/http';
import { requireVehicle } from '$lib/server/services/vehicles';
import { compareRevisions } from '$lib/server/services/revisions';

export const GET: RequestHandler = ({ locals, params, url }) =>
	apiCall(async () => {
		const user = requireRole(locals, 'viewer');
		const from = queryInt(url, 'from', { min: 1, max: Number.MAX_SAFE_INTEGER });
		const to = queryInt(url, 'to', { min: 1, max: Number.MAX_SAFE_INTEGER });
		if (!from || !to) error(400, 'Give two revision ids: ?from=…&to=…');
		const vehicle = await requireVehicle(params.slug);
		const cmp = await compareRevisions(vehicle.id, from, to, user, locals.units);
		return json({
			from: { id: cmp.from.id, author: cmp.from.authorName, createdAt: cmp.from.createdAt.toISOString(), summary: cmp.from.summary },
			to: { id: cmp.to.id, author: cmp.to.authorName, createdAt: cmp.to.createdAt.toISOString(), summary: cmp.to.summary },
			changes: cmp.changes.map(({ path, label, section, kind, before, after }) => ({ path, label, section, kind, before, after })),
			notes: cmp.notes,
			photos: cmp.photos
		});
	});
