import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { apiCall, queryInt } from '$lib/server/http';
import { requireVehicle } from '$lib/server/services/vehicles';
import { listRevisions } from '$lib/server/services/revisions';
import { withTallies } from '$lib/server/services/revisionTally';

export const GET: RequestHandler = ({ locals, params, url }) =>
	apiCall(async () => {
		const user = requireRole(locals, 'viewer');
		const vehicle = await requireVehicle(params.slug);
		const result = await listRevisions(user, {
			vehicleId: vehicle.id,
			page: queryInt(url, 'page', { min: 1, max: 100_000 }),
			pageSize: queryInt(url, 'pageSize', { min: 1, max: 500 })
		});
		return json({
			// sizeDelta stays for older clients; tally says what changed: { fields, notes, measurements } or null.
			items: (await withTallies(result.items)).map((r) => ({
				id: r.id,
				parentId: r.parentId,
				author: r.author,
				summary: r.summary,
				createdAt: r.createdAt,
				size: r.size,
				sizeDelta: r.sizeDelta,
				sections: r.sections,
				tally: r.tally,
				hidden: r.hidden,
				restoresRevisionId: r.restoresRevisionId
			})),
			total: result.total,
			page: result.page,
			pageSize: result.pageSize
		});
	});
