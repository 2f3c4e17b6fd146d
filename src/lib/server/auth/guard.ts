import { error } from '@sveltejs/kit';
import { roleAtLeast, type Role } from '../../domain/roles';
import { blockNotice, type EditBlock } from '../../domain/block';

export type SessionUser = {
	id: number;
	email: string;
	name: string;
	role: Role;
	units: 'metric' | 'imperial';
	/** Set while a moderator's block on editing is in force. */
	block?: EditBlock | null;
};

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
