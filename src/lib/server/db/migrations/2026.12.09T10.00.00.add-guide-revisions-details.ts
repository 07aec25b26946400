import { QueryTypes } from 'sequelize';
import type { Migration } from '../umzug.js';

/*
 * A guide's details (title, summary, budget, base region, tags, disclosure, walkthrough link)
 * move onto its revisions, so a saved draft changes nothing public until an editor approves
 * it (issue 12, item 1). One change: the columns are added, filled from the guide row and
 * only then made required, which cannot be split without leaving rows empty in between.
 * The guides table keeps its columns as the published revision's copy, written only when a
 * revision is approved (services/guide-reviews).
 *
 * Backfill: every existing revision gets its guide's current details. That is the only
 * source there is; where a draft had already overwritten the guide row, the published
 * revision inherits those words, exactly as the public page showed them.
 */
const raw = { type: QueryTypes.RAW };

export const up: Migration = async ({ context: qi }) => {
	const q = (sql: string) => qi.sequelize.query(sql, raw);
	await q(`ALTER TABLE guide_revisions
		ADD COLUMN title VARCHAR(160) NULL,
		ADD COLUMN summary TEXT NULL,
		ADD COLUMN target_budget_minor BIGINT UNSIGNED NULL,
		ADD COLUMN base_region_id INT UNSIGNED NULL,
		ADD COLUMN tags JSON NULL,
		ADD COLUMN disclosure VARCHAR(16) NULL,
		ADD COLUMN disclosure_note TEXT NULL,
		ADD COLUMN walkthrough_url VARCHAR(500) NULL`);
	await q(`UPDATE guide_revisions r JOIN guides g ON g.id = r.guide_id SET
		r.title = g.title, r.summary = g.summary, r.target_budget_minor = g.target_budget_minor,
		r.base_region_id = g.base_region_id, r.tags = g.tags, r.disclosure = g.disclosure,
		r.disclosure_note = g.disclosure_note, r.walkthrough_url = g.walkthrough_url`);
	await q(`ALTER TABLE guide_revisions
		MODIFY title VARCHAR(160) NOT NULL,
		MODIFY summary TEXT NOT NULL,
		MODIFY target_budget_minor BIGINT UNSIGNED NOT NULL,
		MODIFY base_region_id INT UNSIGNED NOT NULL,
		MODIFY tags JSON NOT NULL,
		MODIFY disclosure VARCHAR(16) NOT NULL DEFAULT 'none',
		ADD CONSTRAINT guide_revisions_base_region_id_fk FOREIGN KEY (base_region_id)
			REFERENCES regions (id) ON DELETE RESTRICT ON UPDATE CASCADE`);
};

export const down: Migration = async ({ context: qi }) => {
	const q = (sql: string) => qi.sequelize.query(sql, raw);
	await q('ALTER TABLE guide_revisions DROP FOREIGN KEY guide_revisions_base_region_id_fk');
	await q(`ALTER TABLE guide_revisions
		DROP COLUMN title, DROP COLUMN summary, DROP COLUMN target_budget_minor,
		DROP COLUMN base_region_id, DROP COLUMN tags, DROP COLUMN disclosure,
		DROP COLUMN disclosure_note, DROP COLUMN walkthrough_url`);
};
