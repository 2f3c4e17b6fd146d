import { config } from './config';

/**
 * A small in-process cache with a time limit. Writes made by this process clear the entries they touch
 * at once; the time limit bounds how stale an entry can be after another instance's write.
 */
export function ttlCache<K, V>(ttlMs: number, limit = 10_000) {
	const entries = new Map<K, { value: V; until: number }>();
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
			if (entries.size >= limit) entries.delete(entries.keys().next().value as K);
			entries.set(key, { value, until: Date.now() + ttlMs });
			return value;
		},
		delete(key: K) {
			entries.delete(key);
		},
		clear() {
			entries.clear();
		}
	};
}

/**
 * A cache of pending or settled look-ups: concurrent requests for one key share a single query,
 * and a failed look-up is not kept.
 */
export function lookupCache<K, V>(ttlMs: number, limit = 10_000) {
	const cache = ttlCache<K, Promise<V>>(ttlMs, limit);
	return {
		get(key: K, load: () => Promise<V>): Promise<V> {
			const hit = cache.get(key);
			if (hit) return hit;
			const pending = load();
			pending.catch(() => cache.delete(key));
			return cache.set(key, pending);
		},
		delete: cache.delete,
		clear: cache.clear
	};
}

/** How long another instance's change can take to show here (role, block, page row, watch, trust marks). */
export const SHARED_STATE_TTL_MS = config.sharedStateTtlMs;
