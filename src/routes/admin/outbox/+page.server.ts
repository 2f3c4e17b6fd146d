import { error } from '@sveltejs/kit';
import type { PageServerLoad } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { config } from '$lib/server/config';
import { listCaptured, outboxDir } from '$lib/server/mail/outbox';

export const load: PageServerLoad = async ({ locals, url }) => {
	// The capture is a development stand-in; a production shop sends real mail and has no outbox.
	if (config.production) error(404, 'Not found');
	requireRole(locals, 'admin');
	const to = url.searchParams.get('to')?.trim() || undefined;
	const mails = await listCaptured({ to, limit: 200 });
	return {
		to: to ?? '',
		dir: outboxDir(),
		mails: mails.map((m) => ({ id: m.id, receivedAt: m.receivedAt, to: m.envelope.to.join(', '), subject: m.subject }))
	};
};
