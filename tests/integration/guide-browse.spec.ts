import { parseFeed } from '@rowanmanning/feed-parser';
import { beforeAll, describe, expect, it } from 'vitest';
import { FrameResult, Guide, GuideRevision, GuideSlot, sequelize } from '../../src/lib/server/db';
import { seeder } from '../../src/lib/server/db/seeders';
import { demoGuides } from '../../src/lib/server/db/seeders/demo-data';
import {
	parseGuideBrowseLenient,
	parseGuideBrowseStrict
} from '../../src/lib/schemas/guide-browse';
import type { GuideBrowseQuery } from '../../src/lib/schemas/guide-browse';
import * as guideBrowse from '../../src/lib/server/services/guide-browse';
import * as guidePrices from '../../src/lib/server/services/guide-prices';
import { atomFeed, xmlEscape } from '../../src/lib/server/services/guide-feed';
import * as guides from '../../src/lib/server/services/guides';
import { resetDatabase } from '../support/db';

/*
 * Guide browse and the Atom feed on the real MariaDB with the demo community and the ECB
 * 2 Jan 2024 demo rates. Every expected total below is the guide service's own figure for
 * that region (guides.getPriced), so browse and the guide page can never disagree.
 */
const query = (q: Partial<GuideBrowseQuery>): GuideBrowseQuery => ({
	tag: [],
	sort: 'newest',
	page: 1,
	...q
});

async function browse(q: Partial<GuideBrowseQuery>) {
	const outcome = await guideBrowse.browse(query(q));
	if (outcome.kind !== 'ok') throw new Error(outcome.kind);
	return outcome.result;
}

async function totalIn(slug: string, region: string): Promise<number> {
	const outcome = await guides.getPriced(slug, region);
	if (outcome.kind !== 'ok' || !outcome.guide.picksTotal) throw new Error(`no total for ${slug}`);
	return outcome.guide.picksTotal.amountMinor;
}

