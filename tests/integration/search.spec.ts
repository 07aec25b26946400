import { beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { Guide, Part, Quote, Region, Store, sequelize } from '../../src/lib/server/db';
import { seeder } from '../../src/lib/server/db/seeders';
import { parseGuideBrowseStrict } from '../../src/lib/schemas/guide-browse';
import type { GuideBrowseQuery } from '../../src/lib/schemas/guide-browse';
import { parsePartSearchStrict } from '../../src/lib/schemas/parts';
import * as guideBrowse from '../../src/lib/server/services/guide-browse';
import * as parts from '../../src/lib/server/services/parts';
import { GET as partsRoute } from '../../src/routes/api/v1/parts/+server';
import { resetDatabase } from '../support/db';

/*
 * Full-text search of guides (title, summary, build notes) and of the parts catalog (brand,
 * model), and the catalog's price column and price sort, on the real MariaDB. The texts,
 * parts and quotes are written here by hand; every expected match, order and figure below
 * was worked out by reading them, not by running the product.
 *
 * Search rules checked (docs/architecture.md "EXPLAIN notes"; MariaDB full-text rules from
 * the MariaDB manual, "Full-Text Index Overview", from memory): words match from their start;
 * every word must match; a reader's `+ - " * @ ( ) ~ < >` are text, not operators; words
 * shorter than innodb_ft_min_token_size (3) and InnoDB stopwords ("the") still count.
 */

async function browse(q: Partial<GuideBrowseQuery>, perPage?: number) {
	const outcome = await guideBrowse.browse({ tag: [], sort: 'newest', page: 1, ...q }, perPage);
	if (outcome.kind !== 'ok') throw new Error(outcome.kind);
	return outcome.result;
}
const slugs = (items: { slug: string }[]) => items.map((i) => i.slug).sort();

describe('guide text search', () => {
	/** The four published demo guides get these texts (title, summary, build notes). */
	const TEXTS: [string, string, string][] = [
		[
			'Whisper-quiet 1440p tower',
			'Low noise for long sessions.',
			'Fit the case fans first. A C++ toolchain runs fine too.'
		],
		[
			'Pocket ITX build',
			'A tiny box for a desk.',
			'Seat the 12V-2x6 plug fully until it clicks. Bramblecore cooler, stock paste.'
		],
		['Studio workstation', 'Quiet tower for audio work.', 'Ground yourself before the board.'],
		['X3 streaming rig', 'Encodes and plays with Bramblecore fans.', 'Fans set to a quiet profile.']
	];
	let guide: string[] = [];

	beforeAll(async () => {
		await resetDatabase();
		await seeder(sequelize).up();
		const published = await Guide.findAll({
			where: { state: 'published' },
			order: [['id', 'ASC']]
		});
		expect(published.length, 'the demo community has four published guides').toBe(4);
		guide = published.map((g) => g.slug);
		for (const [i, g] of published.entries()) {
			const [title, summary, notes] = TEXTS[i] ?? ['', '', ''];
			// The published revision's text is what is searched; the guide row keeps its copy.
			await sequelize.query(
				'UPDATE guide_revisions SET title = ?, summary = ?, build_notes_md = ? WHERE id = ?',
				{ replacements: [title, summary, notes, g.publishedRevisionId], type: QueryTypes.UPDATE }
			);
			await g.update({ title, summary });
		}
	});

	const found = async (q: string) => slugs((await browse({ q })).items);
	const of = (...i: number[]) => i.map((n) => guide[n]).sort();

	it('finds a word in the title, the summary or the build notes, from its start', async () => {
		// "quiet": title of 0 ("Whisper-quiet"), summary of 2, build notes of 3.
		expect(await found('quiet')).toEqual(of(0, 2, 3));
		// Both words: 0 (title) and 2 (summary); 3 has "quiet" but no "tower".
		expect(await found('quiet tower')).toEqual(of(0, 2));
		// A word's start: "bramble" finds "Bramblecore" in the notes of 1 and the summary of 3.
		expect(await found('Bramble')).toEqual(of(1, 3));
		expect(await found('12V-2x6')).toEqual(of(1));
	});

	it("takes a reader's operators as text: no error, every word still required", async () => {
		// +quiet, -tower and "studio are the words quiet, tower and studio: only 2 has all.
		expect(await found('+quiet -tower "studio')).toEqual(of(2));
		expect(await found('@quiet* ~(tower)<>')).toEqual(of(0, 2));
		expect(await found('"')).toEqual([]);
		expect(await found("' OR 1=1 --")).toEqual([]);
	});

	it('keeps short words and stopwords: with other words as a substring, alone as a title start', async () => {
		// "c++" (shorter than 3) with "toolchain": only the notes of 0 hold both.
		expect(await found('c++ toolchain')).toEqual(of(0));
		// "the" is an InnoDB stopword; "the board" is only in the notes of 2.
		expect(await found('the board')).toEqual(of(2));
		// "x3" alone: a title beginning with it (3, "X3 streaming rig").
		expect(await found('x3')).toEqual(of(3));
		expect(await found('x3 streaming')).toEqual(of(3));
	});

	it('answers no match with an empty page, and pages the matches', async () => {
		const none = await browse({ q: 'zyxwv' });
		expect(none.items).toEqual([]);
		expect(none.total).toBe(0);
		expect(none.pageCount).toBe(1);

		const first = await browse({ q: 'quiet' }, 2);
		const second = await browse({ q: 'quiet', page: 2 }, 2);
		expect([first.total, first.pageCount, first.items.length]).toEqual([3, 2, 2]);
		expect(second.items.length).toBe(1);
		expect(slugs([...first.items, ...second.items])).toEqual(of(0, 2, 3));
	});

	it('searches with a region and its sorts, and validates q at the edge', async () => {
		expect(slugs((await browse({ q: 'quiet', region: 'de', sort: 'total' })).items)).toEqual(
			of(0, 2, 3)
		);
		const ok = parseGuideBrowseStrict(new URLSearchParams('q=%2Bquiet+-tower'));
		expect(ok.ok && ok.query.q).toBe('+quiet -tower');
		const long = parseGuideBrowseStrict(new URLSearchParams({ q: 'w'.repeat(101) }));
		expect(long.ok ? null : long.issues.q).toEqual(['Search for at most 100 characters.']);
	});
});

describe('parts search, price column and price sort', () => {
	const slugOf = { P1: '', P2: '', P3: '', P4: '', P5: '' };

	beforeAll(async () => {
		await resetDatabase();
		// Germany: prices shown with 19 % VAT; the United States: before sales tax (docs/sources.md 11a, 11c).
		const de = await Region.create({
			code: 'de',
			name: 'Germany',
			currency: 'EUR',
			taxMode: 'inclusive',
			taxRateBp: 1900
		});
		const us = await Region.create({
			code: 'us',
			name: 'United States',
			currency: 'USD',
			taxMode: 'exclusive',
			taxRateBp: 0
		});
		const s1 = await Store.create({ name: 'Lindwerk', regionId: de.id, url: 'https://a.test' });
		const s2 = await Store.create({ name: 'Fuchsbau', regionId: de.id, url: 'https://b.test' });
		const s3 = await Store.create({ name: 'Baywell', regionId: us.id, url: 'https://c.test' });
		const part = async (
			key: keyof typeof slugOf,
			category: Part['category'],
			brand: string,
			model: string
		) => {
			const slug = `${brand}-${model}`.toLowerCase().replace(/[^a-z0-9]+/g, '-');
			slugOf[key] = slug;
			return Part.create({ category, brand, model, slug, specs: {} });
		};
		const p1 = await part('P1', 'cooler', 'Vantor', 'Strata 606 Air');
		const p2 = await part('P2', 'case', 'Vantor', 'X2 Mini');
		const p3 = await part('P3', 'psu', 'Kessly', 'The Way 850W');
		const p4 = await part('P4', 'case', 'Orvel', 'Ridge');
		const p5 = await part('P5', 'cooler', 'Kessly', 'Strata-Lite 300');
		const quote = (
			p: Part,
			store: Store,
			amountMinor: number,
			taxIncluded: boolean,
			day: string,
			status: 'active' | 'withdrawn' = 'active'
		) =>
			Quote.create({
				partId: p.id,
				storeId: store.id,
				regionId: store.regionId,
				amountMinor,
				currency: store.regionId === us.id ? 'USD' : 'EUR',
				taxIncluded,
				observedAt: new Date(`2026-11-${day}T10:00:00Z`),
				url: null,
				source: 'editor',
				status
			});
		await quote(p1, s1, 8990, true, '01'); // older: not the price
		await quote(p1, s2, 7900, true, '10'); // latest in de: €79.00
		await quote(p2, s1, 4500, true, '05'); // €45.00
		await quote(p2, s2, 3900, true, '20', 'withdrawn'); // withdrawn: never a price
		await quote(p3, s2, 10000, false, '08'); // €100.00 before tax: €119.00 with 19 %
		await quote(p5, s1, 11000, true, '09'); // €110.00
		await quote(p4, s3, 5999, false, '07'); // only in the United States: $59.99
	});

	const search = (options: Partial<Parameters<typeof parts.search>[0]>) =>
		parts.search({ q: '', page: 1, ...options });
	const found = async (q: string) => (await search({ q, perPage: 100 })).items.map((i) => i.slug);

	it('finds every word in the brand or the model, from its start, by brand and model', async () => {
		// Kessly Strata-Lite 300 before Vantor Strata 606 Air.
		expect(await found('strata')).toEqual([slugOf.P5, slugOf.P1]);
		expect(await found('vantor strat')).toEqual([slugOf.P1]);
		expect(await found('606')).toEqual([slugOf.P1]);
		// Inside a word is no match: "rata" is not the start of any word ("Strata").
		expect(await found('rata')).toEqual([]);
	});

	it("takes a reader's operators as text and keeps short words and stopwords", async () => {
		// "-lite" is the word lite, required like strata: only Strata-Lite has both.
		expect(await found('+strata -lite')).toEqual([slugOf.P5]);
		expect(await found('"strata"*')).toEqual([slugOf.P5, slugOf.P1]);
		expect(await found('"*@()~<>')).toEqual([]);
		// "x2" is shorter than the index's 3 characters: alone, a model or brand beginning with it.
		expect(await found('x2')).toEqual([slugOf.P2]);
		expect(await found('vantor x2')).toEqual([slugOf.P2]);
		// Two short words: the first begins the model ("X2 Mini"), the second is inside it ("mi").
		expect(await found('x2 mi')).toEqual([slugOf.P2]);
		// "the" is an InnoDB stopword, "way" is indexed.
		expect(await found('the way')).toEqual([slugOf.P3]);
		expect(await found('zyxwv')).toEqual([]);
	});

	it('pages the matches', async () => {
		const first = await search({ q: 'vantor', perPage: 1 });
		const second = await search({ q: 'vantor', perPage: 1, page: 2 });
		expect([first.total, first.pageCount]).toEqual([2, 2]);
		expect([...first.items, ...second.items].map((i) => i.slug)).toEqual([slugOf.P1, slugOf.P2]);
		// Matches sorted by price in the database: 79.00 (P1) on page 1, 110.00 (P5) on page 2.
		const byPrice = [1, 2].map((page) =>
			search({ q: 'strata', region: 'de', sort: 'price', perPage: 1, page })
		);
		expect((await Promise.all(byPrice)).map((r) => r.items.map((i) => i.slug))).toEqual([
			[slugOf.P1],
			[slugOf.P5]
		]);
	});

	it('shows each part’s latest active quote in the chosen region, in its tax convention', async () => {
		const result = await search({ region: 'de', perPage: 100 });
		expect(result.region?.code).toBe('de');
		const price = Object.fromEntries(
			result.items.map((i) => [
				i.slug,
				i.price ? [i.price.unit.amountMinor, i.price.storeName] : null
			])
		);
		expect(price).toEqual({
			[slugOf.P1]: [7900, 'Fuchsbau'],
			[slugOf.P2]: [4500, 'Lindwerk'],
			[slugOf.P3]: [11900, 'Fuchsbau'], // 100.00 + 19 % = 119.00 (docs/sources.md 11a DE 19 %, 11c shown with VAT)
			[slugOf.P4]: null,
			[slugOf.P5]: [11000, 'Lindwerk']
		});
		// By brand and model when not sorted by price.
		expect(result.items.map((i) => i.slug)).toEqual([
			slugOf.P5,
			slugOf.P3,
			slugOf.P4,
			slugOf.P1,
			slugOf.P2
		]);
		const us = await search({ region: 'us', q: 'ridge' });
		expect(us.items.map((i) => i.price?.unit)).toEqual([{ amountMinor: 5999, currency: 'USD' }]);
		expect((await search({})).items.every((i) => i.price === null)).toBe(true);
	});

	it('sorts by price in the region, lowest first, unpriced last, paged in the database', async () => {
		// 45.00 (P2) < 79.00 (P1) < 110.00 (P5) < 119.00 (P3, sorted by its price with tax) < none (P4).
		const pages = [];
		for (let page = 1; page <= 3; page++)
			pages.push(await search({ region: 'de', sort: 'price', perPage: 2, page }));
		expect(pages.map((p) => p.items.map((i) => i.slug))).toEqual([
			[slugOf.P2, slugOf.P1],
			[slugOf.P5, slugOf.P3],
			[slugOf.P4]
		]);
		expect(pages[0]?.pageCount).toBe(3);
		const coolers = await search({ region: 'de', sort: 'price', category: 'cooler' });
		expect(coolers.items.map((i) => i.price?.unit.amountMinor)).toEqual([7900, 11000]);
	});

	it('refuses a price sort without a region and an unknown region, with field messages', async () => {
		const call = (qs: string) =>
			partsRoute({ url: new URL(`http://x.test/api/v1/parts${qs}`) } as Parameters<
				typeof partsRoute
			>[0]);
		const noRegion = await call('?sort=price');
		expect(noRegion.status).toBe(400);
		expect(((await noRegion.json()) as { issues: Record<string, string[]> }).issues.sort).toEqual([
			'Choose a region to sort by price: prices are compared in its currency.'
		]);
		const unknown = await call('?region=zz');
		expect(unknown.status).toBe(400);
		expect(((await unknown.json()) as { issues: Record<string, string[]> }).issues.region).toEqual([
			'No region has the code "zz".'
		]);
		const operators = await call(`?q=${encodeURIComponent('+strata -lite')}&region=de&sort=price`);
		expect(operators.status).toBe(200);
		const parsed = parsePartSearchStrict(new URLSearchParams('sort=cheapest&region=de'));
		expect(parsed.ok ? null : parsed.issues.sort).toEqual(['Sort by one of: name, price.']);
	});

	it('answers each part with the id the pickers post and the draft, build and fit APIs take', async () => {
		const answer = await partsRoute({
			url: new URL('http://x.test/api/v1/parts?q=ridge&category=case')
		} as Parameters<typeof partsRoute>[0]);
		expect(answer.status).toBe(200);
		const stored = await Part.findOne({ where: { slug: slugOf.P4 } });
		expect(((await answer.json()) as { items: unknown[] }).items).toEqual([
			{
				id: stored?.id,
				slug: 'orvel-ridge',
				category: 'case',
				brand: 'Orvel',
				model: 'Ridge',
				specs: {},
				price: null
			}
		]);
	});
});
