import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { formAction } from '$lib/server/forms';
import { setUnits } from '$lib/server/services/preferences';
import { vehiclePageData } from '$lib/server/views/vehiclePage';
import { viewData } from '$lib/server/render/pageMemo';

export const load: PageServerLoad = async (event) => {
	// What the page depends on, read here so a client-side navigation to another page or notice loads it again
	// even when the data was already read for the page memo.
	void event.params.slug;
	void event.url.searchParams.get('saved');
	void event.url.searchParams.get('merged');
	return viewData(event.locals, 'page', () => vehiclePageData(event));
};

const unitsSchema = z.object({ units: z.enum(['metric', 'imperial'], { error: 'Choose metric or imperial.' }) });

const YEAR_SECONDS = 365 * 24 * 60 * 60;

export const actions: Actions = {
	units: async ({ locals, request, cookies }) => {
		const user = requireRole(locals, 'viewer');
		return formAction(request, async (posted) => {
			const { units } = unitsSchema.parse(Object.fromEntries(posted));
			await setUnits(user.id, units);
			cookies.set('units', units, { path: '/', maxAge: YEAR_SECONDS, sameSite: 'lax', httpOnly: false });
			// The page is rendered again in this same request after the action.
			locals.units = units;
			return { units };
		});
	}
};
