// The one read every first view of a page makes runs as a prepared statement on a connection lent by Sequelize's
// own pool. Going through `sequelize.query` costs the app twice the CPU of the query itself (its replacements are
// parsed out of the SQL text on every call, its result wrapped again), and the database parses and plans the
// statement each time; a prepared statement is parsed once per connection (the driver keeps it) and sent its
// values alone. The pool's lending rules still apply: reads to a replica when there is one (readRouting.ts),
// connections lent outside the request (pool.ts).
import { QueryTypes } from 'sequelize';
import { db } from '.';

type Lending = {
	getConnection: (options: { type: string }) => Promise<PreparingConnection>;
	releaseConnection: (connection: PreparingConnection) => unknown;
};
type PreparingConnection = { execute: (sql: string, values: readonly unknown[]) => Promise<unknown[]> };

/** The rows of a SELECT with `?` placeholders, run as a prepared statement with `values`. */
export async function preparedRows<Row>(sql: string, values: readonly (string | number)[]): Promise<Row[]> {
	const pool = db().connectionManager as unknown as Lending;
	const connection = await pool.getConnection({ type: QueryTypes.SELECT });
	try {
		// The driver's result carries its column metadata as an extra property; a copy gives plain rows.
		return [...((await connection.execute(sql, values)) as Row[])];
	} finally {
		await pool.releaseConnection(connection);
	}
}
