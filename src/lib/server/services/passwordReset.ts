import { logFailure } from '../observability/log';
import { z } from 'zod';
import { RateLimiterRes } from 'rate-limiter-flexible';
import { SharedLimiter } from '../auth/sharedLimiter';
import { db } from '../db';
import { AccountToken, User } from '../db/models';
import { hashPassword } from '../auth/password';
import { clearSignInFailures } from '../auth/throttle';
import { config } from '../config';
import { deliverQueuedMail, queueMail } from '../mail/queue';
import { resetMail } from '../mail/templates';
import { emailSchema, newUserSchema } from './users';
import { newToken, revokeOpenTokens, usableToken } from './accountTokens';
import { shopSettings } from './settings';
import { ServiceError, fieldMessages } from '../errors';
import { announceAccountChange } from '../events';

export const RESET_LIFETIME_MS = 60 * 60 * 1000;

// Requests are counted per address asked for and per client, whether or not the address has an account.
const perEmail = new SharedLimiter({ keyPrefix: 'reset-email', points: 3, duration: 60 * 60 });
const perClient = new SharedLimiter({ keyPrefix: 'reset-client', points: 10, duration: 60 * 60 });

/** The one answer to every well-formed request, so it never tells whether an address has an account. */
export const RESET_REQUESTED =
	'If that address belongs to an account here, a link to choose a new password is on its way. It works once, within one hour. Nothing arrived? Check the spam folder, or ask your admin.';

export type ResetRequestResult =
	| { ok: true; message: string; delivery: Promise<void> }
	| { ok: false; status: 400 | 429; message: string };

/**
 * Answers at once and looks the address up afterwards (`delivery`), so neither the words nor the time taken
 * differ between an address with an account and one without.
 */
export async function requestPasswordReset(emailInput: unknown, clientAddress: string, now = new Date()): Promise<ResetRequestResult> {
	const email = emailSchema.safeParse(emailInput);
	if (!email.success) return { ok: false, status: 400, message: email.error.issues[0].message };
	try {
		await perClient.consume(clientAddress);
		await perEmail.consume(email.data);
	} catch (err) {
		if (!(err instanceof RateLimiterRes)) throw err;
		const minutes = Math.max(1, Math.ceil(err.msBeforeNext / 60_000));
		return { ok: false, status: 429, message: `Too many reset requests. Try again in ${minutes} ${minutes === 1 ? 'minute' : 'minutes'}.` };
	}
	const delivery = mailResetLink(email.data, now).catch((err) => logFailure('password reset mail failed', err));
	return { ok: true, message: RESET_REQUESTED, delivery };
}

async function mailResetLink(email: string, now: Date): Promise<void> {
	const user = await User.findOne({ where: { email, status: 'active' } });
	if (!user) return;
	const { token, tokenHash } = newToken();
	const expiresAt = new Date(now.getTime() + RESET_LIFETIME_MS);
	const shop = await shopSettings();
	const mailId = await db().transaction(async (transaction) => {
		await revokeOpenTokens('reset', { userId: user.id }, now, transaction);
		await AccountToken.create({ kind: 'reset', userId: user.id, email: null, role: null, invitedBy: null, tokenHash, expiresAt, createdAt: now }, { transaction });
		return queueMail({ to: user.email, ...resetMail({ shopName: shop.shopName, name: user.name, link: `${config.origin}/reset/${token}`, expiresAt, timeZone: shop.timeZone }) }, transaction);
	});
	await deliverQueuedMail({ ids: [mailId] });
}

export const RESET_UNUSABLE = 'This reset link has expired, was replaced by a newer one, or was already used. Ask for a new link.';

export async function resetLinkWorks(token: string, now = new Date()): Promise<boolean> {
	return (await usableToken('reset', token, now)) !== null;
}

export const newPasswordSchema = z
	.object({ password: newUserSchema.shape.password, confirm: z.string({ error: 'Type the password again.' }) })
	.refine((v) => v.password === v.confirm, { path: ['confirm'], message: 'The two passwords are not the same; type them again.' });

/** Sets the new password and ends every session of that person (their session version moves on). */
export async function resetPassword(token: string, input: unknown, now = new Date()): Promise<{ email: string }> {
	const parsed = newPasswordSchema.safeParse(input);
	if (!parsed.success) {
		const fields = fieldMessages(parsed.error);
		throw new ServiceError(Object.values(fields)[0] ?? 'Check the form.', 400, fields);
	}
	// A dead link is refused before the slow password hash, so made-up tokens cost next to nothing.
	if (!(await usableToken('reset', token, now))) throw new ServiceError(RESET_UNUSABLE, 404);
	const passwordHash = await hashPassword(parsed.data.password);
	const { email, userId } = await db().transaction(async (transaction) => {
		const row = await usableToken('reset', token, now, { transaction, lock: true });
		const user = row?.userId ? await User.findByPk(row.userId, { transaction, lock: transaction.LOCK.UPDATE }) : null;
		if (!row || !user || user.status !== 'active') throw new ServiceError(RESET_UNUSABLE, 404);
		await user.update({ passwordHash, sessionVersion: user.sessionVersion + 1 }, { transaction });
		await row.update({ usedAt: now }, { transaction });
		await revokeOpenTokens('reset', { userId: user.id }, now, transaction);
		return { email: user.email, userId: user.id };
	});
	await clearSignInFailures(email);
	announceAccountChange(userId);
	return { email };
}
