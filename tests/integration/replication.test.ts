import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { rmSync } from 'node:fs';
import { QueryTypes } from 'sequelize';
import { closeDb, freshDatabase } from '../helpers/database';
import { freePort } from '../helpers/ports';
import { makeUser } from '../helpers/users';
import { db } from '../../src/lib/server/db';
import { config } from '../../src/lib/server/config';
import { preparedRows } from '../../src/lib/server/db/prepared';
import { primaryPosition, readingFromPrimary, replicaReached } from '../../src/lib/server/db/readRouting';
import { freshReads, WRITTEN_COOKIE } from '../../src/lib/server/freshReads';
import { emptyContent } from '../../src/lib/domain/content/schema';
import type { SessionUser } from '../../src/lib/domain/sessionUser';
import { createVehicle, revisionById, saveRevision } from '../../src/lib/server/services/revisions';
import { pageRevision } from '../../src/lib/server/services/visibility';

// A primary and a read replica (the layout `npm run cluster` starts): reads go to the replica, a person who
// just saved reads their own write even while the replica lags, and a stopped replica sends reads to the
// primary. This file runs its own pair of MariaDB servers.

const DIR = `.data/replication-${process.pid}`;
let primary = 0;
let replica = 0;
let editor: SessionUser;


function cluster(...args: string[]): void {
	const run = spawnSync('bash', ['scripts/cluster.sh', ...args], {
		env: { ...process.env, CLUSTER_DIR: DIR, PRIMARY_PORT: String(primary), REPLICA_PORT: String(replica), DB_NAME: baseName, DB_USER: config.db.user, DB_PASSWORD: config.db.password, DB_FAST: '1' },
		encoding: 'utf8'
	});
	if (run.status !== 0) throw new Error(`cluster.sh ${args.join(' ')} failed: ${run.stderr}`);
}

/** Runs SQL as root on one of the two servers, through its socket. */
function asRoot(server: 'primary' | 'replica', sql: string): string {
	const run = spawnSync('mariadb', [`--socket=${DIR}/${server}/mysqld.sock`, '-uroot', '-N', '-e', sql], { encoding: 'utf8' });
	if (run.status !== 0) throw new Error(run.stderr);
	return run.stdout.trim();
}

const baseName = config.db.name;
/** Which server answered: each has its own server_id (1 primary, 2 replica). */
const answeredBy = async () => (await db().query<{ id: number }>('SELECT @@server_id AS id', { type: QueryTypes.SELECT }))[0].id;
// The page view's prepared read takes its connection from the same pool, by the same rule.
const preparedAnsweredBy = async () => (await preparedRows<{ id: number }>('SELECT @@server_id AS id', []))[0].id;
const latestOf = async (vehicleId: number) =>
	Number((await db().query<{ id: number }>('SELECT latest_revision_id AS id FROM vehicles WHERE id = ?', { replacements: [vehicleId], type: QueryTypes.SELECT }))[0].id);

beforeAll(async () => {
	[primary, replica] = [await freePort(), await freePort()];
	cluster('databases', 'start');
	await closeDb();
	config.db.port = primary;
	config.db.replica = { host: '127.0.0.1', port: replica };
	await freshDatabase('replication');
	editor = await makeUser('editor');
}, 180_000);

afterAll(async () => {
	await closeDb();
	config.db.replica = null;
	try {
		cluster('databases', 'stop');
	} finally {
		rmSync(DIR, { recursive: true, force: true });
	}
});

