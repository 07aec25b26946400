import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import type { QueryOptions } from 'sequelize';
import { Part, Quote, Region, Store, User, sequelize } from '../../src/lib/server/db';
import { up as backfill } from '../../src/lib/server/db/migrations/2026.12.15T10.07.00.backfill-part-region-prices';
import * as catalogParts from '../../src/lib/server/services/catalog-parts';
import * as catalogStores from '../../src/lib/server/services/catalog-stores';
import * as parts from '../../src/lib/server/services/parts';
import * as regions from '../../src/lib/server/services/regions';
import { resetDatabase } from '../support/db';

/*
 * part_region_prices, the stored key the catalog sorts by price with, on the real MariaDB:
 * kept by triggers whatever writes a quote, a region's tax or a part, and read by the
 * price sort through its indexes. Every key below is worked by hand from the quotes written
 * here. The rule: a shelf price shown with VAT is the net price × (1 + rate) (docs/sources.md
 * 10d "€100.00 net × 1.19 = €119.00", 11a DE 19 %, 11c EU prices include VAT); the other way,
 * a VAT-inclusive price ÷ (1 + rate) (common practice, no published source). Keys are minor
 * units with the four decimals MariaDB's division keeps (the catalog's key before it was
 * stored had them too, from the MariaDB manual's div_precision_increment, from memory).
 */

interface StoredRow {
	partId: number;
	regionId: number;
	category: string;
	brand: string;
	model: string;
	quoteId: number;
	priceKey: string;
}

async function stored(): Promise<StoredRow[]> {
	return sequelize.query<StoredRow>(
		`SELECT part_id AS partId, region_id AS regionId, category, brand, model,
		        quote_id AS quoteId, CAST(price_key AS CHAR) AS priceKey
		   FROM part_region_prices ORDER BY region_id, part_id`,
		{ type: QueryTypes.SELECT }
	);
}

const day = (d: string) => new Date(`2026-11-${d}T10:00:00Z`);
// A valid air cooler (schemas/part-specs.ts), so the editor's part form accepts it.
const COOLER_SPECS = { type: 'air', heightMm: 155, sockets: ['AM5'], ratedHeatW: 220 };

