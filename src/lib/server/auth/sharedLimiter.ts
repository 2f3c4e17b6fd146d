// A fixed-window counter kept in MariaDB, so limits hold across every app instance behind a load
// balancer. It answers with rate-limiter-flexible's RateLimiterRes, like the library's own stores.
import { QueryTypes } from 'sequelize';
import { RateLimiterRes } from 'rate-limiter-flexible';
import { db } from '../db';

type Row = { points: number; expire_ms: number | string };

/** Expired rows are swept now and then by the writes themselves. */
const SWEEP_EVERY = 200;
let writes = 0;

export class SharedLimiter {
	constructor(private readonly opts: { keyPrefix: string; points: number; duration: number }) {}

	private key(k: string) {
		return `${this.opts.keyPrefix}:${k}`.slice(0, 255);
	}

	/** The key's current window, or null when it has none (never counted, or the window ended). */
	private async read(key: string, now: number): Promise<RateLimiterRes | null> {
		const [row] = await db().query<Row>('SELECT points, expire_ms FROM rate_limits WHERE k = ?', { replacements: [key], type: QueryTypes.SELECT });
		if (!row) return null;
		const expire = Number(row.expire_ms);
		if (expire <= now) return null;
		const consumed = Number(row.points);
		return new RateLimiterRes(Math.max(this.opts.points - consumed, 0), expire - now, consumed);
	}

	get(k: string): Promise<RateLimiterRes | null> {
		return this.read(this.key(k), Date.now());
	}

	/**
	 * Adds points in the current window (a fresh window when the last one ended) and returns the count.
	 * `durationSeconds` sets the length of a window this call opens (default: the limiter's own).
	 */
	async penalty(k: string, points = 1, durationSeconds = this.opts.duration): Promise<RateLimiterRes> {
		const now = Date.now();
		const key = this.key(k);
		const expire = now + durationSeconds * 1000;
		await db().query(
			`INSERT INTO rate_limits (k, points, expire_ms) VALUES (?, ?, ?)
			 ON DUPLICATE KEY UPDATE points = IF(expire_ms <= ?, VALUES(points), points + VALUES(points)),
			                         expire_ms = IF(expire_ms <= ?, VALUES(expire_ms), expire_ms)`,
			{ replacements: [key, points, expire, now, now] }
		);
		if (++writes % SWEEP_EVERY === 0) void db().query('DELETE FROM rate_limits WHERE expire_ms <= ?', { replacements: [now] }).catch(() => undefined);
		return (await this.read(key, now)) ?? new RateLimiterRes(this.opts.points - points, durationSeconds * 1000, points);
	}

	/** Gives back points counted in the current window (never below zero). */
	async reward(k: string, points = 1): Promise<void> {
		await db().query('UPDATE rate_limits SET points = GREATEST(points - ?, 0) WHERE k = ? AND expire_ms > ?', {
			replacements: [points, this.key(k), Date.now()]
		});
	}

	/** Counts one use; rejects with the RateLimiterRes once the window's points are used up. */
	async consume(k: string): Promise<RateLimiterRes> {
		const res = await this.penalty(k, 1);
		if (res.consumedPoints > this.opts.points) throw res;
		return res;
	}

	async delete(k: string): Promise<void> {
		await db().query('DELETE FROM rate_limits WHERE k = ?', { replacements: [this.key(k)] });
	}
}
