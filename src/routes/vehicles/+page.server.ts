import type { PageServerLoad } from './$types';
import { z } from 'zod';
import { hasRole, requireRole } from '$lib/server/auth/guard';
import { catalogue, listVehicles } from '$lib/server/services/vehicles';

const SLUG = /^[a-z0-9-]{1,80}$/;

const filterSchema = z.object({
	make: z.string().regex(SLUG).optional().catch(undefined),
	model: z.string().regex(SLUG).optional().catch(undefined),
	year: z.coerce.number().int().min(1950).max(2100).optional().catch(undefined),
	page: z.coerce.number().int().min(1).max(10_000).optional().catch(undefined)
});

export const load: PageServerLoad = async ({ locals, url }) => {
	const user = requireRole(locals, 'viewer');
	const raw = Object.fromEntries([...url.searchParams].filter(([, v]) => v.trim() !== ''));
	const filter = filterSchema.parse(raw);
	const yearTyped = url.searchParams.get('year')?.trim() ?? '';
	const makes = (await catalogue(user)).filter((m) => m.models.length > 0);
	const make = makes.find((m) => m.slug === filter.make) ?? null;
	const model = make?.models.find((m) => m.slug === filter.model) ?? null;
	const result = await listVehicles(user, { make: make?.slug, model: model?.slug, year: filter.year, page: filter.page });
	return {
		makes,
		make: make ? { name: make.name, slug: make.slug, models: make.models } : null,
		model: model ? { name: model.name, slug: model.slug } : null,
		year: filter.year ?? null,
		yearProblem: yearTyped && filter.year === undefined ? 'A model year is four digits, 1950 to 2100, for example 2012.' : null,
		result,
		canAdd: hasRole(user, 'editor')
	};
};
