import { nextDay, startOfDay } from '../../domain/shopTime';
import { Op, type Transaction, type WhereOptions } from 'sequelize';
import { z } from 'zod';
import { AuditLog, Make, User, Vehicle, VehicleModel } from '../db/models';
import { vehicleTitle } from '../../domain/slug';

export type AuditAction =
	| 'user.create'
	| 'user.role'
	| 'user.status'
	| 'revision.restore'
	| 'revision.hide'
	| 'revision.unhide'
	| 'vehicle.protect'
	| 'revision.review'
	| 'user.invite'
	| 'user.invite.revoke'
	| 'user.block'
	| 'user.unblock'
	| 'setting.change'
	| 'part.create'
	| 'part.update'
	| 'part.delete'
	| 'suggestion.apply'
	| 'suggestion.decline';

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

/** Filters of the audit page, read from the URL so a search can be shared. Days are the shop's (its time zone). */
export const auditFilterSchema = z
	.object({
		person: z.coerce.number().int().positive('Pick a person from the list.').optional(),
		action: z
			.string()
			.regex(/^[a-z]+(\.[a-z]+)*$/, 'Pick an action from the list.')
			.max(40)
			.optional(),
		from: z.iso.date({ error: 'Write the first day as YYYY-MM-DD.' }).optional(),
		to: z.iso.date({ error: 'Write the last day as YYYY-MM-DD.' }).optional(),
		page: z.coerce.number().int().min(1, 'Pages start at 1.').max(100_000).default(1)
	})
	.refine((f) => !f.from || !f.to || f.from <= f.to, { path: ['to'], message: 'The last day comes before the first day.' });
export type AuditFilter = z.infer<typeof auditFilterSchema>;

export type AuditEntry = {
	id: number;
	createdAt: string;
	actor: { id: number; name: string } | null;
	action: string;
	target: { type: string; id: string; label: string; href: string | null };
	details: Record<string, unknown>;
};

export const AUDIT_PAGE_SIZE = 50;

/** Actions that occur in the log, for the filter list. */
export async function auditActions(): Promise<string[]> {
	const rows = (await AuditLog.findAll({ attributes: ['action'], group: ['action'], raw: true })) as unknown as { action: string }[];
	return rows.map((r) => r.action).sort();
}

async function targetLabels(rows: AuditLog[]): Promise<(row: AuditLog, details: Record<string, unknown>) => AuditEntry['target']> {
	const userIds = new Set<number>();
	const vehicleIds = new Set<number>();
	for (const r of rows) {
		const details = JSON.parse(r.details) as Record<string, unknown>;
		if (r.targetType === 'user') userIds.add(Number(r.targetId));
		if (r.targetType === 'vehicle') vehicleIds.add(Number(r.targetId));
		if (r.targetType === 'revision' && typeof details.vehicleId === 'number') vehicleIds.add(details.vehicleId);
	}
	const users = new Map((await User.findAll({ where: { id: [...userIds] }, attributes: ['id', 'name'] })).map((u) => [u.id, u.name]));
	const vehicles = new Map(
		(
			await Vehicle.findAll({
				where: { id: [...vehicleIds] },
				attributes: ['id', 'slug', 'yearFrom', 'yearTo'],
				include: [
					{ model: Make, as: 'make', attributes: ['name'] },
					{ model: VehicleModel, as: 'model', attributes: ['name'] }
				]
			})
		).map((v) => {
			const named = v as Vehicle & { make: Make; model: VehicleModel };
			return [v.id, { slug: v.slug, title: vehicleTitle({ make: named.make.name, model: named.model.name, yearFrom: v.yearFrom, yearTo: v.yearTo }) }];
		})
	);
	return (row, details) => {
		const id = row.targetId;
		if (row.targetType === 'user') {
			return { type: 'user', id, label: users.get(Number(id)) ?? `person #${id}`, href: `/users/${id}` };
		}
		if (row.targetType === 'vehicle') {
			const v = vehicles.get(Number(id));
			return { type: 'vehicle', id, label: v?.title ?? `page #${id}`, href: v ? `/vehicles/${v.slug}` : null };
		}
		if (row.targetType === 'revision') {
			const v = typeof details.vehicleId === 'number' ? vehicles.get(details.vehicleId) : undefined;
			return { type: 'revision', id, label: v ? `revision #${id} of ${v.title}` : `revision #${id}`, href: v ? `/vehicles/${v.slug}/history` : null };
		}
		if (row.targetType === 'invite') {
			return { type: 'invite', id, label: typeof details.email === 'string' ? `invitation to ${details.email}` : `invitation #${id}`, href: null };
		}
		return { type: row.targetType, id, label: `${row.targetType} ${id}`, href: null };
	};
}

/** Newest first; a person matches as the one who acted or the one acted upon. Days are counted in `zone` (the shop's). */
export async function listAudit(filter: AuditFilter, zone = 'UTC'): Promise<{ items: AuditEntry[]; total: number; page: number; pageSize: number }> {
	const where: WhereOptions[] = [];
	if (filter.person) where.push({ [Op.or]: [{ actorId: filter.person }, { targetType: 'user', targetId: String(filter.person) }] });
	if (filter.action) where.push({ action: filter.action });
	// Days are the shop's: a day runs from its midnight to the next in the shop's time zone.
	if (filter.from) where.push({ createdAt: { [Op.gte]: startOfDay(filter.from, zone) } });
	if (filter.to) where.push({ createdAt: { [Op.lt]: startOfDay(nextDay(filter.to), zone) } });
	const { rows, count } = await AuditLog.findAndCountAll({
		where: { [Op.and]: where },
		include: [{ model: User, as: 'actor', attributes: ['id', 'name'] }],
		order: [['id', 'DESC']],
		limit: AUDIT_PAGE_SIZE,
		offset: (filter.page - 1) * AUDIT_PAGE_SIZE
	});
	const label = await targetLabels(rows);
	const items = rows.map((r) => {
		const details = JSON.parse(r.details) as Record<string, unknown>;
		const actor = (r as AuditLog & { actor: User | null }).actor;
		return {
			id: Number(r.id),
			createdAt: r.createdAt.toISOString(),
			actor: actor ? { id: actor.id, name: actor.name } : null,
			action: r.action,
			target: label(r, details),
			details
		};
	});
	return { items, total: count, page: filter.page, pageSize: AUDIT_PAGE_SIZE };
}
