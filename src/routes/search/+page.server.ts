import { redirect } from '@sveltejs/kit';
import type { PageServerLoad } from './$types';
import { hasRole, requireRole } from '$lib/server/auth/guard';
import { asHttpError } from '$lib/server/http';
import { searchIndex } from '$lib/server/search';
import { lookupVin, newPageHref } from '$lib/server/vin/lookup';
import { parseSearchFilters, type SearchFilters } from '$lib/domain/search/filters';
import { vinShape } from '$lib/domain/search/query';
import { conditionRows, tidiedRows } from '$lib/domain/search/conditionRows';

const PAGE_SIZE = 20;

export const load: PageServerLoad = async ({ locals, url }) => {
	const user = requireRole(locals, 'viewer');
	const params = url.searchParams;
	// "Add a condition" and "Remove" send the form: go on to the same search with the rows changed.
	const tidied = tidiedRows(params);
	if (tidied !== null) redirect(303, `/search?${tidied}`);
	const values = {
		q: params.get('q') ?? '',
		make: params.get('make') ?? '',
		year: params.get('year') ?? '',
		body: params.get('body') ?? '',
		photos: ['1', 'on', 'true'].includes(params.get('photos') ?? ''),
		unit: params.get('unit') ?? (locals.units === 'imperial' ? 'in' : 'mm'),
		conditions: conditionRows(params)
	};
	const index = searchIndex();
	const makes = await index.makes().catch(asHttpError);
	const pageNumber = Math.min(500, Math.max(1, Math.trunc(Number(params.get('page'))) || 1));
	const parsed = parseSearchFilters(params);
	const canAdd = hasRole(user, 'editor');
	if (!parsed.ok) return { values, makes, problem: { message: parsed.message, field: parsed.field }, vin: null, results: null, page: 1, pageSize: PAGE_SIZE, canAdd };

	const filters: SearchFilters = parsed.filters;
	const shape = vinShape(filters.q);
	let vin = null;
	if (shape?.problem) vin = { vin: shape.vin, problem: shape.problem, lookup: null, newPageHref: null };
	else if (shape) {
		const lookup = await lookupVin(shape.vin).catch(asHttpError);
		vin = { vin: shape.vin, problem: null, lookup, newPageHref: lookup.newPage && hasRole(user, 'editor') ? newPageHref(lookup.newPage) : null };
	}
	const asked = !shape && (filters.q.trim() || filters.make || filters.year || filters.body || filters.photos || filters.conditions.length);
	const results = asked ? await index.search(filters, { limit: PAGE_SIZE, offset: (pageNumber - 1) * PAGE_SIZE }).catch(asHttpError) : null;
	return { values, makes, problem: null, vin, results, page: pageNumber, pageSize: PAGE_SIZE, canAdd };
};
