import { error } from '@sveltejs/kit';
import { roleAtLeast, type Role } from '../../domain/roles';

export type SessionUser = {
	id: number;
	email: string;
	name: string;
	role: Role;
	units: 'metric' | 'imperial';
};

export function hasRole(user: SessionUser | null | undefined, role: Role): boolean {
	return roleAtLeast(user?.role, role);
}

/** The one permission check every action and endpoint calls; the UI hiding a button is not a check. */
export function requireRole(locals: App.Locals, role: Role): SessionUser {
	const user = locals.user;
	if (!user) error(401, 'Sign in to continue.');
	if (!hasRole(user, role)) error(403, `This needs the ${role} role or higher; you are signed in as ${user.role}.`);
	return user;
}
