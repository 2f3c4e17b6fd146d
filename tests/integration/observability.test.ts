import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Writable } from 'node:stream';
import { closeDb, freshDatabase } from '../helpers/database';
import { createLog, withRequestId } from '../../src/lib/server/observability/log';
import { reportIndexWatermark, startMetricsServer } from '../../src/lib/server/observability/metrics';
import { observeRequests } from '../../src/lib/server/observability/requests';
import { queueMail } from '../../src/lib/server/mail/queue';

// What an operator reads: JSON log lines tagged with the request's id and free of secrets, and Prometheus
// metrics on a loopback port of their own.

let metrics: { port: number; stop(): Promise<void> };

beforeAll(async () => {
	await freshDatabase('observability');
	metrics = await startMetricsServer(0);
});
afterAll(async () => {
	await metrics?.stop();
	await closeDb();
});

function requestThrough(path: string, route: string | null, headers: Record<string, string> = {}, status = 200) {
	return observeRequests({
		event: { url: new URL(`http://127.0.0.1${path}`), route: { id: route }, request: new Request(`http://127.0.0.1${path}`, { headers }) },
		resolve: async () => new Response('ok', { status })
	} as never);
}

describe('logs', () => {
	it('tags every line written inside a request with its id and removes secrets', async () => {
		const lines: string[] = [];
		const sink = new Writable({ write: (chunk, _enc, done) => (lines.push(String(chunk)), done()) });
		const log = createLog(sink, 'info');
		withRequestId('req-12345678', () => log.info({ password: 'hunter22', nested: { token: 'abc' }, email: 'fitter@kickpanel.test' }, 'signed in'));
		log.info('outside any request');
		const [inside, outside] = lines.map((l) => JSON.parse(l));
		expect(inside).toMatchObject({ requestId: 'req-12345678', msg: 'signed in', password: '[removed]', nested: { token: '[removed]' }, email: 'fitter@kickpanel.test' });
		expect(lines[0]).not.toContain('hunter22');
		expect(outside.requestId).toBeUndefined();
	});

	it('answers with the request id, keeping a sane one from the proxy and replacing anything else', async () => {
		expect((await requestThrough('/', '/', { 'x-request-id': 'proxy-abc-123' })).headers.get('x-request-id')).toBe('proxy-abc-123');
		const replaced = (await requestThrough('/', '/', { 'x-request-id': 'bad id; with spaces' })).headers.get('x-request-id');
		expect(replaced).toMatch(/^[0-9a-f-]{36}$/);
	});
});

describe('metrics', () => {
	it('counts requests by route and status, and reports the pool, the index lag and the mail queue', async () => {
		for (let i = 0; i < 3; i++) await requestThrough(`/vehicles/sample-${i}`, '/vehicles/[slug]');
		await requestThrough('/nowhere', null, {}, 404);
		await queueMail({ to: 'waiting@kickpanel.test', subject: 'Waiting', text: 'Sample', html: '<p>Sample</p>' });
		reportIndexWatermark(() => 0);
		const res = await fetch(`http://127.0.0.1:${metrics.port}/metrics`);
		expect(res.status).toBe(200);
		const text = await res.text();
		expect(text).toContain('kickpanel_http_requests_total{route="/vehicles/[slug]",method="GET",status="200"} 3');
		expect(text).toContain('kickpanel_http_requests_total{route="unmatched",method="GET",status="404"} 1');
		expect(text).toMatch(/kickpanel_http_request_duration_seconds_count\{route="\/vehicles\/\[slug\]",method="GET"\} 3/);
		expect(text).toContain('kickpanel_mail_queue_depth 1');
		expect(text).toMatch(/kickpanel_db_pool_connections\{state="using"\} \d+/);
		expect(text).toContain('kickpanel_search_index_lag_revisions 0');
		expect((await fetch(`http://127.0.0.1:${metrics.port}/`)).status).toBe(404);
	});
});
