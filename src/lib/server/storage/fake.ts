import { mkdirSync } from 'node:fs';
import { resolve } from 'node:path';
import S3rver from 's3rver';
import type { LocalService } from '../localService';
import { config } from '../config';

export type RunningObjectStoreFake = { name: string; url: string; port: number; bucket: string; stop(): Promise<void> };

/**
 * An S3-compatible server on 127.0.0.1 keeping objects in a directory, with the photo bucket created.
 * Port 0 picks a free one (tests); the URL it answers is what S3_ENDPOINT would be.
 */
export async function startObjectStoreFake(
	options: { port?: number; directory?: string; bucket?: string } = {}
): Promise<RunningObjectStoreFake> {
	const port = options.port ?? config.s3.fakePort;
	const directory = resolve(options.directory ?? config.s3.fakeDir);
	const bucket = options.bucket ?? config.s3.bucket;
	mkdirSync(directory, { recursive: true });
	const server = new S3rver({ address: '127.0.0.1', port, silent: true, directory, configureBuckets: [{ name: bucket }] });
	const address = await server.run();
	return {
		name: `object storage fake (bucket ${bucket} in ${directory})`,
		url: `http://127.0.0.1:${address.port}`,
		port: address.port,
		bucket,
		stop: () => server.close()
	};
}

export const objectStoreFake: LocalService = {
	async start() {
		const endpoint = config.s3.configuredEndpoint;
		// A configured endpoint is a real bucket (or someone else's fake): nothing to stand in for.
		if (endpoint) return { name: 'object storage: S3_ENDPOINT is set, so no local fake; photos are kept', url: endpoint, stop: async () => {} };
		return startObjectStoreFake();
	}
};
