import { Sequelize } from 'sequelize';
import { config } from '../config';
import { initModels } from './models';
import { routeReads } from './readRouting';
import { poolOutsideRequests } from './pool';

let instance: Sequelize | null = null;

export function db(): Sequelize {
	if (instance) return instance;
	const { replica } = config.db;
	const server = (at: { host: string; port: number }) => ({ host: at.host, port: at.port, username: config.db.user, password: config.db.password });
	instance = new Sequelize(config.db.name, config.db.user, config.db.password, {
		host: config.db.host,
		port: config.db.port,
		dialect: 'mariadb',
		...(replica ? { replication: { read: [server(replica)], write: server(config.db) } } : {}),
		logging: false,
		pool: { max: config.db.poolMax, min: 0, idle: 10_000, acquire: 10_000 },
		dialectOptions: { connectTimeout: 5_000 },
		timezone: '+00:00',
		define: { underscored: true }
	});
	initModels(instance);
	poolOutsideRequests(instance);
	if (replica) routeReads(instance);
	return instance;
}

export async function closeDb(): Promise<void> {
	if (!instance) return;
	const closing = instance;
	instance = null;
	await closing.close();
}

export async function databaseIsUp(): Promise<{ up: true } | { up: false; reason: string }> {
	try {
		await db().authenticate();
		return { up: true };
	} catch (err) {
		return { up: false, reason: err instanceof Error ? err.message : String(err) };
	}
}
