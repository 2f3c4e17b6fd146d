import { authSecret, config } from './config';
import { log, logFailure } from './observability/log';
import { reportIndexWatermark, startMetricsServer } from './observability/metrics';
import { databaseIsUp } from './db';
import { warmSeatSpaceIndex } from './fit';
import { startWatchNotices } from './services/watch';
import { startMailQueue } from './mail/queue';
import { searchIndex, stopSearchIndex } from './search';

/** Work done once when the server starts: check the database, warm caches. */
export async function startApp(): Promise<void> {
	// Refuse to serve at all rather than sign sessions with an empty key.
	authSecret();
	// Watch notices and the hourly digest check; the timer stops with the server.
	process.once('sveltekit:shutdown', startWatchNotices());
	// Queued mail (invitations, reset links, notices) is sent from MariaDB, retried until the server takes it.
	process.once('sveltekit:shutdown', startMailQueue());
	// The search index builds in the background and then polls for other instances' saves.
	const index = searchIndex();
	reportIndexWatermark(() => index.caughtUpTo);
	process.once('sveltekit:shutdown', stopSearchIndex);
	const status = await databaseIsUp();
	if (!status.up) logFailure('database not reachable at start-up', status.reason);
	// Built in the background; the first fit query waits for it if it is not done yet.
	else void warmSeatSpaceIndex().catch((err) => logFailure('seat-space index not built at start-up; it is retried on the first fit query', err));
	if (config.metricsPort !== null) {
		// Metrics are for the operator: loopback only, and a port already taken never stops the app.
		startMetricsServer(config.metricsPort).then(
			(metrics) => {
				log.info({ port: metrics.port }, `metrics on http://127.0.0.1:${metrics.port}/metrics`);
				process.once('sveltekit:shutdown', () => void metrics.stop());
			},
			(err) => logFailure('metrics not served', err)
		);
	}
}
