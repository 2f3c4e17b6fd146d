import type { PageServerLoad } from './$types';
import { hasRole, requireRole } from '$lib/server/auth/guard';
import { asHttpError } from '$lib/server/http';
import { lookupVin, newPageHref } from '$lib/server/vin/lookup';

export const load: PageServerLoad = async ({ locals, params }) => {
	const user = requireRole(locals, 'viewer');
	const lookup = await lookupVin(params.vin).catch(asHttpError);
	return { lookup, newPageHref: lookup.newPage && hasRole(user, 'editor') ? newPageHref(lookup.newPage) : null };
};
