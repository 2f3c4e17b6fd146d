import { QueryTypes } from 'sequelize';
import type { Migration } from './types';
import { SECTION_KEYS, type SectionKey, type VehicleContent } from '../../../domain/content/schema';
import { deriveOrigins, type OriginRow } from '../../../domain/origins';
import { insertOriginRows, placeDigests } from '../../history/origins';

export const name = '2026-12-05T02-00-00_revision_origins';

// Which revision last changed each section and place, so "measured in which revision" and "revisions that
// changed a section" are looked up instead of worked out from old contents. Rendered notes are kept by
// content and renderer version, so revisions with equal content share them and a new renderer reaches old ones.
export const up: Migration = async ({ context: q }) => {
	const sql = q.sequelize;
	await sql.query(`CREATE TABLE revision_origins (
		revision_id BIGINT UNSIGNED NOT NULL,
		part VARCHAR(80) CHARACTER SET ascii COLLATE ascii_bin NOT NULL,
		origin_revision_id BIGINT UNSIGNED NOT NULL,
		digest CHAR(32) CHARACTER SET ascii COLLATE ascii_bin NULL,
		PRIMARY KEY (revision_id, part),
		CONSTRAINT revision_origins_revision FOREIGN KEY (revision_id) REFERENCES revisions(id)
	) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
	// The evidence look-up steps over a page's visible revisions by id.
	await sql.query('ALTER TABLE revisions ADD KEY revisions_vehicle_visible (vehicle_id, hidden, id)');
	await sql.query(`CREATE TABLE rendered_notes (
		sha256 CHAR(64) NOT NULL,
		renderer_version SMALLINT UNSIGNED NOT NULL,
		notes LONGTEXT NOT NULL,
		created_at DATETIME(3) NOT NULL,
		PRIMARY KEY (sha256, renderer_version)
	) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);

	// Older revisions: each page's history in order, exactly as a save would have recorded it.
	const vehicles = await sql.query<{ id: number }>('SELECT DISTINCT vehicle_id AS id FROM revisions ORDER BY vehicle_id', { type: QueryTypes.SELECT });
	for (const { id: vehicleId } of vehicles) {
		const rowsById = new Map<number, OriginRow[]>();
		for (let after = 0; ; ) {
			const batch = await sql.query<{ id: number | string; parentId: number | string | null; content: string; sections: string }>(
				'SELECT id, parent_id AS parentId, content, sections FROM revisions WHERE vehicle_id = ? AND id > ? ORDER BY id LIMIT 200',
				{ replacements: [vehicleId, after], type: QueryTypes.SELECT }
			);
			if (batch.length === 0) break;
			const written: { revisionId: number; rows: OriginRow[] }[] = [];
			for (const r of batch) {
				const id = Number(r.id);
				const parent = r.parentId === null ? null : (rowsById.get(Number(r.parentId)) ?? []);
				const sections = r.sections.split(',').filter((s): s is SectionKey => (SECTION_KEYS as readonly string[]).includes(s));
				const rows = deriveOrigins(id, parent, sections, placeDigests(JSON.parse(r.content) as VehicleContent));
				rowsById.set(id, rows);
				written.push({ revisionId: id, rows });
			}
			await insertOriginRows(sql, written);
			after = Number(batch[batch.length - 1].id);
		}
	}
};

export const down: Migration = async ({ context: q }) => {
	await q.dropTable('rendered_notes');
	await q.sequelize.query('ALTER TABLE revisions DROP KEY revisions_vehicle_visible');
	await q.dropTable('revision_origins');
};
