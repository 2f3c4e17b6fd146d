// The reading view's parts that do not depend on the reader, stored once per content, unit system and
// renderer in `rendered_pages`, and the one query a page view reads its page, revision and parts with (a second
// reads its trust marks when it has any).
import { QueryTypes, type Transaction } from 'sequelize';
import { db } from '../db';
import { preparedRows } from '../db/prepared';
import { vehicleTitle } from '../../domain/slug';
import type { UnitSystem } from '../../domain/units';
import { mayReadRevision, type Reader } from '../../domain/visibility';
import { readingRules } from './readingRules';
import { pageRevision } from './visibility';
import type { StoredRevision } from './revisions';
import type { VehicleSummary } from './vehicles';
import { hasMarksSql, pageMarks, type MarkRow } from './trust';

/** What the reading view's header says of the revision it shows; its content is in the stored parts. */
export type RevisionHead = {
	id: number;
	sha256: string;
	authorName: string;
	summary: string;
	createdAt: Date;
	hidden: boolean;
	reviewedAt: Date | null;
};

/** A page as the reading view finds it: its row, its newest revision, that revision's stored parts (as bytes) if any, and its trust marks. */
export type PageForReading = { vehicle: VehicleSummary; latest: RevisionHead | null; parts: Uint8Array | null; marks: MarkRow[] };

type Row = {
	id: number;
	slug: string;
	yearFrom: number;
	yearTo: number;
	body: string;
	latestRevisionId: number | string | null;
	protection: VehicleSummary['protection'];
	make: string;
	model: string;
	revisionId: number | string | null;
	sha256: string | null;
	summary: string | null;
	hidden: number | null;
	reviewedAt: Date | null;
	createdAt: Date | null;
	authorName: string | null;
	parts: Uint8Array | null;
	hasMarks: number | boolean;
};

// The stored parts come as bytes: the HTML in them is sent as it is, never decoded into text.
const PARTS_AS_BYTES = 'CAST(rp.parts AS BINARY)';

// Every join is on a primary key, the page on its unique slug; whether the page has trust marks comes along (by page).
// Its values go in as units, renderer, slug.
export const PAGE_SQL = `SELECT v.id, v.slug, v.year_from AS yearFrom, v.year_to AS yearTo, v.body, v.latest_revision_id AS latestRevisionId,
		v.protection, mk.name AS make, mo.name AS model,
		r.id AS revisionId, r.sha256, r.summary, r.hidden, r.reviewed_at AS reviewedAt, r.created_at AS createdAt, u.name AS authorName,
		${PARTS_AS_BYTES} AS parts, ${hasMarksSql('v.id')} AS hasMarks
	FROM vehicles v
	JOIN makes mk ON mk.id = v.make_id
	JOIN models mo ON mo.id = v.model_id
	LEFT JOIN revisions r ON r.id = v.latest_revision_id
	LEFT JOIN users u ON u.id = r.author_id
	LEFT JOIN rendered_pages rp ON rp.sha256 = r.sha256 AND rp.units = ? AND rp.renderer = ?
	WHERE v.slug = ?`;

/** The page at `slug` with its newest revision and the parts `renderer` stored for it in `units`; null when no page has that slug now. */
export async function pageForReading(slug: string, units: UnitSystem, renderer: string): Promise<PageForReading | null> {
	const [row] = await preparedRows<Row>(PAGE_SQL, [units, renderer, slug]);
	if (!row) return null;
	const names = { make: row.make, model: row.model, yearFrom: row.yearFrom, yearTo: row.yearTo };
	const vehicle: VehicleSummary = {
		id: row.id,
		slug: row.slug,
		...names,
		body: row.body,
		title: vehicleTitle(names),
		latestRevisionId: row.latestRevisionId === null ? null : Number(row.latestRevisionId),
		protection: row.protection
	};
	const latest: RevisionHead | null =
		row.revisionId === null
			? null
			: {
					id: Number(row.revisionId),
					sha256: row.sha256!,
					authorName: row.authorName ?? 'unknown',
					summary: row.summary ?? '',
					createdAt: row.createdAt!,
					hidden: !!row.hidden,
					reviewedAt: row.reviewedAt
				};
	return { vehicle, latest, parts: row.parts, marks: row.hasMarks ? await pageMarks(vehicle.id) : [] };
}

