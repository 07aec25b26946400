import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
	Guide,
	GuideRevision,
	GuideSlot,
	Part,
	Quote,
	Region,
	Store,
	sequelize
} from '../../src/lib/server/db';
import { seedDemoCommunity } from '../../src/lib/server/db/seeders/demo-community';
import {
	demoGuides,
	demoParts,
	demoQuotes,
	demoRegions,
	demoStores
} from '../../src/lib/server/db/seeders/demo-data';
import type { DemoPart } from '../../src/lib/server/db/seeders/demo-data';
import { parsePartSearchStrict } from '../../src/lib/schemas/parts';
import * as parts from '../../src/lib/server/services/parts';
import { GET as searchRoute } from '../../src/routes/api/v1/parts/+server';
import { GET as detailRoute } from '../../src/routes/api/v1/parts/[slug=slug]/+server';
import { resetDatabase } from '../support/db';

/*
 * The catalog service and its JSON API on the real MariaDB, seeded with the invented demo
 * community. Every expectation is computed from the demo data itself (not from the
 * service), so a wrong filter, order or grouping shows up as a difference.
 */

const SEED_NOW = new Date('2026-11-30T12:00:00Z');
const DAY_MS = 86_400_000;

const byBrandModel = (a: DemoPart, b: DemoPart) =>
	a.brand.localeCompare(b.brand) || a.model.localeCompare(b.model);
const slugsOf = (list: { slug: string }[]) => list.map((p) => p.slug);
const spec = (p: DemoPart, field: string) => p.specs[field];

/** All matching parts, page after page, so the order across pages is checked too. */
async function allPages(options: Omit<Parameters<typeof parts.search>[0], 'page'>) {
	const first = await parts.search({ ...options, page: 1 });
	const items = [...first.items];
	for (let page = 2; page <= first.pageCount; page++) {
		items.push(...(await parts.search({ ...options, page })).items);
	}
	return { total: first.total, items };
}

function query(params: string) {
	const parsed = parsePartSearchStrict(new URLSearchParams(params));
	if (!parsed.ok) throw new Error(`bad test query ${params}: ${JSON.stringify(parsed.issues)}`);
	return parsed.query;
}

