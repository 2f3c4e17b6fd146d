import { QueryTypes } from 'sequelize';
import { db } from '../db';
import { OPEN_RULES } from '../../domain/visibility';
import { Revision, Setting } from '../db/models';
import { roleAtLeast } from '../../domain/roles';
import type { SessionUser } from '../../domain/sessionUser';
import { forgetRevisionFlags, touchVehicle } from './revisions';
import { announceRevision } from '../events';
import { forgetShopSettings, shopSettings } from './settings';
import { recordAudit } from './audit';
import { ServiceError } from '../errors';

/** Marks one revision as looked at by a moderator; marking it again changes nothing. */
export async function markReviewed(revisionId: number, actor: SessionUser, now = new Date()): Promise<{ alreadyReviewed: boolean }> {
	if (!roleAtLeast(actor.role, 'moderator')) throw new ServiceError('Signing off changes needs the moderator role.', 403);
	const outcome: { alreadyReviewed: boolean; vehicleId?: number } = await db().transaction(async (transaction) => {
		const row = await Revision.findByPk(revisionId, { attributes: ['id', 'vehicleId', 'reviewedAt'], transaction, lock: transaction.LOCK.UPDATE });
		if (!row) throw new ServiceError('That revision does not exist.', 404);
		if (row.reviewedAt) return { alreadyReviewed: true };
		await Revision.update({ reviewedBy: actor.id, reviewedAt: now }, { where: { id: revisionId }, transaction });
		await touchVehicle(row.vehicleId, transaction);
		await recordAudit({ actorId: actor.id, action: 'revision.review', targetType: 'revision', targetId: revisionId, details: { vehicleId: row.vehicleId } }, transaction);
		return { alreadyReviewed: false, vehicleId: row.vehicleId };
	});
	if (outcome.alreadyReviewed) return { alreadyReviewed: true };
	forgetRevisionFlags(revisionId);
	// Viewers may now read it: indexes and caches follow, and watchers who could not read it get their notice.
	await announceRevision({ kind: 'review', vehicleId: outcome.vehicleId!, revisionId, authorId: actor.id });
	return { alreadyReviewed: false };
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
		// Switching sign-off off opens every waiting change at once, renames included.
		if (!on) {
			const since = current.reviewBeforeShowSince ? new Date(current.reviewBeforeShowSince) : new Date(0);
			const waiting = await db().query<{ id: number }>(
				'SELECT DISTINCT vehicle_id AS id FROM revisions WHERE reviewed_at IS NULL AND created_at >= ? ORDER BY vehicle_id',
				{ replacements: [since], type: QueryTypes.SELECT, transaction }
			);
			for (const { id } of waiting) await touchVehicle(Number(id), transaction, OPEN_RULES);
		}
		await recordAudit(
			{ actorId: actor.id, action: 'setting.change', targetType: 'setting', targetId: 'reviewBeforeShow', details: { from: current.reviewBeforeShow, to: on } },
			transaction
		);
	});
	forgetShopSettings();
}
