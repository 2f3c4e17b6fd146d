import { createHash } from 'node:crypto';
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { SectionKey, VehicleContent } from '../../domain/content/schema';
import { deriveOrigins, placeFigures, type OriginRow } from '../../domain/origins';

// The revision_origins table: written with each revision (and once by a migration for older ones).

/** A short digest of each place's figures: equal figures, equal digest. */
export function placeDigests(content: VehicleContent): Record<string, string> {
	const out: Record<string, string> = {};
	for (const [part, figures] of Object.entries(placeFigures(content))) {
		out[part] = createHash('sha256').update(JSON.stringify(figures)).digest('hex').slice(0, 32);
	}
	return out;
}

export async function originRowsOf(sequelize: Sequelize, revisionId: number, transaction?: Transaction): Promise<OriginRow[]> {
	const rows = await sequelize.query<{ part: string; origin: number | string; digest: string | null }>(
		'SELECT part, origin_revision_id AS origin, digest FROM revision_origins WHERE revision_id = ?',
		{ replacements: [revisionId], type: QueryTypes.SELECT, transaction }
	);
	return rows.map((r) => ({ part: r.part, originRevisionId: Number(r.origin), digest: r.digest }));
}

const ROWS_PER_STATEMENT = 2_000;

/** Writes the rows of several revisions, a few thousand to a statement. */
export async function insertOriginRows(sequelize: Sequelize, rows: { revisionId: number; rows: OriginRow[] }[], transaction?: Transaction): Promise<void> {
	const flat = rows.flatMap((r) => r.rows.map((o) => [r.revisionId, o.part, o.originRevisionId, o.digest]));
	for (let at = 0; at < flat.length; at += ROWS_PER_STATEMENT) {
		const chunk = flat.slice(at, at + ROWS_PER_STATEMENT);
		await sequelize.query(`INSERT INTO revision_origins (revision_id, part, origin_revision_id, digest) VALUES ${chunk.map(() => '(?, ?, ?, ?)').join(', ')}`, {
			replacements: chunk.flat(),
			transaction
		});
	}
}

/** The rows of a revision just written on top of `parentId`, in the transaction that writes it. */
export async function recordOrigins(
	sequelize: Sequelize,
	revision: { id: number; parentId: number | null; content: VehicleContent; sections: readonly SectionKey[] },
	transaction: Transaction
): Promise<void> {
	const parent = revision.parentId === null ? null : await originRowsOf(sequelize, revision.parentId, transaction);
	const rows = deriveOrigins(revision.id, parent, revision.sections, placeDigests(revision.content));
	await insertOriginRows(sequelize, [{ revisionId: revision.id, rows }], transaction);
}