describe('parts catalog on the real MariaDB', () => {
	beforeAll(async () => {
		await resetDatabase();
		await seedDemoCommunity(sequelize, SEED_NOW);
	});

	afterAll(async () => {
		await resetDatabase();
	});

	describe('search', () => {
		it('lists the whole catalog by brand and model, 24 to a page, with the total', async () => {
			const expected = [...demoParts].sort(byBrandModel);
			const first = await parts.search({ q: '', page: 1 });
			expect(first.total).toBe(demoParts.length);
			expect(first.pageCount).toBe(Math.ceil(demoParts.length / 24));
			expect(first.items).toHaveLength(24);
			const { items } = await allPages({ q: '' });
			expect(slugsOf(items)).toEqual(slugsOf(expected));
		});

		it('keeps pages in bounds: the last page holds the rest, a page past the end gives the last', async () => {
			const pageCount = Math.ceil(demoParts.length / 24);
			const last = await parts.search({ q: '', page: pageCount });
			expect(last.items).toHaveLength(demoParts.length - 24 * (pageCount - 1));
			const past = await parts.search({ q: '', page: pageCount + 50 });
			expect(past.page).toBe(pageCount);
			expect(slugsOf(past.items)).toEqual(slugsOf(last.items));
			const before = await parts.search({ q: '', page: 0 });
			expect(before.page).toBe(1);
			const small = await parts.search({ q: '', page: 2, perPage: 10 });
			expect(small.items).toHaveLength(10);
			expect(small.pageCount).toBe(Math.ceil(demoParts.length / 10));
		});

		it('finds parts whose brand or model holds every word of q, in any case', async () => {
			const cases = ['cobalt', 'HALVARD 606', 'strata halvard', 'ddr5 6000', 'Norrow itx'];
			for (const q of cases) {
				const words = q.toLowerCase().split(/\s+/);
				const expected = demoParts
					.filter((p) =>
						words.every(
							(w) => p.brand.toLowerCase().includes(w) || p.model.toLowerCase().includes(w)
						)
					)
					.sort(byBrandModel);
				expect(expected.length, `demo data has matches for "${q}"`).toBeGreaterThan(0);
				const { total, items } = await allPages({ q });
				expect(total, q).toBe(expected.length);
				expect(slugsOf(items), q).toEqual(slugsOf(expected));
			}
		});

		it('takes LIKE wildcards in q literally', async () => {
			expect((await parts.search({ q: '%', page: 1 })).total).toBe(0);
			expect((await parts.search({ q: '_', page: 1 })).total).toBe(0);
			expect((await parts.search({ q: 'Strata_606', page: 1 })).total).toBe(0);
			expect((await parts.search({ q: "' OR 1=1 --", page: 1 })).total).toBe(0);
		});

		it('narrows to one category', async () => {
			for (const category of ['gpu', 'cpu', 'case'] as const) {
				const expected = demoParts.filter((p) => p.category === category).sort(byBrandModel);
				const { total, items } = await allPages({ q: '', category });
				expect(total).toBe(expected.length);
				expect(slugsOf(items)).toEqual(slugsOf(expected));
			}
		});

		// Each row: the URL query, and the same rule written out over the demo data.
		const filterCases: [string, (p: DemoPart) => boolean][] = [
			['category=cpu&socket=AM5', (p) => p.category === 'cpu' && spec(p, 'socket') === 'AM5'],
			[
				'category=cpu&socket=LGA1851&minCores=20',
				(p) =>
					p.category === 'cpu' && spec(p, 'socket') === 'LGA1851' && Number(spec(p, 'cores')) >= 20
			],
			[
				'category=motherboard&socket=AM5&formFactor=Mini-ITX&memoryType=DDR5',
				(p) =>
					p.category === 'motherboard' &&
					spec(p, 'socket') === 'AM5' &&
					spec(p, 'formFactor') === 'Mini-ITX' &&
					spec(p, 'memoryType') === 'DDR5'
			],
			[
				'category=motherboard&memoryType=DDR4',
				(p) => p.category === 'motherboard' && spec(p, 'memoryType') === 'DDR4'
			],
			[
				'category=memory&memoryType=DDR5&minSpeedMts=6000',
				(p) =>
					p.category === 'memory' &&
					spec(p, 'type') === 'DDR5' &&
					Number(spec(p, 'speedMts')) >= 6000
			],
			['category=gpu&minVramGb=16', (p) => p.category === 'gpu' && Number(spec(p, 'vramGb')) >= 16],
			[
				'category=gpu&maxLengthMm=250',
				(p) => p.category === 'gpu' && Number(spec(p, 'lengthMm')) <= 250
			],
			[
				'category=gpu&minVramGb=12&maxLengthMm=250',
				(p) =>
					p.category === 'gpu' &&
					Number(spec(p, 'vramGb')) >= 12 &&
					Number(spec(p, 'lengthMm')) <= 250
			],
			[
				'category=psu&minRatedW=750&formFactor=SFX',
				(p) =>
					p.category === 'psu' &&
					Number(spec(p, 'ratedW')) >= 750 &&
					spec(p, 'formFactor') === 'SFX'
			],
			[
				'category=case&boardFormFactor=ATX',
				(p) => p.category === 'case' && (spec(p, 'boardFormFactors') as string[]).includes('ATX')
			],
			[
				'category=case&fitsGpuLengthMm=336',
				(p) => p.category === 'case' && Number(spec(p, 'maxGpuLengthMm')) >= 336
			],
			[
				'category=storage&interface=sata',
				(p) => p.category === 'storage' && spec(p, 'interface') === 'sata'
			],
			[
				'category=storage&formFactor=m2-2280&q=cindral',
				(p) =>
					p.category === 'storage' && spec(p, 'formFactor') === 'm2-2280' && p.brand === 'Cindral'
			]
		];

		it.each(filterCases)('spec filters: %s', async (params, rule) => {
			const expected = demoParts.filter(rule).sort(byBrandModel);
			const all = demoParts.filter((p) => p.category === query(params).category);
			// A filter that keeps everything or nothing would not tell a broken filter from a working one.
			expect(expected.length, 'filter keeps some parts').toBeGreaterThan(0);
			expect(expected.length, 'filter drops some parts').toBeLessThan(all.length);
			const { total, items } = await allPages(query(params));
			expect(total).toBe(expected.length);
			expect(slugsOf(items)).toEqual(slugsOf(expected));
		});

		it('pages filtered results too', async () => {
			const expected = demoParts
				.filter((p) => p.category === 'gpu' && Number(spec(p, 'vramGb')) >= 12)
				.sort(byBrandModel);
			const first = await parts.search({
				q: '',
				category: 'gpu',
				specFilters: { minVramGb: 12 },
				page: 1,
				perPage: 2
			});
			expect(first.total).toBe(expected.length);
			expect(first.pageCount).toBe(Math.ceil(expected.length / 2));
			const last = await parts.search({
				q: '',
				category: 'gpu',
				specFilters: { minVramGb: 12 },
				page: 99,
				perPage: 2
			});
			expect(last.page).toBe(first.pageCount);
			expect(slugsOf(last.items)).toEqual(slugsOf(expected.slice((first.pageCount - 1) * 2)));
		});

		it('refuses a spec filter outside its category (the schema stops these before the service)', async () => {
			await expect(
				parts.search({ q: '', category: 'cpu', specFilters: { minVramGb: 8 }, page: 1 })
			).rejects.toThrow(RangeError);
			await expect(
				parts.search({ q: '', specFilters: { socket: 'AM5' }, page: 1 })
			).rejects.toThrow(RangeError);
		});

		it('returns plain JSON-safe objects', async () => {
			const result = await parts.search({ q: 'cobalt', page: 1 });
			expect(JSON.parse(JSON.stringify(result))).toEqual(result);
			expect(Object.getPrototypeOf(result.items[0])).toBe(Object.prototype);
		});
	});

	describe('getBySlug', () => {
		const regionOfStore = (storeName: string) => {
			const store = demoStores.find((s) => s.name === storeName);
			const region = demoRegions.find((r) => r.code === store?.regionCode);
			if (!store || !region) throw new Error(`demo store ${storeName} has no region`);
			return region;
		};

		it('gives null for an unknown slug', async () => {
			expect(await parts.getBySlug('no-such-part')).toBeNull();
		});

		it('returns the specs as stored', async () => {
			for (const demo of demoParts.slice(0, 20)) {
				const part = await parts.getBySlug(demo.slug);
				expect(part).toMatchObject({
					slug: demo.slug,
					category: demo.category,
					brand: demo.brand,
					model: demo.model
				});
				expect(part?.specs).toEqual(demo.specs);
			}
		});

		it('has one history line per store, oldest first, exactly the demo quotes', async () => {
			for (const demo of demoParts) {
				const part = await parts.getBySlug(demo.slug);
				const quotes = demoQuotes.filter((q) => q.partSlug === demo.slug);
				const stores = [...new Set(quotes.map((q) => q.storeName))];
				expect(part?.history.map((s) => s.storeName).sort(), demo.slug).toEqual([...stores].sort());
				for (const series of part?.history ?? []) {
					const region = regionOfStore(series.storeName);
					expect(series.regionCode).toBe(region.code);
					expect(series.currency).toBe(region.currency);
					const expected = quotes
						.filter((q) => q.storeName === series.storeName)
						.sort((a, b) => b.daysAgo - a.daysAgo)
						.map((q) => ({
							observedAt: new Date(SEED_NOW.getTime() - q.daysAgo * DAY_MS).toISOString(),
							amountMinor: q.amountMinor
						}));
					expect(series.points, `${demo.slug} at ${series.storeName}`).toEqual(expected);
				}
			}
		});

		it('shows a five-step history for the Cobalt C6 at Kestrel, in date order', async () => {
			const part = await parts.getBySlug('solenne-cobalt-c6-8g');
			const kestrel = part?.history.find((s) => s.storeName === 'Kestrel Components');
			expect(kestrel?.points.map((p) => p.amountMinor)).toEqual([
				26999, 25999, 24999, 23999, 22999
			]);
			const dates = kestrel?.points.map((p) => p.observedAt) ?? [];
			expect(dates).toEqual([...dates].sort());
			// Four regions, four currencies: the chart draws one axis per currency.
			expect(new Set(part?.history.map((s) => s.currency))).toEqual(
				new Set(['USD', 'EUR', 'GBP', 'JPY'])
			);
		});

		it('groups each store’s latest quote under its region, cheapest first', async () => {
			for (const demo of demoParts) {
				const part = await parts.getBySlug(demo.slug);
				const quotes = demoQuotes.filter((q) => q.partSlug === demo.slug);
				const regionCodes = [...new Set(quotes.map((q) => regionOfStore(q.storeName).code))];
				expect(part?.quotesByRegion.map((g) => g.region.code).sort(), demo.slug).toEqual(
					regionCodes.sort()
				);
				for (const group of part?.quotesByRegion ?? []) {
					const region = demoRegions.find((r) => r.code === group.region.code);
					const latest = [
						...new Set(
							quotes
								.filter((q) => regionOfStore(q.storeName).code === group.region.code)
								.map((q) => q.storeName)
						)
					].map(
						(storeName) =>
							quotes
								.filter((q) => q.storeName === storeName)
								.sort((a, b) => a.daysAgo - b.daysAgo)[0]
					);
					expect(group.quotes.map((q) => [q.storeName, q.price.amountMinor]).sort()).toEqual(
						latest.map((q) => [q?.storeName, q?.amountMinor]).sort()
					);
					const amounts = group.quotes.map((q) => q.price.amountMinor);
					expect(amounts).toEqual([...amounts].sort((a, b) => a - b));
					for (const q of group.quotes) {
						expect(q.price.currency).toBe(region?.currency);
						expect(q.taxIncluded).toBe(region?.taxMode === 'inclusive');
					}
				}
			}
		});

		it('lists the published guides using the part as a pick or an alternate', async () => {
			for (const demo of demoParts) {
				const expected = demoGuides
					.map((g) => ({
						slug: g.slug,
						title: g.title,
						uses: g.slots.flatMap((slot) => [
							...(slot.pickSlug === demo.slug
								? [{ role: 'pick', slotLabel: slot.label, rank: null }]
								: []),
							...slot.alternates.flatMap((alt, i) =>
								alt.partSlug === demo.slug
									? [{ role: 'alternate', slotLabel: slot.label, rank: i + 1 }]
									: []
							)
						])
					}))
					.filter((g) => g.uses.length > 0)
					.sort((a, b) => a.title.localeCompare(b.title));
				const part = await parts.getBySlug(demo.slug);
				expect(part?.guides, demo.slug).toEqual(expected);
			}
			// The demo has parts used by several guides and parts used by none.
			expect((await parts.getBySlug('cindral-c4-2tb'))?.guides.length).toBeGreaterThan(1);
		});

		it('counts only the published revision of a published guide', async () => {
			const before = await parts.getBySlug('halvard-strata-406');
			expect(before?.guides.map((g) => g.slug)).toEqual(['steady-1080p-starter']);

			// A newer published revision whose CPU slot picks another part.
			const guide = await Guide.findOne({ where: { slug: 'steady-1080p-starter' } });
			const other = await Part.findOne({ where: { slug: 'halvard-strata-606' } });
			if (!guide || !other) throw new Error('demo guide or part missing');
			const oldRevisionId = guide.publishedRevisionId;
			const revision = await GuideRevision.create({
				guideId: guide.id,
				number: 2,
				buildNotesMd: 'Revised.',
				submittedAt: SEED_NOW,
				reviewedAt: SEED_NOW,
				publishedAt: SEED_NOW,
				reviewerId: null,
				reviewNote: null
			});
			await GuideSlot.create({
				revisionId: revision.id,
				category: 'cpu',
				label: 'CPU',
				position: 1,
				pickPartId: other.id,
				reason: 'Newer pick.',
				priceQuoteId: null
			});
			await guide.update({ publishedRevisionId: revision.id });
			expect((await parts.getBySlug('halvard-strata-406'))?.guides).toEqual([]);
			expect(
				(await parts.getBySlug('halvard-strata-606'))?.guides.find((g) => g.slug === guide.slug)
					?.uses
			).toEqual([{ role: 'pick', slotLabel: 'CPU', rank: null }]);

			// Back to revision 1, then archived: an archived guide uses nothing.
			await guide.update({ publishedRevisionId: oldRevisionId });
			expect((await parts.getBySlug('halvard-strata-406'))?.guides.map((g) => g.slug)).toEqual([
				'steady-1080p-starter'
			]);
			await guide.update({ state: 'archived' });
			expect((await parts.getBySlug('halvard-strata-406'))?.guides).toEqual([]);
			await guide.update({ state: 'published' });
		});

		it('leaves withdrawn quotes out and takes a newer quote as the latest', async () => {
			const part = await Part.findOne({ where: { slug: 'ironvale-auric-a52-8g' } });
			const store = await Store.findOne({ where: { name: 'Bayline PC Supply' } });
			const region = await Region.findOne({ where: { code: 'us' } });
			if (!part || !store || !region) throw new Error('demo rows missing');
			const base = {
				partId: part.id,
				storeId: store.id,
				regionId: region.id,
				currency: 'USD',
				taxIncluded: false,
				url: null,
				source: 'editor' as const
			};
			await Quote.create({
				...base,
				amountMinor: 1,
				observedAt: new Date(SEED_NOW.getTime() + DAY_MS),
				status: 'withdrawn'
			});
			let detail = await parts.getBySlug(part.slug);
			let us = detail?.quotesByRegion.find((g) => g.region.code === 'us');
			expect(us?.quotes.find((q) => q.storeName === store.name)?.price.amountMinor).toBe(21999);
			expect(detail?.history.flatMap((s) => s.points).some((p) => p.amountMinor === 1)).toBe(false);

			await Quote.create({
				...base,
				amountMinor: 20999,
				observedAt: new Date(SEED_NOW.getTime() + 2 * DAY_MS)
			});
			detail = await parts.getBySlug(part.slug);
			us = detail?.quotesByRegion.find((g) => g.region.code === 'us');
			expect(us?.quotes.find((q) => q.storeName === store.name)?.price.amountMinor).toBe(20999);
			expect(
				detail?.history.find((s) => s.storeName === store.name)?.points.map((p) => p.amountMinor)
			).toEqual([21999, 20999]);
		});

		it('returns a plain JSON-safe object', async () => {
			const part = await parts.getBySlug('solenne-cobalt-c6-8g');
			expect(JSON.parse(JSON.stringify(part))).toEqual(part);
		});
	});

	describe('GET /api/v1/parts and /api/v1/parts/[slug]', () => {
		type SearchEvent = Parameters<typeof searchRoute>[0];
		type DetailEvent = Parameters<typeof detailRoute>[0];
		const search = (qs: string) =>
			searchRoute({
				url: new URL(`http://127.0.0.1/api/v1/parts${qs}`),
				params: {}
			} as unknown as SearchEvent);
		const detail = (slug: string, qs = '') =>
			detailRoute({
				url: new URL(`http://127.0.0.1/api/v1/parts/${slug}${qs}`),
				params: { slug }
			} as unknown as DetailEvent);

		it('answers a search with items, total, page and pageCount', async () => {
			const response = await search('?category=gpu&minVramGb=16&page=1');
			expect(response.status).toBe(200);
			const body = await response.json();
			const expected = demoParts
				.filter((p) => p.category === 'gpu' && Number(spec(p, 'vramGb')) >= 16)
				.sort(byBrandModel);
			expect(body.total).toBe(expected.length);
			expect(body.page).toBe(1);
			expect(body.pageCount).toBe(1);
			expect(slugsOf(body.items)).toEqual(slugsOf(expected));
		});

		it.each([
			['?colour=red', '_form'],
			['?category=gpu&maxLengthMm=5000', 'maxLengthMm'],
			['?category=gpu&maxLengthMm=-3', 'maxLengthMm'],
			['?category=gpu&minVramGb=eight', 'minVramGb'],
			['?category=cpu&minVramGb=8', 'minVramGb'],
			['?socket=AM5', 'socket'],
			['?category=cpu&socket=AM9', 'socket'],
			['?category=toaster', 'category'],
			['?page=0', 'page'],
			['?q=a&q=b', 'q']
		])('refuses %s with 400 and a message for %s', async (qs, field) => {
			const response = await search(qs);
			expect(response.status).toBe(400);
			const body = await response.json();
			expect(typeof body.message).toBe('string');
			expect(body.issues[field]?.length).toBeGreaterThan(0);
		});

		it('answers a part with its detail, and 404 { message } for an unknown slug', async () => {
			const ok = await detail('solenne-cobalt-c6-8g');
			expect(ok.status).toBe(200);
			expect(await ok.json()).toEqual(
				JSON.parse(JSON.stringify(await parts.getBySlug('solenne-cobalt-c6-8g')))
			);
			const missing = await detail('no-such-part');
			expect(missing.status).toBe(404);
			expect(await missing.json()).toEqual({ message: expect.any(String) });
			expect((await detail('solenne-cobalt-c6-8g', '?extra=1')).status).toBe(400);
		});
	});
});
