import type { Migration } from './types';

export const name = '2026-12-01T14-00-00_accounts_watch_review';

const TABLE_OPTIONS = 'ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci';

export const up: Migration = async ({ context: q }) => {
	// Invite and reset links: only the sha256 of the token is kept, so a leaked table opens no account.
	await q.sequelize.query(`CREATE TABLE account_tokens (
		id INT UNSIGNED AUTO_INCREMENT PRIMARY KEY,
		kind ENUM('invite','reset') NOT NULL,
		user_id INT UNSIGNED NULL,
		email VARCHAR(254) NULL,
		role ENUM('viewer','editor','moderator','admin') NULL,
		invited_by INT UNSIGNED NULL,
		token_hash CHAR(64) NOT NULL,
		expires_at DATETIME(3) NOT NULL,
		used_at DATETIME(3) NULL,
		revoked_at DATETIME(3) NULL,
		created_at DATETIME(3) NOT NULL,
		UNIQUE KEY account_tokens_hash (token_hash),
		KEY account_tokens_kind_email (kind, email),
		KEY account_tokens_kind_user (kind, user_id),
		CONSTRAINT account_tokens_user FOREIGN KEY (user_id) REFERENCES users(id),
		CONSTRAINT account_tokens_inviter FOREIGN KEY (invited_by) REFERENCES users(id)
	) ${TABLE_OPTIONS}`);
	await q.sequelize.query(`CREATE TABLE watches (
		id INT UNSIGNED AUTO_INCREMENT PRIMARY KEY,
		user_id INT UNSIGNED NOT NULL,
		vehicle_id INT UNSIGNED NOT NULL,
		created_at DATETIME(3) NOT NULL,
		UNIQUE KEY watches_user_vehicle (user_id, vehicle_id),
		KEY watches_vehicle (vehicle_id),
		CONSTRAINT watches_user FOREIGN KEY (user_id) REFERENCES users(id),
		CONSTRAINT watches_vehicle FOREIGN KEY (vehicle_id) REFERENCES vehicles(id)
	) ${TABLE_OPTIONS}`);
	await q.sequelize.query(`CREATE TABLE notification_preferences (
		user_id INT UNSIGNED NOT NULL PRIMARY KEY,
		watch_own_edits TINYINT(1) NOT NULL DEFAULT 1,
		notice_mode ENUM('immediate','digest') NOT NULL DEFAULT 'immediate',
		last_digest_at DATETIME(3) NULL,
		CONSTRAINT notification_preferences_user FOREIGN KEY (user_id) REFERENCES users(id)
	) ${TABLE_OPTIONS}`);
	await q.sequelize.query(`CREATE TABLE pending_notices (
		id BIGINT UNSIGNED AUTO_INCREMENT PRIMARY KEY,
		user_id INT UNSIGNED NOT NULL,
		vehicle_id INT UNSIGNED NOT NULL,
		revision_id BIGINT UNSIGNED NOT NULL,
		mode ENUM('immediate','digest') NOT NULL,
		created_at DATETIME(3) NOT NULL,
		sent_at DATETIME(3) NULL,
		UNIQUE KEY pending_notices_user_revision (user_id, revision_id),
		KEY pending_notices_due (mode, sent_at, user_id),
		CONSTRAINT pending_notices_user FOREIGN KEY (user_id) REFERENCES users(id),
		CONSTRAINT pending_notices_vehicle FOREIGN KEY (vehicle_id) REFERENCES vehicles(id),
		CONSTRAINT pending_notices_revision FOREIGN KEY (revision_id) REFERENCES revisions(id)
	) ${TABLE_OPTIONS}`);
	await q.sequelize.query(`CREATE TABLE blocks (
		id INT UNSIGNED AUTO_INCREMENT PRIMARY KEY,
		user_id INT UNSIGNED NOT NULL,
		by_id INT UNSIGNED NOT NULL,
		reason VARCHAR(500) NOT NULL,
		until DATETIME(3) NOT NULL,
		created_at DATETIME(3) NOT NULL,
		lifted_at DATETIME(3) NULL,
		lifted_by INT UNSIGNED NULL,
		KEY blocks_user_active (user_id, lifted_at, until),
		KEY blocks_time (created_at),
		CONSTRAINT blocks_user FOREIGN KEY (user_id) REFERENCES users(id),
		CONSTRAINT blocks_by FOREIGN KEY (by_id) REFERENCES users(id),
		CONSTRAINT blocks_lifted_by FOREIGN KEY (lifted_by) REFERENCES users(id)
	) ${TABLE_OPTIONS}`);
	// Review is metadata beside the append-only content, like the hidden flag.
	await q.sequelize.query(`ALTER TABLE revisions
		ADD COLUMN reviewed_by INT UNSIGNED NULL,
		ADD COLUMN reviewed_at DATETIME(3) NULL,
		ADD KEY revisions_review (reviewed_at, id),
		ADD CONSTRAINT revisions_reviewer FOREIGN KEY (reviewed_by) REFERENCES users(id)`);
};

export const down: Migration = async ({ context: q }) => {
	await q.sequelize.query(`ALTER TABLE revisions
		DROP FOREIGN KEY revisions_reviewer,
		DROP KEY revisions_review,
		DROP COLUMN reviewed_at,
		DROP COLUMN reviewed_by`);
	for (const table of ['blocks', 'pending_notices', 'notification_preferences', 'watches', 'account_tokens']) {
		await q.dropTable(table);
	}
};
