import type { Migration } from '../umzug.js';

/*
 * Photos are processed off the request path (images/photo-jobs.ts): the upload stores the
 * checked original and a row in `processing`; a background job makes the variants and moves
 * the row to `ready` or `failed`. The row is its own job, claimed with a lease like a mail
 * job (jobs/lease-claim.ts). Rows from before this change are all `ready` (the default).
 * One ALTER TABLE, so the columns and their index arrive together or not at all.
 */
export const up: Migration = async ({ context: qi }) => {
	await qi.sequelize.query(
		`ALTER TABLE photos
		 ADD COLUMN state ENUM('processing', 'ready', 'failed') NOT NULL DEFAULT 'ready' AFTER variants,
		 ADD COLUMN variants_done SMALLINT UNSIGNED NOT NULL DEFAULT 0 AFTER state,
		 ADD COLUMN variants_total SMALLINT UNSIGNED NOT NULL DEFAULT 0 AFTER variants_done,
		 ADD COLUMN failure VARCHAR(300) NULL AFTER variants_total,
		 ADD COLUMN original_key VARCHAR(80) NULL AFTER failure,
		 ADD COLUMN attempts SMALLINT UNSIGNED NOT NULL DEFAULT 0 AFTER original_key,
		 ADD COLUMN attempt_id CHAR(36) NULL AFTER attempts,
		 ADD COLUMN lease_until DATETIME(3) NULL AFTER attempt_id,
		 ADD INDEX photos_state_lease (state, lease_until)`
	);
};

export const down: Migration = async ({ context: qi }) => {
	await qi.sequelize.query(
		`ALTER TABLE photos DROP INDEX photos_state_lease, DROP COLUMN state, DROP COLUMN variants_done,
		 DROP COLUMN variants_total, DROP COLUMN failure, DROP COLUMN original_key, DROP COLUMN attempts,
		 DROP COLUMN attempt_id, DROP COLUMN lease_until`
	);
};
