import type { Transaction } from 'sequelize';
import { AuditLog } from '../db/models';

export type AuditAction =
	| 'user.create'
	| 'user.role'
	| 'user.status'
	| 'revision.restore'
	| 'revision.hide'
	| 'revision.unhide'
	| 'vehicle.protect';

export async function recordAudit(
	entry: { actorId: number | null; action: AuditAction; targetType: string; targetId: string | number; details?: object },
	transaction?: Transaction
): Promise<void> {
	await AuditLog.create(
		{
			actorId: entry.actorId,
			action: entry.action,
			targetType: entry.targetType,
			targetId: String(entry.targetId),
			details: JSON.stringify(entry.details ?? {})
		},
		{ transaction }
	);
}
