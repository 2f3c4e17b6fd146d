// npm run bench:load — a shop's mixed load (page reads, searches, fit checks, saves that collide) against the
// cluster of `npm run cluster` (nginx, two app servers, MariaDB primary and replica), then the same load against
// one app server. Every save the app accepted is looked for on the primary and on the replica afterwards.
// BENCH_LOAD_SECONDS (60) per phase, BENCH_LOAD_CONNECTIONS (16) clients at once. Its cluster listens on the ports
// cluster.sh reads, with defaults of its own so it runs beside `npm run cluster`: CLUSTER_PORT (8180),
// APP_PORTS ("3181 3182"), PRIMARY_PORT (3481), REPLICA_PORT (3482), METRICS_PORTS ("off").
import { spawn, spawnSync } from 'node:child_process';
import { rmSync } from 'node:fs';
import mariadb, { type Connection } from 'mariadb';
import { fmt, seededRandom, signInCookie, summarize, writeResults } from './lib';
import { freePort } from '../../tests/helpers/ports';

const SECONDS = Number(process.env.BENCH_LOAD_SECONDS ?? 60);
const CONNECTIONS = Number(process.env.BENCH_LOAD_CONNECTIONS ?? 16);
const CLUSTER_DIR = '.data/bench-cluster';
const PORTS = {
	balancer: Number(process.env.CLUSTER_PORT || 8180),
	apps: (process.env.APP_PORTS || '3181 3182').trim().split(/\s+/).map(Number),
	primary: Number(process.env.PRIMARY_PORT || 3481),
	replica: Number(process.env.REPLICA_PORT || 3482)
};
const BALANCER = `http://127.0.0.1:${PORTS.balancer}`;
const ONE_APP = `http://127.0.0.1:${PORTS.apps[0]}`;
type Kind = 'read' | 'search' | 'fit' | 'save';
const MIX: [Kind, number][] = [['read', 0.5], ['search', 0.25], ['fit', 0.15], ['save', 0.1]];
const WORDS = ['seat', 'dash', 'harness', 'grommet', 'amplifier', 'subwoofer', 'sedan', 'wagon', 'door', 'boot'];

rmSync(CLUSTER_DIR, { recursive: true, force: true });
const clusterEnv = {
	...process.env,
	CLUSTER_DIR,
	CLUSTER_PORT: String(PORTS.balancer),
	APP_PORTS: PORTS.apps.join(' '),
	PRIMARY_PORT: String(PORTS.primary),
	REPLICA_PORT: String(PORTS.replica),
	METRICS_PORTS: process.env.METRICS_PORTS || 'off',
	// The local stand-ins (photo store, mail capture, VIN decoder) on ports nothing else holds.
	S3_FAKE_PORT: String(await freePort()),
	SMTP_CAPTURE_PORT: String(await freePort()),
	VIN_DECODE_PORT: String(await freePort()),
	S3_FAKE_DIR: `${CLUSTER_DIR}/s3`,
	MAIL_CAPTURE_DIR: `${CLUSTER_DIR}/outbox`,
	SAMPLE_DATA: '1',
	LOG_LEVEL: 'warn'
};
const cluster = spawn('bash', ['scripts/cluster.sh'], { env: clusterEnv, stdio: ['ignore', 'ignore', 'inherit'], detached: true });
const stopCluster = () => {
	try {
		process.kill(-cluster.pid!, 'SIGTERM');
	} catch {
		/* already gone */
	}
};
process.on('exit', stopCluster);

let clusterExited = false;
cluster.on('exit', () => (clusterExited = true));

async function up(url: string, tries = 3000): Promise<void> {
	for (let i = 0; i < tries && !clusterExited; i++) {
		try {
			if ((await fetch(`${url}/api/health`)).ok) return;
		} catch {
			/* starting */
		}
		await new Promise((r) => setTimeout(r, 200));
	}
	throw new Error(`${url} did not come up`);
}
await up(BALANCER);
console.log('[bench] cluster up');

const viewer = await signInCookie(BALANCER, 'viewer@kickpanel.test', 'sample-viewer-pass');
const editor = await signInCookie(BALANCER, 'editor@kickpanel.test', 'sample-editor-pass');
const slugs: string[] = (await (await fetch(`${BALANCER}/api/vehicles?pageSize=50`, { headers: { cookie: viewer } })).json()).items.map((v: { slug: string }) => v.slug);

type Phase = {
	latencies: Record<Kind, number[]>;
	/** Answers by kind and status, e.g. "read 200". */
	statuses: Record<string, number>;
	accepted: number[];
	conflicts: number;
	errors5xx: number;
	/** Requests that got no usable answer, and the first few reasons. */
	failed: number;
	failures: string[];
	requests: number;
	seconds: number;
};

