import { createHash, randomBytes } from 'node:crypto';
import { Op, type Transaction } from 'sequelize';
import { RateLimiterRes } from 'rate-limiter-flexible';
import { AccountToken, type TokenKind } from '../db/models';
import { SharedLimiter } from '../auth/sharedLimiter';
import { waitWords } from '../auth/throttle';
import { ServiceError } from '../errors';

const TOKEN_BYTES = 32;
const TOKEN_PATTERN = /^[A-Za-z0-9_-]{43}$/;

/** Only the hash is stored, so reading the table gives nobody a working link. */
export function hashToken(token: string): string {
	return createHash('sha256').update(token).digest('hex');
}

export function newToken(): { token: string; tokenHash: string } {
	const token = randomBytes(TOKEN_BYTES).toString('base64url');
	return { token, tokenHash: hashToken(token) };
}

/** The token row if the link is still good: right kind, never used, not revoked, not expired at `now`. */
export async function usableToken(
	kind: TokenKind,
	token: string,
	now: Date,
	options: { transaction?: Transaction; lock?: boolean } = {}
): Promise<AccountToken | null> {
	if (!TOKEN_PATTERN.test(token)) return null;
	const row = await AccountToken.findOne({
		where: { kind, tokenHash: hashToken(token) },
		transaction: options.transaction,
		lock: options.lock && options.transaction ? options.transaction.LOCK.UPDATE : undefined
	});
	if (!row || row.usedAt || row.revokedAt || row.expiresAt.getTime() <= now.getTime()) return null;
	return row;
}

/** Earlier links of the same kind for the same person (or, given no one, all of them) stop working when a new one is sent or one is used. */
export async function revokeOpenTokens(
	kind: TokenKind,
	who: { email: string } | { userId: number } | Record<string, never>,
	now: Date,
	transaction: Transaction
): Promise<number> {
	const [count] = await AccountToken.update(
		{ revokedAt: now },
		{ where: { kind, ...who, usedAt: null, revokedAt: null, expiresAt: { [Op.gt]: now } }, transaction }
	);
	return count;
}

// Choosing a password through a link hashes it (deliberately slow), so posts to link pages are
// counted per client address, whatever the token.
const LINK_POSTS_PER_WINDOW = 20;
const linkPosts = new SharedLimiter({ keyPrefix: 'link-post', points: LINK_POSTS_PER_WINDOW, duration: 15 * 60 });

/** Counts one post to a reset or invitation link from this address; refuses with 429 past the limit. */
export async function countLinkPost(clientAddress: string): Promise<void> {
	try {
		await linkPosts.consume(clientAddress);
	} catch (err) {
		if (!(err instanceof RateLimiterRes)) throw err;
		throw new ServiceError(`Too many tries from this device. Wait ${waitWords(Math.max(1, Math.ceil(err.msBeforeNext / 1000)))} and try again.`, 429);
	}
}
