import { z } from 'zod';
import type { Transaction } from 'sequelize';
import { AccountToken, User } from '../db/models';
import { db } from '../db';
import { config } from '../config';
import { hashPassword } from '../auth/password';
import { newToken, revokeOpenTokens, usableToken } from './accountTokens';
import { acceptInviteSchema } from './invites';
import { emailSchema } from './users';
import { recordAudit } from './audit';
import { ServiceError, invalidInput } from '../errors';

// An install starts with nobody in it; the person who starts it gets a short-lived, single-use link that makes
// the first admin. Only its hash is stored, and it stops working as soon as any active admin exists.
export const SETUP_LIFETIME_MS = 60 * 60 * 1000;
export const SETUP_UNUSABLE = 'This setup link has expired, was replaced by a newer one, or was already used. Restart Kickpanel for a new one, or use `npm run user:create`.';

export const setupSchema = z.object({ email: emailSchema }).and(acceptInviteSchema);

async function hasActiveAdmin(transaction?: Transaction): Promise<boolean> {
	return (await User.count({ where: { role: 'admin', status: 'active' }, transaction })) > 0;
}

/** A new setup link while the install has no active admin (older ones stop working); null once it has one. */
export async function issueSetupLink(now = new Date()): Promise<{ link: string; expiresAt: Date } | null> {
	const { token, tokenHash } = newToken();
	const expiresAt = new Date(now.getTime() + SETUP_LIFETIME_MS);
	const issued = await db().transaction(async (transaction) => {
		if (await hasActiveAdmin(transaction)) return false;
		await revokeOpenTokens('setup', {}, now, transaction);
		await AccountToken.create({ kind: 'setup', email: null, role: 'admin', invitedBy: null, userId: null, tokenHash, expiresAt, createdAt: now }, { transaction });
		return true;
	});
	return issued ? { link: `${config.origin}/setup/${token}`, expiresAt } : null;
}

export async function setupLinkWorks(token: string, now = new Date()): Promise<boolean> {
	return !!(await usableToken('setup', token, now)) && !(await hasActiveAdmin());
}

/** Makes the first admin from the setup form: name, e-mail and password. */
export async function completeSetup(token: string, input: unknown, now = new Date()): Promise<{ email: string; userId: number }> {
	const parsed = setupSchema.safeParse(input);
	if (!parsed.success) invalidInput(parsed.error);
	// A dead link is refused before the slow password hash.
	if (!(await usableToken('setup', token, now))) throw new ServiceError(SETUP_UNUSABLE, 404);
	const passwordHash = await hashPassword(parsed.data.password);
	return db().transaction(async (transaction) => {
		const link = await usableToken('setup', token, now, { transaction, lock: true });
		if (!link || (await hasActiveAdmin(transaction))) throw new ServiceError(SETUP_UNUSABLE, 404);
		const { email, name } = parsed.data;
		if (await User.findOne({ where: { email }, transaction })) {
			throw new ServiceError('Someone already has an account with that e-mail address.', 409, { email: 'This address already has an account.' });
		}
		const user = await User.create({ email, name, role: 'admin', passwordHash }, { transaction });
		await link.update({ usedAt: now, userId: user.id }, { transaction });
		await recordAudit({ actorId: null, action: 'user.create', targetType: 'user', targetId: user.id, details: { role: 'admin', setup: link.id } }, transaction);
		return { email, userId: user.id };
	});
}
