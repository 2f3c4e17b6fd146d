import type { PageServerLoad } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { ServiceError } from '$lib/server/errors';
import { catalogue, listVehicles, requireVehicle } from '$lib/server/services/vehicles';
import { listParts } from '$lib/server/services/parts';
import { vehicleFitFacts } from '$lib/server/services/fit';
import { trustSummary } from '$lib/server/services/trust';
import { BODY_STYLE_NAMES, type BodyStyle } from '$lib/domain/content/schema';

// Up to this many pages the vehicle list is one grouped select; beyond it, pick the make first.
const ONE_LIST_LIMIT = 200;

export const load: PageServerLoad = async ({ locals, url }) => {
	requireRole(locals, 'viewer');
	const q = url.searchParams;
	const slug = (q.get('vehicle') ?? '').trim();

	let vehicle = null;
	let missing: string | null = null;
	if (slug) {
		try {
			const v = await requireVehicle(slug);
			const [facts, trust] = await Promise.all([vehicleFitFacts(v), trustSummary(v, locals.units)]);
			if (facts) {
				vehicle = {
					slug: v.slug,
					title: v.title,
					make: v.make,
					yearFrom: v.yearFrom,
					yearTo: v.yearTo,
					body: BODY_STYLE_NAMES[v.body as BodyStyle] ?? v.body,
					...facts.places,
					evidence: facts.evidence,
					trust
				};
			}
		} catch (err) {
			if (!(err instanceof ServiceError)) throw err;
			missing = err.message;
		}
	}

	const makes = (await catalogue()).map((m) => ({ name: m.name, slug: m.slug }));
	const makeSlug = q.get('make') || (vehicle ? (makes.find((m) => m.name === vehicle.make)?.slug ?? '') : '');
	const all = await listVehicles({ pageSize: ONE_LIST_LIMIT });
	const oneList = all.total <= ONE_LIST_LIMIT;
	const list = oneList ? all.items : makeSlug ? (await listVehicles({ make: makeSlug, pageSize: ONE_LIST_LIMIT })).items : [];

	return {
		makes,
		makeSlug,
		oneList,
		vehicles: list.map((v) => ({ slug: v.slug, title: v.title, make: v.make, body: BODY_STYLE_NAMES[v.body as BodyStyle] ?? v.body })),
		parts: await listParts(),
		vehicle,
		missing,
		units: locals.units,
		canMark: true
	};
};
