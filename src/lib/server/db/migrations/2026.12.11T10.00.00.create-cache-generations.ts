import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';

/*
 * Counters that app processes compare to know whether what they keep in memory is still
 * current (services/guide-view-cache.ts). Several processes (`npm run serve`) share one
 * database, so a write in one must reach the memory of the others: every write that changes
 * a cached value bumps its counter here, and every reader compares it with one primary-key
 * read. One row per kind of cached value, created on first bump.
 */
export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('cache_generations', {
		name: { type: DataTypes.STRING(32), primaryKey: true, allowNull: false },
		value: { type: DataTypes.BIGINT.UNSIGNED, allowNull: false },
		updated_at: { type: DataTypes.DATE, allowNull: false }
	});
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('cache_generations');
};
