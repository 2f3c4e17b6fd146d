export const ROLES = ['viewer', 'editor', 'moderator', 'admin'] as const;
export type Role = (typeof ROLES)[number];

const RANK: Record<Role, number> = { viewer: 0, editor: 1, moderator: 2, admin: 3 };

/** Roles are ordered: each one can do everything the ones below it can. */
export function roleAtLeast(role: Role | null | undefined, needed: Role): boolean {
	return !!role && RANK[role] >= RANK[needed];
}
