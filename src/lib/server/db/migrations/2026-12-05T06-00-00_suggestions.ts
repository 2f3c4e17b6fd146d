import type { Migration } from './types';

export const name = '2026-12-05T06-00-00_suggestions';

// A writer's change to a page locked for moderators, kept with the revision it started from until a
// moderator applies it (through the normal save and its merge) or declines it with a note.
export const up: Migration = async ({ context: q }) => {
	await q.sequelize.query(`CREATE TABLE suggestions (
		id INT UNSIGNED AUTO_INCREMENT PRIMARY KEY,
		vehicle_id INT UNSIGNED NOT NULL,
		author_id INT UNSIGNED NOT NULL,
		base_revision_id BIGINT UNSIGNED NOT NULL,
		content LONGTEXT NOT NULL,
		summary VARCHAR(500) NOT NULL DEFAULT '',
		status ENUM('open','applied','declined') NOT NULL DEFAULT 'open',
		answered_by INT UNSIGNED NULL,
		answered_at DATETIME(3) NULL,
		answer_note VARCHAR(500) NOT NULL DEFAULT '',
		applied_revision_id BIGINT UNSIGNED NULL,
		created_at DATETIME(3) NOT NULL,
		KEY suggestions_vehicle (vehicle_id, status),
		KEY suggestions_open (status, created_at),
		KEY suggestions_author (author_id, created_at),
		CONSTRAINT suggestions_vehicle FOREIGN KEY (vehicle_id) REFERENCES vehicles(id),
		CONSTRAINT suggestions_author FOREIGN KEY (author_id) REFERENCES users(id),
		CONSTRAINT suggestions_base FOREIGN KEY (base_revision_id) REFERENCES revisions(id),
		CONSTRAINT suggestions_answered_by FOREIGN KEY (answered_by) REFERENCES users(id),
		CONSTRAINT suggestions_applied FOREIGN KEY (applied_revision_id) REFERENCES revisions(id)
	) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
};

export const down: Migration = async ({ context: q }) => {
	await q.dropTable('suggestions');
};
