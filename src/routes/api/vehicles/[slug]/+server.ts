import { json } from '@sveltejs/kit';
import { z } from 'zod';
import type { RequestHandler } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { apiCall, readJson } from '$lib/server/http';
import { requireVehicle } from '$lib/server/services/vehicles';
import { requirePageRevision } from '$lib/server/services/visibility';
import { saveRevision } from '$lib/server/services/revisions';

export const GET: RequestHandler = ({ locals, params }) =>
	apiCall(async () => {
		const user = requireRole(locals, 'viewer');
		const vehicle = await requireVehicle(params.slug);
		const rev = await requirePageRevision(vehicle, user);
		return json({
			slug: vehicle.slug,
			make: vehicle.make,
			model: vehicle.model,
			yearFrom: vehicle.yearFrom,
			yearTo: vehicle.yearTo,
			body: vehicle.body,
			protection: vehicle.protection,
			revisionId: rev.id,
			changedAt: rev.createdAt.toISOString(),
			changedBy: rev.authorName,
			content: rev.content
		});
	});

const saveBody = z.object({
	baseRevisionId: z.number({ error: 'baseRevisionId must be the id of the revision you edited.' }).int().positive(),
	content: z.unknown(),
	summary: z.string({ error: 'summary must be text.' }).max(500, 'Keep the change note under 500 characters.').default('')
});

export const PUT: RequestHandler = ({ locals, params, request }) =>
	apiCall(async () => {
		const user = requireRole(locals, 'editor');
		const body = await readJson(request, saveBody);
		const vehicle = await requireVehicle(params.slug);
		const saved = await saveRevision(vehicle.id, body, user);
		return json({ revisionId: saved.revisionId, merged: saved.merged, slug: saved.slug });
	});
