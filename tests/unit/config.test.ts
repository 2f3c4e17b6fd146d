import { describe, expect, it } from 'vitest';
import { authSecret, ConfigError, readConfig } from '../../src/lib/server/config';

// Defaults are the ones README.md's configuration table documents.
describe('settings from the environment', () => {
	it('falls back to the documented defaults when nothing is set', () => {
		const settings = readConfig({});
		expect(settings.db).toEqual({ host: '127.0.0.1', port: 3307, name: 'kickpanel', user: 'kickpanel', password: 'kickpanel-local', poolMax: 10, replica: null });
		// No replica unless DB_REPLICA_PORT is set; logs at info; metrics on loopback 9464.
		expect(settings.logLevel).toBe('info');
		expect(settings.metricsPort).toBe(9464);
		expect(readConfig({ DB_REPLICA_PORT: '3328' }).db.replica).toEqual({ host: '127.0.0.1', port: 3328 });
		expect(readConfig({ METRICS_PORT: 'off' }).metricsPort).toBeNull();
		expect(settings.auth).toMatchObject({ maxFailuresPerAccount: 5, maxFailuresPerAddress: 20, lockoutSeconds: 900, trustHost: false });
		expect(settings.photos).toEqual({ maxBytes: 15_728_640, maxPixels: 60_000_000 });
		expect(settings.s3).toMatchObject({ endpoint: 'http://127.0.0.1:4569', bucket: 'kickpanel-photos', region: 'us-east-1', forcePathStyle: true });
		expect(settings.mail).toMatchObject({ host: '127.0.0.1', port: 2525, from: 'Kickpanel <no-reply@kickpanel.test>', captureDir: '.data/outbox' });
		expect(settings.searchPollMs).toBe(5_000);
		expect(settings.sharedStateTtlMs).toBe(2_000);
		expect(settings.pageMemoBytes).toBe(64 * 1024 * 1024);
	});

	it('treats an empty variable as unset, except a database password, which may be empty', () => {
		const settings = readConfig({ DB_PORT: '', DB_PASSWORD: '', S3_BUCKET: '' });
		expect(settings.db.port).toBe(3307);
		expect(settings.db.password).toBe('');
		expect(settings.s3.bucket).toBe('kickpanel-photos');
	});

	it('sends mail to the capture port unless SMTP_PORT names another', () => {
		expect(readConfig({ SMTP_CAPTURE_PORT: '2600' }).mail.port).toBe(2600);
		expect(readConfig({ SMTP_CAPTURE_PORT: '2600', SMTP_PORT: '587' }).mail.port).toBe(587);
	});

	it('uses the fake bucket keys only without a real endpoint', () => {
		expect(readConfig({}).s3.credentials).toEqual({ accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' });
		expect(readConfig({ S3_ENDPOINT: 'https://objects.example.test' }).s3.credentials).toBeUndefined();
		expect(readConfig({ S3_ENDPOINT: 'https://objects.example.test', S3_ACCESS_KEY_ID: 'k', S3_SECRET_ACCESS_KEY: 's' }).s3.credentials).toEqual({
			accessKeyId: 'k',
			secretAccessKey: 's'
		});
	});

	it('trusts the request host when the operator fixes ORIGIN or says so', () => {
		expect(readConfig({ ORIGIN: 'https://wiki.example.test' }).auth.trustHost).toBe(true);
		expect(readConfig({ AUTH_TRUST_HOST: 'true' }).auth.trustHost).toBe(true);
		expect(readConfig({ AUTH_TRUST_HOST: '0' }).auth.trustHost).toBe(false);
	});

	it('refuses bad values, naming every variable and what it holds', () => {
		let thrown: unknown;
		try {
			readConfig({ DB_PORT: '33o7', SMTP_SECURE: 'maybe', VIN_DECODE_URL: 'decoder', PAGE_MEMO_MB: '-1', PHOTO_MAX_BYTES: '1.5' });
		} catch (err) {
			thrown = err;
		}
		expect(thrown).toBeInstanceOf(ConfigError);
		const problems = (thrown as ConfigError).problems;
		expect(problems).toHaveLength(5);
		expect(problems).toContain('DB_PORT must be a whole number from 1 to 65535 (it is "33o7")');
		expect(problems).toContain('PAGE_MEMO_MB must be a whole number of at least 0 (it is "-1")');
		expect(problems.find((p) => p.startsWith('SMTP_SECURE'))).toContain('"maybe"');
		expect(problems.find((p) => p.startsWith('VIN_DECODE_URL'))).toContain('"decoder"');
		expect(problems.find((p) => p.startsWith('PHOTO_MAX_BYTES'))).toContain('"1.5"');
	});

	it('refuses a port out of range', () => {
		expect(() => readConfig({ DB_PORT: '70000' })).toThrow(/DB_PORT must be a whole number from 1 to 65535/);
	});

	it('has no session secret to offer when AUTH_SECRET is unset, and says how to set one', () => {
		expect(() => authSecret(readConfig({ NODE_ENV: 'production' }))).toThrow(/AUTH_SECRET is not set/);
		expect(() => authSecret(readConfig({ AUTH_SECRET: '' }))).toThrow(ConfigError);
		expect(authSecret(readConfig({ AUTH_SECRET: 'a-long-random-value' }))).toBe('a-long-random-value');
	});

	it('refuses a short AUTH_SECRET in production and names its length', () => {
		const short = 'a'.repeat(31);
		const long = 'a'.repeat(32);
		expect(() => authSecret(readConfig({ NODE_ENV: 'production', AUTH_SECRET: short }))).toThrow(/31 characters long.*at least 32/);
		expect(() => authSecret(readConfig({ NODE_ENV: 'production', AUTH_SECRET: 'secret' }))).toThrow(ConfigError);
		expect(authSecret(readConfig({ NODE_ENV: 'production', AUTH_SECRET: long }))).toBe(long);
		// Outside production a short one still works, for tests and a development server.
		expect(authSecret(readConfig({ AUTH_SECRET: short }))).toBe(short);
	});
});
