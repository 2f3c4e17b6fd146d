import { error } from '@sveltejs/kit';
import { roleAtLeast, type Role } from '../../domain/roles';
import { blockNotice } from '../../domain/block';
import type { SessionUser } from '../../domain/sessionUser';
import { ServiceError } from '../errors';

export function hasRole(user: SessionUser | null | undefined, role: Role): boolean {
	return roleAtLeast(user?.role, role);
}

/** The one permission check every action and endpoint calls; the UI hiding a button is not a check. */
export function requireRole(locals: App.Locals, role: Role): SessionUser {
	const user = locals.user;
	if (!user) error(401, 'Sign in to continue.');
	if (!hasRole(user, role)) error(403, `This needs the ${role} role or higher; you are signed in as ${user.role}.`);
	// A block stops editing and moderating; reading and the owner's staff pages stay open.
	if (user.block && (role === 'editor' || role === 'moderator')) error(403, blockNotice(user.block));
	return user;
}

/**
 * The same check for a form whose typed work must come back to it (the vehicle editor): a refusal is a
 * ServiceError, which `formAction` answers with everything that was posted instead of an error page.
 */
export function requireRoleInForm(locals: App.Locals, role: Role): SessionUser {
	const user = locals.user;
	if (!user) {
		throw new ServiceError('You are signed out (the sign-in ended or was closed elsewhere), so nothing was saved. Everything you typed is still below: sign in again in another tab, then save again.', 401);
	}
	if (!hasRole(user, role)) throw new ServiceError(`This needs the ${role} role or higher; you are signed in as ${user.role}. Nothing was saved; everything you typed is still below.`, 403);
	if (user.block && (role === 'editor' || role === 'moderator')) throw new ServiceError(`${blockNotice(user.block)} Nothing was saved; everything you typed is still below.`, 403);
	return user;
}
