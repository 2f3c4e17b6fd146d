import type { Migration } from './types';

export const name = '2026-12-01T12-00-00_parts_and_trust';

export const up: Migration = async ({ context: q }) => {
	// Box sizes in mm as columns (the fit check reads them); the kind's own figures in specs (JSON).
	await q.sequelize.query(`CREATE TABLE parts (
		id INT UNSIGNED AUTO_INCREMENT PRIMARY KEY,
		kind ENUM('amplifier','head-unit','speaker','enclosure') NOT NULL,
		sku VARCHAR(60) NOT NULL,
		name VARCHAR(160) NOT NULL,
		length_mm DOUBLE NULL,
		width_mm DOUBLE NULL,
		height_mm DOUBLE NULL,
		specs TEXT NOT NULL,
		notes TEXT NOT NULL,
		created_by INT UNSIGNED NULL,
		updated_by INT UNSIGNED NULL,
		created_at DATETIME(3) NOT NULL,
		updated_at DATETIME(3) NOT NULL,
		UNIQUE KEY parts_sku (sku),
		KEY parts_kind_name (kind, name)
	) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
	await q.sequelize.query(`CREATE TABLE confirmations (
		id BIGINT UNSIGNED AUTO_INCREMENT PRIMARY KEY,
		vehicle_id INT UNSIGNED NOT NULL,
		revision_id BIGINT UNSIGNED NOT NULL,
		user_id INT UNSIGNED NOT NULL,
		kind ENUM('confirm','flag') NOT NULL,
		field_path VARCHAR(200) NULL,
		note VARCHAR(1000) NOT NULL DEFAULT '',
		created_at DATETIME(3) NOT NULL,
		KEY confirmations_vehicle_time (vehicle_id, created_at),
		KEY confirmations_user_time (user_id, created_at),
		CONSTRAINT confirmations_vehicle FOREIGN KEY (vehicle_id) REFERENCES vehicles(id),
		CONSTRAINT confirmations_revision FOREIGN KEY (revision_id) REFERENCES revisions(id),
		CONSTRAINT confirmations_user FOREIGN KEY (user_id) REFERENCES users(id)
	) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
};

export const down: Migration = async ({ context: q }) => {
	for (const table of ['confirmations', 'parts']) await q.dropTable(table);
};
