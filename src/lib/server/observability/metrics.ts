// Prometheus metrics, served on their own loopback port (METRICS_PORT) so they are never part of the app's
// public answers: requests by route and status, latency, the database pool, the search index's lag and the
// mail queue's depth.
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { collectDefaultMetrics, Counter, Gauge, Histogram, Registry } from 'prom-client';
import { QueryTypes } from 'sequelize';
import { db } from '../db';
import { mailQueueDepth } from '../mail/queue';
import { logFailure } from './log';

export const registry = new Registry();
collectDefaultMetrics({ register: registry, prefix: 'kickpanel_' });

export const requestsTotal = new Counter({
	name: 'kickpanel_http_requests_total',
	help: 'Answered requests by route, method and status.',
	labelNames: ['route', 'method', 'status'] as const,
	registers: [registry]
});

export const requestSeconds = new Histogram({
	name: 'kickpanel_http_request_duration_seconds',
	help: 'Time to answer, by route and method.',
	labelNames: ['route', 'method'] as const,
	buckets: [0.002, 0.005, 0.01, 0.025, 0.05, 0.1, 0.25, 0.5, 1, 2.5, 5],
	registers: [registry]
});

type PoolStats = { size: number; available: number; using: number; waiting: number };
function poolStats(): PoolStats | null {
	const pool = (db().connectionManager as unknown as { pool?: { write?: PoolStats } & PoolStats }).pool;
	if (!pool) return null;
	return pool.write ?? pool;
}

new Gauge({
	name: 'kickpanel_db_pool_connections',
	help: 'Database pool connections by state (in use, idle, requests waiting for one).',
	labelNames: ['state'] as const,
	registers: [registry],
	collect() {
		const stats = poolStats();
		if (!stats) return;
		this.set({ state: 'using' }, stats.using);
		this.set({ state: 'idle' }, stats.available);
		this.set({ state: 'waiting' }, stats.waiting);
	}
});

/** The revision the search index has caught up to, set by the index itself. */
let indexedUpTo: () => number = () => 0;
export function reportIndexWatermark(read: () => number): void {
	indexedUpTo = read;
}

new Gauge({
	name: 'kickpanel_search_index_lag_revisions',
	help: 'Revisions written (on any app server) that this server’s search index has not taken in yet.',
	registers: [registry],
	async collect() {
		const [row] = await db().query<{ newest: number | null }>('SELECT MAX(id) AS newest FROM revisions', { type: QueryTypes.SELECT });
		this.set(Math.max(0, Number(row?.newest ?? 0) - indexedUpTo()));
	}
});

new Gauge({
	name: 'kickpanel_mail_queue_depth',
	help: 'Mail stored and not yet taken by the mail server.',
	registers: [registry],
	async collect() {
		this.set(await mailQueueDepth());
	}
});

/** Serves GET /metrics on 127.0.0.1:port; answers the port it listens on (0 picks a free one). */
export function startMetricsServer(port: number): Promise<{ port: number; stop(): Promise<void> }> {
	const server: Server = createServer(async (req, res) => {
		if (req.url !== '/metrics') {
			res.writeHead(404).end();
			return;
		}
		try {
			const body = await registry.metrics();
			res.writeHead(200, { 'content-type': registry.contentType }).end(body);
		} catch (err) {
			logFailure('metrics: collecting failed', err);
			res.writeHead(500).end();
		}
	});
	return new Promise((resolve, reject) => {
		server.once('error', reject);
		server.listen(port, '127.0.0.1', () =>
			resolve({ port: (server.address() as AddressInfo).port, stop: () => new Promise((done) => server.close(() => done())) })
		);
	});
}
