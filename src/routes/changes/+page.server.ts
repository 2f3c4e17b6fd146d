import { error } from '@sveltejs/kit';
import type { PageServerLoad } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { listRevisions } from '$lib/server/services/revisions';
import { changesFilter } from '$lib/server/services/changes';
import { listUsers } from '$lib/server/services/users';

export const load: PageServerLoad = async ({ locals, url }) => {
	requireRole(locals, 'viewer');
	const filter = changesFilter(url);
	if (!filter.success) error(400, filter.error.issues[0].message);
	const [revisions, users] = await Promise.all([
		listRevisions({ authorId: filter.data.user, section: filter.data.section, page: filter.data.page }),
		listUsers()
	]);
	return { revisions, filter: filter.data, people: users.map((u) => ({ id: u.id, name: u.name })) };
};
