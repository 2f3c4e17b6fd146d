import { error } from '@sveltejs/kit';
import type { PageServerLoad } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { listRevisions } from '$lib/server/services/revisions';
import { changesFilter } from '$lib/server/services/changes';
import { User } from '$lib/server/db/models';

export const load: PageServerLoad = async ({ locals, params, url }) => {
	requireRole(locals, 'viewer');
	const id = Number(params.id);
	if (!Number.isInteger(id) || id < 1) error(404, 'No such person.');
	const person = await User.findByPk(id, { attributes: ['id', 'name', 'role'] });
	if (!person) error(404, 'No such person.');
	const filter = changesFilter(url);
	if (!filter.success) error(400, filter.error.issues[0].message);
	const revisions = await listRevisions({ authorId: id, section: filter.data.section, page: filter.data.page });
	return { person: { id: person.id, name: person.name, role: person.role }, revisions };
};
