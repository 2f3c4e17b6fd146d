import { error } from '@sveltejs/kit';
import type { PageServerLoad } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { config } from '$lib/server/config';
import { capturedById } from '$lib/server/mail/outbox';

export const load: PageServerLoad = async ({ locals, params }) => {
	if (config.production) error(404, 'Not found');
	requireRole(locals, 'admin');
	const mail = await capturedById(params.id);
	if (!mail) error(404, 'No captured message with that id.');
	return { mail };
};
