import { logFailure } from '$lib/server/observability/log';
import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { databaseIsUp } from '$lib/server/db';

export const GET: RequestHandler = async () => {
	const database = await databaseIsUp();
	if (!database.up) {
		// The driver's words stay in the server log: they can name hosts, users and versions.
		logFailure('health: database down', database.reason);
		return json(
			{ status: 'down', database: 'down', message: 'The database is not answering; the reason is in the server log.' },
			{ status: 503, headers: { 'cache-control': 'no-store' } }
		);
	}
	return json({ status: 'ok', database: 'up' }, { headers: { 'cache-control': 'no-store' } });
};
