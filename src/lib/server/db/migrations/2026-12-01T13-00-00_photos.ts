import type { Migration } from './types';

export const name = '2026-12-01T13-00-00_photos';

// A photo's id is the sha256 of the bytes uploaded, so the same file is one row however often it is added.
export const up: Migration = async ({ context: q }) => {
	await q.sequelize.query(`CREATE TABLE photos (
		id CHAR(64) CHARACTER SET ascii COLLATE ascii_bin NOT NULL PRIMARY KEY,
		mime VARCHAR(40) NOT NULL,
		width INT UNSIGNED NOT NULL,
		height INT UNSIGNED NOT NULL,
		bytes INT UNSIGNED NOT NULL,
		uploader_id INT UNSIGNED NOT NULL,
		created_at DATETIME(3) NOT NULL,
		KEY photos_uploader_time (uploader_id, created_at),
		CONSTRAINT photos_uploader FOREIGN KEY (uploader_id) REFERENCES users(id)
	) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
};

export const down: Migration = async ({ context: q }) => {
	await q.dropTable('photos');
};
