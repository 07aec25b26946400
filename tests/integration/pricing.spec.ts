/*
 * The pricing service (services/pricing.ts) on the real MariaDB: several revisions priced in
 * one call with a fixed number of queries, and the same totals the guide page and browse show.
 *
 * Fixture (all invented): a US guide and a Japanese guide, priced at home and in Germany.
 * Rates: ECB 2 January 2024, 1 EUR = 1.0956 USD = 155.68 JPY (docs/sources.md 10c, V).
 * Taxes: Germany VAT 19 % (docs/sources.md 11a, V2), shown in prices; Japan consumption tax
 * 10 % (docs/sources.md s1, value from memory), shown in prices; US prices before tax
 * (docs/sources.md 11c, M). Germany's storage factor 1.04 is the fixture's own. Every
 * expected amount below is worked by hand, rounded half-even to the cent once (D).
 */
import { createServer } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { settled } from '../../src/lib/server/background';
import {
	FrameResult,
	FxRate,
	Guide,
	GuideRevision,
	GuideSlot,
	Part,
	Quote,
	Region,
	SlotAlternate,
	Store,
	User,
	sequelize
} from '../../src/lib/server/db';
import type { PartCategory } from '../../src/lib/domain/types';
import * as catalogStores from '../../src/lib/server/services/catalog-stores';
import * as fxService from '../../src/lib/server/services/fx';
import * as guideBrowse from '../../src/lib/server/services/guide-browse';
import * as guidePrices from '../../src/lib/server/services/guide-prices';
import * as guideReviews from '../../src/lib/server/services/guide-reviews';
import * as guideViews from '../../src/lib/server/services/guide-view-cache';
import * as guides from '../../src/lib/server/services/guides';
import { priceRevisions } from '../../src/lib/server/services/pricing';
import { resetDatabase } from '../support/db';

/** Runs `fn` and returns the SQL statements it sent (Sequelize's `beforeQuery` hook). */
async function countQueries<T>(fn: () => Promise<T>): Promise<{ result: T; queries: string[] }> {
	const queries: string[] = [];
	sequelize.addHook('beforeQuery', 'count-pricing-queries', (_options, query) => {
		queries.push(String((query as unknown as { sql?: string }).sql ?? 'query'));
	});
	try {
		return { result: await fn(), queries };
	} finally {
		sequelize.removeHook('beforeQuery', 'count-pricing-queries');
	}
}

const eur = (amountMinor: number) => ({ amountMinor, currency: 'EUR' });
const usd = (amountMinor: number) => ({ amountMinor, currency: 'USD' });
const jpy = (amountMinor: number) => ({ amountMinor, currency: 'JPY' });

interface Fixture {
	regions: Record<'us' | 'de' | 'jp', Region>;
	revisions: { office: number; compact: number };
}

let fx: Fixture;

async function part(category: PartCategory, brand: string, model: string, specs: object) {
	const slug = `${brand}-${model}`.toLowerCase().replace(/[^a-z0-9]+/g, '-');
	return Part.create({ category, brand, model, slug, specs: specs as Record<string, unknown> });
}

async function quote(
	partId: number,
	store: Store,
	amountMinor: number,
	currency: string,
	taxIncluded: boolean,
	day: string
) {
	return Quote.create({
		partId,
		storeId: store.id,
		regionId: store.regionId,
		amountMinor,
		currency,
		taxIncluded,
		observedAt: new Date(`${day}T12:00:00Z`),
		url: null,
		source: 'editor'
	});
}

