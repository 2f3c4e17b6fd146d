import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { apiCall, readJson } from '$lib/server/http';
import { ServiceError } from '$lib/server/errors';
import { powerWire } from '$lib/domain/power';
import { powerWireInputSchema } from '$lib/domain/powerInput';
import { FUSE_CAUTIONS } from '$lib/domain/fuse';

export const POST: RequestHandler = ({ locals, request }) =>
	apiCall(async () => {
		requireRole(locals, 'viewer');
		const input = await readJson(request, powerWireInputSchema);
		const result = powerWire(input);
		if (!result.ok) throw new ServiceError(result.reason, 422);
		const { awg, resistanceOhms, dropV, dropPct, ampacityA, fuseA, fuseBasis, upsized, basis } = result;
		return json({ awg, resistanceOhms, dropV, dropPct, ampacityA, fuseA, fuseBasis, upsized, basis, cautions: FUSE_CAUTIONS });
	});
