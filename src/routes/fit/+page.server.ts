import type { PageServerLoad } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { ServiceError } from '$lib/server/errors';
import { catalogue, currentRevision, listVehicles, requireVehicle } from '$lib/server/services/vehicles';
import { listParts } from '$lib/server/services/parts';
import { measurementOrigins, placeReaders } from '$lib/server/services/evidence';
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
			const rev = await currentRevision(v);
			if (rev) {
				const [evidence, trust] = await Promise.all([measurementOrigins(v, placeReaders(rev.content)), trustSummary(v, locals.units)]);
				vehicle = {
					slug: v.slug,
					title: v.title,
					make: v.make,
					body: BODY_STYLE_NAMES[v.body as BodyStyle] ?? v.body,
					seats: rev.content.seats.spaces,
					dash: { opening: rev.content.dash.opening, depthMm: rev.content.dash.depthMm, kit: rev.content.dash.kit },
					speakers: rev.content.speakers.locations,
					evidence,
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
