import { Op } from 'sequelize';
import { Revision, User } from '../db/models';
import type { VehicleContent } from '../../domain/content/schema';
import { revisionById } from './revisions';
import { currentRevision, type VehicleSummary } from './vehicles';

// Who measured the figures a page shows now, and in which revision.

export type Evidence = {
	/** The revision shown now. */
	revisionId: number;
	changedBy: string;
	changedAt: string;
	/** The oldest revision in an unbroken line up to now that already had these figures. */
	measuredInRevisionId: number;
	measuredBy: string;
	measuredAt: string;
	/** True when the walk back stopped at its limit: the figures may be older still. */
	orAtLeastSince: boolean;
};

const HISTORY_WALK_LIMIT = 200;

/**
 * Who entered the figures now shown for each place. Walks back from the current revision while a
 * place's figures stay the same; hidden revisions are skipped, as their authors are not shown.
 */
export async function measurementOrigins(
	vehicle: VehicleSummary,
	places: Record<string, (content: VehicleContent) => unknown>
): Promise<Record<string, Evidence>> {
	const current = await currentRevision(vehicle);
	if (!current) return {};
	const history = await Revision.findAll({
		where: { vehicleId: vehicle.id, hidden: false, id: { [Op.lte]: current.id } },
		attributes: ['id', 'createdAt', 'authorId'],
		include: [{ model: User, as: 'author', attributes: ['name'] }],
		order: [['id', 'DESC']],
		limit: HISTORY_WALK_LIMIT
	});
	const keys = Object.keys(places);
	const now = Object.fromEntries(keys.map((k) => [k, JSON.stringify(places[k](current.content) ?? null)]));
	const origin: Record<string, { id: number; by: string; at: Date }> = {};
	const open = new Set(keys);
	for (const row of history) {
		if (open.size === 0) break;
		const rev = Number(row.id) === current.id ? current : await revisionById(Number(row.id));
		if (!rev) continue;
		for (const k of [...open]) {
			if (JSON.stringify(places[k](rev.content) ?? null) === now[k]) {
				origin[k] = { id: rev.id, by: (row as Revision & { author?: User | null }).author?.name ?? 'unknown', at: row.createdAt };
			} else {
				open.delete(k);
			}
		}
	}
	const out: Record<string, Evidence> = {};
	for (const k of keys) {
		const o = origin[k] ?? { id: current.id, by: current.authorName, at: current.createdAt };
		out[k] = {
			revisionId: current.id,
			changedBy: current.authorName,
			changedAt: current.createdAt.toISOString(),
			measuredInRevisionId: o.id,
			measuredBy: o.by,
			measuredAt: o.at.toISOString(),
			orAtLeastSince: open.has(k) && history.length >= HISTORY_WALK_LIMIT
		};
	}
	return out;
}

/** Evidence keys the fit screen and job sheet use: "seat:<id>", "dash", "speaker:<id>". */
export function placeReaders(content: VehicleContent): Record<string, (c: VehicleContent) => unknown> {
	const readers: Record<string, (c: VehicleContent) => unknown> = {
		dash: (c) => [c.dash.opening, c.dash.depthMm]
	};
	for (const s of content.seats.spaces) {
		readers[`seat:${s.id}`] = (c) => {
			const e = c.seats.spaces.find((x) => x.id === s.id);
			return e ? [e.seat, e.lengthMm, e.widthMm, e.heightMm] : null;
		};
	}
	for (const l of content.speakers.locations) {
		readers[`speaker:${l.id}`] = (c) => {
			const e = c.speakers.locations.find((x) => x.id === l.id);
			return e ? [e.cutoutMm, e.depthMm] : null;
		};
	}
	return readers;
}
