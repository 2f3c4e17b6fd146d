import http from 'node:http';
import { BASE } from './browser';

export type Raw = { status: number; headers: http.IncomingHttpHeaders; body: Buffer };

/** A GET of the app that leaves the body as it came over the wire (no decoding, no redirect followed). */
export function rawGet(path: string, headers: Record<string, string>): Promise<Raw> {
	return new Promise((resolve, reject) => {
		http
			.get(`${BASE}${path}`, { headers }, (res) => {
				const chunks: Buffer[] = [];
				res.on('data', (c: Buffer) => chunks.push(c));
				res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks) }));
			})
			.on('error', reject);
	});
}
