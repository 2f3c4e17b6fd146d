import { z } from 'zod';
import { db } from '../db';
import { Op, type Transaction } from 'sequelize';
import { AccountToken, EndedSession, ROLES, User, type Role } from '../db/models';
import { hashPassword, MIN_PASSWORD_LENGTH, verifyPassword } from '../auth/password';
import { beginSignInAttempt, forgiveSignInTries } from '../auth/throttle';
import type { SessionUser } from '../../domain/sessionUser';
import { recordAudit } from './audit';
import { SHARED_STATE_TTL_MS, lookupCache } from '../cache';
import { activeBlockFor } from './blocks';
import { announceAccountChange, onAccountChanged } from '../events';
import { ServiceError } from '../errors';

export const emailSchema = z
	.string({ error: 'Enter an e-mail address.' })
	.trim()
	.toLowerCase()
	.pipe(z.email({ error: 'Enter a valid e-mail address, like name@example.com.' }));

export const newUserSchema = z.object({
	email: emailSchema,
	// One line of text: a name lands in mail headers and subjects, where a line break would start a new header.
	name: z
		.string()
		.trim()
		.min(1, 'Enter a name.')
		.max(120, 'Keep the name under 120 characters.')
		.regex(/^[^\p{Cc}\p{Zl}\p{Zp}]*$/u, 'A name is one line of text, without line breaks or control characters.'),
	password: z
		.string()
		.min(MIN_PASSWORD_LENGTH, `Use at least ${MIN_PASSWORD_LENGTH} characters for the password.`)
		.max(200, 'Keep the password under 200 characters.'),
	role: z.enum(ROLES, { error: `Choose a role: ${ROLES.join(', ')}.` })
});
export type NewUser = z.infer<typeof newUserSchema>;

/** A refused account change, naming the field at fault when there is one. */
export class UserError extends ServiceError {
	constructor(
		message: string,
		readonly field?: string
	) {
		super(message, 400, field ? { [field]: message } : undefined);
	}
}

export function toSessionUser(u: User): SessionUser {
	return { id: u.id, email: u.email, name: u.name, role: u.role, units: u.units };
}

export async function createUser(input: NewUser, actorId: number | null): Promise<User> {
	const data = newUserSchema.parse(input);
	const passwordHash = await hashPassword(data.password);
	return db().transaction(async (transaction) => {
		const existing = await User.findOne({ where: { email: data.email }, transaction });
		if (existing) throw new UserError('Someone already has an account with that e-mail address.', 'email');
		const user = await User.create({ email: data.email, name: data.name, role: data.role, passwordHash }, { transaction });
		await recordAudit({ actorId, action: 'user.create', targetType: 'user', targetId: user.id, details: { role: data.role } }, transaction);
		return user;
	});
}

export function listUsers(): Promise<User[]> {
	return User.findAll({ order: [['name', 'ASC']] });
}

export async function changeRole(userId: number, role: Role, actorId: number): Promise<void> {
	await afterCommitForget(userId, () => db().transaction(async (transaction) => {
		const user = await User.findByPk(userId, { transaction, lock: transaction.LOCK.UPDATE });
		if (!user) throw new UserError('That user no longer exists.');
		if (user.role === role) return;
		if (user.id === actorId) throw new UserError('You cannot change your own role; ask another admin.');
		const from = user.role;
		// Signed-in sessions carry what the role allowed when they began: they end, on every app server.
		await user.update({ role, sessionVersion: user.sessionVersion + 1 }, { transaction });
		const revokedInvites = role === 'admin' ? 0 : await revokeInvitesFrom(user.id, transaction);
		await recordAudit({ actorId, action: 'user.role', targetType: 'user', targetId: user.id, details: { from, to: role, revokedInvites } }, transaction);
	}));
}

