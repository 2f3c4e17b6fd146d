import { config } from './config';

/**
 * A small in-process cache with a time limit. Writes made by this process clear the entries they touch
 * at once; the time limit bounds how stale an entry can be after another instance's write. Entries are
 * kept in the order they were set, so expired ones are dropped from the front as new ones come in: a
 * cache whose keys seldom repeat (one page after another) does not grow to its limit with dead entries.
 */
export function ttlCache<K, V>(ttlMs: number, limit = 10_000) {
	const entries = new Map<K, { value: V; until: number }>();
	const dropExpired = (now: number) => {
		for (const [key, entry] of entries) {
			if (entry.until >= now) break;
			entries.delete(key);
		}
	};
	return {
		get(key: K): V | undefined {
			const hit = entries.get(key);
			if (!hit) return undefined;
			if (hit.until < Date.now()) {
				entries.delete(key);
				return undefined;
			}
			return hit.value;
		},
		set(key: K, value: V): V {
			const now = Date.now();
			dropExpired(now);
			entries.delete(key);
			if (entries.size >= limit) entries.delete(entries.keys().next().value as K);
			entries.set(key, { value, until: now + ttlMs });
			return value;
		},
		delete(key: K) {
			entries.delete(key);
		},
		clear() {
			entries.clear();
		},
		get size() {
			return entries.size;
		}
	};
}

/**
 * A cache of pending or settled look-ups: concurrent requests for one key share a single query,
 * and a failed look-up is not kept. A settled look-up is kept as its value, never as its promise: a
 * promise carries the async context of the request that made it, and keeping one would keep that whole
 * request (its event, its rendered page) alive for as long as the entry stays.
 */
export function lookupCache<K, V>(ttlMs: number, limit = 10_000) {
	const settled = ttlCache<K, { value: V }>(ttlMs, limit);
	const inFlight = new Map<K, Promise<V>>();
	return {
		get(key: K, load: () => Promise<V>): Promise<V> {
			const hit = settled.get(key);
			if (hit) return Promise.resolve(hit.value);
			const running = inFlight.get(key);
			if (running) return running;
			// A look-up cleared or deleted while it ran still answers its callers but is not kept.
			const pending: Promise<V> = load().then(
				(value) => {
					if (inFlight.get(key) === pending) {
						inFlight.delete(key);
						settled.set(key, { value });
					}
					return value;
				},
				(err: unknown) => {
					if (inFlight.get(key) === pending) inFlight.delete(key);
					throw err;
				}
			);
			inFlight.set(key, pending);
			return pending;
		},
		delete(key: K) {
			settled.delete(key);
			inFlight.delete(key);
		},
		clear() {
			settled.clear();
			inFlight.clear();
		},
		/** Settled entries kept, expired or not yet dropped. */
		get size() {
			return settled.size;
		}
	};
}

/** How long another instance's change can take to show here (role, block, page row, watch, trust marks). */
export const SHARED_STATE_TTL_MS = config.sharedStateTtlMs;
