import { Op } from 'sequelize';
import { db } from '../db';
import { Revision, Setting } from '../db/models';
import { roleAtLeast } from '../../domain/roles';
import type { SessionUser } from '../../domain/sessionUser';
import { revisionById, type StoredRevision } from './revisions';
import type { VehicleSummary } from './vehicles';
import { forgetShopSettings, shopSettings } from './settings';
import { recordAudit } from './audit';
import { ServiceError } from '../errors';

export type VisibleRevision = { revision: StoredRevision | null; newerAwaitingReview: boolean };

/**
 * The revision a person is shown. With "review before it shows" on, viewers get the newest revision a moderator
 * has reviewed (or one saved before the setting was switched on); editors and up always get the newest.
 */
export async function visibleRevision(
	vehicle: Pick<VehicleSummary, 'id' | 'latestRevisionId'>,
	user: Pick<SessionUser, 'role'> | null
): Promise<VisibleRevision> {
	const latestId = vehicle.latestRevisionId;
	if (!latestId) return { revision: null, newerAwaitingReview: false };
	const settings = await shopSettings();
	if (!settings.reviewBeforeShow || roleAtLeast(user?.role, 'editor')) {
		return { revision: await revisionById(latestId), newerAwaitingReview: false };
	}
	const shown: Record<string | symbol, unknown>[] = [{ reviewedAt: { [Op.ne]: null } }];
	if (settings.reviewBeforeShowSince) shown.push({ createdAt: { [Op.lt]: new Date(settings.reviewBeforeShowSince) } });
	const row = await Revision.findOne({
		where: { vehicleId: vehicle.id, hidden: false, id: { [Op.lte]: latestId }, [Op.or]: shown },
		attributes: ['id'],
		order: [['id', 'DESC']]
	});
	if (!row) return { revision: null, newerAwaitingReview: true };
	const id = Number(row.id);
	return { revision: await revisionById(id), newerAwaitingReview: id !== latestId };
}

/** Marks one revision as looked at by a moderator; marking it again changes nothing. */
export async function markReviewed(revisionId: number, actor: SessionUser, now = new Date()): Promise<{ alreadyReviewed: boolean }> {
	if (!roleAtLeast(actor.role, 'moderator')) throw new ServiceError('Signing off changes needs the moderator role.', 403);
	return db().transaction(async (transaction) => {
		const row = await Revision.findByPk(revisionId, { attributes: ['id', 'vehicleId', 'reviewedAt'], transaction, lock: transaction.LOCK.UPDATE });
		if (!row) throw new ServiceError('That revision does not exist.', 404);
		if (row.reviewedAt) return { alreadyReviewed: true };
		await Revision.update({ reviewedBy: actor.id, reviewedAt: now }, { where: { id: revisionId }, transaction });
		await recordAudit({ actorId: actor.id, action: 'revision.review', targetType: 'revision', targetId: revisionId, details: { vehicleId: row.vehicleId } }, transaction);
		return { alreadyReviewed: false };
	});
}

export async function reviewState(revisionId: number): Promise<{ reviewedBy: number | null; reviewedAt: Date | null } | null> {
	const row = await Revision.findByPk(revisionId, { attributes: ['reviewedBy', 'reviewedAt'] });
	return row ? { reviewedBy: row.reviewedBy ?? null, reviewedAt: row.reviewedAt ?? null } : null;
}

/** Switching it on keeps what viewers see today: only changes saved from now on wait for a review. */
export async function setReviewBeforeShow(on: boolean, actor: SessionUser, now = new Date()): Promise<void> {
	if (!roleAtLeast(actor.role, 'admin')) throw new ServiceError('Changing shop settings needs the admin role.', 403);
	const current = await shopSettings();
	if (current.reviewBeforeShow === on) return;
	await db().transaction(async (transaction) => {
		await Setting.upsert({ name: 'reviewBeforeShow', value: String(on) }, { transaction });
		if (on) await Setting.upsert({ name: 'reviewBeforeShowSince', value: now.toISOString() }, { transaction });
		await recordAudit(
			{ actorId: actor.id, action: 'setting.change', targetType: 'setting', targetId: 'reviewBeforeShow', details: { from: current.reviewBeforeShow, to: on } },
			transaction
		);
	});
	forgetShopSettings();
}
