// Gives an integration test file its own fresh database on the private test server, fully migrated (or empty).
import mariadb from 'mariadb';
import { config } from '../../src/lib/server/config';
import { closeDb, db } from '../../src/lib/server/db';
import { migrateToLatest } from '../../src/lib/server/db/migrate';

/** The server's own database name, before any test file switched to one of its own. */
const BASE_NAME = config.db.name;

/** A new database with no tables at all; every later query of this process goes to it. */
export async function emptyDatabase(name: string): Promise<void> {
	const dbName = `${BASE_NAME}_${name}`.replace(/[^a-zA-Z0-9_]/g, '_');
	const conn = await mariadb.createConnection({
		host: config.db.host,
		port: config.db.port,
		user: config.db.user,
		password: config.db.password
	});
	try {
		await conn.query(`DROP DATABASE IF EXISTS \`${dbName}\``);
		await conn.query(`CREATE DATABASE \`${dbName}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
	} finally {
		await conn.end();
	}
	await closeDb();
	config.db.name = dbName;
}

export async function freshDatabase(name: string): Promise<void> {
	await emptyDatabase(name);
	db();
	await migrateToLatest();
}

export { closeDb };
