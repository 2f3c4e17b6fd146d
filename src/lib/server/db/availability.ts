// Whether MariaDB is answering. A request that finds it gone marks it down; from then on requests are answered
// at once with a 503 (instead of each waiting for a connection that will not come), and a probe every second
// clears the mark as soon as the database answers again.
import { databaseIsUp } from './index';
import { isDatabaseUnreachable } from './unreachable';

export { isDatabaseUnreachable };

export const DATABASE_DOWN_MESSAGE = 'The database is not answering right now, so nothing was read or saved. Try again in a minute; what you typed is still in the form.';

let downSince: number | null = null;
let probe: NodeJS.Timeout | null = null;
export const PROBE_MS = 1_000;

/** Records an error; when it says the database is gone, later requests are answered 503 until it is back. */
export function noteDatabaseError(err: unknown): boolean {
	if (!isDatabaseUnreachable(err)) return false;
	downSince ??= Date.now();
	if (!probe) {
		probe = setInterval(() => {
			void databaseIsUp().then((status) => {
				if (!status.up) return;
				downSince = null;
				if (probe) clearInterval(probe);
				probe = null;
			});
		}, PROBE_MS);
		probe.unref();
	}
	return true;
}

/** Since when the database has been marked down in this process, or null. */
export function databaseDownSince(): number | null {
	return downSince;
}
