import type { PageServerLoad } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { ServiceError } from '$lib/server/errors';
import { countOpenVehicles, listVehicles, makesWithPages, requireVehicle } from '$lib/server/services/vehicles';
import { listParts } from '$lib/server/services/parts';
import { vehicleFitFacts, vehiclesForBox } from '$lib/server/services/fit';
import { readTypedBox } from '$lib/domain/typedBox';
import { readNumber } from '$lib/domain/calcInput';
import { CLEARANCE_MM, DEFAULT_CLEARANCE_MM } from '$lib/domain/sizeRules';
import { trustSummary } from '$lib/server/services/trust';
import { BODY_STYLE_NAMES, type BodyStyle } from '$lib/domain/content/schema';

// Up to this many pages the vehicle list is one grouped select; beyond it, pick the make first.
const ONE_LIST_LIMIT = 200;

export const load: PageServerLoad = async ({ locals, url }) => {
	const user = requireRole(locals, 'viewer');
	const q = url.searchParams;
	const slug = (q.get('vehicle') ?? '').trim();

	let vehicle = null;
	let missing: string | null = null;
	if (slug) {
		try {
			const v = await requireVehicle(slug);
			const facts = await vehicleFitFacts(v, user);
			if (facts) {
				const trust = await trustSummary(v.id, facts.revisionId, locals.units);
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

	// A typed box and no vehicle asks the other way round: which of our vehicles take it.
	const unit = q.get('unit') === 'in' ? 'in' : 'mm';
	const typed = q.get('part') ? null : readTypedBox({ l: q.get('l') ?? '', w: q.get('w') ?? '', h: q.get('h') ?? '' }, unit);
	const clearance = readNumber(q.get('clearance') ?? String(DEFAULT_CLEARANCE_MM), { label: 'Clearance', unit: 'mm', ...CLEARANCE_MM });
	const reverse =
		!slug && typed?.box && typeof clearance === 'number'
			? { for: [q.get('l'), q.get('w'), q.get('h'), unit, clearance].join('|'), fits: await vehiclesForBox(typed.box, { clearanceMm: clearance }) }
			: null;

	const [makes, total] = await Promise.all([makesWithPages(user), countOpenVehicles(user)]);
	const makeSlug = q.get('make') || (vehicle ? (makes.find((m) => m.name === vehicle.make)?.slug ?? '') : '');
	const oneList = total <= ONE_LIST_LIMIT;
	// The list is read only when it is shown: all pages when they fit one list, else the chosen make's.
	const list = oneList || makeSlug ? (await listVehicles(user, { make: oneList ? undefined : makeSlug, pageSize: ONE_LIST_LIMIT })).items : [];

	return {
		makes,
		makeSlug,
		oneList,
		vehicles: list.map((v) => ({ slug: v.slug, title: v.title, make: v.make, body: BODY_STYLE_NAMES[v.body as BodyStyle] ?? v.body })),
		parts: await listParts(),
		vehicle,
		missing,
		reverse,
		units: locals.units,
		canMark: true
	};
};