export function revisionHead(revision: StoredRevision): RevisionHead {
	const { id, sha256, authorName, summary, createdAt, hidden, reviewedAt } = revision;
	return { id, sha256, authorName, summary, createdAt, hidden, reviewedAt };
}

/**
 * The revision this reader reads as the page, by the one reading rule: the newest when they may read it
 * (no further query), else the newest they may read.
 */
export async function readableHead(page: Pick<PageForReading, 'vehicle' | 'latest'>, reader: Reader): Promise<{ revision: RevisionHead | null; newerAwaitingReview: boolean }> {
	if (!page.latest) return { revision: null, newerAwaitingReview: false };
	if (mayReadRevision(page.latest, reader, await readingRules())) return { revision: page.latest, newerAwaitingReview: false };
	const { revision, newerAwaitingReview } = await pageRevision(page.vehicle, reader);
	return { revision: revision && revisionHead(revision), newerAwaitingReview };
}

/** The stored parts of a content in `units` from `renderer`, as bytes, or null. */
export async function storedParts(sha256: string, units: UnitSystem, renderer: string): Promise<Uint8Array | null> {
	const [row] = await db().query<{ parts: Uint8Array }>(`SELECT ${PARTS_AS_BYTES} AS parts FROM rendered_pages rp WHERE sha256 = ? AND units = ? AND renderer = ?`, {
		replacements: [sha256, units, renderer],
		type: QueryTypes.SELECT
	});
	return row?.parts ?? null;
}

/** Keeps a content's parts, one row per unit system; parts already kept for the same content, units and renderer stay as they are. */
export async function storeParts(sha256: string, renderer: string, byUnits: Partial<Record<UnitSystem, string>>, transaction?: Transaction): Promise<void> {
	const rows = Object.entries(byUnits);
	if (!rows.length) return;
	await db().query(`INSERT IGNORE INTO rendered_pages (sha256, units, renderer, parts) VALUES ${rows.map(() => '(?, ?, ?, ?)').join(', ')}`, {
		replacements: rows.flatMap(([units, parts]) => [sha256, units, renderer, parts]),
		transaction
	});
}

/** Which unit systems of a content `renderer` has kept already. */
export async function keptUnits(sha256: string, renderer: string): Promise<UnitSystem[]> {
	const rows = await db().query<{ units: UnitSystem }>('SELECT units FROM rendered_pages WHERE sha256 = ? AND renderer = ?', {
		replacements: [sha256, renderer],
		type: QueryTypes.SELECT
	});
	return rows.map((r) => r.units);
}

/** Current revisions of pages after `afterVehicleId`, in page order, that `renderer` has not kept in every unit system, with those it has. */
export async function currentRevisionsMissingParts(
	renderer: string,
	afterVehicleId: number,
	limit: number
): Promise<{ vehicleId: number; revisionId: number; kept: UnitSystem[] }[]> {
	const rows = await db().query<{ vehicleId: number; revisionId: number | string; kept: string | null }>(
		`SELECT v.id AS vehicleId, v.latest_revision_id AS revisionId,
			(SELECT GROUP_CONCAT(rp.units) FROM rendered_pages rp WHERE rp.sha256 = r.sha256 AND rp.renderer = :renderer) AS kept
		FROM vehicles v JOIN revisions r ON r.id = v.latest_revision_id
		WHERE v.id > :after
		HAVING kept IS NULL OR kept NOT LIKE '%,%'
		ORDER BY v.id LIMIT :limit`,
		{ replacements: { after: afterVehicleId, renderer, limit }, type: QueryTypes.SELECT }
	);
	return rows.map((r) => ({ vehicleId: Number(r.vehicleId), revisionId: Number(r.revisionId), kept: (r.kept ? r.kept.split(',') : []) as UnitSystem[] }));
}

/**
 * Forgets parts that other builds stored before `before`, a few hundred rows at a time: after a release
 * they are never read again, while a server still running the previous build (a rolling restart) keeps
 * its own for a while. Resolves with how many rows went.
 */
export async function forgetOtherBuilds(renderer: string, before: Date, batch = 500): Promise<number> {
	let gone = 0;
	for (;;) {
		const n = Number(
			await db().query('DELETE FROM rendered_pages WHERE renderer <> ? AND created_at < ? LIMIT ?', {
				replacements: [renderer, before, batch],
				type: QueryTypes.BULKDELETE
			})
		);
		gone += n;
		if (n < batch) return gone;
	}
}