/** A published guide whose one revision has `slots` (pick, its chosen quote, alternates). */
async function publishedGuide(
	slug: string,
	authorId: string,
	base: Region,
	slots: {
		category: PartCategory;
		label: string;
		quantity: number;
		pick: Part;
		chosen: Quote | null;
		alternates: Part[];
	}[]
): Promise<number> {
	const guide = await Guide.create({
		slug,
		authorId,
		title: slug,
		summary: 'Pricing service check.',
		targetBudgetMinor: 100000,
		baseRegionId: base.id,
		state: 'published',
		publishedRevisionId: null
	});
	const revision = await GuideRevision.create({
		guideId: guide.id,
		number: 1,
		buildNotesMd: '',
		buildNotesHtml: '',
		submittedAt: new Date(),
		reviewedAt: new Date(),
		publishedAt: new Date(),
		reviewerId: null,
		reviewNote: null
	});
	for (const [i, s] of slots.entries()) {
		const slot = await GuideSlot.create({
			revisionId: revision.id,
			category: s.category,
			label: s.label,
			position: i + 1,
			quantity: s.quantity,
			pickPartId: s.pick.id,
			reason: 'Fixture pick.',
			priceQuoteId: s.chosen?.id ?? null
		});
		for (const [j, alt] of s.alternates.entries())
			await SlotAlternate.create({
				slotId: slot.id,
				partId: alt.id,
				rank: j + 1,
				reasonTag: 'lower_price',
				note: ''
			});
	}
	await guide.update({ publishedRevisionId: revision.id });
	return revision.id;
}

async function createFixture(): Promise<Fixture> {
	const us = await Region.create({
		code: 'us',
		name: 'United States',
		currency: 'USD',
		taxMode: 'exclusive',
		taxRateBp: 0
	});
	const de = await Region.create({
		code: 'de',
		name: 'Germany',
		currency: 'EUR',
		taxMode: 'inclusive',
		taxRateBp: 1900,
		categoryFactorsBp: { storage: 10400 }
	});
	const jp = await Region.create({
		code: 'jp',
		name: 'Japan',
		currency: 'JPY',
		taxMode: 'inclusive',
		taxRateBp: 1000
	});
	for (const [currency, ratePerEur] of [
		['USD', '1.0956'],
		['JPY', '155.68']
	] as const)
		await FxRate.create({ currency, ratePerEur, asOf: '2024-01-02', source: 'fixture' });
	const store = (name: string, region: Region) =>
		Store.create({ name, regionId: region.id, url: 'https://shop.example' });
	const harborline = await store('Harborline Components', us);
	const lindenwerk = await store('Lindenwerk Technik', de);
	const sakuragawa = await store('Sakuragawa Parts', jp);

	const nvme = { interface: 'nvme', formFactor: 'm2-2280', pcieGen: 4, readMbs: 5000 };
	const small = await part('storage', 'Veltrane', 'Drift 1TB', {
		...nvme,
		capacityGb: 1000,
		writeMbs: 4000
	});
	const large = await part('storage', 'Veltrane', 'Drift 2TB', {
		...nvme,
		capacityGb: 2000,
		writeMbs: 4500
	});
	const fan = await part('fan', 'Quillwind', 'Breeze 120', { sizeMm: 120, count: 1, maxRpm: 1800 });
	const os = await part('os', 'Orchard', 'OS Home', { edition: 'Home', licence: 'retail' });
	const comb = await part('extra', 'Tidewell', 'Cable comb set', { kind: 'cable combs' });

	// United States, before tax. The author chose $79.99 for the small drive; a later $74.99
	// quote exists, but the author's choice is the guide's base price.
	const chosenUs = await quote(small.id, harborline, 7999, 'USD', false, '2024-05-01');
	await quote(small.id, harborline, 7499, 'USD', false, '2024-06-01');
	await quote(large.id, harborline, 13999, 'USD', false, '2024-05-01');
	await quote(fan.id, harborline, 1250, 'USD', false, '2024-05-01');
	// Germany, with VAT: only the small drive is quoted.
	await quote(small.id, lindenwerk, 6990, 'EUR', true, '2024-05-02');
	// Japan, with consumption tax.
	const chosenJp = await quote(large.id, sakuragawa, 16500, 'JPY', true, '2024-05-03');
	await quote(small.id, sakuragawa, 9800, 'JPY', true, '2024-05-03');
	await quote(os.id, sakuragawa, 14800, 'JPY', true, '2024-05-03');

	const author = await User.create({ email: 'pricing-author@example.test', name: 'Ines Varga' });
	const office = await publishedGuide('quiet-office-tower', author.id, us, [
		{
			category: 'storage',
			label: 'Storage',
			quantity: 1,
			pick: small,
			chosen: chosenUs,
			alternates: [large]
		},
		{ category: 'fan', label: 'Case fans', quantity: 2, pick: fan, chosen: null, alternates: [] },
		// Quoted nowhere: unpriced everywhere, counted and left out of the totals.
		{ category: 'extra', label: 'Extras', quantity: 1, pick: comb, chosen: null, alternates: [] }
	]);
	const compact = await publishedGuide('compact-home-desk', author.id, jp, [
		{
			category: 'storage',
			label: 'Storage',
			quantity: 1,
			pick: large,
			chosen: chosenJp,
			alternates: [small]
		},
		{
			category: 'os',
			label: 'Operating system',
			quantity: 1,
			pick: os,
			chosen: null,
			alternates: []
		}
	]);
	return { regions: { us, de, jp }, revisions: { office, compact } };
}

