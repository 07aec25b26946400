import { QueryTypes } from 'sequelize';
import type { Migration } from '../umzug.js';

/*
 * The digest an alert was first listed in (null: not mailed yet). "New since the last
 * digest" is then exact: an alert whose row commits while a digest is being written is
 * simply unmarked and goes in the next one, whatever its first_seen_at says. One ALTER for
 * column and key, so it cannot stop half-way; the key is named so down can drop it.
 */
export const up: Migration = async ({ context: qi }) => {
	await qi.sequelize.query(
		`ALTER TABLE guide_upkeep_alerts ADD COLUMN digest_id INT UNSIGNED NULL,
		 ADD CONSTRAINT guide_upkeep_alerts_digest_fk FOREIGN KEY (digest_id)
		 REFERENCES upkeep_digests (id) ON DELETE SET NULL ON UPDATE CASCADE`,
		{ type: QueryTypes.RAW }
	);
};

export const down: Migration = async ({ context: qi }) => {
	await qi.sequelize.query(
		`ALTER TABLE guide_upkeep_alerts DROP FOREIGN KEY guide_upkeep_alerts_digest_fk,
		 DROP COLUMN digest_id`,
		{ type: QueryTypes.RAW }
	);
};