export async function setUserStatus(userId: number, status: 'active' | 'disabled', actorId: number): Promise<void> {
	await afterCommitForget(userId, () => db().transaction(async (transaction) => {
		const user = await User.findByPk(userId, { transaction, lock: transaction.LOCK.UPDATE });
		if (!user) throw new UserError('That user no longer exists.');
		if (user.status === status) return;
		if (user.id === actorId) throw new UserError('You cannot disable your own account.');
		const from = user.status;
		// A new session version means enabling the account again does not bring its old sessions back.
		await user.update({ status, sessionVersion: user.sessionVersion + 1 }, { transaction });
		const revokedInvites = status === 'disabled' ? await revokeInvitesFrom(user.id, transaction) : 0;
		await recordAudit({ actorId, action: 'user.status', targetType: 'user', targetId: user.id, details: { from, to: status, revokedInvites } }, transaction);
	}));
}

/** Invitations an admin sent and nobody has used yet stop working once that person may no longer invite. */
async function revokeInvitesFrom(userId: number, transaction: Transaction): Promise<number> {
	const now = new Date();
	const [count] = await AccountToken.update(
		{ revokedAt: now },
		{ where: { kind: 'invite', invitedBy: userId, usedAt: null, revokedAt: null, expiresAt: { [Op.gt]: now } }, transaction }
	);
	return count;
}

/** Runs a write, then drops the person's cached session so the next request reads the committed row. */
async function afterCommitForget<T>(userId: number, write: () => Promise<T>): Promise<T> {
	const result = await write();
	announceAccountChange(userId);
	return result;
}

type SessionSnapshot = { user: SessionUser; status: string; sessionVersion: number; endedSessions: Set<string> } | null;
const sessionSnapshots = lookupCache<number, SessionSnapshot>(SHARED_STATE_TTL_MS);

// Every write to a person's account, role, block or password announces it, so the next request sees it.
onAccountChanged((userId) => sessionSnapshots.delete(userId));

/**
 * The signed-in user for a session, read fresh so a disabled, demoted or blocked user is refused at once.
 * Another app server's sign-out, disable or role change reaches this one within SHARED_STATE_TTL_MS.
 */
export async function activeSessionUser(userId: number, sessionVersion: number, sessionId: string): Promise<SessionUser | null> {
	const snapshot = await sessionSnapshots.get(userId, async () => {
		const user = await User.findByPk(userId, { attributes: ['id', 'email', 'name', 'role', 'status', 'units', 'sessionVersion'] });
		if (!user) return null;
		const block = await activeBlockFor(user.id);
		const ended = await EndedSession.findAll({ where: { userId, expiresAt: { [Op.gt]: new Date() } }, attributes: ['sessionId'] });
		return {
			user: { ...toSessionUser(user), block: block ? { reason: block.reason, until: block.until } : null },
			status: user.status,
			sessionVersion: user.sessionVersion,
			endedSessions: new Set(ended.map((row) => row.sessionId))
		};
	});
	if (!snapshot || snapshot.status !== 'active' || snapshot.sessionVersion !== sessionVersion || snapshot.endedSessions.has(sessionId)) return null;
	return snapshot.user;
}

/** Signing out: this session stops working everywhere, though its cookie may live on in a copy. */
export async function endSession(claims: { uid: number; sid: string; exp: number }, now = new Date()): Promise<void> {
	await EndedSession.destroy({ where: { expiresAt: { [Op.lte]: now } } });
	await EndedSession.upsert({ sessionId: claims.sid, userId: claims.uid, expiresAt: new Date(claims.exp * 1000) });
	announceAccountChange(claims.uid);
}

export type SignInResult =
	| { ok: true; user: User }
	| { ok: false; reason: 'invalid' }
	| { ok: false; reason: 'locked'; retryAfterSeconds: number };

export async function authenticate(emailInput: unknown, password: unknown, address: string): Promise<SignInResult> {
	const email = emailSchema.safeParse(emailInput);
	if (!email.success || typeof password !== 'string' || password.length === 0 || password.length > 200) {
		return { ok: false, reason: 'invalid' };
	}
	const throttle = await beginSignInAttempt(email.data, address);
	if (throttle.locked) return { ok: false, reason: 'locked', retryAfterSeconds: throttle.retryAfterSeconds };
	const user = await User.findOne({ where: { email: email.data } });
	const matches = await verifyPassword(password, user?.passwordHash ?? null);
	if (!user || !matches || user.status !== 'active') return { ok: false, reason: 'invalid' };
	await forgiveSignInTries(email.data, address);
	return { ok: true, user };
}
