import type { Migration } from './types';

export const name = '2026-12-05T03-00-00_ended_sessions';

// A signed-out session is remembered until its cookie would have expired, so a copied cookie stops working on
// every app server. The first admin of an empty install may be made through a one-time setup link.
export const up: Migration = async ({ context: q }) => {
	await q.sequelize.query(`CREATE TABLE ended_sessions (
		session_id CHAR(36) CHARACTER SET ascii COLLATE ascii_bin NOT NULL PRIMARY KEY,
		user_id INT UNSIGNED NOT NULL,
		expires_at DATETIME(3) NOT NULL,
		KEY ended_sessions_user (user_id, expires_at),
		KEY ended_sessions_expiry (expires_at)
	) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
	await q.sequelize.query(`ALTER TABLE account_tokens MODIFY kind ENUM('invite','reset','setup') NOT NULL`);
};

export const down: Migration = async ({ context: q }) => {
	await q.sequelize.query(`DELETE FROM account_tokens WHERE kind = 'setup'`);
	await q.sequelize.query(`ALTER TABLE account_tokens MODIFY kind ENUM('invite','reset') NOT NULL`);
	await q.dropTable('ended_sessions');
};
