import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawnSync, type ChildProcess } from 'node:child_process';
import { rmSync } from 'node:fs';
import mariadb, { type Connection } from 'mariadb';
import { freePort } from '../helpers/ports';
import { userFor } from './browser';
import { signInCookie, startBuiltApp } from '../../scripts/bench/lib';
import { readConfig } from '../../src/lib/server/config';

// Two app servers on one MariaDB primary and its read replica (the layout of `npm run cluster`): what a
// moderator, an admin or a writer does through server A is honoured by server B within the bound README
// states — SHARED_STATE_TTL_MS plus the replica's lag for what a request reads, SEARCH_POLL_MS plus the lag
// for the search index. Server B's reader never carries A's read-your-writes cookie, so B reads the replica.

const { sharedStateTtlMs: TTL_MS, searchPollMs: POLL_MS } = readConfig(process.env);
/** One request's worth of slack on a shared, loaded machine; the bound itself comes from the settings. */
const ALLOWANCE_MS = 1_500;
const DIR = `.data/two-servers-${process.pid}`;
const DB_NAME = process.env.DB_NAME ?? 'kickpanel_test';

let ports = { primary: 0, replica: 0 };
const servers: ChildProcess[] = [];
let A = '';
let B = '';
let primary: Connection;
let replica: Connection;
const cookies: Record<'viewer' | 'editor' | 'moderator' | 'admin', string> = { viewer: '', editor: '', moderator: '', admin: '' };

function databases(action: 'start' | 'stop'): void {
	const run = spawnSync('bash', ['scripts/cluster.sh', 'databases', action], {
		env: { ...process.env, CLUSTER_DIR: DIR, PRIMARY_PORT: String(ports.primary), REPLICA_PORT: String(ports.replica), DB_NAME, DB_FAST: '1' },
		encoding: 'utf8'
	});
	if (run.status !== 0) throw new Error(`cluster.sh databases ${action} failed: ${run.stderr}`);
}

function onPrimary(script: string): void {
	const run = spawnSync('npx', ['tsx', script], { env: { ...process.env, DB_PORT: String(ports.primary), DB_NAME }, encoding: 'utf8' });
	if (run.status !== 0) throw new Error(`${script} failed: ${run.stderr}`);
}

const connect = (port: number) =>
	mariadb.createConnection({ host: '127.0.0.1', port, user: process.env.DB_USER ?? 'kickpanel', password: process.env.DB_PASSWORD ?? 'kickpanel-local', database: DB_NAME });

beforeAll(async () => {
	ports = { primary: await freePort(), replica: await freePort() };
	databases('start');
	onPrimary('scripts/migrate.ts');
	onPrimary('scripts/seed.ts');
	const [portA, portB] = [await freePort(), await freePort()];
	const env = { DB_PORT: String(ports.primary), DB_REPLICA_PORT: String(ports.replica), DB_NAME, METRICS_PORT: 'off' };
	servers.push(await startBuiltApp(portA, env), await startBuiltApp(portB, env));
	[A, B] = [`http://127.0.0.1:${portA}`, `http://127.0.0.1:${portB}`];
	[primary, replica] = [await connect(ports.primary), await connect(ports.replica)];
	for (const role of Object.keys(cookies) as (keyof typeof cookies)[]) {
		const user = userFor(role);
		cookies[role] = await signInCookie(A, user.email, user.password);
	}
}, 240_000);

afterAll(async () => {
	for (const server of servers) server.kill('SIGTERM');
	await primary?.end();
	await replica?.end();
	try {
		databases('stop');
	} finally {
		rmSync(DIR, { recursive: true, force: true });
	}
}, 60_000);

/** Milliseconds from `since` until the replica has applied everything the primary holds now. */
async function replicaLag(since: number): Promise<number> {
	const [{ pos }] = await primary.query('SELECT @@GLOBAL.gtid_binlog_pos AS pos');
	const [{ r }] = await replica.query('SELECT MASTER_GTID_WAIT(?, 30) AS r', [pos]);
	expect(Number(r), 'the replica caught up with the primary').toBe(0);
	return Math.max(0, Date.now() - since);
}

/**
 * Asks `check` again and again until it holds; fails once the bound (counted from `since`, the moment the
 * write was answered) plus the allowance has passed. Returns how long it took.
 */
async function honoured(what: string, since: number, boundMs: number, check: () => Promise<boolean>): Promise<number> {
	const deadline = since + boundMs + ALLOWANCE_MS;
	for (;;) {
		if (await check()) return Date.now() - since;
		if (Date.now() > deadline) break;
		await new Promise((r) => setTimeout(r, 100));
	}
	expect.fail(`${what}: not honoured within ${boundMs} ms (+${ALLOWANCE_MS} ms allowance)`);
}

