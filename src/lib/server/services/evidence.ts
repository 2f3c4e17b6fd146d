import { QueryTypes } from 'sequelize';
import { db } from '../db';
import type { VehicleContent } from '../../domain/content/schema';
import { placeFigures } from '../../domain/origins';
import type { StoredRevision } from './revisions';

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
	/** True when the figures may be older than the revision named. The whole history is recorded, so never. */
	orAtLeastSince: boolean;
};

/*
 * One look-up over revision_origins (see history/origins.ts). For each place the current revision
 * records the revision that set its figures. Hidden revisions are passed over, as their authors are
 * not shown: the line of revisions with these figures runs back through visible revisions only, so the
 * credit goes to the oldest visible revision after the last visible one whose figures differ. When a
 * hidden edit changed a place and a later edit put the figures back, the credit stays with whoever
 * entered them before the hidden edit. The current revision is never hidden.
 *
 * Usually the revision that set the figures and the one before it are both visible, and the answer is
 * that revision, found by primary key; only otherwise does the statement step over the page's visible
 * revisions (an index range on vehicle, hidden, id).
 */
const ORIGINS_SQL = `
SELECT t.part, m.id, m.created_at AS createdAt, u.name AS authorName
FROM (
	SELECT o.part, CASE WHEN og.hidden = 0 AND (pa.id IS NULL OR pa.hidden = 0) THEN og.id ELSE (
		SELECT MIN(v.id) FROM revisions v
		WHERE v.vehicle_id = :vehicleId AND v.hidden = 0 AND v.id <= :current AND v.id > COALESCE((
			SELECT b.id FROM revisions b
			WHERE b.vehicle_id = :vehicleId AND b.hidden = 0 AND b.id < o.origin_revision_id
				AND NOT EXISTS (SELECT 1 FROM revision_origins x WHERE x.revision_id = b.id AND x.part = o.part AND x.digest = o.digest)
			ORDER BY b.id DESC LIMIT 1
		), 0)
	) END AS credit
	FROM revision_origins o
	JOIN revisions og ON og.id = o.origin_revision_id
	LEFT JOIN revisions pa ON pa.id = og.parent_id
	WHERE o.revision_id = :current AND o.part IN (:parts)
) t
JOIN revisions m ON m.id = t.credit
LEFT JOIN users u ON u.id = m.author_id`;

/** Who entered the figures now shown for each place, by evidence key (the keys of `places`). */
export async function measurementOrigins(current: StoredRevision, places: Readonly<Record<string, unknown>>): Promise<Record<string, Evidence>> {
	const keys = Object.keys(places);
	if (keys.length === 0) return {};
	const rows = await db().query<{ part: string; id: number | string; createdAt: Date; authorName: string | null }>(ORIGINS_SQL, {
		replacements: { vehicleId: current.vehicleId, current: current.id, parts: keys },
		type: QueryTypes.SELECT
	});
	const found = new Map(rows.map((r) => [r.part, r]));
	const out: Record<string, Evidence> = {};
	for (const k of keys) {
		const o = found.get(k);
		out[k] = {
			revisionId: current.id,
			changedBy: current.authorName,
			changedAt: current.createdAt.toISOString(),
			measuredInRevisionId: o ? Number(o.id) : current.id,
			measuredBy: o ? (o.authorName ?? 'unknown') : current.authorName,
			measuredAt: (o ? new Date(o.createdAt) : current.createdAt).toISOString(),
			orAtLeastSince: false
		};
	}
	return out;
}

/** Evidence keys the fit screen and job sheet use ("seat:<id>", "dash", "speaker:<id>"), each reading its figures. */
export function placeReaders(content: VehicleContent): Record<string, (c: VehicleContent) => unknown> {
	const readers: Record<string, (c: VehicleContent) => unknown> = {};
	for (const key of Object.keys(placeFigures(content))) {
		if (key === 'dash' || key.startsWith('seat:') || key.startsWith('speaker:')) readers[key] = (c) => placeFigures(c)[key] ?? null;
	}
	return readers;
}
