import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { closeDb, freshDatabase } from '../helpers/database';
import { makeUser } from '../helpers/users';
import { createUser, authenticate } from '../../src/lib/server/services/users';
import { accountWaitSeconds, ACCOUNT_FREE_TRIES, ACCOUNT_MAX_WAIT_SECONDS } from '../../src/lib/server/auth/throttle';
import { countLinkPost, newToken } from '../../src/lib/server/services/accountTokens';
import { resetPassword } from '../../src/lib/server/services/passwordReset';
import { acceptInvite } from '../../src/lib/server/services/invites';
import { ServiceError } from '../../src/lib/server/errors';

// Counts the slow password hashes the services ask for, without changing what they do.
const hashes = vi.hoisted(() => ({ count: 0 }));
vi.mock('../../src/lib/server/auth/password', async (importOriginal) => {
	const real = await importOriginal<typeof import('../../src/lib/server/auth/password')>();
	return {
		...real,
		hashPassword: (plain: string) => {
			hashes.count++;
			return real.hashPassword(plain);
		}
	};
});

beforeAll(() => freshDatabase('credentials'));
afterAll(() => closeDb());

describe('password guesses', () => {
	it('gives a burst of parallel wrong guesses no more tries than one at a time', async () => {
		await createUser({ email: 'burst@kickpanel.test', name: 'Burst Target', password: 'burst-pass-12', role: 'viewer' }, null);
		const answers = await Promise.all(Array.from({ length: 25 }, () => authenticate('burst@kickpanel.test', 'wrong-guess-00', '10.9.0.1')));
		const checked = answers.filter((a) => !a.ok && a.reason === 'invalid').length;
		// Five tries per account and address (the configured default).
		expect(checked).toBeLessThanOrEqual(5);
		expect(answers.filter((a) => !a.ok && a.reason === 'locked').length).toBeGreaterThanOrEqual(20);
	});

	it('slows guesses spread over many addresses without locking the person out of their usual device', async () => {
		await createUser({ email: 'owner2@kickpanel.test', name: 'Usual Device', password: 'usual-pass-12', role: 'editor' }, null);
		expect((await authenticate('owner2@kickpanel.test', 'usual-pass-12', '10.7.0.1')).ok).toBe(true);
		for (let i = 0; i < ACCOUNT_FREE_TRIES + 3; i++) await authenticate('owner2@kickpanel.test', 'wrong-guess-00', `10.8.${i}.1`);
		const stranger = await authenticate('owner2@kickpanel.test', 'usual-pass-12', '10.8.200.1');
		expect(stranger.ok).toBe(false);
		expect(stranger.ok === false && stranger.reason).toBe('locked');
		expect(stranger.ok === false && stranger.reason === 'locked' && stranger.retryAfterSeconds).toBeLessThanOrEqual(ACCOUNT_MAX_WAIT_SECONDS);
		expect((await authenticate('owner2@kickpanel.test', 'usual-pass-12', '10.7.0.1')).ok).toBe(true);
	});

	it('waits 1, 2, 4 … seconds after the free tries, never more than a minute', () => {
		// Doubling back-off (common practice); the cap keeps a colleague's wait short.
		expect([0, 1, 2, 3, 4].map((k) => accountWaitSeconds(ACCOUNT_FREE_TRIES + k))).toEqual([0, 1, 2, 4, 8]);
		expect(accountWaitSeconds(ACCOUNT_FREE_TRIES + 50)).toBe(60);
	});
});

describe('reset and invitation links', () => {
	it('refuses a made-up link before hashing the password it carries', async () => {
		const before = hashes.count;
		const form = { password: 'flood-pass-word', confirm: 'flood-pass-word', name: 'Nobody' };
		for (let i = 0; i < 10; i++) {
			await expect(resetPassword(newToken().token, form)).rejects.toMatchObject({ status: 404 });
			await expect(acceptInvite(newToken().token, form)).rejects.toMatchObject({ status: 404 });
		}
		expect(hashes.count).toBe(before);
	});

	it('counts posts to link pages per address and answers 429 past the limit', async () => {
		await makeUser('viewer');
		for (let i = 0; i < 20; i++) await countLinkPost('10.6.0.1');
		const refused = await countLinkPost('10.6.0.1').catch((e) => e);
		expect(refused).toBeInstanceOf(ServiceError);
		expect(refused.status).toBe(429);
		expect(refused.message).toMatch(/Too many tries from this device/);
		await expect(countLinkPost('10.6.0.2')).resolves.toBeUndefined();
	});
});

describe('a shop signing in all day', () => {
	it('never locks an address or an account for tries that succeeded', async () => {
		await createUser({ email: 'busy@kickpanel.test', name: 'Busy Counter', password: 'busy-pass-123', role: 'viewer' }, null);
		// More successful sign-ins from one address than the per-address and per-account limits allow failures.
		for (let i = 0; i < 30; i++) expect((await authenticate('busy@kickpanel.test', 'busy-pass-123', '10.5.0.1')).ok).toBe(true);
		for (let i = 0; i < 25; i++) expect((await authenticate('busy@kickpanel.test', 'busy-pass-123', `10.5.1.${i}`)).ok).toBe(true);
	});
});
