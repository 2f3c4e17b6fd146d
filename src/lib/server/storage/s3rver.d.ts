// s3rver ships no types; this covers the part Kickpanel's local fake uses.
declare module 's3rver' {
	export interface S3rverOptions {
		address?: string;
		port?: number;
		silent?: boolean;
		directory?: string;
		resetOnClose?: boolean;
		configureBuckets?: { name: string; configs?: (string | Uint8Array)[] }[];
	}

	export default class S3rver {
		constructor(options?: S3rverOptions);
		run(): Promise<{ address: string; family: string; port: number }>;
		close(): Promise<void>;
	}
}
