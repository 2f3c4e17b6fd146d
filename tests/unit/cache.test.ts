import { AsyncLocalStorage } from 'node:async_hooks';
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { lookupCache, ttlCache } from '../../src/lib/server/cache';

setFlagsFromString('--expose-gc');
const collectGarbage = runInNewContext('gc') as () => void;

afterEach(() => {
	vi.useRealTimers();
});

describe('ttlCache', () => {
	it('answers within its time limit and forgets after it', () => {
		vi.useFakeTimers({ now: 0 });
		const cache = ttlCache<string, number>(1_000);
		cache.set('a', 1);
		vi.setSystemTime(999);
		expect(cache.get('a')).toBe(1);
		vi.setSystemTime(1_001);
		expect(cache.get('a')).toBeUndefined();
	});

	it('drops expired entries as new ones come in, so keys that never repeat do not pile up', () => {
		vi.useFakeTimers({ now: 0 });
		const cache = ttlCache<number, number>(1_000);
		for (let i = 0; i < 5_000; i++) {
			vi.setSystemTime(i); // one new key a millisecond
			cache.set(i, i);
		}
		// Only the last second's keys (and the one just set) are still held.
		expect(cache.size).toBeLessThanOrEqual(1_001);
		expect(cache.get(4_999)).toBe(4_999);
		expect(cache.get(3_000)).toBeUndefined();
	});

	it('setting a key again restarts its time and keeps the rest in expiry order', () => {
		vi.useFakeTimers({ now: 0 });
		const cache = ttlCache<string, number>(1_000);
		cache.set('a', 1);
		vi.setSystemTime(500);
		cache.set('b', 2);
		cache.set('a', 3);
		vi.setSystemTime(1_200);
		cache.set('c', 4);
		expect(cache.get('a')).toBe(3);
		expect(cache.get('b')).toBe(2);
	});

	it('stays within its entry limit', () => {
		const cache = ttlCache<number, number>(60_000, 3);
		for (let i = 0; i < 10; i++) cache.set(i, i);
		expect(cache.size).toBe(3);
		expect(cache.get(9)).toBe(9);
		expect(cache.get(0)).toBeUndefined();
	});
});

describe('lookupCache', () => {
	it('shares one look-up among concurrent callers and keeps its value', async () => {
		const cache = lookupCache<string, number>(60_000);
		const load = vi.fn(async () => 7);
		const [a, b] = await Promise.all([cache.get('k', load), cache.get('k', load)]);
		expect([a, b]).toEqual([7, 7]);
		expect(await cache.get('k', load)).toBe(7);
		expect(load).toHaveBeenCalledTimes(1);
	});

	it('does not keep a failed look-up', async () => {
		const cache = lookupCache<string, number>(60_000);
		await expect(cache.get('k', async () => Promise.reject(new Error('down')))).rejects.toThrow('down');
		expect(await cache.get('k', async () => 2)).toBe(2);
	});

	it('does not keep a look-up that was cleared while it ran', async () => {
		const cache = lookupCache<string, number>(60_000);
		let finish!: (n: number) => void;
		const running = cache.get('k', () => new Promise<number>((resolve) => (finish = resolve)));
		cache.clear();
		finish(1);
		expect(await running).toBe(1);
		expect(await cache.get('k', async () => 2)).toBe(2);
	});

	it('keeps a null answer (a page that does not exist) like any other', async () => {
		const cache = lookupCache<string, null>(60_000);
		const load = vi.fn(async () => null);
		await cache.get('k', load);
		expect(await cache.get('k', load)).toBeNull();
		expect(load).toHaveBeenCalledTimes(1);
	});

	it('does not keep alive the request a look-up was made in', async () => {
		// A request's async context holds its whole event; a cached promise made inside it would carry it along.
		const requests = new AsyncLocalStorage<{ page: Uint8Array }>();
		const cache = lookupCache<string, number>(60_000);
		const made = (() => {
			const request = { page: new Uint8Array(1024 * 1024) };
			const ref = new WeakRef(request);
			return { ref, answer: requests.run(request, () => cache.get('k', async () => 1)) };
		})();
		expect(await made.answer).toBe(1);
		delete (made as { answer?: unknown }).answer;
		await new Promise((resolve) => setTimeout(resolve, 0));
		collectGarbage();
		await new Promise((resolve) => setTimeout(resolve, 0));
		collectGarbage();
		expect(made.ref.deref()).toBeUndefined();
		expect(cache.size).toBe(1);
	});
});
