import { logFailure } from '../observability/log';
import { GetObjectCommand, HeadObjectCommand, PutObjectCommand, S3Client } from '@aws-sdk/client-s3';
import type { PhotoStore, StoredObject, StoredObjectInfo } from './store';
import { ServiceError } from '../errors';


export type S3StoreConfig = {
	endpoint: string;
	bucket: string;
	region: string;
	/** Absent: the SDK's own chain (instance role, shared profile) supplies credentials. */
	credentials?: { accessKeyId: string; secretAccessKey: string };
	forcePathStyle: boolean;
};

function isNotFound(err: unknown): boolean {
	const e = err as { name?: string; $metadata?: { httpStatusCode?: number } };
	return e?.name === 'NotFound' || e?.name === 'NoSuchKey' || e?.$metadata?.httpStatusCode === 404;
}

/** The store could not be reached or failed on its side (no answer, a 5xx): the person hears it plainly. */
function unavailable(err: unknown): unknown {
	const status = (err as { $metadata?: { httpStatusCode?: number } })?.$metadata?.httpStatusCode;
	if (status !== undefined && status < 500) return err;
	logFailure('photo storage', err);
	return new ServiceError('Photo storage is not answering right now, so nothing was uploaded or changed. Try again in a minute.', 503);
}

/** Photo storage in any S3-compatible bucket through the AWS SDK. */
export class S3PhotoStore implements PhotoStore {
	private readonly client: S3Client;
	readonly bucket: string;

	constructor(config: S3StoreConfig) {
		this.bucket = config.bucket;
		this.client = new S3Client({
			endpoint: config.endpoint,
			region: config.region,
			forcePathStyle: config.forcePathStyle,
			credentials: config.credentials,
			// A store that is down answers within seconds instead of holding the upload open.
			maxAttempts: 2,
			requestHandler: { connectionTimeout: 3_000, requestTimeout: 30_000 }
		});
	}

	async put(key: string, bytes: Uint8Array, contentType: string): Promise<void> {
		try {
			await this.client.send(new PutObjectCommand({ Bucket: this.bucket, Key: key, Body: bytes, ContentType: contentType }));
		} catch (err) {
			throw unavailable(err);
		}
	}

	async head(key: string): Promise<StoredObjectInfo | null> {
		try {
			const res = await this.client.send(new HeadObjectCommand({ Bucket: this.bucket, Key: key }));
			return { bytes: res.ContentLength ?? 0, contentType: res.ContentType ?? 'application/octet-stream' };
		} catch (err) {
			if (isNotFound(err)) return null;
			throw unavailable(err);
		}
	}

	async get(key: string): Promise<StoredObject | null> {
		try {
			const res = await this.client.send(new GetObjectCommand({ Bucket: this.bucket, Key: key }));
			if (!res.Body) return null;
			return {
				bytes: res.ContentLength ?? 0,
				contentType: res.ContentType ?? 'application/octet-stream',
				body: res.Body.transformToWebStream() as ReadableStream<Uint8Array>
			};
		} catch (err) {
			if (isNotFound(err)) return null;
			throw unavailable(err);
		}
	}

	close(): void {
		this.client.destroy();
	}
}
