/**
 * Generation counters in MariaDB (table cache_generations) that tell every app process
 * whether what it keeps in memory is still current. `npm run serve` runs several processes
 * against one database, and a write in one (an approval, an accepted quote, a rates refresh)
 * must reach the memory of all of them: an in-process event would only reach the writer.
 *
 * Why a counter read on each request rather than a time-to-live: the guide page's ETag is
 * built from it, and a validator that can lag a write would let a shared cache keep
 * answering 304 with the old price. The read is one primary-key lookup folded into the
 * guide's own slug lookup (guide-view-cache.ts), so it costs no extra round trip. It runs
 * on the same connection pool (replica or primary) as the reads that compute the view, so a
 * counter already bumped there implies the data that caused the bump is there too.
 */
import { QueryTypes } from 'sequelize';
import { sequelize } from '$lib/server/db';
import { BUMP_SQL, GUIDE_EXTRAS, GUIDE_LIST, GUIDE_VIEW } from '$lib/server/db/generation-names';

export { GUIDE_EXTRAS, GUIDE_LIST, GUIDE_VIEW };

/**
 * Moves the counter `name` on. Call after the write it announces has committed, never
 * inside it: readers that see the new value must also see the write.
 */
export async function bump(name: string): Promise<void> {
	await sequelize.query(BUMP_SQL, { type: QueryTypes.INSERT, replacements: { name } });
}

/** Bumps the guide view counter: every cached guide page and pricing answer is recomputed. */
export function bumpGuideViews(): Promise<void> {
	return bump(GUIDE_VIEW);
}

/** Bumps the guide list counter: every kept guide list answer is made again. */
export function bumpGuideLists(): Promise<void> {
	return bump(GUIDE_LIST);
}
