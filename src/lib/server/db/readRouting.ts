// Reads go to the replica when there is one, writes and transactions to the primary. Three exceptions keep
// a person from ever reading an older page than the one they saved: a request run with `readingFromPrimary`
// (the person wrote recently and the replica has not caught up), a replica that cannot be reached (reads
// fall back to the primary for a few seconds), and anything inside a transaction (always the primary).
import { AsyncLocalStorage } from 'node:async_hooks';
import { QueryTypes, type Sequelize } from 'sequelize';
import { isDatabaseUnreachable } from './unreachable';

const primaryReads = new AsyncLocalStorage<true>();
/** After a failed replica connection, reads use the primary this long before trying the replica again. */
export const REPLICA_RETRY_MS = 5_000;
let replicaDownUntil = 0;

/** Runs `work` with every read on the primary. */
export function readingFromPrimary<T>(work: () => T): T {
	return primaryReads.run(true, work);
}

type Acquire = (options?: { type?: string; useMaster?: boolean }) => Promise<unknown>;

/**
 * Reads a row that is never deleted once written (a revision). A replica that has not applied it yet would
 * make it look missing, and a cached "missing" would hide a page for a while: then the primary answers.
 */
export async function evenWhileReplicaLags<T>(read: () => Promise<T | null>): Promise<T | null> {
	const found = await read();
	if (found !== null || !replicaInUse || primaryReads.getStore() === true) return found;
	return readingFromPrimary(read);
}
let replicaInUse = false;

/** Wraps the pool's connection choice; called once when a Sequelize instance with a replica is made. */
export function routeReads(sequelize: Sequelize): void {
	replicaInUse = true;
	const manager = sequelize.connectionManager as unknown as { getConnection: Acquire };
	const acquire = manager.getConnection.bind(manager);
	manager.getConnection = async (options = {}) => {
		const toPrimary = options.useMaster === true || primaryReads.getStore() === true || Date.now() < replicaDownUntil;
		if (toPrimary || options.type !== QueryTypes.SELECT) return acquire({ ...options, useMaster: toPrimary || options.useMaster });
		try {
			return await acquire({ ...options, useMaster: false });
		} catch (err) {
			if (!isDatabaseUnreachable(err)) throw err;
			replicaDownUntil = Date.now() + REPLICA_RETRY_MS;
			return acquire({ ...options, useMaster: true });
		}
	};
}

const GTID_POSITION = /^\d+-\d+-\d+(,\d+-\d+-\d+)*$/;
export const isGtidPosition = (s: string): boolean => GTID_POSITION.test(s);

/** Where the primary's binary log stands now: a person's write is at or before it. */
export async function primaryPosition(sequelize: Sequelize): Promise<string> {
	const [row] = await sequelize.query<{ pos: string }>('SELECT @@GLOBAL.gtid_binlog_pos AS pos', { type: QueryTypes.SELECT, useMaster: true });
	return row?.pos ?? '';
}

/** Whether the replica has applied everything up to `position`, waiting at most `waitSeconds` for it. */
export async function replicaReached(sequelize: Sequelize, position: string, waitSeconds = 0.5): Promise<boolean> {
	if (!isGtidPosition(position)) return true;
	if (Date.now() < replicaDownUntil) return false;
	try {
		const [row] = await sequelize.query<{ r: number | string | null }>('SELECT MASTER_GTID_WAIT(:position, :waitSeconds) AS r', {
			type: QueryTypes.SELECT,
			replacements: { position, waitSeconds }
		});
		return Number(row?.r) === 0;
	} catch {
		return false;
	}
}
