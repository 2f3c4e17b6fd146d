import { GetObjectCommand, HeadObjectCommand, PutObjectCommand, S3Client } from '@aws-sdk/client-s3';
import type { PhotoStore, StoredObject, StoredObjectInfo } from './store';

export const DEFAULT_BUCKET = 'kickpanel-photos';
export const DEFAULT_FAKE_PORT = 4569;
/** The local fake accepts these fixed keys; a real bucket gets its own from the environment. */
export const FAKE_CREDENTIALS = { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' } as const;

export type S3StoreConfig = {
	endpoint: string;
	bucket: string;
	region: string;
	/** Absent: the SDK's own chain (instance role, shared profile) supplies credentials. */
	credentials?: { accessKeyId: string; secretAccessKey: string };
	forcePathStyle: boolean;
};

function flag(raw: string | undefined, fallback: boolean): boolean {
	if (raw === undefined || raw === '') return fallback;
	return !['0', 'false', 'no', 'off'].includes(raw.trim().toLowerCase());
}

/** Read at call time so a test or script can point the store elsewhere before first use. */
export function s3ConfigFromEnv(env: NodeJS.ProcessEnv = process.env): S3StoreConfig {
	const usingFake = !env.S3_ENDPOINT;
	const keyId = env.S3_ACCESS_KEY_ID;
	const secret = env.S3_SECRET_ACCESS_KEY;
	return {
		endpoint: env.S3_ENDPOINT || `http://127.0.0.1:${env.S3_FAKE_PORT || DEFAULT_FAKE_PORT}`,
		bucket: env.S3_BUCKET || DEFAULT_BUCKET,
		region: env.S3_REGION || 'us-east-1',
		credentials: keyId && secret ? { accessKeyId: keyId, secretAccessKey: secret } : usingFake ? { ...FAKE_CREDENTIALS } : undefined,
		forcePathStyle: flag(env.S3_FORCE_PATH_STYLE, true)
	};
}

function isNotFound(err: unknown): boolean {
	const e = err as { name?: string; $metadata?: { httpStatusCode?: number } };
	return e?.name === 'NotFound' || e?.name === 'NoSuchKey' || e?.$metadata?.httpStatusCode === 404;
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
			credentials: config.credentials
		});
	}

	async put(key: string, bytes: Uint8Array, contentType: string): Promise<void> {
		await this.client.send(new PutObjectCommand({ Bucket: this.bucket, Key: key, Body: bytes, ContentType: contentType }));
	}

	async head(key: string): Promise<StoredObjectInfo | null> {
		try {
			const res = await this.client.send(new HeadObjectCommand({ Bucket: this.bucket, Key: key }));
			return { bytes: res.ContentLength ?? 0, contentType: res.ContentType ?? 'application/octet-stream' };
		} catch (err) {
			if (isNotFound(err)) return null;
			throw err;
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
			throw err;
		}
	}

	close(): void {
		this.client.destroy();
	}
}
