// Helpers shared by the benchmarks: a private MariaDB of their own, the built app, timing.
import { execFileSync, spawn, type ChildProcess } from 'node:child_process';
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';

export function percentile(sorted: number[], p: number): number {
	if (sorted.length === 0) return NaN;
	const i = Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1));
	return sorted[i];
}

export function summarize(samplesMs: number[]) {
	const s = [...samplesMs].sort((a, b) => a - b);
	return { n: s.length, p50: percentile(s, 50), p95: percentile(s, 95), p99: percentile(s, 99), max: s[s.length - 1] };
}

/**
 * A benchmark's own MariaDB, emptied when it starts and removed when it stops. With `keep` (BENCH_KEEP=1) the
 * data stays for the next run, which then skips making it: for timing one change after another on the same data.
 */
export function benchDatabase(name: string, port: number, bufferPool = '512M', keep = process.env.BENCH_KEEP === '1') {
	const env = { ...process.env, DB_DATA_DIR: `.data/bench-${name}-mariadb`, DB_PORT: String(port), DB_BUFFER_POOL: bufferPool, DB_FAST: '1' };
	return {
		env,
		keep,
		start() {
			execFileSync('bash', ['scripts/db.sh', keep ? 'start' : 'reset'], { env, stdio: 'inherit' });
			process.env.DB_PORT = String(port);
		},
		stop() {
			execFileSync('bash', ['scripts/db.sh', 'stop'], { env, stdio: 'inherit' });
			if (!keep) execFileSync('rm', ['-rf', env.DB_DATA_DIR]);
		}
	};
}

/** CPU seconds (user + system) a process has used so far, from /proc. */
export function cpuSeconds(pid: number): number {
	const fields = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1].split(' ');
	// utime and stime are the 14th and 15th fields of the line, in clock ticks (100 a second on Linux).
	return (Number(fields[11]) + Number(fields[12])) / 100;
}

/** The process id of a bench database started by `benchDatabase(name, …)`. */
export function databasePid(name: string): number {
	return Number(readFileSync(`.data/bench-${name}-mariadb/mysqld.pid`, 'utf8').trim());
}

/** Measures how busy the app server and the database were while `run` ran, as a share of one core each. */
export async function busy<T>(pids: { app: number; database: number }, run: () => Promise<T>): Promise<{ result: T; appCores: number; databaseCores: number }> {
	const t0 = performance.now();
	const app0 = cpuSeconds(pids.app);
	const db0 = cpuSeconds(pids.database);
	const result = await run();
	const seconds = (performance.now() - t0) / 1000;
	return { result, appCores: (cpuSeconds(pids.app) - app0) / seconds, databaseCores: (cpuSeconds(pids.database) - db0) / seconds };
}

export async function startBuiltApp(port: number, env: NodeJS.ProcessEnv): Promise<ChildProcess> {
	execFileSync('bash', ['-c', 'source scripts/lib.sh && ensure_build'], { stdio: 'inherit' });
	// Node runs the app as `npm start` runs it, with any extra flags (a profiler) from BENCH_NODE_ARGS.
	const serverFlags = execFileSync('bash', ['-c', 'source scripts/lib.sh && echo "$SERVER_NODE_FLAGS"'], { encoding: 'utf8' });
	const nodeArgs = `${serverFlags} ${process.env.BENCH_NODE_ARGS ?? ''}`.split(/\s+/).filter(Boolean);
	const child = spawn('node', [...nodeArgs, 'server.js'], {
		env: { ...process.env, PORT: String(port), HOST: '127.0.0.1', ORIGIN: `http://127.0.0.1:${port}`, NODE_ENV: 'production', ...env },
		stdio: ['ignore', 'ignore', 'inherit']
	});
	for (let i = 0; i < 600; i++) {
		try {
			const res = await fetch(`http://127.0.0.1:${port}/api/health`);
			if (res.ok) return child;
		} catch {
			/* not up yet */
		}
		await new Promise((r) => setTimeout(r, 100));
	}
	child.kill();
	throw new Error('the app did not start');
}

/** Signs in through the real sign-in form and returns the session cookie header. */
export async function signInCookie(base: string, email: string, password: string): Promise<string> {
	const body = new URLSearchParams({ email, password, providerId: 'credentials', redirectTo: '/' });
	const res = await fetch(`${base}/signin`, {
		method: 'POST',
		body,
		redirect: 'manual',
		headers: { origin: base, 'content-type': 'application/x-www-form-urlencoded' }
	});
	const cookies = res.headers.getSetCookie().map((c) => c.split(';')[0]);
	const session = cookies.find((c) => c.startsWith('authjs.session-token='));
	if (!session) throw new Error(`sign-in failed (${res.status})`);
	return session;
}

export function writeResults(name: string, results: unknown) {
	mkdirSync('bench-results', { recursive: true });
	writeFileSync(`bench-results/${name}.json`, JSON.stringify(results, null, 2));
}

export const fmt = (ms: number) => `${ms.toFixed(ms < 10 ? 2 : 1)} ms`;

/** mulberry32: a seeded generator, so every run of a benchmark measures the same invented data. */
export function seededRandom(seed: number): () => number {
	let state = seed;
	return () => {
		state = (state + 0x6d2b79f5) | 0;
		let t = state;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
}
