import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { apiCall, readJson } from '$lib/server/http';
import { ampCurrent } from '$lib/domain/power';
import { ampCurrentInputSchema } from '$lib/domain/powerInput';
import { FUSE_CAUTIONS } from '$lib/domain/fuse';

export const POST: RequestHandler = ({ locals, request }) =>
	apiCall(async () => {
		requireRole(locals, 'viewer');
		const input = await readJson(request, ampCurrentInputSchema);
		return json({ ...ampCurrent(input), cautions: FUSE_CAUTIONS });
	});
