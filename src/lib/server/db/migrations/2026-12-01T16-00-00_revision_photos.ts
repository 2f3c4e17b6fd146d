import { QueryTypes } from 'sequelize';
import type { Migration } from './types';

export const name = '2026-12-01T16-00-00_revision_photos';

// Which revisions show which photo, so a photo left only in hidden revisions is no longer served to readers.
export const up: Migration = async ({ context: q }) => {
	await q.sequelize.query(`CREATE TABLE revision_photos (
		photo_id VARCHAR(64) CHARACTER SET ascii COLLATE ascii_bin NOT NULL,
		revision_id BIGINT UNSIGNED NOT NULL,
		PRIMARY KEY (photo_id, revision_id),
		KEY revision_photos_revision (revision_id),
		CONSTRAINT revision_photos_revision FOREIGN KEY (revision_id) REFERENCES revisions(id)
	) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
	// Revisions written before this table: read their photo lists once, in batches.
	for (let after = 0; ; ) {
		const rows = await q.sequelize.query<{ id: number; content: string }>(
			`SELECT id, content FROM revisions WHERE id > ? AND content NOT LIKE '%"photos":[]%' ORDER BY id LIMIT 500`,
			{ replacements: [after], type: QueryTypes.SELECT }
		);
		if (rows.length === 0) break;
		const pairs: [string, number][] = [];
		for (const r of rows) {
			const photos = (JSON.parse(r.content) as { photos?: { id?: unknown }[] }).photos ?? [];
			for (const id of new Set(photos.map((p) => p.id).filter((id): id is string => typeof id === 'string'))) pairs.push([id, Number(r.id)]);
		}
		if (pairs.length) {
			await q.sequelize.query(`INSERT IGNORE INTO revision_photos (photo_id, revision_id) VALUES ${pairs.map(() => '(?, ?)').join(', ')}`, {
				replacements: pairs.flat()
			});
		}
		after = Number(rows[rows.length - 1].id);
	}
};

export const down: Migration = async ({ context: q }) => {
	await q.dropTable('revision_photos');
};
