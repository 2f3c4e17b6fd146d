import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTransport } from 'nodemailer';
import { closeDb, freshDatabase } from '../helpers/database';
import { makeUser, SAMPLE_SESSION } from '../helpers/users';
import { linkToken, startTestOutbox, type TestOutbox } from '../helpers/mail';
import { AccountToken, AuditLog, User, Vehicle } from '../../src/lib/server/db/models';
import { activeSessionUser, authenticate, setUserStatus } from '../../src/lib/server/services/users';
import { acceptInvite, INVITE_LIFETIME_MS, invitationFor, inviteByEmail, revokeInvite } from '../../src/lib/server/services/invites';
import { requestPasswordReset, RESET_LIFETIME_MS, RESET_REQUESTED, resetLinkWorks, resetPassword } from '../../src/lib/server/services/passwordReset';
import { activeBlockFor, blockUser, liftBlock } from '../../src/lib/server/services/blocks';
import { changePassword } from '../../src/lib/server/services/account';
import { auditFilterSchema, listAudit } from '../../src/lib/server/services/audit';
import { createVehicle, saveRevision } from '../../src/lib/server/services/revisions';
import { requireRole } from '../../src/lib/server/auth/guard';
import type { SessionUser } from '../../src/lib/domain/sessionUser';
import { emptyContent } from '../../src/lib/domain/content/schema';
import { ServiceError } from '../../src/lib/server/errors';

let outbox: TestOutbox;
let admin: SessionUser;
let moderator: SessionUser;
const DAY_MS = 24 * 60 * 60 * 1000;

beforeAll(async () => {
	await freshDatabase('accounts');
	outbox = await startTestOutbox();
	admin = await makeUser('admin', 'Owner Sample');
	moderator = await makeUser('moderator', 'Lead Sample');
});
afterAll(async () => {
	await outbox.stop();
	await closeDb();
});

const locals = (user: SessionUser | null) => ({ user, units: 'metric' }) as App.Locals;