describe('the pricing service on the real MariaDB', () => {
	beforeAll(async () => {
		await resetDatabase();
		fx = await createFixture();
		// The fixture publishes behind the review service's back: store the list figures as
		// approval does (lists read guide_region_prices).
		await guidePrices.refreshAll();
	});

	it('prices several revisions in their base regions in one call, by hand', async () => {
		const { revisions } = await priceRevisions([fx.revisions.office, fx.revisions.compact], null);
		const office = revisions.get(fx.revisions.office);
		const compact = revisions.get(fx.revisions.compact);
		// Office (US): the author's $79.99 (not the later $74.99) + 2 × $12.50 = $104.99; the
		// cable combs have no price anywhere. Range: $79.99 or $139.99 for storage, + $25.00.
		expect(office?.region.code).toBe('us');
		expect(office?.adjustment.picksTotal).toEqual(usd(10499));
		expect(office?.adjustment.unpricedSlots).toBe(1);
		expect(office?.adjustment.range).toEqual({ min: usd(10499), max: usd(16499) });
		expect(office?.prices[0]?.pick).toMatchObject({ unit: usd(7999), status: 'quoted' });
		// Compact (Japan): the author's ¥16,500 + ¥14,800 = ¥31,300; the ¥9,800 alternate
		// makes the cheapest ¥24,600.
		expect(compact?.region.code).toBe('jp');
		expect(compact?.adjustment.picksTotal).toEqual(jpy(31300));
		expect(compact?.adjustment.unpricedSlots).toBe(0);
		expect(compact?.adjustment.range).toEqual({ min: jpy(24600), max: jpy(31300) });
	});

	it('prices several revisions in Germany in one call, quoted or estimated, by hand', async () => {
		const { revisions } = await priceRevisions(
			[fx.revisions.office, fx.revisions.compact],
			fx.regions.de
		);
		const office = revisions.get(fx.revisions.office);
		const compact = revisions.get(fx.revisions.compact);
		// Office: small drive quoted €69.90. Large drive estimated from $139.99:
		// 139.99 / 1.0956 × 1.04 × 1.19 = 158.1340… → €158.13. Fan from $12.50:
		// 12.50 / 1.0956 × 1.19 = 13.5770… → €13.58, × 2 = €27.16. Total €69.90 + €27.16 = €97.06;
		// range €97.06 to €158.13 + €27.16 = €185.29.
		expect(office?.prices[0]?.pick).toMatchObject({ unit: eur(6990), status: 'quoted' });
		expect(office?.prices[0]?.alternates[0]).toMatchObject({
			unit: eur(15813),
			status: 'estimated',
			observedAt: '2024-01-02'
		});
		expect(office?.prices[1]?.pick).toMatchObject({ unit: eur(1358), status: 'estimated' });
		expect(office?.adjustment.picksTotal).toEqual(eur(9706));
		expect(office?.adjustment.unpricedSlots).toBe(1);
		expect(office?.adjustment.range).toEqual({ min: eur(9706), max: eur(18529) });
		// Compact: large drive from ¥16,500 with tax: 16500 / 1.10 / 155.68 × 1.04 × 1.19
		// = 119.2446… → €119.24; OS from ¥14,800: 14800 / 1.10 / 155.68 × 1.19 = 102.8449… →
		// €102.84. Total €222.08; with the small drive quoted €69.90: €172.74 to €222.08.
		expect(compact?.prices[0]?.pick).toMatchObject({ unit: eur(11924), status: 'estimated' });
		expect(compact?.prices[1]?.pick).toMatchObject({ unit: eur(10284), status: 'estimated' });
		expect(compact?.adjustment.picksTotal).toEqual(eur(22208));
		expect(compact?.adjustment.range).toEqual({ min: eur(17274), max: eur(22208) });
	});

	it('sends the same few queries for one revision as for two', async () => {
		for (const target of [null, fx.regions.de]) {
			const one = await countQueries(() => priceRevisions([fx.revisions.office], target));
			const two = await countQueries(() =>
				priceRevisions([fx.revisions.office, fx.revisions.compact], target)
			);
			expect(two.result.revisions.size).toBe(2);
			expect(two.queries.length).toBe(one.queries.length);
			// Revisions and base regions, slots, quotes, and (across regions) the rates.
			expect(two.queries.length).toBeLessThanOrEqual(5);
		}
	});

	it('gives the guide page and browse the very same totals', async () => {
		for (const [slug, total, range] of [
			['quiet-office-tower', eur(9706), { min: eur(9706), max: eur(18529) }],
			['compact-home-desk', eur(22208), { min: eur(17274), max: eur(22208) }]
		] as const) {
			const page = await guides.getPriced(slug, 'de');
			if (page.kind !== 'ok') throw new Error(page.kind);
			expect(page.guide.picksTotal).toEqual(total);
			expect(page.guide.totalRange).toEqual(range);
		}
		const browse = await guideBrowse.browse({ region: 'de', tag: [], sort: 'total', page: 1 });
		if (browse.kind !== 'ok') throw new Error(browse.kind);
		expect(browse.result.items.map((g) => [g.slug, g.picksTotal])).toEqual([
			['quiet-office-tower', eur(9706)],
			['compact-home-desk', eur(22208)]
		]);
		const base = await guideBrowse.listPublished();
		expect(Object.fromEntries(base.map((g) => [g.slug, g.picksTotal]))).toEqual({
			'quiet-office-tower': usd(10499),
			'compact-home-desk': jpy(31300)
		});
	});

	it('browses in a region with the same queries for two guides as for three', async () => {
		const query = { region: 'de', tag: [], sort: 'total' as const, page: 1 };
		// Warmed first: regions and the tag list are cached, so both counts are the list query.
		await guideBrowse.browse(query);
		const two = await countQueries(() => guideBrowse.browse(query));
		// A third guide with a revision of its own (a revision belongs to one guide), published
		// and stored as approval does.
		const [large, os, author] = await Promise.all([
			Part.findOne({ where: { model: 'Drift 2TB' } }),
			Part.findOne({ where: { model: 'OS Home' } }),
			User.findOne({ where: { email: 'pricing-author@example.test' } })
		]);
		if (!large || !os || !author) throw new Error('fixture missing');
		const thirdRevision = await publishedGuide('compact-home-desk-copy', author.id, fx.regions.jp, [
			{
				category: 'storage',
				label: 'Storage',
				quantity: 1,
				pick: large,
				chosen: null,
				alternates: []
			},
			{
				category: 'os',
				label: 'Operating system',
				quantity: 1,
				pick: os,
				chosen: null,
				alternates: []
			}
		]);
		await guidePrices.refreshRevisions([thirdRevision]);
		const third = await Guide.findOne({ where: { slug: 'compact-home-desk-copy' } });
		try {
			await guideBrowse.browse(query);
			const three = await countQueries(() => guideBrowse.browse(query));
			const items = three.result.kind === 'ok' ? three.result.result.items : [];
			expect(items).toHaveLength(3);
			expect(three.queries.length).toBe(two.queries.length);
			// One query: the page of stored rows with its count.
			expect(three.queries.length).toBe(1);
		} finally {
			await third?.destroy();
		}
	});

	it('still prices a guide whose author has since moved its base region: the old region’s chosen quote is no base price', async () => {
		// Saving a draft changes the guide's base region at once, while the published revision
		// keeps the quote its author chose in the old region (US dollars). That quote must not
		// be read as a price in the new base region.
		await Guide.update(
			{ baseRegionId: fx.regions.de.id },
			{ where: { slug: 'quiet-office-tower' } }
		);
		try {
			const outcome = await guides.getPriced('quiet-office-tower', null);
			if (outcome.kind !== 'ok') throw new Error(outcome.kind);
			expect(outcome.guide.region.code).toBe('de');
			// The small drive's latest German quote; nothing else has a German price.
			expect(outcome.guide.slots[0]?.price).toMatchObject({ unit: eur(6990), status: 'quoted' });
			expect(outcome.guide.picksTotal).toEqual(eur(6990));
			expect(outcome.guide.unpricedSlots).toBe(2);
		} finally {
			await Guide.update(
				{ baseRegionId: fx.regions.us.id },
				{ where: { slug: 'quiet-office-tower' } }
			);
		}
	});
});

