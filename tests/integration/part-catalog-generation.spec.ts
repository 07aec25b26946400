import { beforeAll, describe, expect, it } from 'vitest';
import { Part, Photo, Quote, Store, sequelize } from '../../src/lib/server/db';
import { seeder } from '../../src/lib/server/db/seeders';
import { generationCounter, resetDatabase } from '../support/db';

/*
 * The catalog's validator (src/lib/server/http/list-caching.ts) reads the `part-catalog`
 * counter. Every write to a part, quote, store or photo row must move it, whichever service
 * or process made it, and only once the write is committed.
 */
const counter = () => generationCounter('part-catalog');

beforeAll(async () => {
	await resetDatabase();
	await seeder(sequelize).up();
});

describe('the part catalog counter', () => {
	it('moves when a quote is added, after its transaction commits, not before', async () => {
		const quote = (await Quote.findOne({ where: { status: 'active' } }))!;
		const before = await counter();
		await sequelize.transaction(async (transaction) => {
			await Quote.create(
				{
					partId: quote.partId,
					storeId: quote.storeId,
					regionId: quote.regionId,
					amountMinor: 12345,
					currency: quote.currency,
					taxIncluded: quote.taxIncluded,
					observedAt: new Date(),
					source: quote.source
				},
				{ transaction }
			);
			// Another connection reads the counter while the quote is still uncommitted.
			expect(await counter()).toBe(before);
		});
		expect(await counter()).toBeGreaterThan(before);
	});

	it('moves on a bulk update of quotes (withdrawing them), outside a transaction', async () => {
		const quote = (await Quote.findOne({ where: { status: 'active' } }))!;
		const before = await counter();
		await Quote.update({ status: 'withdrawn' }, { where: { id: quote.id } });
		expect(await counter()).toBeGreaterThan(before);
	});

	it('moves when a part is renamed, a store renamed, or a photo hidden', async () => {
		const part = (await Part.findOne())!;
		let before = await counter();
		await part.update({ model: `${part.model} II` });
		expect(await counter()).toBeGreaterThan(before);

		const store = (await Store.findOne())!;
		before = await counter();
		await store.update({ name: `${store.name} Outlet` });
		expect(await counter()).toBeGreaterThan(before);

		before = await counter();
		await Photo.update({ hiddenAt: new Date() }, { where: { id: -1 } });
		expect(await counter()).toBeGreaterThan(before);
	});
});
