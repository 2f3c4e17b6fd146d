import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { hasRole, requireRole } from '$lib/server/auth/guard';
import { apiCall } from '$lib/server/http';
import { lookupVin, newPageHref } from '$lib/server/vin/lookup';

/** GET /api/vin/{vin}: check digit, model year, decoder answer and the pages the VIN leads to; 400 when it cannot be a VIN. */
export const GET: RequestHandler = ({ locals, params }) =>
	apiCall(async () => {
		const user = requireRole(locals, 'viewer');
		const found = await lookupVin(params.vin);
		return json({
			vin: found.vin,
			valid: found.valid,
			checkDigit: found.checkDigit,
			modelYear: found.modelYear,
			wmi: found.wmi,
			problem: found.problem,
			decoded: found.decoded,
			decoder: found.decoder,
			matches: found.matches.map(({ slug, title, yearFrom, yearTo, body, reason }) => ({ slug, title, yearFrom, yearTo, body, reason })),
			newPageHref: found.newPage && hasRole(user, 'editor') ? newPageHref(found.newPage) : null
		});
	});
