// The one place that reads the environment. Every setting is checked here when the process starts,
// so a mistyped value stops start-up with the variable's name instead of failing later in a request.
// Defaults match scripts/db.sh, scripts/services.ts and the table in README.md.
import { z } from 'zod';

type Env = Record<string, string | undefined>;

const DEFAULT_BUCKET = 'kickpanel-photos';
/** The local object-storage fake accepts these fixed keys; a real bucket gets its own. */
export const S3_FAKE_CREDENTIALS = { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' } as const;
const MB = 1024 * 1024;

// An empty variable means "not set", as a shell's `FOO= npm start` intends.
const unsetIfEmpty = (raw: unknown) => (raw === '' ? undefined : raw);
/** A variable that may be unset; its default is applied in readConfig, beside the others. */
const optional = <T extends z.ZodType<unknown, string>>(schema: T) => z.preprocess(unsetIfEmpty, schema.optional());

function wholeNumber(min: number, max = Number.MAX_SAFE_INTEGER) {
	const message = max === Number.MAX_SAFE_INTEGER ? `must be a whole number of at least ${min}` : `must be a whole number from ${min} to ${max}`;
	return z
		.string()
		.trim()
		.regex(/^-?\d+$/, message)
		.transform(Number)
		.pipe(z.number().int().min(min, message).max(max, message));
}

const port = (min = 1) => wholeNumber(min, 65_535);

const YES = ['1', 'true', 'yes', 'on'];
const NO = ['0', 'false', 'no', 'off'];
const flag = z
	.string()
	.transform((raw) => raw.trim().toLowerCase())
	.refine((raw) => YES.includes(raw) || NO.includes(raw), `must be one of ${[...YES, ...NO].join(', ')}`)
	.transform((raw) => YES.includes(raw));

const address = z.url('must be a full address such as https://host:port');

const envSchema = z.object({
	NODE_ENV: optional(z.string()),
	KICKPANEL_DEV_TOOLS: optional(z.string()),
	ORIGIN: optional(address),
	AUTH_SECRET: optional(z.string()),
	AUTH_TRUST_HOST: optional(flag),
	AUTH_MAX_FAILURES_ACCOUNT: optional(wholeNumber(1)),
	AUTH_MAX_FAILURES_ADDRESS: optional(wholeNumber(1)),
	AUTH_LOCKOUT_SECONDS: optional(wholeNumber(1)),
	DB_HOST: optional(z.string()),
	DB_PORT: optional(port()),
	DB_REPLICA_HOST: optional(z.string()),
	DB_REPLICA_PORT: optional(port()),
	DB_NAME: optional(z.string()),
	DB_USER: optional(z.string()),
	// An empty password is a real choice for a local account, so only an unset one takes the default.
	DB_PASSWORD: z.string().optional(),
	DB_POOL_MAX: optional(wholeNumber(1, 1_000)),
	PAGE_MEMO_MB: optional(wholeNumber(0)),
	LOG_LEVEL: optional(z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent'], { error: 'must be one of fatal, error, warn, info, debug, trace, silent' })),
	METRICS_PORT: optional(z.union([z.literal('off'), port(0)])),
	SHARED_STATE_TTL_MS: optional(wholeNumber(0)),
	SEARCH_POLL_MS: optional(wholeNumber(0)),
	PHOTO_MAX_BYTES: optional(wholeNumber(1)),
	PHOTO_MAX_PIXELS: optional(wholeNumber(1)),
	S3_ENDPOINT: optional(address),
	S3_BUCKET: optional(z.string()),
	S3_REGION: optional(z.string()),
	S3_ACCESS_KEY_ID: optional(z.string()),
	S3_SECRET_ACCESS_KEY: optional(z.string()),
	S3_FORCE_PATH_STYLE: optional(flag),
	// 0 lets a local stand-in pick a free port.
	S3_FAKE_PORT: optional(port(0)),
	S3_FAKE_DIR: optional(z.string()),
	SMTP_HOST: optional(z.string()),
	SMTP_PORT: optional(port()),
	SMTP_CAPTURE_PORT: optional(port(0)),
	SMTP_SECURE: optional(flag),
	SMTP_USER: optional(z.string()),
	SMTP_PASS: optional(z.string()),
	MAIL_FROM: optional(z.string()),
	MAIL_CAPTURE_DIR: optional(z.string()),
	MAIL_QUEUE_INTERVAL_MS: optional(wholeNumber(100)),
	VIN_DECODE_URL: optional(address),
	VIN_DECODE_KEY: optional(z.string()),
	VIN_DECODE_TIMEOUT_MS: optional(wholeNumber(1)),
	VIN_DECODE_PORT: optional(port(0))
});

/** One or more environment variables hold values Kickpanel cannot use; the message names each one. */
export class ConfigError extends Error {
	constructor(readonly problems: string[]) {
		super(`Kickpanel cannot start with these settings:\n${problems.map((p) => `  - ${p}`).join('\n')}`);
		this.name = 'ConfigError';
	}
}

function describe(issue: z.core.$ZodIssue, env: Env): string {
	const name = String(issue.path[0] ?? 'environment');
	const raw = env[name];
	return raw === undefined ? `${name} ${issue.message}` : `${name} ${issue.message} (it is "${raw}")`;
}

/** The settings the environment describes; throws ConfigError naming every bad variable. */
export function readConfig(env: Env = process.env) {
	const parsed = envSchema.safeParse(env);
	if (!parsed.success) throw new ConfigError(parsed.error.issues.map((issue) => describe(issue, env)));
	const e = parsed.data;
	const s3FakePort = e.S3_FAKE_PORT ?? 4569;
	const capturePort = e.SMTP_CAPTURE_PORT ?? 2525;
	const vinFakePort = e.VIN_DECODE_PORT ?? 3391;
	return {
		/** A production build with the development pages (the outbox) off. */
		production: e.NODE_ENV === 'production' && e.KICKPANEL_DEV_TOOLS !== '1',
		db: {
			host: e.DB_HOST ?? '127.0.0.1',
			port: e.DB_PORT ?? 3307,
			name: e.DB_NAME ?? 'kickpanel',
			user: e.DB_USER ?? 'kickpanel',
			password: e.DB_PASSWORD ?? 'kickpanel-local',
			poolMax: e.DB_POOL_MAX ?? 10,
			/** A read replica (MariaDB replication); unset: every query goes to the primary. */
			replica: e.DB_REPLICA_PORT ? { host: e.DB_REPLICA_HOST ?? e.DB_HOST ?? '127.0.0.1', port: e.DB_REPLICA_PORT } : null
		},
		auth: {
			// With ORIGIN fixed by the operator, the request host is never taken from the client.
			trustHost: (e.AUTH_TRUST_HOST ?? false) || !!e.ORIGIN,
			/** Signs and encrypts sessions; authSecret() refuses to go on without one. */
			secret: e.AUTH_SECRET ?? null,
			/** A production server refuses a secret short enough to guess. */
			requireStrongSecret: e.NODE_ENV === 'production',
			maxFailuresPerAccount: e.AUTH_MAX_FAILURES_ACCOUNT ?? 5,
			maxFailuresPerAddress: e.AUTH_MAX_FAILURES_ADDRESS ?? 20,
			lockoutSeconds: e.AUTH_LOCKOUT_SECONDS ?? 15 * 60
		},
		origin: e.ORIGIN ?? 'http://127.0.0.1:3000',
		/** Memory for whole rendered pages kept for repeat views (see render/pageMemo.ts); 0 turns it off. */
		pageMemoBytes: (e.PAGE_MEMO_MB ?? 64) * MB,
		logLevel: e.LOG_LEVEL ?? 'info',
		/** Prometheus metrics on 127.0.0.1 only; 0 picks a free port (printed at start), off turns them off. */
		metricsPort: e.METRICS_PORT === 'off' ? null : (e.METRICS_PORT ?? 9464),
		/** How long another instance's change can take to show here (role, block, page row, watch, trust marks). */
		sharedStateTtlMs: e.SHARED_STATE_TTL_MS ?? 2_000,
		/** How often this instance picks up revisions saved by other instances. */
		searchPollMs: e.SEARCH_POLL_MS ?? 5_000,
		photos: { maxBytes: e.PHOTO_MAX_BYTES ?? 15 * MB, maxPixels: e.PHOTO_MAX_PIXELS ?? 60_000_000 },
		s3: {
			/** Unset: the local fake (scripts/services.ts) stands in. */
			configuredEndpoint: e.S3_ENDPOINT ?? null,
			endpoint: e.S3_ENDPOINT ?? `http://127.0.0.1:${s3FakePort}`,
			bucket: e.S3_BUCKET ?? DEFAULT_BUCKET,
			region: e.S3_REGION ?? 'us-east-1',
			// Absent: the SDK's own chain (instance role, shared profile) supplies credentials.
			credentials:
				e.S3_ACCESS_KEY_ID && e.S3_SECRET_ACCESS_KEY
					? { accessKeyId: e.S3_ACCESS_KEY_ID, secretAccessKey: e.S3_SECRET_ACCESS_KEY }
					: e.S3_ENDPOINT
						? undefined
						: { ...S3_FAKE_CREDENTIALS },
			forcePathStyle: e.S3_FORCE_PATH_STYLE ?? true,
			fakePort: s3FakePort,
			fakeDir: e.S3_FAKE_DIR ?? '.data/s3'
		},
		mail: {
			/** Unset: the local capture (scripts/services.ts) receives every message. */
			configuredHost: e.SMTP_HOST ?? null,
			host: e.SMTP_HOST ?? '127.0.0.1',
			port: e.SMTP_PORT ?? (capturePort || 2525),
			secure: e.SMTP_SECURE ?? false,
			user: e.SMTP_USER ?? null,
			pass: e.SMTP_PASS ?? null,
			from: e.MAIL_FROM ?? 'Kickpanel <no-reply@kickpanel.test>',
			capturePort,
			captureDir: e.MAIL_CAPTURE_DIR ?? '.data/outbox',
			/** How often each app server looks for queued mail that is due. */
			queueIntervalMs: e.MAIL_QUEUE_INTERVAL_MS ?? 15_000
		},
		vin: {
			/** Unset: the local fake decoder answers. */
			configuredUrl: e.VIN_DECODE_URL ?? null,
			url: (e.VIN_DECODE_URL ?? `http://127.0.0.1:${vinFakePort}`).replace(/\/+$/, ''),
			timeoutMs: e.VIN_DECODE_TIMEOUT_MS ?? 2_000,
			apiKey: e.VIN_DECODE_KEY ?? null,
			fakePort: vinFakePort
		}
	};
}

export type Config = ReturnType<typeof readConfig>;

/** This process's settings. Tests may point a section elsewhere (a database, a mail capture) before use. */
export const config: Config = readConfig();

/** Shortest AUTH_SECRET a production server accepts: 32 characters of base64 carry 192 bits. */
export const MIN_AUTH_SECRET_LENGTH = 32;
const MAKE_A_SECRET = 'set it to a long random value (for example `openssl rand -base64 32`), or run `npm start`, which generates one into .data/auth-secret.';

/** The session secret; the app refuses to start without one (or, in production, with a short one) rather than sign guessable sessions. */
export function authSecret(settings: Pick<Config, 'auth'> = config): string {
	const { secret, requireStrongSecret } = settings.auth;
	if (!secret) throw new ConfigError([`AUTH_SECRET is not set. It signs and encrypts sessions: ${MAKE_A_SECRET}`]);
	if (requireStrongSecret && secret.length < MIN_AUTH_SECRET_LENGTH) {
		throw new ConfigError([`AUTH_SECRET is ${secret.length} characters long; a production server needs at least ${MIN_AUTH_SECRET_LENGTH}: ${MAKE_A_SECRET}`]);
	}
	return secret;
}
