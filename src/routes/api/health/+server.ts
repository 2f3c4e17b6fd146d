import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { databaseIsUp } from '$lib/server/db';

export const GET: RequestHandler = async () => {
	const database = await databaseIsUp();
	if (!database.up) {
		return json(
			{ status: 'down', database: 'down', message: `The database is not answering: ${database.reason}` },
			{ status: 503, headers: { 'cache-control': 'no-store' } }
		);
	}
	return json({ status: 'ok', database: 'up' }, { headers: { 'cache-control': 'no-store' } });
};
