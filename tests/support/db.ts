/* Row-level reset between integration tests: the schema stays, every table is emptied. */
import { QueryTypes } from 'sequelize';
import { sequelize } from '../../src/lib/server/db';
import { invalidateReferenceCaches } from '../../src/lib/server/services/reference-cache';

// The seeder log is emptied too: with the rows gone, no seeder has run.
const KEEP = new Set(['schema_migrations']);

export async function resetDatabase(): Promise<void> {
	// One pinned connection: FOREIGN_KEY_CHECKS is per session.
	await sequelize.transaction(async (transaction) => {
		const tables = await sequelize.query<{ name: string }>(
			'SELECT table_name AS name FROM information_schema.tables WHERE table_schema = DATABASE()',
			{ type: QueryTypes.SELECT, transaction }
		);
		await sequelize.query('SET FOREIGN_KEY_CHECKS = 0', { type: QueryTypes.RAW, transaction });
		for (const { name } of tables) {
			if (KEEP.has(name)) continue;
			await sequelize.query(`TRUNCATE TABLE \`${name}\``, { type: QueryTypes.RAW, transaction });
		}
		await sequelize.query('SET FOREIGN_KEY_CHECKS = 1', { type: QueryTypes.RAW, transaction });
	});
	// TRUNCATE bypasses the model hooks that keep the in-process caches current.
	invalidateReferenceCaches();
}

export async function countRows(table: string): Promise<number> {
	const [row] = await sequelize.query<{ n: number }>(`SELECT COUNT(*) AS n FROM \`${table}\``, {
		type: QueryTypes.SELECT
	});
	return Number(row?.n ?? 0);
}

/** A cache_generations counter as another connection reads it (0 before its first bump). */
export async function generationCounter(name: string): Promise<number> {
	const [row] = await sequelize.query<{ value: number }>(
		'SELECT value FROM cache_generations WHERE name = :name',
		{ type: QueryTypes.SELECT, replacements: { name } }
	);
	return Number(row?.value ?? 0);
}