describe('invitations', () => {
	it('mails a single-use link; the account exists only once the person sets their name and password', async () => {
		await inviteByEmail({ email: 'New.Fitter@Kickpanel.test', role: 'editor' }, admin);
		expect(await User.findOne({ where: { email: 'new.fitter@kickpanel.test' } })).toBeNull();
		expect((await authenticate('new.fitter@kickpanel.test', 'anything-at-all', '10.20.0.1')).ok).toBe(false);

		const [mail] = await outbox.to('new.fitter@kickpanel.test');
		expect(mail.subject).toContain('Owner Sample');
		expect(mail.from).toContain('no-reply@kickpanel.test');
		expect(mail.envelope.to).toEqual(['new.fitter@kickpanel.test']);
		const token = linkToken(mail, 'invite');
		expect(mail.html).toContain(`/invite/${token}`);
		expect(mail.raw).toMatch(/^Content-Type: multipart\/alternative/m);

		// 32 random bytes in base64url are 43 characters (RFC 4648 §5); only the SHA-256 (FIPS 180-4, Node's crypto) is stored.
		expect(token).toHaveLength(43);
		const row = await AccountToken.findOne({ where: { kind: 'invite', email: 'new.fitter@kickpanel.test' } });
		expect(row!.tokenHash).toBe(createHash('sha256').update(token).digest('hex'));
		expect(JSON.stringify(row!.toJSON())).not.toContain(token);

		expect(await invitationFor(token)).toEqual({ email: 'new.fitter@kickpanel.test', role: 'editor' });
		const mismatch = await acceptInvite(token, { name: 'Fitter New', password: 'bay-three-lift', confirm: 'bay-three-lifts' }).catch((e) => e);
		expect(mismatch).toBeInstanceOf(ServiceError);
		expect(mismatch.fieldErrors.confirm).toMatch(/not the same/);

		const { userId } = await acceptInvite(token, { name: 'Fitter New', password: 'bay-three-lift', confirm: 'bay-three-lift' });
		const user = await User.findByPk(userId);
		expect(user).toMatchObject({ email: 'new.fitter@kickpanel.test', name: 'Fitter New', role: 'editor', status: 'active' });
		expect((await authenticate('new.fitter@kickpanel.test', 'bay-three-lift', '10.20.0.2')).ok).toBe(true);

		await expect(acceptInvite(token, { name: 'Again', password: 'bay-three-lift', confirm: 'bay-three-lift' })).rejects.toMatchObject({ status: 404 });
		expect(await invitationFor(token)).toBeNull();
		expect(await User.count({ where: { email: 'new.fitter@kickpanel.test' } })).toBe(1);
	});

	it('lets only the newest link work when the same address is invited twice', async () => {
		await inviteByEmail({ email: 'twice@kickpanel.test', role: 'viewer' }, admin);
		await inviteByEmail({ email: 'twice@kickpanel.test', role: 'moderator' }, admin);
		const [newest, older] = await outbox.to('twice@kickpanel.test');
		expect(await invitationFor(linkToken(older, 'invite'))).toBeNull();
		expect(await invitationFor(linkToken(newest, 'invite'))).toEqual({ email: 'twice@kickpanel.test', role: 'moderator' });
		await expect(acceptInvite(linkToken(older, 'invite'), { name: 'Old Link', password: 'long-enough-1', confirm: 'long-enough-1' })).rejects.toMatchObject({
			status: 404
		});
	});

	it('stops working after 7 days', async () => {
		const sentAt = new Date('2026-12-02T08:00:00.000Z');
		await inviteByEmail({ email: 'late@kickpanel.test', role: 'viewer' }, admin, sentAt);
		const token = linkToken((await outbox.to('late@kickpanel.test'))[0], 'invite');
		const deadline = sentAt.getTime() + INVITE_LIFETIME_MS;
		expect(INVITE_LIFETIME_MS).toBe(7 * DAY_MS);
		expect(await invitationFor(token, new Date(deadline - 1))).not.toBeNull();
		expect(await invitationFor(token, new Date(deadline))).toBeNull();
		await expect(acceptInvite(token, { name: 'Too Late', password: 'long-enough-1', confirm: 'long-enough-1' }, new Date(deadline + 1))).rejects.toMatchObject({
			status: 404
		});
		expect(await User.findOne({ where: { email: 'late@kickpanel.test' } })).toBeNull();
	});

	it('is for admins only, refuses an address that has an account, and can be revoked', async () => {
		await expect(inviteByEmail({ email: 'x@kickpanel.test', role: 'viewer' }, moderator)).rejects.toMatchObject({ status: 403 });
		await expect(inviteByEmail({ email: 'NEW.FITTER@kickpanel.test', role: 'viewer' }, admin)).rejects.toMatchObject({ status: 409 });
		const bad = await inviteByEmail({ email: 'not-an-address', role: 'boss' }, admin).catch((e) => e);
		expect(Object.keys(bad.fieldErrors).sort()).toEqual(['email', 'role']);

		await inviteByEmail({ email: 'revoked@kickpanel.test', role: 'viewer' }, admin);
		const token = linkToken((await outbox.to('revoked@kickpanel.test'))[0], 'invite');
		const row = await AccountToken.findOne({ where: { email: 'revoked@kickpanel.test', revokedAt: null } });
		await revokeInvite(row!.id, admin);
		expect(await invitationFor(token)).toBeNull();
	});
});

