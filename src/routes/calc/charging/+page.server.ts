import type { PageServerLoad } from './$types';
import { requireRole } from '$lib/server/auth/guard';

export const load: PageServerLoad = ({ locals }) => {
	requireRole(locals, 'viewer');
	return {};
};