describe('a primary and a read replica', () => {
	it('reads from the replica, writes to the primary, and the replica catches up', async () => {
		expect(await answeredBy()).toBe(2);
		expect(await readingFromPrimary(answeredBy)).toBe(1);
		expect(await preparedAnsweredBy()).toBe(2);
		expect(await readingFromPrimary(preparedAnsweredBy)).toBe(1);
		const made = await createVehicle(emptyContent({ make: 'Ostrel', model: 'Twinbay', yearFrom: 2014, yearTo: 2018, body: 'van' }), editor);
		expect(await replicaReached(db(), await primaryPosition(db()), 5)).toBe(true);
		expect((await revisionById(made.revisionId))?.id).toBe(made.revisionId);
	});

	it('lets a person read their own save while the replica lags behind', async () => {
		const made = await createVehicle(emptyContent({ make: 'Ostrel', model: 'Lagmere', yearFrom: 2010, yearTo: 2013, body: 'sedan' }), editor);
		await replicaReached(db(), await primaryPosition(db()), 5);
		const vehicleId = Number((await db().query<{ id: number }>('SELECT id FROM vehicles WHERE slug = ?', { replacements: [made.slug], type: QueryTypes.SELECT, useMaster: true }))[0].id);
		// The replica stops applying changes: it is behind from now on.
		asRoot('replica', 'STOP SLAVE SQL_THREAD');
		try {
			const content = structuredClone((await revisionById(made.revisionId))!.content);
			content.identity.notes = 'Saved while the replica lags';
			const saved = await saveRevision(vehicleId, { baseRevisionId: made.revisionId, content, summary: 'Lag' }, editor);
			const position = await primaryPosition(db());
			expect(await replicaReached(db(), position, 0.2)).toBe(false);
			// Anyone else reading the replica still sees the older revision…
			expect(await latestOf(vehicleId)).toBe(made.revisionId);
			// …but the writer's next request, carrying the position of their save, is answered from the primary.
			const answer = await freshReads({
				event: { cookies: { get: (name: string) => (name === WRITTEN_COOKIE ? position : undefined) }, request: new Request('http://127.0.0.1/vehicles/x') },
				resolve: async () => new Response(String(await latestOf(vehicleId)))
			} as never);
			expect(Number(await answer.text())).toBe(saved.revisionId);
		} finally {
			asRoot('replica', 'START SLAVE SQL_THREAD');
		}
		expect(await replicaReached(db(), await primaryPosition(db()), 5)).toBe(true);
	});

	it('never takes a revision the replica has not applied yet for a missing one', async () => {
		const made = await createVehicle(emptyContent({ make: 'Ostrel', model: 'Slowpost', yearFrom: 2008, yearTo: 2012, body: 'wagon' }), editor);
		await replicaReached(db(), await primaryPosition(db()), 5);
		const vehicleId = Number((await db().query<{ id: number }>('SELECT id FROM vehicles WHERE slug = ?', { replacements: [made.slug], type: QueryTypes.SELECT, useMaster: true }))[0].id);
		asRoot('replica', 'STOP SLAVE SQL_THREAD');
		let second: { revisionId: number };
		try {
			const content = structuredClone((await revisionById(made.revisionId))!.content);
			content.identity.notes = 'First note while the replica lags';
			const first = await saveRevision(vehicleId, { baseRevisionId: made.revisionId, content, summary: 'Lag 1' }, editor);
			// The second save reads the first as the page's newest, so this server now holds its content.
			content.identity.notes = 'Second note while the replica lags';
			second = await saveRevision(vehicleId, { baseRevisionId: first.revisionId, content, summary: 'Lag 2' }, editor);
			// The replica has neither; asked for them, the primary answers rather than "no such revision".
			expect((await revisionById(first.revisionId))?.id).toBe(first.revisionId);
			expect((await revisionById(second.revisionId))?.id).toBe(second.revisionId);
		} finally {
			asRoot('replica', 'START SLAVE SQL_THREAD');
		}
		expect(await replicaReached(db(), await primaryPosition(db()), 5)).toBe(true);
		// Caught up, the page reads its newest revision at once: nothing was kept as missing meanwhile.
		const viewer = await makeUser('viewer');
		expect((await pageRevision({ id: vehicleId, latestRevisionId: second.revisionId }, viewer)).revision?.id).toBe(second.revisionId);
	});

	it('gives the writer the position of their save in a cookie', async () => {
		const answer = await freshReads({
			event: { cookies: { get: () => undefined }, request: new Request('http://127.0.0.1/vehicles/x', { method: 'POST' }) },
			resolve: async () => new Response(null, { status: 303 })
		} as never);
		expect(answer.headers.get('set-cookie')).toMatch(new RegExp(`^${WRITTEN_COOKIE}=\\d+-1-\\d+; Path=/; Max-Age=600; HttpOnly; SameSite=Lax$`));
	});

	it('sends reads to the primary while the replica is stopped', async () => {
		asRoot('replica', 'SHUTDOWN');
		await new Promise((r) => setTimeout(r, 1500));
		await closeDb();
		expect(await answeredBy()).toBe(1);
		expect(await preparedAnsweredBy()).toBe(1);
		const made = await createVehicle(emptyContent({ make: 'Ostrel', model: 'Solo', yearFrom: 2019, yearTo: 2021, body: 'suv' }), editor);
		expect((await revisionById(made.revisionId))?.id).toBe(made.revisionId);
	});
});
