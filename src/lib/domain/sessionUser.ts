import type { Role } from './roles';
import type { EditBlock } from './block';
import type { UnitSystem } from './units';

/** The signed-in person as every request sees them: who, which role, which units, any block on editing. */
export type SessionUser = {
	id: number;
	email: string;
	name: string;
	role: Role;
	units: UnitSystem;
	/** Set while a moderator's block on editing is in force. */
	block?: EditBlock | null;
};
