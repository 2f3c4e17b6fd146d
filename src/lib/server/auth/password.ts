import bcrypt from 'bcryptjs';

const COST = 10;
// Compared against when the e-mail is unknown, so a wrong address takes as long as a wrong password.
const DUMMY_HASH = bcrypt.hashSync('kickpanel-no-such-user', COST);

export const MIN_PASSWORD_LENGTH = 10;

export function hashPassword(plain: string): Promise<string> {
	return bcrypt.hash(plain, COST);
}

export async function verifyPassword(plain: string, hash: string | null): Promise<boolean> {
	const ok = await bcrypt.compare(plain, hash ?? DUMMY_HASH);
	return ok && hash !== null;
}
