import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, freshDatabase } from '../helpers/database';
import { makeUser } from '../helpers/users';
import { linkToken, startTestOutbox, type TestOutbox } from '../helpers/mail';
import { db } from '../../src/lib/server/db';
import { EndedSession } from '../../src/lib/server/db/models';
import { activeSessionUser, changeRole, endSession, setUserStatus } from '../../src/lib/server/services/users';
import { invitationFor, inviteByEmail, pendingInvites } from '../../src/lib/server/services/invites';
import { SHARED_STATE_TTL_MS } from '../../src/lib/server/cache';
import type { SessionUser } from '../../src/lib/domain/sessionUser';

let outbox: TestOutbox;
let owner: SessionUser;
const inAnHour = () => Math.floor(Date.now() / 1000) + 3600;

beforeAll(async () => {
	await freshDatabase('sessions');
	outbox = await startTestOutbox();
	owner = await makeUser('admin', 'Owner Sample');
});
afterAll(async () => {
	await outbox.stop();
	await closeDb();
});

describe('signing out', () => {
	it('ends that session, and only that one, even for a copy of its cookie', async () => {
		const fitter = await makeUser('editor');
		const laptop = randomUUID();
		const phone = randomUUID();
		expect(await activeSessionUser(fitter.id, 1, laptop)).not.toBeNull();

		await endSession({ uid: fitter.id, sid: laptop, exp: inAnHour() });
		expect(await activeSessionUser(fitter.id, 1, laptop)).toBeNull();
		expect(await activeSessionUser(fitter.id, 1, phone)).toMatchObject({ id: fitter.id });
		// Signing out twice (two tabs) is not an error.
		await endSession({ uid: fitter.id, sid: laptop, exp: inAnHour() });
	});

	it('reaches this server within the shared-state bound when another app server records the sign-out', async () => {
		const fitter = await makeUser('viewer');
		const session = randomUUID();
		expect(await activeSessionUser(fitter.id, 1, session)).not.toBeNull();
		// Another server writes the row; nothing in this process announces it.
		await db().query('INSERT INTO ended_sessions (session_id, user_id, expires_at) VALUES (?, ?, ?)', {
			replacements: [session, fitter.id, new Date(Date.now() + 3600_000)]
		});
		await new Promise((resolve) => setTimeout(resolve, SHARED_STATE_TTL_MS + 50));
		expect(await activeSessionUser(fitter.id, 1, session)).toBeNull();
	});

	it('forgets ended sessions once their cookies would have expired anyway', async () => {
		const fitter = await makeUser('viewer');
		const old = randomUUID();
		await EndedSession.create({ sessionId: old, userId: fitter.id, expiresAt: new Date(Date.now() - 1000) });
		await endSession({ uid: fitter.id, sid: randomUUID(), exp: inAnHour() });
		expect(await EndedSession.findByPk(old)).toBeNull();
	});
});

describe('disabling an account and changing a role', () => {
	it('ends every session of a disabled person, and enabling the account again does not bring them back', async () => {
		const fitter = await makeUser('editor');
		expect(await activeSessionUser(fitter.id, 1, randomUUID())).not.toBeNull();
		await setUserStatus(fitter.id, 'disabled', owner.id);
		await setUserStatus(fitter.id, 'active', owner.id);
		expect(await activeSessionUser(fitter.id, 1, randomUUID())).toBeNull();
	});

	it('ends every session of a person whose role changes, promotion included', async () => {
		const fitter = await makeUser('viewer');
		await changeRole(fitter.id, 'editor', owner.id);
		expect(await activeSessionUser(fitter.id, 1, randomUUID())).toBeNull();
	});
});

describe('invitations from someone who may no longer invite', () => {
	async function inviteFrom(admin: SessionUser, email: string): Promise<string> {
		await inviteByEmail({ email, role: 'editor' }, admin);
		return linkToken((await outbox.to(email))[0], 'invite');
	}

	it('revokes the pending invitations of an admin who is demoted, and keeps other admins’ ones', async () => {
		const leaving = await makeUser('admin');
		const staying = await makeUser('admin');
		const fromLeaving = await inviteFrom(leaving, 'demoted-invitee@kickpanel.test');
		const fromStaying = await inviteFrom(staying, 'kept-invitee@kickpanel.test');

		await changeRole(leaving.id, 'moderator', owner.id);
		expect(await invitationFor(fromLeaving)).toBeNull();
		expect(await invitationFor(fromStaying)).toMatchObject({ email: 'kept-invitee@kickpanel.test' });
		expect((await pendingInvites()).map((i) => i.email)).not.toContain('demoted-invitee@kickpanel.test');
	});

	it('revokes the pending invitations of an admin whose account is disabled', async () => {
		const leaving = await makeUser('admin');
		const token = await inviteFrom(leaving, 'disabled-invitee@kickpanel.test');
		await setUserStatus(leaving.id, 'disabled', owner.id);
		await setUserStatus(leaving.id, 'active', owner.id);
		expect(await invitationFor(token)).toBeNull();
	});
});
