import type { Migration } from './types';

export const name = '2026-12-01T10-00-00_foundation';

export const up: Migration = async ({ context: q }) => {
	await q.sequelize.query(`CREATE TABLE users (
		id INT UNSIGNED AUTO_INCREMENT PRIMARY KEY,
		email VARCHAR(254) NOT NULL,
		name VARCHAR(120) NOT NULL,
		password_hash VARCHAR(100) NULL,
		role ENUM('viewer','editor','moderator','admin') NOT NULL DEFAULT 'viewer',
		status ENUM('active','disabled') NOT NULL DEFAULT 'active',
		units ENUM('metric','imperial') NOT NULL DEFAULT 'metric',
		session_version INT UNSIGNED NOT NULL DEFAULT 1,
		created_at DATETIME(3) NOT NULL,
		updated_at DATETIME(3) NOT NULL,
		UNIQUE KEY users_email (email)
	) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
	await q.sequelize.query(`CREATE TABLE makes (
		id INT UNSIGNED AUTO_INCREMENT PRIMARY KEY,
		name VARCHAR(80) NOT NULL,
		slug VARCHAR(80) NOT NULL,
		UNIQUE KEY makes_name (name),
		UNIQUE KEY makes_slug (slug)
	) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
	await q.sequelize.query(`CREATE TABLE models (
		id INT UNSIGNED AUTO_INCREMENT PRIMARY KEY,
		make_id INT UNSIGNED NOT NULL,
		name VARCHAR(80) NOT NULL,
		slug VARCHAR(80) NOT NULL,
		UNIQUE KEY models_make_slug (make_id, slug),
		CONSTRAINT models_make FOREIGN KEY (make_id) REFERENCES makes(id)
	) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
	await q.sequelize.query(`CREATE TABLE vehicles (
		id INT UNSIGNED AUTO_INCREMENT PRIMARY KEY,
		slug VARCHAR(160) NOT NULL,
		make_id INT UNSIGNED NOT NULL,
		model_id INT UNSIGNED NOT NULL,
		year_from SMALLINT UNSIGNED NOT NULL,
		year_to SMALLINT UNSIGNED NOT NULL,
		body VARCHAR(20) NOT NULL,
		latest_revision_id BIGINT UNSIGNED NULL,
		protection ENUM('none','moderators') NOT NULL DEFAULT 'none',
		created_at DATETIME(3) NOT NULL,
		updated_at DATETIME(3) NOT NULL,
		UNIQUE KEY vehicles_slug (slug),
		KEY vehicles_model_years (model_id, year_from, year_to),
		KEY vehicles_make (make_id),
		CONSTRAINT vehicles_make FOREIGN KEY (make_id) REFERENCES makes(id),
		CONSTRAINT vehicles_model FOREIGN KEY (model_id) REFERENCES models(id)
	) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
	await q.sequelize.query(`CREATE TABLE vehicle_slugs (
		slug VARCHAR(160) NOT NULL PRIMARY KEY,
		vehicle_id INT UNSIGNED NOT NULL,
		CONSTRAINT vehicle_slugs_vehicle FOREIGN KEY (vehicle_id) REFERENCES vehicles(id)
	) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
	await q.sequelize.query(`CREATE TABLE revisions (
		id BIGINT UNSIGNED AUTO_INCREMENT PRIMARY KEY,
		vehicle_id INT UNSIGNED NOT NULL,
		parent_id BIGINT UNSIGNED NULL,
		author_id INT UNSIGNED NOT NULL,
		summary VARCHAR(500) NOT NULL DEFAULT '',
		content LONGTEXT NOT NULL,
		rendered LONGTEXT NOT NULL,
		sha256 CHAR(64) NOT NULL,
		size INT UNSIGNED NOT NULL,
		size_delta INT NOT NULL DEFAULT 0,
		sections VARCHAR(200) NOT NULL DEFAULT '',
		restores_revision_id BIGINT UNSIGNED NULL,
		hidden TINYINT(1) NOT NULL DEFAULT 0,
		created_at DATETIME(3) NOT NULL,
		KEY revisions_vehicle_time (vehicle_id, created_at),
		KEY revisions_author_time (author_id, created_at),
		KEY revisions_time (created_at),
		CONSTRAINT revisions_vehicle FOREIGN KEY (vehicle_id) REFERENCES vehicles(id),
		CONSTRAINT revisions_author FOREIGN KEY (author_id) REFERENCES users(id),
		CONSTRAINT revisions_parent FOREIGN KEY (parent_id) REFERENCES revisions(id)
	) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
	await q.sequelize.query(`CREATE TABLE audit_log (
		id BIGINT UNSIGNED AUTO_INCREMENT PRIMARY KEY,
		actor_id INT UNSIGNED NULL,
		action VARCHAR(40) NOT NULL,
		target_type VARCHAR(40) NOT NULL,
		target_id VARCHAR(64) NOT NULL,
		details TEXT NOT NULL,
		created_at DATETIME(3) NOT NULL,
		KEY audit_time (created_at),
		KEY audit_actor_time (actor_id, created_at),
		KEY audit_action_time (action, created_at)
	) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
	await q.sequelize.query(`CREATE TABLE settings (
		name VARCHAR(60) NOT NULL PRIMARY KEY,
		value TEXT NOT NULL
	) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
};

export const down: Migration = async ({ context: q }) => {
	for (const table of ['settings', 'audit_log', 'revisions', 'vehicle_slugs', 'vehicles', 'models', 'makes', 'users']) {
		await q.dropTable(table);
	}
};