describe('guide browse on the real MariaDB', () => {
	beforeAll(async () => {
		await resetDatabase();
		await seeder(sequelize).up();
	});

	it('lists every published guide newest first, priced in its base region by default', async () => {
		const result = await browse({});
		expect(result.total).toBe(demoGuides.length);
		expect(result.items.map((g) => g.slug).sort()).toEqual(demoGuides.map((g) => g.slug).sort());
		const dates = result.items.map((g) => g.publishedAt);
		expect(dates).toEqual([...dates].sort().reverse());
		for (const g of result.items) expect(g.pricedIn.code).toBe(g.baseRegion.code);
	});

	it('filters by every ticked tag and by base region', async () => {
		const gaming1440 = await browse({ tag: ['1440p', 'gaming'] });
		const expected = demoGuides
			.filter((g) => g.tags.includes('1440p') && g.tags.includes('gaming'))
			.map((g) => g.slug);
		expect(gaming1440.items.map((g) => g.slug).sort()).toEqual(expected.sort());
		expect(expected.length).toBeGreaterThan(1);

		const fromUk = await browse({ base: 'uk' });
		expect(fromUk.items.map((g) => g.slug)).toEqual(
			demoGuides.filter((g) => g.baseRegionCode === 'uk').map((g) => g.slug)
		);
		expect((await browse({ tag: ['no-such-tag'] })).items).toEqual([]);
	});

	it('prices every guide in the reader region and keeps those within the budget, bounds included', async () => {
		const all = await browse({ region: 'de', sort: 'total' });
		const totals = await Promise.all(all.items.map((g) => totalIn(g.slug, 'de')));
		expect(all.items.map((g) => g.picksTotal?.amountMinor)).toEqual(totals);
		expect(
			all.items.every((g) => g.picksTotal?.currency === 'EUR' && g.pricedIn.code === 'de')
		).toBe(true);
		// Lowest total first.
		expect(totals).toEqual([...totals].sort((a, b) => a - b));

		// A budget exactly at the second cheapest total (whole euros, rounded outward) keeps it.
		const second = totals[1] ?? 0;
		const within = await browse({
			region: 'de',
			min: Math.floor(second / 100),
			max: Math.ceil(second / 100),
			sort: 'total'
		});
		expect(within.items.map((g) => g.slug)).toEqual([all.items[1]?.slug]);

		const upToSecond = await browse({ region: 'de', max: Math.ceil(second / 100) });
		expect(upToSecond.items.map((g) => g.slug).sort()).toEqual(
			all.items
				.slice(0, 2)
				.map((g) => g.slug)
				.sort()
		);
		expect((await browse({ region: 'de', max: 1 })).total).toBe(0);
	});

	it('sorts by best value: FPS per 100 EUR from the seeded frame results and totals, guides without either last', async () => {
		// One demo guide loses its frame results so the "no value" end of the order is exercised.
		const withoutResults = demoGuides[1]?.slug ?? '';
		const stripped = await Guide.findOne({ where: { slug: withoutResults } });
		await FrameResult.destroy({ where: { revisionId: stripped?.publishedRevisionId ?? 0 } });
		// Written behind the services' back: recompute that revision's stored figures as a
		// publish would (lists read them from guide_region_prices).
		await guidePrices.refreshRevisions([stripped?.publishedRevisionId ?? 0]);

		const result = await browse({ region: 'de', sort: 'value' });
		expect(result.total).toBe(demoGuides.length);

		// Independent figure: geometric mean as the n-th root of the product of the average FPS
		// (stored in tenths), over the total in whole euros (EUR has 2 minor digits, ISO 4217).
		const expected = await Promise.all(
			result.items.map(async (g) => {
				const guide = await Guide.findOne({ where: { slug: g.slug } });
				const frames = await FrameResult.findAll({
					where: { revisionId: guide?.publishedRevisionId ?? 0 }
				});
				const priced = await guides.getPriced(g.slug, 'de');
				if (priced.kind !== 'ok') throw new Error(priced.kind);
				const total = priced.guide.unpricedSlots === 0 ? priced.guide.picksTotal : null;
				if (frames.length === 0 || !total)
					return { slug: g.slug, publishedAt: g.publishedAt, value: null };
				expect(total.currency).toBe('EUR');
				const product = frames.reduce((p, f) => p * (f.avgFpsTenths / 10), 1);
				const geometricMean = product ** (1 / frames.length);
				return {
					slug: g.slug,
					publishedAt: g.publishedAt,
					value: (geometricMean * 100) / (total.amountMinor / 100)
				};
			})
		);
		const valued = expected.filter((e) => e.value !== null);
		expect(valued.length).toBeGreaterThan(1);
		expect(expected.find((e) => e.slug === withoutResults)?.value).toBeNull();

		const order = [...expected].sort(
			(a, b) =>
				(b.value ?? -Infinity) - (a.value ?? -Infinity) ||
				b.publishedAt.localeCompare(a.publishedAt) ||
				a.slug.localeCompare(b.slug)
		);
		expect(result.items.map((g) => g.slug)).toEqual(order.map((e) => e.slug));
		for (const [i, g] of result.items.entries()) {
			const value = expected[i]?.value ?? null;
			if (value === null) expect(g.fpsPer100).toBeNull();
			else expect(g.fpsPer100).toBeCloseTo(value, 9);
		}
		// The values really differ, so the order is not an accident of ties.
		expect(new Set(valued.map((e) => e.value?.toFixed(6))).size).toBe(valued.length);
		// Without a region every guide is in its own currency: no value to compare.
		expect((await browse({})).items.every((g) => g.fpsPer100 === null)).toBe(true);
	});

	it('offers the tags of listed guides only, and follows a guide retagged or hidden', async () => {
		const demoTags = [...new Set(demoGuides.flatMap((g) => g.tags))].sort();
		expect((await browse({})).tags).toEqual(demoTags);
		const guide = await Guide.findOne({ where: { slug: 'steady-1080p-starter' } });
		if (!guide) throw new Error('no demo guide steady-1080p-starter');
		const tags = guide.tags;
		try {
			// A tag no demo guide carries appears with the guide that takes it…
			await guide.update({ tags: [...tags, 'zz-retagged'] });
			expect((await browse({})).tags).toEqual([...demoTags, 'zz-retagged']);
			// …and leaves when that guide is hidden, with the tags only it carries (1080p,
			// budget, microatx: demo-data.ts), though its row still holds them.
			await guide.update({ hiddenAt: new Date(), hiddenReason: 'Test.' });
			expect((await browse({})).tags).toEqual([
				'1440p',
				'4k',
				'atx',
				'compact',
				'creator',
				'gaming',
				'mini-itx',
				'quiet'
			]);
		} finally {
			await guide.update({ hiddenAt: null, hiddenReason: null, tags });
		}
		expect((await browse({})).tags).toEqual(demoTags);
	});

	it('answers unknown regions as such, not with an empty list', async () => {
		expect((await guideBrowse.browse(query({ region: 'zz' }))).kind).toBe('unknown_region');
		expect(await guideBrowse.browse(query({ base: 'zz' }))).toEqual({
			kind: 'unknown_region',
			field: 'base'
		});
	});

	it('pages by 12 and reports the page count', async () => {
		// Republish copies of the first demo guide until there are 27 published guides.
		const source = await Guide.findOne({ where: { slug: demoGuides[0]?.slug ?? '' } });
		const slots = await GuideSlot.findAll({
			where: { revisionId: source?.publishedRevisionId ?? 0 }
		});
		for (let i = 0; i < 27 - demoGuides.length; i++) {
			const copy = await Guide.create({
				slug: `copy-${i}`,
				authorId: source?.authorId ?? null,
				title: `Copy ${i}`,
				summary: 'A copy for paging.',
				targetBudgetMinor: 70000,
				baseRegionId: source?.baseRegionId ?? 0,
				tags: ['paging'],
				state: 'published',
				publishedRevisionId: null
			});
			const revision = await GuideRevision.create({
				guideId: copy.id,
				number: 1,
				buildNotesMd: '',
				submittedAt: null,
				reviewedAt: null,
				publishedAt: new Date(Date.UTC(2026, 0, 1 + i)),
				reviewerId: null,
				reviewNote: null
			});
			await GuideSlot.bulkCreate(
				slots.map((s) => ({
					revisionId: revision.id,
					category: s.category,
					label: s.label,
					position: s.position,
					quantity: s.quantity,
					pickPartId: s.pickPartId,
					reason: s.reason,
					priceQuoteId: s.priceQuoteId
				}))
			);
			await copy.update({ publishedRevisionId: revision.id });
		}
		// Published behind the review service's back: store their figures as approval would.
		await guidePrices.refreshAll();
		const first = await browse({});
		expect([first.total, first.pageCount, first.items.length]).toEqual([27, 3, 12]);
		const third = await browse({ page: 3 });
		expect(third.items.length).toBe(3);
		const seen = [...first.items, ...(await browse({ page: 2 })).items, ...third.items].map(
			(g) => g.slug
		);
		expect(new Set(seen).size).toBe(27);
		expect((await browse({ page: 4 })).items).toEqual([]);
		expect((await browse({ tag: ['paging'] })).total).toBe(27 - demoGuides.length);
	});
});

