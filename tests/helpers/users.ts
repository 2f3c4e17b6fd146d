import type { Role } from '../../src/lib/domain/roles';
import { createUser, toSessionUser } from '../../src/lib/server/services/users';
import type { SessionUser } from '../../src/lib/domain/sessionUser';

let counter = 0;

export async function makeUser(role: Role, name = `Test ${role} ${++counter}`): Promise<SessionUser> {
	const user = await createUser({ email: `${role}${counter}-${Date.now()}@kickpanel.test`, name, password: 'test-password-123', role }, null);
	return toSessionUser(user);
}

/** The session id a test passes for "this person's signed-in session". */
export const SAMPLE_SESSION = '00000000-0000-4000-8000-000000000001';
