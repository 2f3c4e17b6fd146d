// What the app sends MariaDB: every statement on a connection lent by the pool, whether run through
// Sequelize's `query` (the driver's `query`) or as a prepared statement (the driver's `execute`).
import { db } from '../../src/lib/server/db';

type Connection = Record<'query' | 'execute', (sql: unknown, ...rest: unknown[]) => unknown>;
type Lending = { getConnection: (options?: object) => Promise<Connection> };

/** Runs `work` and gives its result with the SQL of each statement sent while it ran, in order. */
export async function statementsDuring<T>(work: () => Promise<T>): Promise<{ result: T; sql: string[] }> {
	const manager = db().connectionManager as unknown as Lending;
	const lend = manager.getConnection;
	const sql: string[] = [];
	const restore: (() => void)[] = [];
	manager.getConnection = async (options) => {
		const connection = await lend.call(manager, options);
		for (const method of ['query', 'execute'] as const) {
			const original = connection[method];
			if (Object.hasOwn(connection, method)) continue;
			connection[method] = function (this: unknown, statement: unknown, ...rest: unknown[]) {
				sql.push(typeof statement === 'string' ? statement : String((statement as { sql?: unknown }).sql));
				return original.call(this, statement, ...rest);
			};
			restore.push(() => delete (connection as Partial<Connection>)[method]);
		}
		return connection;
	};
	try {
		return { result: await work(), sql };
	} finally {
		manager.getConnection = lend;
		for (const undo of restore) undo();
	}
}
