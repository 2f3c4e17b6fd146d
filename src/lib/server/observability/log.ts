// Structured logs: one JSON line per event (pino), each carrying the id of the request it belongs to, with
// passwords, tokens, cookies and secrets removed before anything is written.
import { AsyncLocalStorage } from 'node:async_hooks';
import pino, { type DestinationStream, type Logger } from 'pino';
import { config } from '../config';

const requestContext = new AsyncLocalStorage<{ requestId: string }>();
const standardOut = pino.destination(1);

// Any field by these names, at the top or one level down, never reaches the log.
const SECRETS = {
	paths: ['password', 'token', 'secret', 'cookie', 'authorization', '*.password', '*.token', '*.secret', '*.cookie', '*.authorization'],
	censor: '[removed]'
};

/**
 * A logger writing JSON lines to `destination`; tests pass their own to read the lines back. Secrets are removed
 * unless `redact` is false, which only a logger of fixed fields that cannot hold one may ask for.
 */
export function createLog(destination?: DestinationStream, level: string = config.logLevel, { redact = true }: { redact?: boolean } = {}): Logger {
	return pino(
		{
			level,
			base: { app: 'kickpanel' },
			...(redact ? { redact: SECRETS } : {}),
			mixin: () => {
				const store = requestContext.getStore();
				return store ? { requestId: store.requestId } : {};
			}
		},
		destination ?? standardOut
	);
}

export const log = createLog();

/**
 * The line written for every answered request. Its fields are fixed (method, route id, status, milliseconds)
 * and none can hold a secret, so it skips the redaction above: with paths one level down, that pass cost a
 * page view several times what the rest of its line does.
 */
export const answerLog = createLog(standardOut, config.logLevel, { redact: false });

/** Runs `work` with every log line inside it tagged with the request's id. */
export function withRequestId<T>(requestId: string, work: () => T): T {
	return requestContext.run({ requestId }, work);
}

/** A failure worth an operator's attention, with the error's message (never its whole object: it may hold secrets). */
export function logFailure(what: string, err?: unknown): void {
	log.error({ error: err === undefined ? undefined : err instanceof Error ? err.message : String(err) }, what);
}
