import { Umzug, SequelizeStorage } from 'umzug';
import { db } from './index';
import { migrations } from './migrations';

export function migrator() {
	const sequelize = db();
	return new Umzug({
		migrations: migrations.map((m) => ({ name: m.name, up: m.up, down: m.down })),
		context: sequelize.getQueryInterface(),
		storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
		logger: undefined
	});
}

export async function migrateToLatest(): Promise<string[]> {
	const applied = await migrator().up();
	return applied.map((m) => m.name);
}