describe('guide browse query', () => {
	it('the API parse refuses bad, unknown and repeated parameters with field issues', () => {
		const bad = parseGuideBrowseStrict(
			new URLSearchParams('min=abc&sort=cheapest&page=0&x=1&base=de&base=us')
		);
		expect(bad.ok).toBe(false);
		if (bad.ok) return;
		expect(Object.keys(bad.issues).sort()).toEqual(['_form', 'base', 'min', 'page', 'sort'].sort());
		const noRegion = parseGuideBrowseStrict(new URLSearchParams('max=900'));
		expect(noRegion.ok ? {} : noRegion.issues).toHaveProperty('max');
		const valueNoRegion = parseGuideBrowseStrict(new URLSearchParams('sort=value'));
		expect(valueNoRegion.ok ? {} : valueNoRegion.issues).toEqual({
			sort: ['Choose a region to sort by value: totals are compared in its currency.']
		});
		const totalNoRegion = parseGuideBrowseStrict(new URLSearchParams('sort=total'));
		expect(totalNoRegion.ok ? {} : totalNoRegion.issues).toEqual({
			sort: ['Choose a region to sort by total: totals are compared in its currency.']
		});
		expect(parseGuideBrowseStrict(new URLSearchParams('region=de&sort=value'))).toEqual({
			ok: true,
			query: { region: 'de', tag: [], sort: 'value', page: 1 }
		});
		const ok = parseGuideBrowseStrict(
			new URLSearchParams('region=DE&min=500&max=900&tag=1440p&tag=gaming&sort=total')
		);
		expect(ok).toEqual({
			ok: true,
			query: { region: 'de', min: 500, max: 900, tag: ['1440p', 'gaming'], sort: 'total', page: 1 }
		});
	});

	it('the page parse drops what is bad, says why, and keeps the rest', () => {
		const { query: q, issues } = parseGuideBrowseLenient(
			new URLSearchParams('region=de&min=-5&max=900&tag=<b>&page=2')
		);
		expect(q).toEqual({ region: 'de', max: 900, tag: [], sort: 'newest', page: 2 });
		expect(Object.keys(issues).sort()).toEqual(['min', 'tag']);
	});
});

