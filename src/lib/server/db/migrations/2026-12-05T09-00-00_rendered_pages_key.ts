import type { Migration } from './types';

export const name = '2026-12-05T09-00-00_rendered_pages_key';

// The stored parts are found by joining on revisions.sha256; a digest column of another character
// set cannot use the primary key for that join and the page query scans every stored part.
export const up: Migration = async ({ context: q }) => {
	await q.sequelize.query('ALTER TABLE rendered_pages MODIFY sha256 CHAR(64) CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci NOT NULL');
};

export const down: Migration = async ({ context: q }) => {
	await q.sequelize.query('ALTER TABLE rendered_pages MODIFY sha256 CHAR(64) CHARACTER SET ascii COLLATE ascii_bin NOT NULL');
};
