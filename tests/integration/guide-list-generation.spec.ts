import { beforeAll, describe, expect, it } from 'vitest';
import { Guide, User, sequelize } from '../../src/lib/server/db';
import { seeder } from '../../src/lib/server/db/seeders';
import * as accounts from '../../src/lib/server/services/accounts';
import { generationCounter, resetDatabase } from '../support/db';

/*
 * The guide lists' validator (src/lib/server/http/list-caching.ts) reads the `guide-list`
 * counter. Every write to a guide row, and an author's new name, must move it, and only
 * once the write is committed: a reader that sees the new counter must see the write.
 */
const counter = () => generationCounter('guide-list');

beforeAll(async () => {
	await resetDatabase();
	await seeder(sequelize).up();
});

describe('the guide list counter', () => {
	it('moves when a guide row is saved, after its transaction commits, not before', async () => {
		const guide = (await Guide.findOne({ where: { state: 'published' } }))!;
		const before = await counter();
		await sequelize.transaction(async (transaction) => {
			await guide.update({ featured: !guide.featured }, { transaction });
			// Another connection reads the counter while the write is still uncommitted.
			expect(await counter()).toBe(before);
		});
		expect(await counter()).toBeGreaterThan(before);
	});

	it('moves on a bulk update outside a transaction (hiding a guide, for instance)', async () => {
		const guide = (await Guide.findOne({ where: { state: 'published' } }))!;
		const before = await counter();
		await Guide.update({ hiddenAt: null }, { where: { id: guide.id } });
		expect(await counter()).toBeGreaterThan(before);
	});

	it('stays when a draft save moves only the guide row’s version', async () => {
		// A draft's details live on its revision; the lists show nothing of the row's version.
		const guide = (await Guide.findOne({ where: { state: 'published' } }))!;
		const before = await counter();
		await Guide.update({ version: guide.version + 1 }, { where: { id: guide.id } });
		expect(await counter()).toBe(before);
	});

	it('moves when an author changes the name the lists show', async () => {
		const author = (await User.findOne({ where: { role: 'author' } }))!;
		const before = await counter();
		await accounts.updateProfile(author.id, { name: 'Renamed Author' });
		expect(await counter()).toBeGreaterThan(before);
	});
});
