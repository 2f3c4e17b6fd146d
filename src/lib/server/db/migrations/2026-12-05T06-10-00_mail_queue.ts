import type { Migration } from './types';

export const name = '2026-12-05T06-10-00_mail_queue';

// Every mail the app sends is written here first, in the same transaction as the change that asks for it,
// and sent from here with retries: a mail server that is down loses nothing, and a claim keeps two app
// servers from sending the same message.
export const up: Migration = async ({ context: q }) => {
	await q.sequelize.query(`CREATE TABLE mail_queue (
		id BIGINT UNSIGNED NOT NULL AUTO_INCREMENT PRIMARY KEY,
		recipient VARCHAR(320) NOT NULL,
		subject VARCHAR(500) NOT NULL,
		text_body MEDIUMTEXT NOT NULL,
		html_body MEDIUMTEXT NOT NULL,
		message_id VARCHAR(200) CHARACTER SET ascii COLLATE ascii_bin NOT NULL,
		attempts INT UNSIGNED NOT NULL DEFAULT 0,
		next_attempt_at DATETIME(3) NOT NULL,
		claim CHAR(16) CHARACTER SET ascii COLLATE ascii_bin NULL,
		claimed_until DATETIME(3) NULL,
		last_error VARCHAR(500) NULL,
		created_at DATETIME(3) NOT NULL,
		sent_at DATETIME(3) NULL,
		UNIQUE KEY mail_queue_message (message_id),
		KEY mail_queue_due (sent_at, next_attempt_at)
	) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
};

export const down: Migration = async ({ context: q }) => {
	await q.dropTable('mail_queue');
};