async function phase(base: string, seed: number): Promise<Phase> {
	const random = seededRandom(seed);
	const out: Phase = { latencies: { read: [], search: [], fit: [], save: [] }, statuses: {}, accepted: [], conflicts: 0, errors5xx: 0, failed: 0, failures: [], requests: 0, seconds: SECONDS };
	const deadline = Date.now() + SECONDS * 1000;
	const pick = (): Kind => {
		let r = random();
		for (const [kind, share] of MIX) if ((r -= share) < 0) return kind;
		return 'read';
	};
	const timed = async (kind: Kind, url: string, init: RequestInit = {}): Promise<Response> => {
		const t = performance.now();
		const res = await fetch(url, init);
		const body = await res.arrayBuffer();
		out.latencies[kind].push(performance.now() - t);
		out.requests++;
		out.statuses[`${kind} ${res.status}`] = (out.statuses[`${kind} ${res.status}`] ?? 0) + 1;
		if (res.status >= 500) out.errors5xx++;
		if (res.status >= 400 && res.status !== 409 && out.failures.length < 5) out.failures.push(`${kind} ${url} answered ${res.status}: ${Buffer.from(body).toString('utf8').slice(0, 160)}`);
		return new Response(body, { status: res.status });
	};
	const client = async () => {
		while (Date.now() < deadline) {
			const kind = pick();
			await one(kind).catch((err) => {
				out.failed++;
				if (out.failures.length < 5) out.failures.push(`${kind}: ${err instanceof Error ? err.message : String(err)}`);
			});
		}
	};
	const one = async (kind: Kind) => {
		// Saves go to a few pages only, so they collide and the merge has work to do.
		const slug = kind === 'save' ? slugs[Math.floor(random() * 3)] : slugs[Math.floor(random() * slugs.length)];
		if (kind === 'read') await timed(kind, `${base}/vehicles/${slug}`, { headers: { cookie: viewer } });
		else if (kind === 'search') await timed(kind, `${base}/api/search?q=${WORDS[Math.floor(random() * WORDS.length)]}`, { headers: { cookie: viewer } });
		else if (kind === 'fit') await timed(kind, `${base}/api/fit?l=${250 + Math.floor(random() * 200)}&w=200&h=${60 + Math.floor(random() * 60)}`, { headers: { cookie: viewer } });
		else {
			const current = await fetch(`${base}/api/vehicles/${slug}`, { headers: { cookie: editor } });
			if (current.status >= 500) out.errors5xx++;
			if (current.status !== 200) throw new Error(`the page to edit answered ${current.status}: ${await current.text()}`);
			const page = await current.json();
			const content = page.content;
			content.identity.notes = `${content.identity.notes.split('\n\nLoad note')[0]}\n\nLoad note ${Math.floor(random() * 1e9)}`;
			const res = await timed('save', `${base}/api/vehicles/${slug}`, {
				method: 'PUT',
				headers: { cookie: editor, 'content-type': 'application/json', origin: base },
				body: JSON.stringify({ baseRevisionId: page.revisionId, content, summary: 'Load test note' })
			});
			if (res.status === 200) out.accepted.push((await res.json()).revisionId);
			else if (res.status === 409) out.conflicts++;
		}
	};
	await Promise.all(Array.from({ length: CONNECTIONS }, client));
	return out;
}

console.log(`[bench] cluster phase: ${SECONDS} s, ${CONNECTIONS} clients through nginx…`);
const clustered = await phase(BALANCER, 1);
console.log(`[bench] one-server phase: ${SECONDS} s, ${CONNECTIONS} clients on ${ONE_APP}…`);
const single = await phase(ONE_APP, 2);

// Every accepted save, on the primary and (once it has caught up) on the replica.
const connect = (port: number) => mariadb.createConnection({ host: '127.0.0.1', port, user: 'kickpanel', password: 'kickpanel-local', database: 'kickpanel' });
const [primary, replica] = [await connect(PORTS.primary), await connect(PORTS.replica)];
const accepted = [...clustered.accepted, ...single.accepted];
const [{ pos }] = await primary.query('SELECT @@GLOBAL.gtid_binlog_pos AS pos');
await replica.query('SELECT MASTER_GTID_WAIT(?, 60)', [pos]);
const found = async (conn: Connection) =>
	accepted.length ? Number((await conn.query(`SELECT COUNT(*) AS n FROM revisions WHERE id IN (${accepted.map(Number).join(',')})`))[0].n) : 0;
const onPrimary = await found(primary);
const onReplica = await found(replica);
await primary.end();
await replica.end();
stopCluster();
spawnSync('sleep', ['3']);

const rate = (p: Phase) => p.requests / p.seconds;
const line = (name: string, p: Phase) => {
	console.log(`\n${name}: ${rate(p).toFixed(0)} req/s, ${p.requests} requests, 5xx ${p.errors5xx} (target 0), no answer ${p.failed}, saves accepted ${p.accepted.length}, refused as conflicts ${p.conflicts}`);
	console.log(`  answers: ${Object.entries(p.statuses).sort().map(([k, n]) => `${k}: ${n}`).join(', ')}`);
	for (const failure of p.failures) console.log(`  refused or unanswered: ${failure}`);
	for (const kind of Object.keys(p.latencies) as Kind[]) {
		const s = summarize(p.latencies[kind]);
		console.log(`  ${kind.padEnd(6)} n=${String(s.n).padStart(6)}  p50 ${fmt(s.p50)}  p95 ${fmt(s.p95)}  p99 ${fmt(s.p99)}`);
	}
};
line('cluster (nginx, 2 app servers, primary + replica)', clustered);
line('one app server', single);
const lostPrimary = accepted.length - onPrimary;
const lostReplica = accepted.length - onReplica;
console.log(`\ncluster / one server: ${(rate(clustered) / rate(single)).toFixed(2)}× req/s`);
console.log(`saves accepted ${accepted.length}: lost on the primary ${lostPrimary} (target 0), missing on the replica ${lostReplica} (target 0)`);
writeResults('load', {
	seconds: SECONDS,
	connections: CONNECTIONS,
	cluster: { rps: rate(clustered), ...clustered, latencies: Object.fromEntries(Object.entries(clustered.latencies).map(([k, v]) => [k, summarize(v)])) },
	single: { rps: rate(single), ...single, latencies: Object.fromEntries(Object.entries(single.latencies).map(([k, v]) => [k, summarize(v)])) },
	ratio: rate(clustered) / rate(single),
	lostPrimary,
	lostReplica
});
process.exit(lostPrimary || lostReplica || clustered.errors5xx || single.errors5xx || clustered.failed || single.failed ? 1 : 0);
