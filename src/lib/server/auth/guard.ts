import { error } from '@sveltejs/kit';
import { roleAtLeast, type Role } from '../../domain/roles';
import { blockNotice } from '../../domain/block';
import type { SessionUser } from '../../domain/sessionUser';

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