/*
 * The full pass (guide-prices.ts refreshAll: raw rows, page by page, every region priced in
 * memory) stores exactly what the per-revision path stores (refreshRevisions: the guide
 * page's own pricing, region by region), prices and upkeep alerts alike, across page
 * boundaries. Same fixture and rules as above, plus one frame result for the compact guide
 * so the stored value is compared too; each figure checked here is worked by hand above.
 */
describe('the full pass of stored list figures on the real MariaDB', () => {
	beforeAll(async () => {
		await resetDatabase();
		fx = await createFixture();
		// Test input, invented: one measured title at an average of 62.0 FPS.
		await FrameResult.create({
			revisionId: fx.revisions.compact,
			workload: 'Lantern Drift',
			resolution: '1920x1080',
			avgFpsTenths: 620,
			low1FpsTenths: 480
		});
	});

	async function storedRows() {
		const select = (sql: string) =>
			sequelize.query<Record<string, unknown>>(sql, { type: QueryTypes.SELECT });
		return {
			prices: await select(
				`SELECT revision_id, region_id, guide_id, is_base, currency, picks_total_minor,
				        unpriced_slots, range_min_minor, range_max_minor, fps_per_100, total_sort,
				        value_sort, published_at
				   FROM guide_region_prices ORDER BY revision_id, region_id`
			),
			alerts: await select(
				`SELECT guide_id, revision_id, fingerprint, kind, region_id, slot_key, severity, details
				   FROM guide_upkeep_alerts ORDER BY guide_id, fingerprint`
			)
		};
	}

	it('stores, one revision per page, the very rows the per-revision path stores', async () => {
		await guidePrices.refreshRevisions([fx.revisions.office, fx.revisions.compact]);
		const perRevision = await storedRows();
		await sequelize.query('DELETE FROM guide_region_prices');
		await sequelize.query('DELETE FROM guide_upkeep_alerts');
		await guidePrices.refreshAll({ batch: 1 });
		const fullPass = await storedRows();
		expect(fullPass).toEqual(perRevision);

		// Two guides in three regions; the figures are the ones worked by hand above
		// (ECB 2 Jan 2024, docs/sources.md 10c; VAT and consumption tax as above).
		expect(fullPass.prices).toHaveLength(6);
		// The fixture's quotes are from 2024: stale in every region that lists them.
		expect(fullPass.alerts.length).toBeGreaterThan(0);
		const row = (revisionId: number, region: Region) =>
			fullPass.prices.find((r) => r.revision_id === revisionId && r.region_id === region.id);
		// Office in the US: $104.99, the cable combs unpriced, $104.99 to $164.99.
		expect(row(fx.revisions.office, fx.regions.us)).toMatchObject({
			is_base: 1,
			currency: 'USD',
			picks_total_minor: 10499,
			unpriced_slots: 1,
			range_min_minor: 10499,
			range_max_minor: 16499,
			fps_per_100: null
		});
		// Office in Germany: €97.06, €97.06 to €185.29.
		expect(row(fx.revisions.office, fx.regions.de)).toMatchObject({
			is_base: 0,
			currency: 'EUR',
			picks_total_minor: 9706,
			unpriced_slots: 1,
			range_min_minor: 9706,
			range_max_minor: 18529
		});
		// Compact in Japan: ¥31,300, ¥24,600 to ¥31,300. Value (docs/architecture.md
		// Computations 5): one result, so the geometric mean is 62.0 FPS; per ¥100:
		// 62.0 × 100 / 31,300 = 0.198083…
		const compactJp = row(fx.revisions.compact, fx.regions.jp);
		expect(compactJp).toMatchObject({
			is_base: 1,
			currency: 'JPY',
			picks_total_minor: 31300,
			unpriced_slots: 0,
			range_min_minor: 24600,
			range_max_minor: 31300
		});
		expect(Number(compactJp?.fps_per_100)).toBeCloseTo(0.198083, 6);
		// Compact in Germany: €222.08, €172.74 to €222.08; per €100: 62.0 × 100 / 222.08
		// = 27.917867…
		const compactDe = row(fx.revisions.compact, fx.regions.de);
		expect(compactDe).toMatchObject({
			picks_total_minor: 22208,
			range_min_minor: 17274,
			range_max_minor: 22208
		});
		expect(Number(compactDe?.fps_per_100)).toBeCloseTo(27.917867, 6);
	});

	it('moves the guide-view counter once per pass, not once per page', async () => {
		// Every move drops each process's guide views and kept answers; a pass paged one
		// revision at a time over the fixture's two guides must still move it only once.
		const counter = async () => {
			const [row] = await sequelize.query<{ value: number }>(
				"SELECT value FROM cache_generations WHERE name = 'guide-view'",
				{ type: QueryTypes.SELECT }
			);
			return Number(row?.value ?? 0);
		};
		const before = await counter();
		await guidePrices.refreshAll({ batch: 1 });
		expect(await counter()).toBe(before + 1);
	});
});