/** Posts a form action as a browser without scripts would, and expects it to go through. */
async function act(base: string, path: string, cookie: string, fields: Record<string, string>): Promise<number> {
	const res = await fetch(`${base}${path}`, {
		method: 'POST',
		headers: { cookie, origin: base, 'content-type': 'application/x-www-form-urlencoded' },
		body: new URLSearchParams(fields)
	});
	const outcome = await res.json();
	expect(['success', 'redirect'], `${path}: ${JSON.stringify(outcome)}`).toContain(outcome.type);
	return Date.now();
}

type PageAnswer = { status: number; revisionId?: number; content?: { identity: { notes: string } } };

async function readPage(base: string, slug: string, cookie: string): Promise<PageAnswer> {
	const res = await fetch(`${base}/api/vehicles/${slug}`, { headers: { cookie } });
	return res.ok ? { status: res.status, ...(await res.json()) } : { status: res.status };
}

/** Saves the page's identity notes as `notes`; answers the status and, when accepted, the new revision. */
async function save(base: string, slug: string, cookie: string, notes: string): Promise<{ status: number; revisionId?: number }> {
	const page = await readPage(base, slug, cookie);
	if (page.status !== 200) return { status: page.status };
	page.content!.identity.notes = notes;
	const res = await fetch(`${base}/api/vehicles/${slug}`, {
		method: 'PUT',
		headers: { cookie, origin: base, 'content-type': 'application/json' },
		body: JSON.stringify({ baseRevisionId: page.revisionId, content: page.content, summary: notes })
	});
	return res.ok ? { status: res.status, revisionId: (await res.json()).revisionId } : { status: res.status };
}

async function found(base: string, word: string, slug: string): Promise<boolean> {
	const res = await fetch(`${base}/api/search?q=${word}`, { headers: { cookie: cookies.viewer } });
	expect(res.status).toBe(200);
	return (await res.json()).items.some((hit: { slug: string }) => hit.slug === slug);
}

/** A page of the test's own (invented sample data), made through server A. */
async function newPage(model: string): Promise<string> {
	const res = await fetch(`${A}/vehicles/new`, {
		method: 'POST',
		headers: { cookie: cookies.editor, origin: A, 'content-type': 'application/x-www-form-urlencoded' },
		body: new URLSearchParams({ make: 'Varrow', model, yearFrom: '2012', yearTo: '2016', body: 'hatchback', market: '', aliases: '' })
	});
	const outcome = await res.json();
	expect(outcome.type, JSON.stringify(outcome)).toBe('redirect');
	return String(outcome.location).split('/')[2];
}

