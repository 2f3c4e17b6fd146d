// Gives an integration test file its own fresh database on the private test server, fully migrated.
import mariadb from 'mariadb';
import { config } from '../../src/lib/server/config';
import { closeDb, db } from '../../src/lib/server/db';
import { migrateToLatest } from '../../src/lib/server/db/migrate';

export async function freshDatabase(name: string): Promise<void> {
	const dbName = `${config.db.name}_${name}`.replace(/[^a-zA-Z0-9_]/g, '_');
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
	db();
	await migrateToLatest();
}

export { closeDb };
