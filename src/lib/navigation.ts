import { roleAtLeast, type Role } from './domain/roles';

export type NavLink = { href: string; label: string; role: Role };

const LINKS: NavLink[] = [
	{ href: '/vehicles', label: 'Vehicles', role: 'viewer' },
	{ href: '/fit', label: 'Will it fit?', role: 'viewer' },
	{ href: '/calc', label: 'Calculators', role: 'viewer' },
	{ href: '/parts', label: 'Parts', role: 'viewer' },
	{ href: '/shop-log', label: 'Shop log', role: 'viewer' },
	{ href: '/following', label: 'Following', role: 'viewer' },
	{ href: '/guide', label: 'Guide', role: 'viewer' },
	{ href: '/admin/users', label: 'Staff', role: 'admin' }
];

export function navLinks(role: Role | null): NavLink[] {
	if (!role) return [];
	return LINKS.filter((l) => roleAtLeast(role, l.role));
}
