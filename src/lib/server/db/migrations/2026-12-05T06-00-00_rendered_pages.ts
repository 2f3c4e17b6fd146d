import type { Migration } from './types';

export const name = '2026-12-05T06-00-00_rendered_pages';

// The reading view's parts that do not depend on the reader (figures, tables, notes, quick facts, outline),
// kept by content digest, unit system and the build that rendered them, so every app server shares one copy.
export const up: Migration = async ({ context: q }) => {
	await q.sequelize.query(`CREATE TABLE rendered_pages (
		sha256 CHAR(64) CHARACTER SET ascii COLLATE ascii_bin NOT NULL,
		units ENUM('metric','imperial') NOT NULL,
		renderer VARCHAR(64) CHARACTER SET ascii COLLATE ascii_bin NOT NULL,
		parts LONGTEXT NOT NULL,
		created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
		PRIMARY KEY (sha256, units, renderer),
		KEY rendered_pages_age (renderer, created_at)
	) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
};

export const down: Migration = async ({ context: q }) => {
	await q.dropTable('rendered_pages');
};
