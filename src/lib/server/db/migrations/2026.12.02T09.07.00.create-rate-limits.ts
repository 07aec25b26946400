/*
 * The shared counter table of rate-limiter-flexible's RateLimiterMySQL (see
 * src/lib/server/rate-limit.ts). The library inserts with `INSERT INTO … VALUES (?, ?, ?)`
 * and no column list, so the table must have exactly these three columns in this order, as in
 * its own `_getCreateTableStmt()` (lib/RateLimiterMySQL.js, 11.4.0): `key` VARCHAR(255)
 * primary key, `points` INT NOT NULL DEFAULT 0, `expire` BIGINT UNSIGNED (epoch ms, NULL =
 * never), InnoDB (the atomic upsert relies on its row locks). No timestamps or id column.
 *
 * Differences from the library's statement, on purpose: utf8mb4 with a binary collation
 * instead of utf8 with the default case- and accent-insensitive one, so two keys are the same
 * counter only when they are byte-identical (the limiter normalises keys itself).
 */
import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';

export const up: Migration = async ({ context: qi }) => {
	await qi.createTable(
		'rate_limits',
		{
			key: {
				type: 'VARCHAR(255) CHARACTER SET utf8mb4 COLLATE utf8mb4_bin',
				allowNull: false,
				primaryKey: true
			},
			points: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
			expire: { type: DataTypes.BIGINT.UNSIGNED, allowNull: true }
		},
		{ engine: 'InnoDB', charset: 'utf8mb4', collate: 'utf8mb4_bin' }
	);
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('rate_limits');
};
