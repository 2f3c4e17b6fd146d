import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, freshDatabase } from '../helpers/database';
import { AuditLog, User } from '../../src/lib/server/db/models';
import { activeSessionUser, authenticate, changeRole, createUser, setUserStatus, UserError } from '../../src/lib/server/services/users';
import { SharedLimiter } from '../../src/lib/server/auth/sharedLimiter';
import { db } from '../../src/lib/server/db';
import { SAMPLE_SESSION } from '../helpers/users';

beforeAll(() => freshDatabase('users'));
afterAll(() => closeDb());

describe('staff accounts', () => {
	it('creates a user with a bcrypt hash, never the plain password', async () => {
		const u = await createUser({ email: 'Counter@Kickpanel.test', name: 'Counter One', password: 'counter-pass-1', role: 'viewer' }, null);
		expect(u.email).toBe('counter@kickpanel.test');
		const row = await User.findByPk(u.id);
		expect(row!.passwordHash).toMatch(/^\$2[aby]\$10\$/);
		expect(row!.passwordHash).not.toContain('counter-pass-1');
	});

	it('refuses a second account with the same e-mail', async () => {
		await expect(
			createUser({ email: 'counter@kickpanel.test', name: 'Again', password: 'counter-pass-1', role: 'viewer' }, null)
		).rejects.toThrow(UserError);
	});

	it('signs in with the right password and gives the same answer for a wrong password or an unknown e-mail', async () => {
		expect((await authenticate('counter@kickpanel.test', 'counter-pass-1', '10.0.0.1')).ok).toBe(true);
		const wrong = await authenticate('counter@kickpanel.test', 'nope-nope-nope', '10.0.0.1');
		const unknown = await authenticate('nobody@kickpanel.test', 'nope-nope-nope', '10.0.0.1');
		expect(wrong).toEqual({ ok: false, reason: 'invalid' });
		expect(unknown).toEqual({ ok: false, reason: 'invalid' });
	});

	it('locks one account from one address after repeated failures, even with the right password', async () => {
		await createUser({ email: 'target@kickpanel.test', name: 'Target', password: 'target-pass-1', role: 'editor' }, null);
		for (let i = 0; i < 5; i++) await authenticate('target@kickpanel.test', 'wrong-wrong-wrong', '10.1.0.1');
		const locked = await authenticate('target@kickpanel.test', 'target-pass-1', '10.1.0.1');
		expect(locked.ok).toBe(false);
		expect(locked.ok === false && locked.reason).toBe('locked');
		// The same person elsewhere is not locked out by those failures.
		expect((await authenticate('target@kickpanel.test', 'target-pass-1', '10.1.0.99')).ok).toBe(true);
	});

	it('locks a client address that tries many accounts', async () => {
		for (let i = 0; i < 20; i++) await authenticate(`spray${i}@kickpanel.test`, 'wrong-wrong-wrong', '10.2.0.1');
		const result = await authenticate('counter@kickpanel.test', 'counter-pass-1', '10.2.0.1');
		expect(result.ok === false && result.reason).toBe('locked');
	});

	it('records role changes and disables in the audit log, and the session loses access at once', async () => {
		const admin = await createUser({ email: 'owner@kickpanel.test', name: 'Owner', password: 'owner-pass-12', role: 'admin' }, null);
		const staff = await createUser({ email: 'staff@kickpanel.test', name: 'Staff', password: 'staff-pass-12', role: 'editor' }, null);
		expect((await activeSessionUser(staff.id, 1, SAMPLE_SESSION))?.role).toBe('editor');

		await changeRole(staff.id, 'viewer', admin.id);
		expect(await activeSessionUser(staff.id, 1, SAMPLE_SESSION)).toBeNull();
		expect((await activeSessionUser(staff.id, 2, SAMPLE_SESSION))?.role).toBe('viewer');

		await setUserStatus(staff.id, 'disabled', admin.id);
		expect(await activeSessionUser(staff.id, 2, SAMPLE_SESSION)).toBeNull();
		expect((await authenticate('staff@kickpanel.test', 'staff-pass-12', '10.3.0.1')).ok).toBe(false);

		const log = await AuditLog.findAll({ where: { targetId: String(staff.id) }, order: [['id', 'ASC']] });
		expect(log.map((l) => [l.action, JSON.parse(l.details)])).toEqual([
			['user.create', { role: 'editor' }],
			['user.role', { from: 'editor', to: 'viewer', revokedInvites: 0 }],
			['user.status', { from: 'active', to: 'disabled', revokedInvites: 0 }]
		]);
		expect(log[1].actorId).toBe(admin.id);
	});

	it('does not let an admin demote or disable themselves', async () => {
		const admin = await User.findOne({ where: { email: 'owner@kickpanel.test' } });
		await expect(changeRole(admin!.id, 'viewer', admin!.id)).rejects.toThrow(/own role/);
		await expect(setUserStatus(admin!.id, 'disabled', admin!.id)).rejects.toThrow(/own account/);
	});
});

describe('limits shared by every app instance', () => {
	// Two limiters with one prefix stand for the same limit in two app processes: both read MariaDB.
	const instance = () => new SharedLimiter({ keyPrefix: 'test-shared', points: 3, duration: 60 });

	it('counts uses made through either instance together', async () => {
		const a = instance();
		const b = instance();
		await a.penalty('k1');
		await b.penalty('k1');
		const seen = await a.get('k1');
		expect(seen).toMatchObject({ consumedPoints: 2, remainingPoints: 1 });
		expect(seen!.msBeforeNext).toBeGreaterThan(55_000);
		await b.consume('k1');
		await expect(a.consume('k1')).rejects.toMatchObject({ consumedPoints: 4, remainingPoints: 0 });
	});

	it('starts a fresh window once the last one has ended, and forgets on delete', async () => {
		const a = instance();
		await a.penalty('k2', 3);
		await db().query("UPDATE rate_limits SET expire_ms = 1 WHERE k = 'test-shared:k2'");
		expect(await a.get('k2')).toBeNull();
		expect(await a.penalty('k2')).toMatchObject({ consumedPoints: 1 });
		await a.delete('k2');
		expect(await a.get('k2')).toBeNull();
	});

	it('keeps counting correctly when many failures land at once', async () => {
		const a = instance();
		await Promise.all(Array.from({ length: 25 }, () => a.penalty('k3')));
		expect(await a.get('k3')).toMatchObject({ consumedPoints: 25 });
	});
});

