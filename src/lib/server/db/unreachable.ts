// Errors that say MariaDB cannot be reached, told apart from a bad query or a refused change.
import { ConnectionError } from 'sequelize';

/** Driver codes for a connection that was refused, closed or never came. */
const LOST_CONNECTION = /^(ECONNREFUSED|ECONNRESET|EPIPE|ETIMEDOUT|ER_SOCKET_UNEXPECTED_CLOSE|ER_CONNECTION_TIMEOUT|ER_GET_CONNECTION_TIMEOUT|ER_CONNECTION_ALREADY_CLOSED|ER_CLOSING_POOL|PROTOCOL_CONNECTION_LOST)$/;

/** True for errors that say the database cannot be reached (as opposed to a bad query or a refused change). */
export function isDatabaseUnreachable(err: unknown): boolean {
	let cause: unknown = err;
	for (let depth = 0; cause && depth < 4; depth++) {
		if (cause instanceof ConnectionError) return true;
		const c = cause as { code?: unknown; fatal?: unknown; parent?: unknown; original?: unknown; cause?: unknown };
		if (typeof c.code === 'string' && LOST_CONNECTION.test(c.code)) return true;
		if (c.fatal === true) return true;
		cause = c.parent ?? c.original ?? c.cause;
	}
	return false;
}
