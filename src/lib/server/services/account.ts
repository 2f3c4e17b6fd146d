import { z } from 'zod';
import { User } from '../db/models';
import { hashPassword, verifyPassword } from '../auth/password';
import { beginSignInAttempt, forgiveSignInTries, waitWords } from '../auth/throttle';
import type { SessionUser } from '../../domain/sessionUser';
import { newUserSchema } from './users';
import { announceAccountChange } from '../events';
import { ServiceError, invalidInput } from '../errors';

export const nameSchema = z.object({ name: newUserSchema.shape.name });

export async function changeName(userId: number, input: unknown): Promise<string> {
	const parsed = nameSchema.safeParse(input);
	if (!parsed.success) invalidInput(parsed.error);
	await User.update({ name: parsed.data.name }, { where: { id: userId } });
	announceAccountChange(userId);
	return parsed.data.name;
}

export const passwordChangeSchema = z
	.object({
		current: z.string({ error: 'Enter your current password.' }).min(1, 'Enter your current password.'),
		password: newUserSchema.shape.password,
		confirm: z.string({ error: 'Type the new password again.' })
	})
	.refine((v) => v.password === v.confirm, { path: ['confirm'], message: 'The two new passwords are not the same; type them again.' });

/** Needs the current password (its tries count with sign-in tries); changes the password and ends every session signed in with the old one; returns the new session version for this device. */
export async function changePassword(user: SessionUser, input: unknown, clientAddress: string): Promise<number> {
	const parsed = passwordChangeSchema.safeParse(input);
	if (!parsed.success) invalidInput(parsed.error);
	const throttle = await beginSignInAttempt(user.email, clientAddress);
	if (throttle.locked) throw new ServiceError(`Too many wrong passwords. Wait ${waitWords(throttle.retryAfterSeconds)} and try again.`, 403);
	const row = await User.findByPk(user.id);
	if (!row) throw new ServiceError('Your account no longer exists.', 404);
	if (!(await verifyPassword(parsed.data.current, row.passwordHash))) {
		throw new ServiceError('That is not your current password.', 400, { current: 'That is not your current password.' });
	}
	await forgiveSignInTries(user.email, clientAddress);
	const sessionVersion = row.sessionVersion + 1;
	await row.update({ passwordHash: await hashPassword(parsed.data.password), sessionVersion });
	announceAccountChange(user.id);
	return sessionVersion;
}
