import { error } from '@sveltejs/kit';
import type { PageServerLoad } from './$types';
import { hasRole, requireRole } from '$lib/server/auth/guard';
import { asHttpError } from '$lib/server/http';
import { requirePart } from '$lib/server/services/parts';
import { vehiclesForPart } from '$lib/server/services/fit';
import { partEnclosure, vehiclesForBootBox } from '$lib/server/services/bootFit';

export const load: PageServerLoad = async ({ locals, params, url }) => {
	const user = requireRole(locals, 'viewer');
	const id = Number(params.id);
	if (!Number.isInteger(id) || id <= 0) error(404, 'No part with that number in the catalogue.');
	try {
		const part = await requirePart(id);
		const fits = await vehiclesForPart(part);
		const bootFits = part.kind === 'enclosure' || part.kind === 'amplifier' ? await vehiclesForBootBox(partEnclosure(part)) : null;
		return { part, fits, bootFits, canManage: hasRole(user, 'moderator'), saved: url.searchParams.has('saved'), units: locals.units };
	} catch (err) {
		asHttpError(err);
	}
};