/*
 * The stored list figures (guide_region_prices) follow their inputs: a rates refresh, an
 * accepted quote and a published revision each change the total browse shows, and the new
 * figure is the one worked by hand here. Same fixture and rules as above.
 */
describe('stored list figures on the real MariaDB', () => {
	let editorId = '';
	const server = createServer((_req, res) => {
		// Test input, invented for this check: a later day on which the dollar stands at 1.2000
		// and the yen at 160.00 per euro, in the ECB file's layout (docs/sources.md 10c).
		res.writeHead(200, { 'content-type': 'text/xml' }).end(
			`<?xml version="1.0" encoding="UTF-8"?>
<gesmes:Envelope xmlns:gesmes="http://www.gesmes.org/xml/2002-08-01" xmlns="http://www.ecb.int/vocabulary/2002-08-01/eurofxref">
<Cube><Cube time='2024-01-03'><Cube currency='USD' rate='1.2000'/><Cube currency='JPY' rate='160.00'/></Cube></Cube>
</gesmes:Envelope>`
		);
	});

	beforeAll(async () => {
		await resetDatabase();
		fx = await createFixture();
		await guidePrices.refreshAll();
		const editor = await User.create({
			email: 'prices-editor@example.test',
			name: 'Ola Brandt',
			role: 'editor'
		});
		editorId = editor.id;
		await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
	});

	afterAll(() => new Promise<void>((resolve) => server.close(() => resolve())));

	async function storedTotal(region: string, slug: string) {
		const outcome = await guideBrowse.browse({ region, tag: [], sort: 'total', page: 1 });
		if (outcome.kind !== 'ok') throw new Error(outcome.kind);
		return outcome.result.items.find((g) => g.slug === slug)?.picksTotal ?? null;
	}

	it('changes the stored German total of the office guide when the rates are refreshed', async () => {
		// Before: €97.06, worked by hand above (ECB 2 Jan 2024, docs/sources.md 10c).
		expect(await storedTotal('de', 'quiet-office-tower')).toEqual(eur(9706));
		const { port } = server.address() as AddressInfo;
		await fxService.refresh({ url: `http://127.0.0.1:${port}/eurofxref-daily.xml` });
		// The full pass runs after the refresh has answered.
		await settled();
		// After: small drive still quoted €69.90; fan from $12.50 at 1.2000 with 19 % VAT:
		// 12.50 / 1.2000 × 1.19 = 12.3958… → €12.40, × 2 = €24.80. Total €69.90 + €24.80 = €94.70.
		expect(await storedTotal('de', 'quiet-office-tower')).toEqual(eur(9470));
	});

	it('changes the stored German total when an editor accepts a German quote for the fan', async () => {
		const store = await Store.findOne({ where: { name: 'Lindenwerk Technik' } });
		const fan = await Part.findOne({ where: { model: 'Breeze 120' } });
		const added = await catalogStores.addQuote(editorId, {
			partSlug: fan?.slug,
			storeId: String(store?.id),
			amount: '11.90',
			taxIncluded: 'on',
			observedOn: '2024-06-02'
		});
		expect(added.kind).toBe('ok');
		// The fan is now quoted in Germany at €11.90 with VAT: 2 × €11.90 = €23.80, + €69.90
		// for the small drive = €93.70 (no estimate left for the fan).
		expect(await storedTotal('de', 'quiet-office-tower')).toEqual(eur(9370));
	});

	it('stores the new revision’s totals when an editor publishes it', async () => {
		const guide = await Guide.findOne({ where: { slug: 'quiet-office-tower' } });
		const large = await Part.findOne({ where: { model: 'Drift 2TB' } });
		const revision = await GuideRevision.create({
			guideId: guide?.id ?? 0,
			number: 2,
			buildNotesMd: '',
			buildNotesHtml: '',
			submittedAt: new Date(),
			reviewedAt: null,
			publishedAt: null,
			reviewerId: null,
			reviewNote: null
		});
		// Revision 2: only the large drive, no chosen quote.
		await GuideSlot.create({
			revisionId: revision.id,
			category: 'storage',
			label: 'Storage',
			position: 1,
			quantity: 1,
			pickPartId: large?.id ?? 0,
			reason: 'Fixture pick.',
			priceQuoteId: null
		});
		const outcome = await guideReviews.decide(
			{ id: editorId, role: 'editor' },
			revision.id,
			{ decision: 'approve', note: '', slotNotes: [] },
			{ guidesUrl: 'http://slotwise.test/guides' }
		);
		expect(outcome.kind).toBe('ok');
		// Base region (US): the large drive's latest US quote, $139.99.
		expect(await storedTotal('us', 'quiet-office-tower')).toEqual(usd(13999));
		// Germany: no German quote for the large drive; estimated from $139.99 at the refreshed
		// 1.2000 with the storage factor 1.04 and 19 % VAT: 139.99 / 1.2000 × 1.04 × 1.19
		// = 144.3763… → €144.38.
		expect(await storedTotal('de', 'quiet-office-tower')).toEqual(eur(14438));
	});
});

