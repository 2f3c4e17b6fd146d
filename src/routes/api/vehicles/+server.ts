import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { apiCall, queryInt } from '$lib/server/http';
import { listVehicles } from '$lib/server/services/vehicles';

export const GET: RequestHandler = ({ locals, url }) =>
	apiCall(async () => {
		const user = requireRole(locals, 'viewer');
		const result = await listVehicles(user, {
			make: url.searchParams.get('make') ?? undefined,
			model: url.searchParams.get('model') ?? undefined,
			year: queryInt(url, 'year', { min: 1950, max: 2100 }),
			page: queryInt(url, 'page', { min: 1, max: 100_000 }),
			pageSize: queryInt(url, 'pageSize', { min: 1, max: 200 })
		});
		return json({
			items: result.items.map(({ slug, make, model, yearFrom, yearTo, body, latestRevisionId }) => ({ slug, make, model, yearFrom, yearTo, body, latestRevisionId })),
			total: result.total,
			page: result.page,
			pageSize: result.pageSize
		});
	});
