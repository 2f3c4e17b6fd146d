import { shopSettings } from '$lib/server/services/settings';
import { error } from '@sveltejs/kit';
import type { PageServerLoad } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { config } from '$lib/server/config';
import { auditActions, auditFilterSchema, listAudit } from '$lib/server/services/audit';
import { listUsers } from '$lib/server/services/users';

export const load: PageServerLoad = async ({ locals, url }) => {
	requireRole(locals, 'admin');
	const raw = Object.fromEntries([...url.searchParams].filter(([, v]) => v !== ''));
	const filter = auditFilterSchema.safeParse(raw);
	if (!filter.success) error(400, filter.error.issues[0].message);
	const { timeZone } = await shopSettings();
	const [entries, actions, people] = await Promise.all([listAudit(filter.data, timeZone), auditActions(), listUsers()]);
	return { entries, filter: filter.data, actions, people: people.map((p) => ({ id: p.id, name: p.name })), outbox: !config.production };
};