/*
 * The cached guide view (services/guide-view-cache.ts: the guide page's and the pricing
 * API's computed answer) follows the same events as the stored figures. Between events a
 * repeated read comes from memory with a single query (the guide's stamp), so an event
 * that failed to invalidate it would leave the old figure here. Same fixture and rules as
 * above; each figure is the one worked by hand in the block above.
 */
describe('the cached guide view on the real MariaDB', () => {
	let editorId = '';
	const server = createServer((_req, res) => {
		// The same invented later day as above: 1 EUR = 1.2000 USD = 160.00 JPY (docs/sources.md 10c).
		res.writeHead(200, { 'content-type': 'text/xml' }).end(
			`<?xml version="1.0" encoding="UTF-8"?>
<gesmes:Envelope xmlns:gesmes="http://www.gesmes.org/xml/2002-08-01" xmlns="http://www.ecb.int/vocabulary/2002-08-01/eurofxref">
<Cube><Cube time='2024-01-03'><Cube currency='USD' rate='1.2000'/><Cube currency='JPY' rate='160.00'/></Cube></Cube>
</gesmes:Envelope>`
		);
	});

	beforeAll(async () => {
		await resetDatabase();
		fx = await createFixture();
		await guidePrices.refreshAll();
		const editor = await User.create({
			email: 'view-cache-editor@example.test',
			name: 'Pia Lund',
			role: 'editor'
		});
		editorId = editor.id;
		await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
	});

	afterAll(() => new Promise<void>((resolve) => server.close(() => resolve())));

	async function viewed(region: string | null) {
		const outcome = await guideViews.guidePage('quiet-office-tower', region, null);
		if (outcome.kind !== 'ok') throw new Error(outcome.kind);
		return outcome.page.guide;
	}

	/** The view read twice: the second read must be one query (the stamp), not a recomputation. */
	async function cachedTotal(region: string | null) {
		await viewed(region);
		const { result, queries } = await countQueries(() => viewed(region));
		expect(queries).toHaveLength(1);
		return result.picksTotal;
	}

	it('keeps the view in memory, and shows the new German total once the rates are refreshed', async () => {
		// €97.06 at ECB 2 Jan 2024 (docs/sources.md 10c, V), worked by hand in the first block.
		expect(await cachedTotal('de')).toEqual(eur(9706));
		const { port } = server.address() as AddressInfo;
		await fxService.refresh({ url: `http://127.0.0.1:${port}/eurofxref-daily.xml` });
		// 12.50 / 1.2000 × 1.19 = 12.3958… → €12.40, × 2 = €24.80, + €69.90 = €94.70.
		expect((await viewed('de')).picksTotal).toEqual(eur(9470));
		// The pricing API answers from the same view.
		const api = await guideViews.priced('quiet-office-tower', 'de');
		expect(api.kind === 'ok' ? api.guide.picksTotal : null).toEqual(eur(9470));
	});

	it('shows the new German total once an editor accepts a German quote for the fan', async () => {
		expect(await cachedTotal('de')).toEqual(eur(9470));
		const store = await Store.findOne({ where: { name: 'Lindenwerk Technik' } });
		const fan = await Part.findOne({ where: { model: 'Breeze 120' } });
		const added = await catalogStores.addQuote(editorId, {
			partSlug: fan?.slug,
			storeId: String(store?.id),
			amount: '11.90',
			taxIncluded: 'on',
			observedOn: '2024-06-02'
		});
		expect(added.kind).toBe('ok');
		// 2 × €11.90 = €23.80, + €69.90 = €93.70.
		expect((await viewed('de')).picksTotal).toEqual(eur(9370));
	});

	it('shows the new revision once an editor publishes it', async () => {
		// Revision 1 in the US, before tax: small drive $79.99 (the author's quote) + 2 × $12.50
		// for the fans = $104.99; the cable combs are quoted nowhere.
		expect(await cachedTotal(null)).toEqual(usd(10499));
		const guide = await Guide.findOne({ where: { slug: 'quiet-office-tower' } });
		const large = await Part.findOne({ where: { model: 'Drift 2TB' } });
		const revision = await GuideRevision.create({
			guideId: guide?.id ?? 0,
			number: 2,
			buildNotesMd: '',
			buildNotesHtml: '',
			submittedAt: new Date(),
			reviewedAt: null,
			publishedAt: null,
			reviewerId: null,
			reviewNote: null
		});
		await GuideSlot.create({
			revisionId: revision.id,
			category: 'storage',
			label: 'Storage',
			position: 1,
			quantity: 1,
			pickPartId: large?.id ?? 0,
			reason: 'Fixture pick.',
			priceQuoteId: null
		});
		const outcome = await guideReviews.decide(
			{ id: editorId, role: 'editor' },
			revision.id,
			{ decision: 'approve', note: '', slotNotes: [] },
			{ guidesUrl: 'http://slotwise.test/guides' }
		);
		expect(outcome.kind).toBe('ok');
		const us = await viewed(null);
		expect(us.revisionNumber).toBe(2);
		// The large drive's US quote, $139.99.
		expect(us.picksTotal).toEqual(usd(13999));
		// 139.99 / 1.2000 × 1.04 × 1.19 = 144.3763… → €144.38 (worked in the block above).
		expect((await viewed('de')).picksTotal).toEqual(eur(14438));
	});

	it('follows a write made by another app process once that process bumps the counter', async () => {
		expect(await cachedTotal(null)).toEqual(usd(13999));
		// Another process changes the quote with its own connection: this process's memory
		// has not heard of it, so the view is still the cached one...
		await sequelize.query(
			`UPDATE quotes q JOIN parts p ON p.id = q.part_id SET q.amount_minor = 12999
			  WHERE p.model = 'Drift 2TB' AND q.currency = 'USD'`
		);
		expect((await viewed(null)).picksTotal).toEqual(usd(13999));
		// ...until it bumps the shared counter, as every invalidating write does.
		await sequelize.query(
			`INSERT INTO cache_generations (name, value, updated_at) VALUES ('guide-view', 1, NOW())
			 ON DUPLICATE KEY UPDATE value = value + 1`
		);
		// The large drive now at $129.99, the whole of revision 2.
		expect((await viewed(null)).picksTotal).toEqual(usd(12999));
	});
});
