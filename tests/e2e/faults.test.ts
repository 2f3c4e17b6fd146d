import { afterAll, describe, expect, it } from 'vitest';
import { spawn, type ChildProcess } from 'node:child_process';
import { createServer } from 'node:net';
import mariadb from 'mariadb';
import { BASE, userFor } from './browser';
import { signInCookie } from '../../scripts/bench/lib';

// A second app server, killed (SIGKILL, no chance to tidy up) while it is saving: every save it answered is
// kept whole, the one it was in the middle of is either whole or absent, and the other server carries on.

let second: ChildProcess | null = null;
afterAll(() => {
	second?.kill('SIGKILL');
});

async function freePort(): Promise<number> {
	const server = createServer();
	await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
	const p = (server.address() as { port: number }).port;
	await new Promise<void>((resolve) => server.close(() => resolve()));
	return p;
}

async function startSecondServer(port: number): Promise<string> {
	const base = `http://127.0.0.1:${port}`;
	second = spawn('node', ['build/index.js'], {
		env: { ...process.env, PORT: String(port), HOST: '127.0.0.1', ORIGIN: base, NODE_ENV: 'production', METRICS_PORT: 'off' },
		stdio: 'ignore'
	});
	for (let i = 0; i < 300; i++) {
		try {
			if ((await fetch(`${base}/api/health`)).ok) return base;
		} catch {
			/* starting */
		}
		await new Promise((r) => setTimeout(r, 100));
	}
	throw new Error('the second app server did not start');
}

describe('an app server killed in the middle of saves', () => {
	it('leaves every save whole or absent, and the other server answers on', async () => {
		const other = await startSecondServer(await freePort());
		const editor = userFor('editor');
		const cookie = await signInCookie(BASE, editor.email, editor.password);
		const headers = { cookie, 'content-type': 'application/json' };
		// A page of its own (sample data, invented), so no other test's page changes.
		const created = await fetch(`${BASE}/vehicles/new`, {
			method: 'POST',
			headers: { cookie, origin: BASE, 'content-type': 'application/x-www-form-urlencoded' },
			body: new URLSearchParams({ make: 'Quillan', model: 'Faultline', yearFrom: '2016', yearTo: '2019', body: 'wagon', market: '', aliases: '' })
		});
		// Asked without text/html, the action answers as JSON: { type: 'redirect', location }.
		const outcome = await created.json();
		expect(outcome.type).toBe('redirect');
		const slug = String(outcome.location).split('/')[2];

		const accepted: number[] = [];
		for (let i = 0; i < 40; i++) {
			try {
				const page = await (await fetch(`${other}/api/vehicles/${slug}`, { headers })).json();
				page.content.identity.notes = `${page.content.identity.notes.split('\n\nShift note')[0]}\n\nShift note ${i}`;
				const saving = fetch(`${other}/api/vehicles/${slug}`, { method: 'PUT', headers, body: JSON.stringify({ baseRevisionId: page.revisionId, content: page.content, summary: `Shift note ${i}` }) });
				// Pull the plug part-way through the sixth save.
				if (i === 5) setTimeout(() => second!.kill('SIGKILL'), 3);
				const res = await saving;
				expect(res.status).toBe(200);
				accepted.push((await res.json()).revisionId);
			} catch (err) {
				if (i < 5) throw err;
				break;
			}
		}
		expect(second!.killed).toBe(true);
		expect(accepted.length).toBeGreaterThanOrEqual(5);

		// The first server still answers, and reads what the killed one saved.
		const listed = await (await fetch(`${BASE}/api/vehicles/${slug}/revisions?pageSize=500`, { headers })).json();
		const ids: number[] = listed.items.map((r: { id: number }) => r.id);
		for (const id of accepted) expect(ids).toContain(id);

		// In the database: one straight chain of whole revisions, the page on the newest.
		const conn = await mariadb.createConnection({
			host: process.env.DB_HOST ?? '127.0.0.1',
			port: Number(process.env.DB_PORT),
			user: process.env.DB_USER ?? 'kickpanel',
			password: process.env.DB_PASSWORD ?? 'kickpanel-local',
			database: process.env.DB_NAME
		});
		try {
			const [vehicle] = await conn.query('SELECT id, latest_revision_id AS latest FROM vehicles WHERE slug = ?', [slug]);
			const rows: { id: number; parent: number | null; notes: number }[] = await conn.query(
				`SELECT r.id, r.parent_id AS parent, (SELECT COUNT(*) FROM rendered_notes n WHERE n.sha256 = r.sha256) AS notes
				 FROM revisions r WHERE r.vehicle_id = ? ORDER BY r.id`,
				[vehicle.id]
			);
			rows.forEach((r, k) => {
				if (k > 0) expect(Number(r.parent)).toBe(Number(rows[k - 1].id));
				expect(Number(r.notes)).toBeGreaterThan(0);
			});
			expect(Number(vehicle.latest)).toBe(Number(rows.at(-1)!.id));
			// The save cut off mid-way is whole (it reached its commit) or not there at all.
			const after = rows.filter((r) => Number(r.id) > accepted.at(-1)!);
			expect(after.length).toBeLessThanOrEqual(1);
		} finally {
			await conn.end();
		}
	}, 120_000);
});
