import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { apiCall, queryInt } from '$lib/server/http';
import { ServiceError } from '$lib/server/errors';
import { searchIndex } from '$lib/server/search';
import { parseSearchFilters } from '$lib/domain/search/filters';
import { YEAR_MAX, YEAR_MIN } from '$lib/domain/search/query';

/** Search as you type: GET /api/search?q=&limit=&make=&year=&body=&photos=&measure=&op=&value=&unit= */
export const GET: RequestHandler = ({ locals, url }) =>
	apiCall(async () => {
		requireRole(locals, 'viewer');
		const limit = queryInt(url, 'limit', { min: 1, max: 50 }) ?? 10;
		const offset = queryInt(url, 'offset', { min: 0, max: 10_000 }) ?? 0;
		queryInt(url, 'year', { min: YEAR_MIN, max: YEAR_MAX });
		const parsed = parseSearchFilters(url.searchParams);
		if (!parsed.ok) throw new ServiceError(parsed.message, 400, { [parsed.field]: parsed.message });
		const result = await searchIndex().search(parsed.filters, { limit, offset });
		return json({
			items: result.items.map((h) => ({
				slug: h.slug,
				title: h.title,
				make: h.make,
				model: h.model,
				yearFrom: h.yearFrom,
				yearTo: h.yearTo,
				body: h.body,
				snippet: h.snippet,
				highlights: h.highlights,
				section: h.section,
				sectionName: h.sectionName,
				score: h.score
			})),
			total: result.total,
			tookMs: result.tookMs,
			corrections: result.corrections,
			years: result.years
		});
	});
