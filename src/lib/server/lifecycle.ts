import { databaseIsUp } from './db';

/** Work done once when the server starts: check the database, warm caches. */
export async function startApp(): Promise<void> {
	const status = await databaseIsUp();
	if (!status.up) console.error(`[kickpanel] database not reachable at start-up: ${status.reason}`);
}
