// The pool lends and takes back its connections outside the request that asked for one. What the pool makes
// while doing so (a new connection's socket, the timer that closes idle connections) lives on after the request
// and remembers the async context it was made in, which holds the whole request: its data, its rendered page.
// Made inside requests, they kept finished requests alive for as long as a connection or that timer lasted.
// Callers still await the connection, and run their queries, in their own context.
import { AsyncResource } from 'node:async_hooks';
import type { Sequelize } from 'sequelize';

/** Runs `work` in the context this module was loaded in: a built server loads it at start-up, before any request. */
const outsideRequests = AsyncResource.bind(<T>(work: () => T): T => work());

type Pooling = { getConnection: (options?: object) => Promise<unknown>; releaseConnection: (connection: unknown) => unknown };

/** Makes `sequelize`'s pool open, lend and take back connections outside the caller's request. */
export function poolOutsideRequests(sequelize: Sequelize): void {
	const manager = sequelize.connectionManager as unknown as Pooling;
	const get = manager.getConnection.bind(manager);
	const release = manager.releaseConnection.bind(manager);
	manager.getConnection = (options) => outsideRequests(() => get(options));
	manager.releaseConnection = (connection) => outsideRequests(() => release(connection));
}