describe('Atom feed of published guides', () => {
	beforeAll(async () => {
		await resetDatabase();
		await seeder(sequelize).up();
	});

	it('parses with a feed parser and lists every published guide with its link, dates and author', async () => {
		const xml = await atomFeed('http://slotwise.test');
		const feed = parseFeed(xml);
		expect(feed.meta.type).toBe('atom');
		expect(feed.title).toContain('Slotwise');
		expect(feed.self).toBe('http://slotwise.test/guides/feed.xml');
		expect(feed.url).toBe('http://slotwise.test/guides');
		const published = await guideBrowse.listPublished();
		expect(feed.items.map((i) => i.url).sort()).toEqual(
			published.map((g) => `http://slotwise.test/guides/${g.slug}`).sort()
		);
		for (const g of published) {
			const item = feed.items.find((i) => i.url?.endsWith(`/guides/${g.slug}`));
			expect(item?.title).toBe(g.title);
			expect(item?.id).toBe(`http://slotwise.test/guides/${g.slug}`);
			expect(item?.published?.toISOString()).toBe(g.publishedAt);
			expect(item?.updated?.toISOString()).toBe(g.publishedAt);
			expect(item?.authors.map((a) => a.name)).toEqual([g.authorName]);
			expect(item?.description).toBe(g.summary);
		}
	});

	it('escapes markup in titles so it reads as text and the XML stays well formed', async () => {
		const demo = demoGuides[0];
		await Guide.update(
			{ title: 'Fast & <b>quiet</b> "build"' },
			{ where: { slug: demo?.slug ?? '' } }
		);
		const xml = await atomFeed('http://slotwise.test');
		expect(xml).toContain('Fast &amp; &lt;b&gt;quiet&lt;/b&gt; &quot;build&quot;');
		const item = parseFeed(xml).items.find((i) => i.url?.endsWith(`/guides/${demo?.slug}`));
		expect(item?.title).toBe('Fast & <b>quiet</b> "build"');
		expect(xmlEscape('a\u0001b')).toBe('ab');
	});
});
