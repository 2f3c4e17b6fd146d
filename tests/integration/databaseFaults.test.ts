import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawn, spawnSync } from 'node:child_process';
import { rmSync } from 'node:fs';
import { json } from '@sveltejs/kit';
import { QueryTypes } from 'sequelize';
import { closeDb, freshDatabase } from '../helpers/database';
import { freePort } from '../helpers/ports';
import { makeUser } from '../helpers/users';
import { db } from '../../src/lib/server/db';
import { config } from '../../src/lib/server/config';
import { apiCall } from '../../src/lib/server/http';
import { databaseDownSince, DATABASE_DOWN_MESSAGE } from '../../src/lib/server/db/availability';
import { databaseGate } from '../../src/lib/server/databaseGate';
import { emptyContent } from '../../src/lib/domain/content/schema';
import type { SessionUser } from '../../src/lib/domain/sessionUser';
import { createVehicle, revisionById, saveRevision } from '../../src/lib/server/services/revisions';
import { requireVehicle } from '../../src/lib/server/services/vehicles';

// MariaDB stopped in the middle of saves: every call answers within seconds (a 503 with a message once the
// database is gone), no revision is half-written, and the app recovers by itself when the database returns.
// This file runs its own MariaDB (own data dir and port), so stopping it touches no other test.

const DATA_DIR = `.data/faults-mariadb-${process.pid}`;
let port = 0;
let moderator: SessionUser;


function database(command: 'start' | 'stop'): void {
	const run = spawnSync('bash', ['scripts/db.sh', command], {
		env: { ...process.env, DB_DATA_DIR: DATA_DIR, DB_PORT: String(port), DB_NAME: baseName, DB_USER: config.db.user, DB_PASSWORD: config.db.password, DB_FAST: '1' },
		encoding: 'utf8'
	});
	if (run.status !== 0) throw new Error(`db.sh ${command} failed: ${run.stderr}`);
}

const baseName = config.db.name;

/** Stops the server without blocking this process, so saves run while it shuts down. */
function stopInBackground(): Promise<void> {
	return new Promise((resolve, reject) => {
		const child = spawn('bash', ['scripts/db.sh', 'stop'], { env: { ...process.env, DB_DATA_DIR: DATA_DIR, DB_PORT: String(port) }, stdio: 'ignore' });
		child.on('exit', (code) => (code === 0 ? resolve() : reject(new Error(`db.sh stop exited ${code}`))));
	});
}
const HANG_MS = 15_000;

/** Fails the test when a call has not answered after HANG_MS: the guard against hanging, not a speed target. */
function answered<T>(p: Promise<T>): Promise<T> {
	return Promise.race([p, new Promise<T>((_, reject) => setTimeout(() => reject(new Error(`no answer after ${HANG_MS} ms`)), HANG_MS).unref())]);
}

beforeAll(async () => {
	port = await freePort();
	database('start');
	await closeDb();
	config.db.port = port;
	await freshDatabase('faults');
	moderator = await makeUser('moderator');
}, 120_000);

afterAll(async () => {
	await closeDb();
	try {
		database('stop');
	} finally {
		rmSync(DATA_DIR, { recursive: true, force: true });
	}
});

describe('the database stopped in the middle of saves', () => {
	it('answers every save (landed whole, or a 503 that says so), leaves no half revision, and recovers by itself', async () => {
		const made = await createVehicle(emptyContent({ make: 'Ostrel', model: 'Faultline', yearFrom: 2012, yearTo: 2016, body: 'wagon' }), moderator);
		const vehicle = await requireVehicle(made.slug);
		let base = made.revisionId;
		const landed: number[] = [made.revisionId];
		const statuses: number[] = [];

		const saveOnce = async (i: number) => {
			const res = await answered(
				apiCall(async () => {
					const content = structuredClone((await revisionById(base))!.content);
					content.identity.notes = `Save ${i}`;
					return json(await saveRevision(vehicle.id, { baseRevisionId: base, content, summary: `Save ${i}` }, moderator));
				})
			);
			statuses.push(res.status);
			if (res.status === 200) {
				const { revisionId } = await res.json();
				landed.push(revisionId);
				base = revisionId;
			} else {
				expect(res.status).toBe(503);
				expect((await res.json()).message).toBe(DATABASE_DOWN_MESSAGE);
			}
		};

		let i = 0;
		for (; i < 10; i++) await saveOnce(i);
		// Stop the server while saves keep coming, then keep saving while it is gone.
		const stopping = stopInBackground();
		while (!(await Promise.race([stopping.then(() => true), saveOnce(i++).then(() => false)]))) {
			/* saving */
		}
		for (let k = 0; k < 5; k++) await saveOnce(i++);
		expect(statuses.filter((s) => s === 503).length).toBeGreaterThan(0);
		expect(databaseDownSince()).not.toBeNull();

		// Meanwhile a page request is turned away at once with the same message.
		const gated = await databaseGate({
			event: { url: new URL('http://127.0.0.1/vehicles/x'), request: new Request('http://127.0.0.1/vehicles/x') },
			resolve: () => Promise.reject(new Error('the page must not be reached'))
		} as never);
		expect(gated.status).toBe(503);
		expect(await gated.text()).toContain('The database is not answering');

		database('start');
		for (let t = 0; t < 100 && databaseDownSince() !== null; t++) await new Promise((r) => setTimeout(r, 200));
		expect(databaseDownSince()).toBeNull();
		await saveOnce(i++);
		expect(statuses.at(-1)).toBe(200);

		// Every save that answered 200 is there, nothing else is, and each has all its parts.
		const rows = await db().query<{ id: number; parent_id: number | null; sha256: string }>(
			'SELECT id, parent_id, sha256 FROM revisions WHERE vehicle_id = ? ORDER BY id',
			{ replacements: [vehicle.id], type: QueryTypes.SELECT }
		);
		expect(rows.map((r) => Number(r.id))).toEqual(landed);
		rows.forEach((r, k) => expect(r.parent_id === null ? null : Number(r.parent_id)).toBe(k === 0 ? null : Number(rows[k - 1].id)));
		const [{ latest }] = await db().query<{ latest: number }>('SELECT latest_revision_id AS latest FROM vehicles WHERE id = ?', {
			replacements: [vehicle.id],
			type: QueryTypes.SELECT
		});
		expect(Number(latest)).toBe(landed.at(-1));
		const [{ missing }] = await db().query<{ missing: number }>(
			`SELECT COUNT(*) AS missing FROM revisions r LEFT JOIN rendered_notes n ON n.sha256 = r.sha256
			 WHERE r.vehicle_id = ? AND n.sha256 IS NULL`,
			{ replacements: [vehicle.id], type: QueryTypes.SELECT }
		);
		expect(Number(missing)).toBe(0);
	}, 180_000);
});
