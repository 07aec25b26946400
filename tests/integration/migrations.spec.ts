import { QueryTypes } from 'sequelize';
import { beforeAll, describe, expect, it } from 'vitest';
import { sequelize } from '../../src/lib/server/db';
import { migrations } from '../../src/lib/server/db/migrations';
import { seedDemoCommunity } from '../../src/lib/server/db/seeders/demo-community';
import {
	demoGuides,
	demoParts,
	demoRegions,
	demoStores,
	demoUsers
} from '../../src/lib/server/db/seeders/demo-data';
import { seeder } from '../../src/lib/server/db/seeders';
import { migrator } from '../../src/lib/server/db/umzug';
import { countRows, resetDatabase } from '../support/db';

const APP_TABLES = [
	'users',
	'regions',
	'fx_rates',
	'parts',
	'stores',
	'quotes',
	'guides',
	'guide_revisions',
	'guide_slots',
	'slot_alternates'
];

/** Every table but the migration and seeder logs. */
async function tablesPresent(): Promise<string[]> {
	const rows = await sequelize.query<{ name: string }>(
		'SELECT table_name AS name FROM information_schema.tables WHERE table_schema = DATABASE()',
		{ type: QueryTypes.SELECT }
	);
	return rows
		.map((r) => r.name)
		.filter((n) => !n.startsWith('schema_'))
		.sort();
}

describe('migrations on the real MariaDB', () => {
	it('runs every migration down and up again, leaving the full schema', async () => {
		const umzug = migrator(sequelize);
		const reverted = await umzug.down({ to: 0 });
		expect(reverted.map((m) => m.name)).toEqual(Object.keys(migrations).reverse());
		expect(await tablesPresent()).toEqual([]);

		const applied = await umzug.up();
		expect(applied.map((m) => m.name)).toEqual(Object.keys(migrations));
		expect(await tablesPresent()).toEqual(expect.arrayContaining(APP_TABLES));
		expect(await umzug.pending()).toEqual([]);
	});

	it('enforces the foreign keys it declares (no orphan slot)', async () => {
		await resetDatabase();
		await expect(
			sequelize.query(
				"INSERT INTO guide_slots (revision_id, slot_key, category, label, position, quantity, pick_part_id, reason, created_at, updated_at) VALUES (999, UUID(), 'cpu', 'CPU', 1, 1, 999, 'x', NOW(), NOW())",
				{ type: QueryTypes.INSERT }
			)
		).rejects.toThrow(/foreign key constraint/i);
	});
});

describe('demo seed', () => {
	beforeAll(resetDatabase);

	async function counts() {
		const result: Record<string, number> = {};
		for (const table of APP_TABLES) result[table] = await countRows(table);
		return result;
	}

	it('seeds the invented community, and a second run adds no duplicates', async () => {
		await seedDemoCommunity(sequelize);
		const first = await counts();
		expect(first.users).toBe(demoUsers.length);
		expect(first.regions).toBe(demoRegions.length);
		expect(first.stores).toBe(demoStores.length);
		expect(first.parts).toBe(demoParts.length);
		expect(first.guides).toBe(demoGuides.length);
		expect(first.guide_slots).toBe(demoGuides.reduce((n, g) => n + g.slots.length, 0));
		expect(first.quotes).toBeGreaterThan(0);

		await seedDemoCommunity(sequelize);
		expect(await counts()).toEqual(first);
	});

	it('runs through the seeder log twice without duplicates either', async () => {
		const before = await counts();
		await seeder(sequelize).up();
		// The only rows the log adds over the community seed: the demo exchange rates.
		const once = await counts();
		expect(once).toEqual({ ...before, fx_rates: 11 });
		await seeder(sequelize).up();
		expect(await counts()).toEqual(once);
	});

	it('stores demo passwords as argon2id hashes, never in clear', async () => {
		const rows = await sequelize.query<{ password_hash: string }>(
			'SELECT password_hash FROM users',
			{
				type: QueryTypes.SELECT
			}
		);
		for (const row of rows)
			expect(row.password_hash).toMatch(/^\$argon2id\$v=19\$m=19456,t=2,p=1\$/);
	});
});