describe('password reset', () => {
	it('mails a link that sets a new password once and signs every session out', async () => {
		const user = await makeUser('editor', 'Reset Sample');
		expect(await activeSessionUser(user.id, 1, SAMPLE_SESSION)).not.toBeNull();

		const asked = await requestPasswordReset(user.email.toUpperCase(), '10.30.0.1');
		expect(asked).toMatchObject({ ok: true, message: RESET_REQUESTED });
		if (asked.ok) await asked.delivery;
		const [mail] = await outbox.to(user.email);
		expect(mail.subject).toMatch(/reset/i);
		expect(mail.text).toContain('Reset Sample');
		const token = linkToken(mail, 'reset');
		expect(await resetLinkWorks(token)).toBe(true);

		await resetPassword(token, { password: 'fresh-pass-word', confirm: 'fresh-pass-word' });
		expect(await activeSessionUser(user.id, 1, SAMPLE_SESSION)).toBeNull();
		expect(await activeSessionUser(user.id, 2, SAMPLE_SESSION)).not.toBeNull();
		expect((await authenticate(user.email, 'fresh-pass-word', '10.30.0.2')).ok).toBe(true);
		expect((await authenticate(user.email, 'test-password-123', '10.30.0.2')).ok).toBe(false);

		await expect(resetPassword(token, { password: 'another-pass-1', confirm: 'another-pass-1' })).rejects.toMatchObject({ status: 404 });
		expect(await resetLinkWorks(token)).toBe(false);
	});

	it('stops working after one hour, and a newer link replaces an older one', async () => {
		const user = await makeUser('viewer');
		const askedAt = new Date('2026-12-03T09:00:00.000Z');
		const first = await requestPasswordReset(user.email, '10.31.0.1', askedAt);
		if (first.ok) await first.delivery;
		const token = linkToken((await outbox.to(user.email))[0], 'reset');
		expect(RESET_LIFETIME_MS).toBe(60 * 60 * 1000);
		expect(await resetLinkWorks(token, new Date(askedAt.getTime() + RESET_LIFETIME_MS - 1))).toBe(true);
		expect(await resetLinkWorks(token, new Date(askedAt.getTime() + RESET_LIFETIME_MS))).toBe(false);
		await expect(
			resetPassword(token, { password: 'late-pass-word', confirm: 'late-pass-word' }, new Date(askedAt.getTime() + RESET_LIFETIME_MS + 1))
		).rejects.toMatchObject({ status: 404 });

		const second = await requestPasswordReset(user.email, '10.31.0.1', new Date(askedAt.getTime() + 10 * 60 * 1000));
		if (second.ok) await second.delivery;
		const [newest, older] = await outbox.to(user.email);
		expect(linkToken(older, 'reset')).toBe(token);
		const during = new Date(askedAt.getTime() + 20 * 60 * 1000);
		expect(await resetLinkWorks(token, during)).toBe(false);
		expect(await resetLinkWorks(linkToken(newest, 'reset'), during)).toBe(true);
	});

	it('gives the same answer for an unknown, a disabled and a known address, and mails only the known one', async () => {
		const known = await makeUser('viewer');
		const gone = await makeUser('viewer');
		await setUserStatus(gone.id, 'disabled', admin.id);
		const tokensBefore = await AccountToken.count({ where: { kind: 'reset' } });
		const answers = [];
		for (const email of ['nobody-here@kickpanel.test', gone.email, known.email]) {
			const r = await requestPasswordReset(email, '10.32.0.1');
			if (r.ok) await r.delivery;
			answers.push(r.ok ? { ok: r.ok, message: r.message } : r);
		}
		expect(answers[0]).toEqual(answers[1]);
		expect(answers[1]).toEqual(answers[2]);
		expect(await outbox.to('nobody-here@kickpanel.test')).toHaveLength(0);
		expect(await outbox.to(gone.email)).toHaveLength(0);
		expect(await outbox.to(known.email)).toHaveLength(1);
		expect(await AccountToken.count({ where: { kind: 'reset' } })).toBe(tokensBefore + 1);
	});

	it('limits requests per address asked for, alike for addresses with and without an account', async () => {
		const known = await makeUser('viewer');
		const results: Record<string, string[]> = { known: [], unknown: [] };
		for (let i = 0; i < 4; i++) {
			const k = await requestPasswordReset(known.email, `10.33.1.${i}`);
			const u = await requestPasswordReset('no-account@kickpanel.test', `10.33.2.${i}`);
			if (k.ok) await k.delivery;
			results.known.push(k.ok ? 'sent' : `${k.status}`);
			results.unknown.push(u.ok ? 'sent' : `${u.status}`);
		}
		expect(results.known).toEqual(['sent', 'sent', 'sent', '429']);
		expect(results.unknown).toEqual(results.known);
		expect(await outbox.to(known.email)).toHaveLength(3);
	});

	it('limits requests per client address across many e-mail addresses', async () => {
		const outcomes = [];
		for (let i = 0; i < 11; i++) {
			const r = await requestPasswordReset(`spray${i}@kickpanel.test`, '10.34.0.1');
			outcomes.push(r.ok ? 'sent' : r.status);
		}
		expect(outcomes.slice(0, 10).every((o) => o === 'sent')).toBe(true);
		expect(outcomes[10]).toBe(429);
	});

	it('answers a malformed address with a message, not a reset', async () => {
		expect(await requestPasswordReset('not an address', '10.35.0.1')).toMatchObject({ ok: false, status: 400, message: expect.stringMatching(/valid e-mail/) });
	});
});

