// Every request gets an id (taken from X-Request-Id when a proxy set a sane one), sent back in the answer,
// carried by every log line written while it is served, and counted in the metrics.
import { randomUUID } from 'node:crypto';
import type { Handle } from '@sveltejs/kit';
import { answerLog, withRequestId } from './log';
import { requestSeconds, requestsTotal } from './metrics';

const SANE_ID = /^[A-Za-z0-9._:-]{8,64}$/;

/** The id a request is known by: the one a proxy gave it when that is sane, else a new one. */
export function requestIdFor(given: string | null | undefined): string {
	return given && SANE_ID.test(given) ? given : randomUUID();
}

/** Counts an answered request in the metrics and writes its log line. */
export function noteAnswer(answer: { method: string; route: string; status: number; seconds: number }): void {
	const { method, route, status, seconds } = answer;
	requestsTotal.inc({ route, method, status: String(status) });
	requestSeconds.observe({ route, method }, seconds);
	answerLog.info({ method, route, status, ms: Math.round(seconds * 1000) }, 'request');
}

export const observeRequests: Handle = async ({ event, resolve }) => {
	const requestId = requestIdFor(event.request.headers.get('x-request-id'));
	const started = performance.now();
	return withRequestId(requestId, async () => {
		const route = event.route.id ?? (event.url.pathname.startsWith('/_app/') ? '/_app' : 'unmatched');
		let status = 500;
		try {
			const response = await resolve(event);
			status = response.status;
			try {
				response.headers.set('x-request-id', requestId);
			} catch {
				// A response with fixed headers (a passed-through fetch) keeps them.
			}
			return response;
		} catch (err) {
			// A redirect thrown by a hook is an answer too.
			status = typeof (err as { status?: unknown })?.status === 'number' ? (err as { status: number }).status : 500;
			throw err;
		} finally {
			noteAnswer({ method: event.request.method, route, status, seconds: (performance.now() - started) / 1000 });
		}
	});
};
