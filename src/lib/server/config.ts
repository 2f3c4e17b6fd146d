// Every setting comes from the environment, with defaults that match scripts/db.sh and scripts/services.ts.
const env = process.env;

function int(name: string, fallback: number): number {
	const raw = env[name];
	if (raw === undefined || raw === '') return fallback;
	const n = Number(raw);
	if (!Number.isInteger(n)) throw new Error(`${name} must be a whole number, got "${raw}"`);
	return n;
}

export const config = {
	production: env.NODE_ENV === 'production' && env.KICKPANEL_DEV_TOOLS !== '1',
	db: {
		host: env.DB_HOST ?? '127.0.0.1',
		port: int('DB_PORT', 3307),
		name: env.DB_NAME ?? 'kickpanel',
		user: env.DB_USER ?? 'kickpanel',
		password: env.DB_PASSWORD ?? 'kickpanel-local',
		poolMax: int('DB_POOL_MAX', 10)
	},
	auth: {
		// With ORIGIN fixed by the operator, the request host is never taken from the client.
		trustHost: env.AUTH_TRUST_HOST === 'true' || env.AUTH_TRUST_HOST === '1' || !!env.ORIGIN,
		maxFailuresPerAccount: int('AUTH_MAX_FAILURES_ACCOUNT', 5),
		maxFailuresPerAddress: int('AUTH_MAX_FAILURES_ADDRESS', 20),
		lockoutSeconds: int('AUTH_LOCKOUT_SECONDS', 15 * 60)
	},
	origin: env.ORIGIN ?? 'http://127.0.0.1:3000',
	/** Memory for whole rendered pages kept for repeat views (see render/pageMemo.ts); 0 turns it off. */
	pageMemoBytes: int('PAGE_MEMO_MB', 64) * 1024 * 1024
};
