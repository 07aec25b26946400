/**
 * Names of the counters in cache_generations (services/cache-generations.ts). Kept apart,
 * without app imports, so models and seeders can bump them too.
 */

/** The computed guide view and its validators: bumped by every event listed in guide-view-cache.ts. */
export const GUIDE_VIEW = 'guide-view';

/**
 * What the guide lists show beyond prices (home, /guides, GET /api/v1/guides): a guide row
 * written (published, featured, hidden, retitled) or an author's name changed. Prices and
 * fit move GUIDE_VIEW, which the lists' validator reads as well.
 */
export const GUIDE_LIST = 'guide-list';

/**
 * What the parts catalog shows (/parts, GET /api/v1/parts): a part, quote, store or photo
 * row written (db/generation-hooks.ts in those models). Rates and regions move GUIDE_VIEW,
 * which the catalog's validator reads as well.
 */
export const PART_CATALOG = 'part-catalog';

/**
 * What a guide page shows beyond its computed view (services/guide-page-extras.ts): forks
 * and public builds of it, its gallery, part photos, tips and their notes, and the names on
 * them. Moved by writes to builds, gallery rows, photos, parts, tips, tip settings and
 * people's names (db/generation-hooks.ts in those models).
 */
export const GUIDE_EXTRAS = 'guide-extras';

/** The statement that moves a counter on; run it after the write it announces has committed. */
export const BUMP_SQL = `INSERT INTO cache_generations (name, value, updated_at) VALUES (:name, 1, NOW())
	 ON DUPLICATE KEY UPDATE value = value + 1, updated_at = NOW()`;
