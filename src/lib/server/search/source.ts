// What the search index reads from MariaDB: the revision of each page that every signed-in person may read
// (readingRules.ts), and what changed since a revision id or a moment.
import { QueryTypes } from 'sequelize';
import { db } from '../db';
import { CONTENT_SCHEMA_VERSION, type VehicleContent } from '../../domain/content/schema';
import type { IndexInput } from './types';
import type { ReadingRules } from '../../domain/visibility';
import { INDEX_READER, pageRevisionSql } from '../services/readingRules';

type LatestRow = { id: number; slug: string; revisionId: number | string; content: string };

const shownSql = (rules: ReadingRules) => `SELECT v.id, v.slug, r.id AS revisionId, r.content
	FROM vehicles v JOIN revisions r ON r.id = ${pageRevisionSql('v', INDEX_READER, rules)}`;

function toInput(row: LatestRow): IndexInput | null {
	// Content was validated when it was saved; only its version is checked here.
	const content = JSON.parse(row.content) as VehicleContent;
	if (content.schemaVersion !== CONTENT_SCHEMA_VERSION) return null;
	return { id: Number(row.id), slug: row.slug, revisionId: Number(row.revisionId), content };
}

/** Every page's shown revision, a batch at a time in id order, so a large wiki never sits in memory twice. */
export async function* shownRevisions(rules: ReadingRules, batchSize = 500): AsyncGenerator<IndexInput[]> {
	let after = 0;
	for (;;) {
		const rows = await db().query<LatestRow>(`${shownSql(rules)} WHERE v.id > :after ORDER BY v.id LIMIT :batch`, {
			replacements: { after, batch: batchSize },
			type: QueryTypes.SELECT
		});
		if (!rows.length) return;
		after = Number(rows[rows.length - 1].id);
		yield rows.map(toInput).filter((r): r is IndexInput => r !== null);
		if (rows.length < batchSize) return;
	}
}

export async function shownRevisionsOf(vehicleIds: number[], rules: ReadingRules): Promise<IndexInput[]> {
	if (!vehicleIds.length) return [];
	const rows = await db().query<LatestRow>(`${shownSql(rules)} WHERE v.id IN (:ids)`, {
		replacements: { ids: vehicleIds },
		type: QueryTypes.SELECT
	});
	return rows.map(toInput).filter((r): r is IndexInput => r !== null);
}

/** The newest revision id (0 for an empty wiki): where polling starts after a build. */
export async function newestRevisionId(): Promise<number> {
	const [row] = await db().query<{ id: number | string | null }>('SELECT MAX(id) AS id FROM revisions', { type: QueryTypes.SELECT });
	return Number(row?.id ?? 0);
}

/** Pages with a revision newer than `afterId`, with the newest such revision of each. */
export async function pagesChangedAfter(afterId: number): Promise<{ vehicleId: number; revisionId: number }[]> {
	const rows = await db().query<{ vehicleId: number; revisionId: number | string }>(
		'SELECT vehicle_id AS vehicleId, MAX(id) AS revisionId FROM revisions WHERE id > :afterId GROUP BY vehicle_id',
		{ replacements: { afterId }, type: QueryTypes.SELECT }
	);
	return rows.map((r) => ({ vehicleId: Number(r.vehicleId), revisionId: Number(r.revisionId) }));
}

/** Pages whose row was touched since `since` (a hide or a sign-off changes what is shown without a new revision). */
export async function pagesTouchedSince(since: Date): Promise<number[]> {
	const rows = await db().query<{ id: number }>('SELECT id FROM vehicles WHERE updated_at >= :since', { replacements: { since }, type: QueryTypes.SELECT });
	return rows.map((r) => Number(r.id));
}

/** Page text for snippets: the content of a few revisions by id. */
export async function revisionContents(ids: number[]): Promise<Map<number, VehicleContent>> {
	if (!ids.length) return new Map();
	const rows = await db().query<{ id: number | string; content: string }>('SELECT id, content FROM revisions WHERE id IN (:ids)', {
		replacements: { ids },
		type: QueryTypes.SELECT
	});
	return new Map(rows.map((r) => [Number(r.id), JSON.parse(r.content) as VehicleContent]));
}
