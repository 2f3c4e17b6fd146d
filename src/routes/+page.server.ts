import type { PageServerLoad } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { listRevisions } from '$lib/server/services/revisions';

export const load: PageServerLoad = async ({ locals }) => {
	const user = requireRole(locals, 'viewer');
	const recent = await listRevisions(user, { pageSize: 8 });
	return { recent: recent.items.map((r) => ({ id: r.id, slug: r.vehicleSlug, title: r.vehicleTitle, author: r.author.name, at: r.createdAt, summary: r.summary, hidden: r.hidden })) };
};
