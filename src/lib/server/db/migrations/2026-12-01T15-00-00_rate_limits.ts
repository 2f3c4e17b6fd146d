import type { Migration } from './types';

export const name = '2026-12-01T15-00-00_rate_limits';

// Counters for sign-in lockouts and reset requests, kept in MariaDB so every app instance sees the same count.
export const up: Migration = async ({ context: q }) => {
	await q.sequelize.query(`CREATE TABLE rate_limits (
		k VARCHAR(255) CHARACTER SET utf8mb4 COLLATE utf8mb4_bin NOT NULL PRIMARY KEY,
		points INT NOT NULL,
		expire_ms BIGINT UNSIGNED NOT NULL,
		KEY rate_limits_expire (expire_ms)
	) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
};

export const down: Migration = async ({ context: q }) => {
	await q.dropTable('rate_limits');
};
