import { fail } from '@sveltejs/kit';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { setUnits } from '$lib/server/services/preferences';
import { vehiclePageData } from '$lib/server/views/vehiclePage';
import { recordView } from '$lib/server/render/pageMemo';

export const load: PageServerLoad = async (event) => recordView(event.locals, 'page', await vehiclePageData(event));

const unitsSchema = z.object({ units: z.enum(['metric', 'imperial'], { error: 'Choose metric or imperial.' }) });

const YEAR_SECONDS = 365 * 24 * 60 * 60;

export const actions: Actions = {
	units: async ({ locals, request, cookies }) => {
		const user = requireRole(locals, 'viewer');
		const parsed = unitsSchema.safeParse(Object.fromEntries(await request.formData()));
		if (!parsed.success) return fail(400, { message: parsed.error.issues[0].message });
		await setUnits(user.id, parsed.data.units);
		cookies.set('units', parsed.data.units, { path: '/', maxAge: YEAR_SECONDS, sameSite: 'lax', httpOnly: false });
		// The page is rendered again in this same request after the action.
		locals.units = parsed.data.units;
		return { units: parsed.data.units };
	}
};