describe('part_region_prices follows every write', () => {
	let de: Region;
	let us: Region;
	let lindwerk: Store;
	let fuchsbau: Store;
	let baywell: Store;
	let cooler: Part;
	let board: Part;

	beforeEach(async () => {
		await resetDatabase();
		// Germany shows prices with 19 % VAT; the US before sales tax (docs/sources.md 11a, 11c).
		de = await Region.create({
			code: 'de',
			name: 'Germany',
			currency: 'EUR',
			taxMode: 'inclusive',
			taxRateBp: 1900
		});
		us = await Region.create({
			code: 'us',
			name: 'United States',
			currency: 'USD',
			taxMode: 'exclusive',
			taxRateBp: 0
		});
		lindwerk = await Store.create({ name: 'Lindwerk', regionId: de.id, url: 'https://a.test' });
		fuchsbau = await Store.create({ name: 'Fuchsbau', regionId: de.id, url: 'https://b.test' });
		baywell = await Store.create({ name: 'Baywell', regionId: us.id, url: 'https://c.test' });
		cooler = await Part.create({
			category: 'cooler',
			brand: 'Vantor',
			model: 'Strata 606 Air',
			slug: 'vantor-strata-606-air',
			specs: COOLER_SPECS
		});
		board = await Part.create({
			category: 'motherboard',
			brand: 'Kessly',
			model: 'B7 Tern',
			slug: 'kessly-b7-tern',
			specs: {}
		});
	});

	const quote = (
		part: Part,
		store: Store,
		amountMinor: number,
		taxIncluded: boolean,
		d: string,
		transaction?: QueryOptions['transaction']
	) =>
		Quote.create(
			{
				partId: part.id,
				storeId: store.id,
				regionId: store.regionId,
				amountMinor,
				currency: store.regionId === us.id ? 'USD' : 'EUR',
				taxIncluded,
				observedAt: day(d),
				url: null,
				source: 'editor'
			},
			{ transaction }
		);

	it('keys a quote in its region’s tax convention, four decimals kept', async () => {
		const pre = await quote(cooler, lindwerk, 10000, false, '01');
		const odd = await quote(board, fuchsbau, 12345, false, '01');
		const usd = await quote(cooler, baywell, 5999, false, '01');
		expect(await stored()).toEqual([
			// €100.00 net × 1.19 = €119.00 → 11900 minor (docs/sources.md 10d).
			{
				partId: cooler.id,
				regionId: de.id,
				category: 'cooler',
				brand: 'Vantor',
				model: 'Strata 606 Air',
				quoteId: pre.id,
				priceKey: '11900.0000'
			},
			// 12345 × 1.19 = 14690.55 minor, not rounded to a whole cent (as the key always was).
			{
				partId: board.id,
				regionId: de.id,
				category: 'motherboard',
				brand: 'Kessly',
				model: 'B7 Tern',
				quoteId: odd.id,
				priceKey: '14690.5500'
			},
			// Before tax in a before-tax region: the amount itself.
			{
				partId: cooler.id,
				regionId: us.id,
				category: 'cooler',
				brand: 'Vantor',
				model: 'Strata 606 Air',
				quoteId: usd.id,
				priceKey: '5999.0000'
			}
		]);
	});

	it('takes the newer quote, falls back when it is withdrawn, and drops the row with none left', async () => {
		const older = await quote(cooler, lindwerk, 8990, true, '01');
		const newer = await quote(cooler, fuchsbau, 7900, true, '10');
		const keyOf = async () => (await stored()).map((r) => [r.quoteId, r.priceKey]);
		expect(await keyOf()).toEqual([[newer.id, '7900.0000']]);
		// An older observation entered later does not replace the newer one.
		const late = await quote(cooler, lindwerk, 9990, true, '05');
		expect(await keyOf()).toEqual([[newer.id, '7900.0000']]);
		// Same moment: the later id wins, as the pricing service picks it.
		const twin = await quote(cooler, lindwerk, 7500, true, '10');
		expect(await keyOf()).toEqual([[twin.id, '7500.0000']]);
		await twin.update({ status: 'withdrawn' });
		expect(await keyOf()).toEqual([[newer.id, '7900.0000']]);
		await newer.update({ status: 'stale' });
		expect(await keyOf()).toEqual([[late.id, '9990.0000']]);
		// A re-dated quote moves in the order: the oldest becomes the latest.
		await older.update({ observedAt: day('20') });
		expect(await keyOf()).toEqual([[older.id, '8990.0000']]);
		await older.destroy();
		await late.destroy();
		expect(await stored()).toEqual([]);
	});

	it('keys a quote the editor form adds (catalog-stores.addQuote)', async () => {
		const ed = await User.create({ email: 'ed@example.test', name: 'Eda Ledger', role: 'editor' });
		const outcome = await catalogStores.addQuote(
			ed.id,
			{
				partSlug: board.slug,
				storeId: String(lindwerk.id),
				amount: '100,00',
				taxIncluded: 'false',
				observedOn: '2026-11-02'
			},
			new Date('2026-11-03T09:00:00Z')
		);
		expect(outcome.kind).toBe('ok');
		// €100.00 before tax in Germany: 11900 (docs/sources.md 10d).
		expect((await stored()).map((r) => [r.partId, r.priceKey])).toEqual([[board.id, '11900.0000']]);
	});

	it('re-keys a region’s rows when its tax rate or mode changes', async () => {
		await quote(cooler, lindwerk, 10000, false, '01'); // €100.00 before tax
		await quote(board, lindwerk, 11900, true, '01'); // €119.00 with VAT
		const keys = async () => (await stored()).map((r) => r.priceKey);
		expect(await keys()).toEqual(['11900.0000', '11900.0000']);
		const ed = await User.create({ email: 'ed@example.test', name: 'Eda Ledger', role: 'editor' });
		// An invented 7 % from today: 10000 × 1.07 = 10700; the VAT-inclusive quote stays.
		const today = new Date().toISOString().slice(0, 10);
		const rate = await regions.addTaxRate(ed.id, 'de', {
			rate: '7',
			effectiveFrom: today,
			note: 'test rate'
		});
		expect(rate.kind).toBe('ok');
		expect(await keys()).toEqual(['10700.0000', '11900.0000']);
		// Shown before tax: the pre-tax quote as it is, 11900 ÷ 1.07 = 11121.4953… → 11121.4953.
		await de.update({ taxMode: 'exclusive' });
		expect(await keys()).toEqual(['10000.0000', '11121.4953']);
		// The US rows are untouched.
		await quote(cooler, baywell, 5999, false, '01');
		await us.update({ taxRateBp: 0, name: 'United States of America' });
		expect((await stored()).filter((r) => r.regionId === us.id).map((r) => r.priceKey)).toEqual([
			'5999.0000'
		]);
	});

	it('moves with the part’s category, brand and model', async () => {
		await quote(cooler, lindwerk, 7900, true, '01');
		await quote(cooler, baywell, 5999, false, '01');
		const ed = await User.create({ email: 'ed@example.test', name: 'Eda Ledger', role: 'editor' });
		const renamed = await catalogParts.updatePart(ed.id, cooler.slug, {
			brand: 'Orvel',
			model: 'Strata 707',
			specs: COOLER_SPECS
		});
		expect(renamed.kind).toBe('ok');
		// No service recategorises a part; the copy follows a plain UPDATE all the same.
		await cooler.update({ category: 'case' });
		expect((await stored()).map((r) => [r.regionId, r.category, r.brand, r.model])).toEqual([
			[de.id, 'case', 'Orvel', 'Strata 707'],
			[us.id, 'case', 'Orvel', 'Strata 707']
		]);
		const cases = await parts.search({
			q: '',
			category: 'case',
			region: 'de',
			sort: 'price',
			page: 1
		});
		expect(cases.items.map((i) => [i.slug, i.price?.unit.amountMinor])).toEqual([
			[cooler.slug, 7900]
		]);
		const coolers = await parts.search({
			q: '',
			category: 'cooler',
			region: 'de',
			sort: 'price',
			page: 1
		});
		expect(coolers.total).toBe(0);
	});

	it('leaves the table as it was when the writing transaction rolls back', async () => {
		const first = await quote(cooler, lindwerk, 7900, true, '01');
		const before = [
			{
				partId: cooler.id,
				regionId: de.id,
				category: 'cooler',
				brand: 'Vantor',
				model: 'Strata 606 Air',
				quoteId: first.id,
				priceKey: '7900.0000'
			}
		];
		expect(await stored()).toEqual(before);
		await expect(
			sequelize.transaction(async (transaction) => {
				await quote(cooler, fuchsbau, 6900, true, '05', transaction);
				await quote(board, fuchsbau, 4500, true, '05', transaction);
				await Quote.update({ status: 'withdrawn' }, { where: { id: first.id }, transaction });
				throw new Error('abandoned');
			})
		).rejects.toThrow('abandoned');
		expect(await stored()).toEqual(before);
	});

	it('is filled by the migration’s backfill from the quotes already there', async () => {
		await quote(cooler, lindwerk, 8990, true, '01');
		const latest = await quote(cooler, fuchsbau, 10000, false, '09');
		await (await quote(cooler, lindwerk, 5000, true, '12')).update({ status: 'withdrawn' });
		const usd = await quote(board, baywell, 5999, false, '01');
		// As before the table existed: quotes, no rows.
		await sequelize.query('DELETE FROM part_region_prices', { type: QueryTypes.DELETE });
		await backfill({ name: 'backfill', context: sequelize.getQueryInterface() });
		expect((await stored()).map((r) => [r.partId, r.regionId, r.quoteId, r.priceKey])).toEqual([
			// The 9 Nov quote (the 12 Nov one is withdrawn): €100.00 net × 1.19 = 11900.
			[cooler.id, de.id, latest.id, '11900.0000'],
			[board.id, us.id, usd.id, '5999.0000']
		]);
	});

	it('sorts equal prices by brand and model, and fills a page across the unpriced boundary', async () => {
		const make = (brand: string, model: string) =>
			Part.create({
				category: 'case',
				brand,
				model,
				slug: `${brand}-${model}`.toLowerCase().replace(/[^a-z0-9]+/g, '-'),
				specs: {}
			});
		const a = await make('Orvel', 'Ridge');
		const b = await make('Halvard', 'Box 2');
		const c = await make('Halvard', 'Box 1');
		const none1 = await make('Zeltan', 'Quiet');
		const none2 = await make('Aurel', 'Mesh');
		await quote(a, lindwerk, 7900, true, '01');
		await quote(b, lindwerk, 7900, true, '01');
		await quote(c, lindwerk, 8000, true, '01');
		const page = (n: number) =>
			parts
				.search({ q: '', category: 'case', region: 'de', sort: 'price', perPage: 2, page: n })
				.then((r) => r.items.map((i) => i.slug));
		// 79.00 Halvard Box 2, 79.00 Orvel Ridge, 80.00 Halvard Box 1, then unpriced by name.
		expect(await page(1)).toEqual([b.slug, a.slug]);
		expect(await page(2)).toEqual([c.slug, none2.slug]);
		expect(await page(3)).toEqual([none1.slug]);
		// With a search word: only the Halvard cases, still by price.
		const halvard = await parts.search({ q: 'halvard', region: 'de', sort: 'price', page: 1 });
		expect(halvard.items.map((i) => i.slug)).toEqual([b.slug, c.slug]);
	});
});

