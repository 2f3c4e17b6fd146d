import { z } from 'zod';
import { Op } from 'sequelize';
import { db } from '../db';
import { Block, User } from '../db/models';
import { ROLES, roleAtLeast, type Role } from '../../domain/roles';
import { blockNotice, type EditBlock } from '../../domain/block';
import type { SessionUser } from '../../domain/sessionUser';
import { recordAudit } from './audit';
import { shopSettings } from './settings';
import { startOfDay } from '../../domain/shopTime';
import { ServiceError, fieldMessages } from '../errors';
import { announceAccountChange } from '../events';

const DAY_MS = 24 * 60 * 60 * 1000;
const LONGEST_BLOCK_DAYS = 5 * 366;

export const blockSchema = z.object({
	reason: z
		.string({ error: 'Give a reason; the person sees it.' })
		.trim()
		.min(3, 'Give a reason; the person sees it.')
		.max(500, 'Keep the reason under 500 characters.'),
	until: z.iso.date({ error: 'Pick the day the pause ends.' })
});

/** A pause ends as the chosen day begins in the shop's time zone. */
export function blockEnd(day: string, zone: string): Date {
	return startOfDay(day, zone);
}

export async function activeBlockFor(userId: number, now = new Date()): Promise<(EditBlock & { id: number; byId: number }) | null> {
	const row = await Block.findOne({
		where: { userId, liftedAt: null, until: { [Op.gt]: now } },
		order: [['until', 'DESC']],
		attributes: ['id', 'reason', 'until', 'byId']
	});
	return row ? { id: row.id, byId: row.byId, reason: row.reason, until: row.until.toISOString() } : null;
}

/** Saves check this themselves too, so a blocked author is refused even by a route that forgot the guard. */
export async function refuseBlockedAuthor(userId: number, now = new Date()): Promise<void> {
	const block = await activeBlockFor(userId, now);
	if (block) throw new ServiceError(blockNotice(block, (await shopSettings()).timeZone), 403);
}

const RANK: Record<Role, number> = Object.fromEntries(ROLES.map((r, i) => [r, i])) as Record<Role, number>;

function mayBlock(actor: SessionUser, target: User, act: 'block' | 'unblock'): string | null {
	const doing = act === 'block' ? 'Pausing someone’s editing' : 'Ending a pause';
	if (!roleAtLeast(actor.role, 'moderator')) return `${doing} needs the moderator role.`;
	if (actor.id === target.id) return act === 'block' ? 'You cannot pause your own editing.' : 'You cannot end your own pause; ask another moderator.';
	if (actor.role !== 'admin' && RANK[target.role] >= RANK[actor.role]) return `A ${actor.role} can ${act === 'block' ? 'pause' : 'end the pause of'} only people with a lower role; ask an admin.`;
	return null;
}

/** One active block per person: a new one replaces the old (which is kept, marked lifted). */
export async function blockUser(targetId: number, input: unknown, actor: SessionUser, now = new Date()): Promise<EditBlock> {
	const parsed = blockSchema.safeParse(input);
	if (!parsed.success) {
		const fields = fieldMessages(parsed.error);
		throw new ServiceError(Object.values(fields)[0] ?? 'Check the form.', 400, fields);
	}
	const until = blockEnd(parsed.data.until, (await shopSettings()).timeZone);
	if (until.getTime() <= now.getTime()) throw new ServiceError('Pick an end day after today.', 400, { until: 'Pick an end day after today.' });
	if (until.getTime() - now.getTime() > LONGEST_BLOCK_DAYS * DAY_MS) {
		throw new ServiceError('A pause lasts at most five years; disable the account instead.', 400, { until: 'Pick a day within five years.' });
	}
	const block = await db().transaction(async (transaction) => {
		const target = await User.findByPk(targetId, { transaction, lock: transaction.LOCK.UPDATE });
		if (!target) throw new ServiceError('That person no longer exists.', 404);
		const refusal = mayBlock(actor, target, 'block');
		if (refusal) throw new ServiceError(refusal, 403);
		const [replaced] = await Block.update(
			{ liftedAt: now, liftedBy: actor.id },
			{ where: { userId: target.id, liftedAt: null, until: { [Op.gt]: now } }, transaction }
		);
		const row = await Block.create({ userId: target.id, byId: actor.id, reason: parsed.data.reason, until, createdAt: now }, { transaction });
		await recordAudit(
			{ actorId: actor.id, action: 'user.block', targetType: 'user', targetId: target.id, details: { reason: row.reason, until: until.toISOString(), replaced: replaced > 0 } },
			transaction
		);
		return { reason: row.reason, until: until.toISOString() };
	});
	announceAccountChange(targetId);
	return block;
}

export async function liftBlock(targetId: number, actor: SessionUser, now = new Date()): Promise<boolean> {
	const lifted = await db().transaction(async (transaction) => {
		const target = await User.findByPk(targetId, { transaction });
		if (!target) throw new ServiceError('That person no longer exists.', 404);
		const refusal = mayBlock(actor, target, 'unblock');
		if (refusal) throw new ServiceError(refusal, 403);
		const [lifted] = await Block.update(
			{ liftedAt: now, liftedBy: actor.id },
			{ where: { userId: target.id, liftedAt: null, until: { [Op.gt]: now } }, transaction }
		);
		if (lifted) await recordAudit({ actorId: actor.id, action: 'user.unblock', targetType: 'user', targetId: target.id }, transaction);
		return lifted > 0;
	});
	announceAccountChange(targetId);
	return lifted;
}

export type BlockListItem = {
	id: number;
	user: { id: number; name: string };
	by: { id: number; name: string };
	reason: string;
	until: string;
	createdAt: string;
	liftedAt: string | null;
	active: boolean;
};

/** Blocks in force first, then the most recent ended ones, for the moderators' list. */
export async function listBlocks(now = new Date(), limit = 100): Promise<BlockListItem[]> {
	const rows = await Block.findAll({
		include: [
			{ model: User, as: 'user', attributes: ['id', 'name'] },
			{ model: User, as: 'by', attributes: ['id', 'name'] }
		],
		order: [['createdAt', 'DESC']],
		limit
	});
	const items = rows.map((r) => {
		const withNames = r as Block & { user: User; by: User };
		return {
			id: r.id,
			user: { id: withNames.user.id, name: withNames.user.name },
			by: { id: withNames.by.id, name: withNames.by.name },
			reason: r.reason,
			until: r.until.toISOString(),
			createdAt: r.createdAt.toISOString(),
			liftedAt: r.liftedAt ? r.liftedAt.toISOString() : null,
			active: !r.liftedAt && r.until.getTime() > now.getTime()
		};
	});
	return [...items.filter((i) => i.active), ...items.filter((i) => !i.active)];
}
