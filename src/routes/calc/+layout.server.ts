import type { LayoutServerLoad } from './$types';
import { requireRole } from '$lib/server/auth/guard';

export const load: LayoutServerLoad = ({ locals }) => {
	requireRole(locals, 'viewer');
	return { units: locals.units };
};
