import { z } from 'zod';
import { Op } from 'sequelize';
import { db } from '../db';
import { AccountToken, User } from '../db/models';
import { ROLES, roleAtLeast, type Role } from '../../domain/roles';
import { hashPassword } from '../auth/password';
import type { SessionUser } from '../../domain/sessionUser';
import { config } from '../config';
import { deliverQueuedMail, queueMail } from '../mail/queue';
import { inviteMail } from '../mail/templates';
import { emailSchema, newUserSchema } from './users';
import { newToken, revokeOpenTokens, usableToken } from './accountTokens';
import { shopSettings } from './settings';
import { recordAudit } from './audit';
import { ServiceError, invalidInput } from '../errors';

export const INVITE_LIFETIME_MS = 7 * 24 * 60 * 60 * 1000;

export const inviteSchema = z.object({
	email: emailSchema,
	role: z.enum(ROLES, { error: `Choose a role: ${ROLES.join(', ')}.` })
});

export const acceptInviteSchema = z
	.object({
		name: newUserSchema.shape.name,
		password: newUserSchema.shape.password,
		confirm: z.string({ error: 'Type the password again.' })
	})
	.refine((v) => v.password === v.confirm, { path: ['confirm'], message: 'The two passwords are not the same; type them again.' });

/**
 * Mails a single-use link that lets the person choose their name and password. No user row exists until the
 * link is used, so nobody can sign in as an invited address before that. Inviting again revokes the older link.
 */
export async function inviteByEmail(input: unknown, admin: SessionUser, now = new Date()): Promise<{ email: string; role: Role; expiresAt: Date; sent: boolean }> {
	if (!roleAtLeast(admin.role, 'admin')) throw new ServiceError('Inviting staff needs the admin role.', 403);
	const parsed = inviteSchema.safeParse(input);
	if (!parsed.success) invalidInput(parsed.error);
	const { email, role } = parsed.data;
	const { token, tokenHash } = newToken();
	const expiresAt = new Date(now.getTime() + INVITE_LIFETIME_MS);
	const shop = await shopSettings();
	const mailId = await db().transaction(async (transaction) => {
		if (await User.findOne({ where: { email }, transaction })) {
			throw new ServiceError('Someone already has an account with that e-mail address.', 409, { email: 'This address already has an account.' });
		}
		const replaced = await revokeOpenTokens('invite', { email }, now, transaction);
		const created = await AccountToken.create(
			{ kind: 'invite', email, role, invitedBy: admin.id, userId: null, tokenHash, expiresAt, createdAt: now },
			{ transaction }
		);
		await recordAudit({ actorId: admin.id, action: 'user.invite', targetType: 'invite', targetId: created.id, details: { email, role, replaced } }, transaction);
		// The link and its mail land together: a mail server that is down delays the mail, it never loses it.
		return queueMail({ to: email, ...inviteMail({ shopName: shop.shopName, inviterName: admin.name, role, link: `${config.origin}/invite/${token}`, expiresAt, timeZone: shop.timeZone }) }, transaction);
	});
	const { sent } = await deliverQueuedMail({ ids: [mailId] });
	return { email, role, expiresAt, sent: sent.includes(mailId) };
}

export type PendingInvite = { id: number; email: string; role: Role; invitedBy: string; createdAt: string; expiresAt: string };

export async function pendingInvites(now = new Date()): Promise<PendingInvite[]> {
	const rows = await AccountToken.findAll({
		where: { kind: 'invite', usedAt: null, revokedAt: null, expiresAt: { [Op.gt]: now } },
		order: [['createdAt', 'DESC']]
	});
	const inviterIds = [...new Set(rows.map((r) => r.invitedBy).filter((id): id is number => id !== null))];
	const inviters = new Map((await User.findAll({ where: { id: inviterIds }, attributes: ['id', 'name'] })).map((u) => [u.id, u.name]));
	return rows.map((r) => ({
		id: r.id,
		email: r.email ?? '',
		role: r.role ?? 'viewer',
		invitedBy: (r.invitedBy && inviters.get(r.invitedBy)) || 'unknown',
		createdAt: r.createdAt.toISOString(),
		expiresAt: r.expiresAt.toISOString()
	}));
}

export async function revokeInvite(inviteId: number, admin: SessionUser, now = new Date()): Promise<void> {
	if (!roleAtLeast(admin.role, 'admin')) throw new ServiceError('Revoking an invitation needs the admin role.', 403);
	await db().transaction(async (transaction) => {
		const row = await AccountToken.findOne({ where: { id: inviteId, kind: 'invite' }, transaction, lock: transaction.LOCK.UPDATE });
		if (!row) throw new ServiceError('That invitation does not exist.', 404);
		if (row.usedAt) throw new ServiceError('That invitation was already accepted; disable the account instead.', 409);
		if (row.revokedAt) return;
		await row.update({ revokedAt: now }, { transaction });
		await recordAudit({ actorId: admin.id, action: 'user.invite.revoke', targetType: 'invite', targetId: row.id, details: { email: row.email } }, transaction);
	});
}

/** What the invitation page shows before the person accepts; null when the link no longer works. */
export async function invitationFor(token: string, now = new Date()): Promise<{ email: string; role: Role } | null> {
	const row = await usableToken('invite', token, now);
	return row ? { email: row.email ?? '', role: row.role ?? 'viewer' } : null;
}

export const INVITE_UNUSABLE = 'This invitation link has expired, was replaced by a newer one, or was already used. Ask your admin to send a new one.';

export async function acceptInvite(token: string, input: unknown, now = new Date()): Promise<{ email: string; userId: number }> {
	const parsed = acceptInviteSchema.safeParse(input);
	if (!parsed.success) invalidInput(parsed.error);
	// A dead link is refused before the slow password hash, so made-up tokens cost next to nothing.
	if (!(await usableToken('invite', token, now))) throw new ServiceError(INVITE_UNUSABLE, 404);
	const passwordHash = await hashPassword(parsed.data.password);
	return db().transaction(async (transaction) => {
		// The row lock makes two tabs racing on one link end with one account and one refusal.
		const invite = await usableToken('invite', token, now, { transaction, lock: true });
		if (!invite || !invite.email || !invite.role) throw new ServiceError(INVITE_UNUSABLE, 404);
		if (await User.findOne({ where: { email: invite.email }, transaction })) {
			throw new ServiceError('An account with this e-mail address already exists. Sign in, or reset its password.', 409);
		}
		const user = await User.create({ email: invite.email, name: parsed.data.name, role: invite.role, passwordHash }, { transaction });
		await invite.update({ usedAt: now, userId: user.id }, { transaction });
		await recordAudit(
			{ actorId: invite.invitedBy, action: 'user.create', targetType: 'user', targetId: user.id, details: { role: invite.role, invite: invite.id } },
			transaction
		);
		return { email: user.email, userId: user.id };
	});
}
