// Local stand-ins for the hosted services (VIN decoding, object storage, e-mail), for npm start and npm test.
// Each stand-in lives beside the client that talks to it; this script only starts them and stops them on a signal.
import { localServices } from '../src/lib/server/local-services';

const running = await Promise.all(localServices.map((s) => s.start()));
for (const r of running) console.log(`[services] ${r.name} on ${r.url}`);

async function stop() {
	await Promise.allSettled(running.map((r) => r.stop()));
	process.exit(0);
}
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