describe('two app servers on one primary and its replica', () => {
	it('a save through A reaches B’s readers and search; a revision hidden through A is hidden on B', async () => {
		const slug = await newPage('Hideaway');
		const first = await readPage(A, slug, cookies.viewer);
		const saved = await save(A, slug, cookies.editor, 'Kick panel fitted with a quorravel grommet');
		expect(saved.status).toBe(200);
		const savedAt = Date.now();
		// B learns of A's save from the database alone: its reader gets it, and its index picks it up at a poll.
		let lag = await replicaLag(savedAt);
		await honoured('the new revision on B', savedAt, TTL_MS + lag, async () => (await readPage(B, slug, cookies.viewer)).revisionId === saved.revisionId);
		await honoured('the new revision in B’s search', savedAt, POLL_MS + lag, () => found(B, 'quorravel', slug));

		// The current revision cannot be hidden: a later save takes the word out, and B's search lets it go.
		const later = await save(A, slug, cookies.editor, 'Kick panel fitted with a plain grommet');
		expect(later.status).toBe(200);
		const laterAt = Date.now();
		lag = await replicaLag(laterAt);
		await honoured('the later save in B’s search', laterAt, POLL_MS + lag, async () => !(await found(B, 'quorravel', slug)));

		// B's viewer compares the two revisions (B keeps the flags of both), then a moderator hides the first on A.
		const compare = () => fetch(`${B}/api/vehicles/${slug}/compare?from=${first.revisionId}&to=${saved.revisionId}`, { headers: { cookie: cookies.viewer } });
		const before = await compare();
		expect(before.status).toBe(200);
		expect(await before.text()).toContain('quorravel');
		const hiddenAt = await act(A, `/vehicles/${slug}/history?/hide`, cookies.moderator, { revisionId: String(saved.revisionId), hidden: 'true', confirmed: 'yes', reason: 'Wrong car' });
		lag = await replicaLag(hiddenAt);
		await honoured('the hide on B’s compare', hiddenAt, TTL_MS + lag, async () => {
			const res = await compare();
			return res.status === 403 && !(await res.text()).includes('quorravel');
		});
		await honoured('the hide in B’s list of revisions', hiddenAt, TTL_MS + lag, async () => {
			const list = await (await fetch(`${B}/api/vehicles/${slug}/revisions`, { headers: { cookie: cookies.viewer } })).json();
			const row = list.items.find((r: { id: number }) => r.id === saved.revisionId);
			// The change note carried the word too; a hidden row is listed without it.
			return row?.hidden === true && !JSON.stringify(row).includes('quorravel');
		});
	});

	it('a page locked for moderators through A refuses a writer’s save on B, and takes it again once unlocked', async () => {
		const slug = await newPage('Lockhart');
		// B has the page row in hand before the lock.
		expect((await save(B, slug, cookies.editor, 'Door card clips: 9 per side')).status).toBe(200);

		const lockedAt = await act(A, `/vehicles/${slug}/history?/lock`, cookies.moderator, { protection: 'moderators' });
		let lag = await replicaLag(lockedAt);
		let tries = 0;
		await honoured('the lock on B', lockedAt, TTL_MS + lag, async () => (await save(B, slug, cookies.editor, `Door card clips, try ${++tries}`)).status === 403);
		// A moderator still saves there, through B.
		expect((await save(B, slug, cookies.moderator, 'Door card clips: 10 per side')).status).toBe(200);

		const unlockedAt = await act(A, `/vehicles/${slug}/history?/lock`, cookies.moderator, { protection: 'none' });
		lag = await replicaLag(unlockedAt);
		await honoured('the unlock on B', unlockedAt, TTL_MS + lag, async () => (await save(B, slug, cookies.editor, `Door card clips, again ${++tries}`)).status === 200);
	});

	it('sign-off switched on through A holds a change back from B’s viewers until a moderator signs it off there', async () => {
		const slug = await newPage('Signet');
		const before = await readPage(A, slug, cookies.viewer);
		const switchedAt = await act(A, '/admin/settings?/signoff', cookies.admin, { reviewBeforeShow: 'on' });
		const saved = await save(A, slug, cookies.editor, 'Sub box under the rear bench: tharnwick bracket');
		expect(saved.status).toBe(200);
		let lag = await replicaLag(switchedAt);
		// B's viewer keeps reading the revision from before the switch while the editor on B reads the unsigned change.
		await honoured('sign-off required, on B', switchedAt, TTL_MS + lag, async () => {
			const [viewer, editor] = [await readPage(B, slug, cookies.viewer), await readPage(B, slug, cookies.editor)];
			return viewer.revisionId === before.revisionId && editor.revisionId === saved.revisionId;
		});
		// The index holds what viewers read: once a poll has passed, the unsigned change is still not found on B.
		await new Promise((r) => setTimeout(r, POLL_MS + lag + ALLOWANCE_MS));
		expect(await found(B, 'tharnwick', slug)).toBe(false);

		const signedAt = await act(A, '/shop-log?/signoff', cookies.moderator, { revisionId: String(saved.revisionId) });
		lag = await replicaLag(signedAt);
		await honoured('the sign-off on B', signedAt, TTL_MS + lag, async () => (await readPage(B, slug, cookies.viewer)).revisionId === saved.revisionId);
		await honoured('the sign-off in B’s search', signedAt, POLL_MS + lag, () => found(B, 'tharnwick', slug));

		// Switched off again: the next change shows to B's viewers without a sign-off.
		await act(A, '/admin/settings?/signoff', cookies.admin, { reviewBeforeShow: 'off' });
		const next = await save(A, slug, cookies.editor, 'Sub box under the rear bench: tharnwick bracket, two bolts');
		const nextAt = Date.now();
		lag = await replicaLag(nextAt);
		await honoured('sign-off switched off, on B', nextAt, TTL_MS + lag, async () => (await readPage(B, slug, cookies.viewer)).revisionId === next.revisionId);
	});

	it('an editor demoted to viewer through A has their next save on B refused', async () => {
		const slug = await newPage('Demion');
		const editor = userFor('editor');
		expect((await save(B, slug, cookies.editor, 'Harness plug behind the glovebox')).status).toBe(200);
		const [{ id }] = await primary.query('SELECT id FROM users WHERE email = ?', [editor.email]);

		const demotedAt = await act(A, '/admin/users?/role', cookies.admin, { userId: String(id), role: 'viewer' });
		const lag = await replicaLag(demotedAt);
		// A role change ends the person's sessions: their old cookie is refused on B (signed out, or short of the role).
		await honoured('the demotion on B', demotedAt, TTL_MS + lag, async () => [401, 403].includes((await save(B, slug, cookies.editor, 'Harness plug, moved')).status));
		// Signed in again on B, they read as a viewer and may not save.
		const again = await signInCookie(B, editor.email, editor.password);
		expect((await readPage(B, slug, again)).status).toBe(200);
		expect((await save(B, slug, again, 'Harness plug, moved again')).status).toBe(403);
	});
});