describe('EXPLAIN of the catalog sorted by price, 3,000 parts', () => {
	interface PlanRow {
		table: string;
		type: string;
		key: string | null;
		rows: number;
		Extra: string | null;
	}
	const captured: string[] = [];

	/** The SELECTs `run` sends, read from Sequelize's afterQuery hook. */
	async function statementsOf(run: () => Promise<unknown>): Promise<string[]> {
		captured.length = 0;
		sequelize.addHook('afterQuery', 'capture', (_options: unknown, query: unknown) => {
			captured.push((query as { sql: string }).sql);
		});
		try {
			await run();
		} finally {
			sequelize.removeHook('afterQuery', 'capture');
		}
		return captured.filter((sql) => /^\s*SELECT/i.test(sql));
	}

	const explain = (sql: string) =>
		sequelize.query<PlanRow>(`EXPLAIN ${sql}`, { type: QueryTypes.SELECT });

	beforeAll(async () => {
		await resetDatabase();
		// Parts 1–3000, a category each in turn: gpu when n mod 4 = 1 (750 of them). Brand
		// 'Orvel', model 'Model 0001'… so the name order is the number order.
		await sequelize.query(
			`INSERT INTO regions (id, code, name, currency, tax_mode, tax_rate_bp, category_factors_bp, created_at, updated_at)
			 VALUES (1, 'de', 'Germany', 'EUR', 'inclusive', 1900, '{}', NOW(), NOW())`,
			{ type: QueryTypes.INSERT }
		);
		await sequelize.query(
			`INSERT INTO stores (id, name, region_id, url, created_at, updated_at)
			 VALUES (1, 'Lindwerk', 1, 'https://a.test', NOW(), NOW())`,
			{ type: QueryTypes.INSERT }
		);
		await sequelize.query(
			`INSERT INTO parts (id, category, brand, model, slug, specs, created_at, updated_at)
			 SELECT seq, ELT(1 + seq MOD 4, 'cpu', 'gpu', 'case', 'cooler'), 'Orvel',
			        CONCAT('Model ', LPAD(seq, 4, '0')), CONCAT('part-', LPAD(seq, 4, '0')), '{}', NOW(), NOW()
			   FROM seq_1_to_3000`,
			{ type: QueryTypes.INSERT }
		);
		// Parts 1–2700 have a VAT-inclusive quote of 100000 − n minor: the higher the number,
		// the cheaper. Parts 2701–3000 have none in Germany.
		await sequelize.query(
			`INSERT INTO quotes (part_id, store_id, region_id, amount_minor, currency, tax_included, shipping_minor, observed_at, source, status, created_at, updated_at)
			 SELECT seq, 1, 1, 100000 - seq, 'EUR', 1, 0, '2026-11-01 10:00:00', 'editor', 'active', NOW(), NOW()
			   FROM seq_1_to_2700`,
			{ type: QueryTypes.INSERT }
		);
		// Fresh statistics, as a server that has lived with these rows would have.
		await sequelize.query('ANALYZE TABLE parts, quotes, part_region_prices', {
			type: QueryTypes.SELECT
		});
	}, 60_000);

	afterAll(resetDatabase);

	const gpuByPrice = (page: number) =>
		parts.search({ q: '', category: 'gpu', region: 'de', sort: 'price', page, perPage: 24 });

	it('walks (region, category, price_key, brand, model, part) in order, no scan or sort of parts', async () => {
		const selects = await statementsOf(() => gpuByPrice(2));
		const page = selects.find((sql) => sql.includes('ORDER BY pp.price_key'));
		expect(page).toBeDefined();
		const plan = await explain(page ?? '');
		const pp = plan.find((r) => r.table === 'pp');
		const p = plan.find((r) => r.table === 'p');
		expect(pp?.key).toBe('part_region_prices_region_category_key');
		expect(pp?.Extra ?? '').not.toMatch(/filesort|temporary/);
		expect(p?.type).toBe('eq_ref');
		for (const row of plan) expect(row.type).not.toBe('ALL');
		// Its count reads the same range and nothing else.
		const count = selects.find((sql) => sql.includes('COUNT(*)') && sql.includes('pp'));
		const countPlan = await explain(count ?? '');
		expect(countPlan.map((r) => [r.table, r.key])).toEqual([
			['pp', 'part_region_prices_region_category_key']
		]);
	});

	it('walks (region, price_key, brand, model, part) for the whole catalog', async () => {
		const selects = await statementsOf(() =>
			parts.search({ q: '', region: 'de', sort: 'price', page: 3 })
		);
		const plan = await explain(selects.find((sql) => sql.includes('ORDER BY pp.price_key')) ?? '');
		expect(plan.find((r) => r.table === 'pp')?.key).toBe('part_region_prices_region_key');
		expect(plan.map((r) => r.Extra ?? '').join(' ')).not.toMatch(/filesort|temporary/);
		for (const row of plan) expect(row.type).not.toBe('ALL');
	});

	it('reads the unpriced parts in name order, each checked by primary key', async () => {
		// 675 priced gpus (n = 1, 5, …, 2697), then 75 unpriced (2701, 2705, …, 2997): page 29
		// of 24 starts at 672, the last three priced, then the first 21 unpriced.
		const selects = await statementsOf(() => gpuByPrice(29));
		const unpriced = selects.find((sql) => sql.includes('pp.part_id IS NULL'));
		const plan = await explain(unpriced ?? '');
		expect(plan.find((r) => r.table === 'p')?.key).toBe('parts_category_brand_model');
		expect(plan.find((r) => r.table === 'pp')).toMatchObject({ type: 'eq_ref', key: 'PRIMARY' });
		expect(plan.map((r) => r.Extra ?? '').join(' ')).not.toMatch(/filesort|temporary/);
	});

	it('gives the pages worked out by hand', async () => {
		const slugs = async (page: number) => (await gpuByPrice(page)).items.map((i) => i.slug);
		const first = await gpuByPrice(1);
		expect([first.total, first.pageCount]).toEqual([750, 32]);
		// Cheapest gpu: the highest n ≤ 2700 with n mod 4 = 1 is 2697, quoted 100000 − 2697 =
		// 97303 minor with VAT included, shown as it is.
		expect(first.items[0]?.slug).toBe('part-2697');
		expect(first.items[0]?.price?.unit.amountMinor).toBe(97303);
		// Page 2 starts 24 gpus on: 2697 − 24 × 4 = 2601.
		expect((await slugs(2))[0]).toBe('part-2601');
		const mixed = await slugs(29);
		expect(mixed.slice(0, 5)).toEqual([
			'part-0009',
			'part-0005',
			'part-0001',
			'part-2701',
			'part-2705'
		]);
		expect(mixed).toHaveLength(24);
		// The 21st unpriced: 2701 + 20 × 4 = 2781.
		expect(mixed[23]).toBe('part-2781');
	});
});