describe('the next request of a disabled or blocked person', () => {
	it('finds no session for a disabled account', async () => {
		const staff = await makeUser('editor');
		expect(await activeSessionUser(staff.id, 1, SAMPLE_SESSION)).not.toBeNull();
		await setUserStatus(staff.id, 'disabled', admin.id);
		expect(await activeSessionUser(staff.id, 1, SAMPLE_SESSION)).toBeNull();
	});

	it('refuses a blocked editor with the reason and end date, at the guard and at the save itself', async () => {
		const writer = await makeUser('editor', 'Blocked Sample');
		const before = await activeSessionUser(writer.id, 1, SAMPLE_SESSION);
		expect(requireRole(locals(before), 'editor').id).toBe(writer.id);
		const created = await createVehicle(emptyContent({ make: 'Ossendra', model: 'Drift', yearFrom: 2011, yearTo: 2015, body: 'sedan' }), before!);

		const until = new Date(Date.now() + 3 * DAY_MS).toISOString().slice(0, 10);
		await blockUser(writer.id, { reason: 'Pasted a customer phone number into notes', until }, moderator);
		const session = await activeSessionUser(writer.id, 1, SAMPLE_SESSION);
		expect(session!.block).toEqual({ reason: 'Pasted a customer phone number into notes', until: `${until}T00:00:00.000Z` });

		let refusal: unknown;
		try {
			requireRole(locals(session), 'editor');
		} catch (err) {
			refusal = err;
		}
		expect(refusal).toMatchObject({ status: 403, body: { message: expect.stringContaining('customer phone number') } });
		expect((refusal as { body: { message: string } }).body.message).toContain(`${until} 00:00 UTC`);
		expect(() => requireRole(locals(session), 'moderator')).toThrow();
		expect(requireRole(locals(session), 'viewer').id).toBe(writer.id);

		// A session read before the block still cannot save: the service checks again.
		const content = emptyContent({ make: 'Ossendra', model: 'Drift', yearFrom: 2011, yearTo: 2015, body: 'sedan' });
		content.seats.notes = 'Under-seat tray is removable.';
		const vehicle = await Vehicle.findOne({ where: { slug: created.slug } });
		await expect(saveRevision(vehicle!.id, { baseRevisionId: created.revisionId, content, summary: 'x' }, before!)).rejects.toMatchObject({ status: 403 });
		await expect(createVehicle(emptyContent({ make: 'Ossendra', model: 'Crest', yearFrom: 2012, yearTo: 2016, body: 'sedan' }), before!)).rejects.toMatchObject({
			status: 403,
			message: expect.stringContaining('customer phone number')
		});

		expect(await activeBlockFor(writer.id, new Date(Date.parse(`${until}T00:00:00.000Z`) + 1))).toBeNull();
		expect(await liftBlock(writer.id, moderator)).toBe(true);
		expect((await activeSessionUser(writer.id, 1, SAMPLE_SESSION))!.block).toBeNull();
	});

	it('lets moderators block only lower roles, never themselves, and only until a later day', async () => {
		const peer = await makeUser('moderator');
		const tomorrow = new Date(Date.now() + DAY_MS).toISOString().slice(0, 10);
		await expect(blockUser(peer.id, { reason: 'test reason', until: tomorrow }, moderator)).rejects.toMatchObject({ status: 403 });
		await expect(blockUser(moderator.id, { reason: 'test reason', until: tomorrow }, moderator)).rejects.toMatchObject({ status: 403 });
		const viewer = await makeUser('viewer');
		const today = new Date().toISOString().slice(0, 10);
		const past = await blockUser(viewer.id, { reason: 'test reason', until: today }, moderator).catch((e) => e);
		expect(past.fieldErrors.until).toMatch(/after today/);
		const noReason = await blockUser(viewer.id, { reason: ' ', until: tomorrow }, moderator).catch((e) => e);
		expect(noReason.fieldErrors.reason).toMatch(/reason/);
		await blockUser(peer.id, { reason: 'admin may block a moderator', until: tomorrow }, admin);
		expect(await activeBlockFor(peer.id)).not.toBeNull();
	});
});

