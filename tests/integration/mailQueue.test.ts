import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { closeDb, freshDatabase } from '../helpers/database';
import { freePort } from '../helpers/ports';
import { makeUser } from '../helpers/users';
import { linkToken, startTestOutbox, type TestOutbox } from '../helpers/mail';
import { db } from '../../src/lib/server/db';
import { config } from '../../src/lib/server/config';
import type { SessionUser } from '../../src/lib/domain/sessionUser';
import { inviteByEmail, invitationFor } from '../../src/lib/server/services/invites';
import { requestPasswordReset } from '../../src/lib/server/services/passwordReset';
import { createUser } from '../../src/lib/server/services/users';
import { CLAIM_MS, deliverQueuedMail, mailQueueDepth, queueMail, retryDelayMs } from '../../src/lib/server/mail/queue';

// A mail server that is down delays mail and loses none; a message is sent once even when two app servers
// look at the queue at the same moment.

let outbox: TestOutbox;
let admin: SessionUser;
let livePort = 0;
let deadPort = 0;


const queued = () =>
	db().query<{ id: number; recipient: string; attempts: number; sent_at: Date | null; last_error: string | null; message_id: string }>(
		'SELECT id, recipient, attempts, sent_at, last_error, message_id FROM mail_queue ORDER BY id',
		{ type: QueryTypes.SELECT }
	);

beforeAll(async () => {
	await freshDatabase('mailqueue');
	outbox = await startTestOutbox();
	livePort = config.mail.port;
	deadPort = await freePort();
	admin = await makeUser('admin', 'Owner Sample');
});
afterAll(async () => {
	config.mail.port = livePort;
	await outbox.stop();
	await closeDb();
});

describe('the mail queue', () => {
	it('keeps an invitation made while the mail server is down and sends it, once, when it is back', async () => {
		config.mail.port = deadPort;
		const made = await inviteByEmail({ email: 'bay.two@kickpanel.test', role: 'viewer' }, admin);
		expect(made.sent).toBe(false);
		const [row] = (await queued()).filter((r) => r.recipient === 'bay.two@kickpanel.test');
		expect(row).toMatchObject({ attempts: 1, sent_at: null });
		expect(row.last_error).toMatch(/could not be sent/);
		expect(await mailQueueDepth()).toBe(1);

		// Not due again before its retry time, even with the server back.
		config.mail.port = livePort;
		expect((await deliverQueuedMail()).sent).toEqual([]);
		const later = new Date(Date.now() + retryDelayMs(1) + 1);
		expect((await deliverQueuedMail({ now: later })).sent).toEqual([Number(row.id)]);
		expect((await deliverQueuedMail({ now: new Date(later.getTime() + 60 * 60_000) })).sent).toEqual([]);

		const mails = await outbox.to('bay.two@kickpanel.test');
		expect(mails).toHaveLength(1);
		expect(mails[0].raw).toContain(row.message_id);
		// The link in the late mail works.
		expect(await invitationFor(linkToken(mails[0], 'invite'))).toMatchObject({ email: 'bay.two@kickpanel.test', role: 'viewer' });
		expect(await mailQueueDepth()).toBe(0);
	});

	it('keeps a reset link asked for while the mail server is down', async () => {
		await createUser({ email: 'reset.sample@kickpanel.test', name: 'Reset Sample', password: 'test-password-123', role: 'editor' }, null);
		config.mail.port = deadPort;
		const asked = await requestPasswordReset('reset.sample@kickpanel.test', '198.51.100.7');
		expect(asked.ok).toBe(true);
		if (asked.ok) await asked.delivery;
		expect(await mailQueueDepth()).toBe(1);
		config.mail.port = livePort;
		await deliverQueuedMail({ now: new Date(Date.now() + retryDelayMs(1) + 1) });
		expect(await outbox.to('reset.sample@kickpanel.test')).toHaveLength(1);
	});

	it('queues nothing when the change asking for the mail is refused', async () => {
		const before = (await queued()).length;
		await expect(inviteByEmail({ email: 'reset.sample@kickpanel.test', role: 'viewer' }, admin)).rejects.toMatchObject({ status: 409 });
		expect((await queued()).length).toBe(before);
	});

	it('sends each message once when two servers deliver at the same moment', async () => {
		const ids: number[] = [];
		for (let i = 0; i < 12; i++) ids.push(await queueMail({ to: `race${i}@kickpanel.test`, subject: `Race ${i}`, text: 'Sample', html: '<p>Sample</p>' }));
		const [a, b, c] = await Promise.all([deliverQueuedMail(), deliverQueuedMail(), deliverQueuedMail()]);
		expect([...a.sent, ...b.sent, ...c.sent].sort((x, y) => x - y)).toEqual(ids);
		for (let i = 0; i < 12; i++) expect(await outbox.to(`race${i}@kickpanel.test`)).toHaveLength(1);
	});

	it('tries again a message whose server stopped mid-send, once its claim has run out', async () => {
		const id = await queueMail({ to: 'stopped@kickpanel.test', subject: 'Stopped', text: 'Sample', html: '<p>Sample</p>' });
		// Another server claimed it and stopped before sending.
		await db().query("UPDATE mail_queue SET claim = 'deadbeefdeadbeef', claimed_until = ? WHERE id = ?", { replacements: [new Date(Date.now() + CLAIM_MS), id] });
		expect((await deliverQueuedMail()).sent).toEqual([]);
		expect((await deliverQueuedMail({ now: new Date(Date.now() + CLAIM_MS + 1000) })).sent).toEqual([id]);
		expect(await outbox.to('stopped@kickpanel.test')).toHaveLength(1);
	});

	it('backs off 30 s, 1 min, 2 min … and never waits more than 30 minutes', () => {
		// The schedule stated on the admin screen: doubling from 30 s, capped at 30 min.
		expect([1, 2, 3, 4].map(retryDelayMs)).toEqual([30_000, 60_000, 120_000, 240_000]);
		expect(retryDelayMs(40)).toBe(30 * 60_000);
	});
});