describe('account settings', () => {
	it('changes the password only with the current one', async () => {
		const me = await makeUser('viewer');
		const wrong = await changePassword(me, { current: 'not-my-password', password: 'new-pass-word-1', confirm: 'new-pass-word-1' }, '10.40.0.1').catch((e) => e);
		expect(wrong.fieldErrors.current).toMatch(/not your current password/);
		const before = (await User.findByPk(me.id))!.sessionVersion;
		const after = await changePassword(me, { current: 'test-password-123', password: 'new-pass-word-1', confirm: 'new-pass-word-1' }, '10.40.0.1');
		expect((await authenticate(me.email, 'new-pass-word-1', '10.40.0.2')).ok).toBe(true);
		// Sessions signed in before the change no longer count; one carrying the new version does.
		expect(after).toBe(before + 1);
		expect(await activeSessionUser(me.id, before, SAMPLE_SESSION)).toBeNull();
		expect(await activeSessionUser(me.id, after, SAMPLE_SESSION)).toMatchObject({ id: me.id });
	});
});

describe('audit log', () => {
	it('records invitations and blocks, filterable by person, action and day', async () => {
		const blocked = await User.findOne({ where: { name: 'Blocked Sample' } });
		const byPerson = await listAudit(auditFilterSchema.parse({ person: String(blocked!.id) }));
		expect(byPerson.items.map((e) => e.action)).toEqual(['user.unblock', 'user.block', 'user.create']);
		expect(byPerson.items[1]).toMatchObject({ actor: { id: moderator.id }, target: { type: 'user', label: 'Blocked Sample', href: `/users/${blocked!.id}` } });

		const invites = await listAudit(auditFilterSchema.parse({ action: 'user.invite' }));
		expect(invites.total).toBe(await AuditLog.count({ where: { action: 'user.invite' } }));
		expect(invites.items.every((e) => e.action === 'user.invite' && e.actor?.id === admin.id)).toBe(true);

		const today = new Date().toISOString().slice(0, 10);
		expect((await listAudit(auditFilterSchema.parse({ from: today, to: today }))).total).toBeGreaterThan(0);
		expect((await listAudit(auditFilterSchema.parse({ to: '2020-01-01' }))).total).toBe(0);
		expect(auditFilterSchema.safeParse({ from: '2026-12-05', to: '2026-12-01' }).success).toBe(false);
	});
});

describe('the local mail capture', () => {
	it('reads back a non-ASCII subject and body the way nodemailer encoded them', async () => {
		// nodemailer writes RFC 2047 encoded words and quoted-printable bodies; the capture must undo both.
		const transport = createTransport({ host: '127.0.0.1', port: outbox.capture.port, secure: false });
		await transport.sendMail({
			from: 'Kickpanel <no-reply@kickpanel.test>',
			to: 'reader@kickpanel.test',
			subject: 'Kabelführung – Türholm ✓',
			text: `Schwellerleiste lösen, dann Kabel durch die Tülle.\n${'Lange Zeile '.repeat(12)}`,
			html: '<p>Tülle <b>prüfen</b></p>'
		});
		transport.close();
		const [mail] = await outbox.to('reader@kickpanel.test');
		expect(mail.subject).toBe('Kabelführung – Türholm ✓');
		expect(mail.text).toBe(`Schwellerleiste lösen, dann Kabel durch die Tülle.\n${'Lange Zeile '.repeat(12)}`.trimEnd());
		expect(mail.html).toBe('<p>Tülle <b>prüfen</b></p>');
	});
});
