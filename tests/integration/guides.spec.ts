import { QueryTypes } from 'sequelize';
import { beforeAll, describe, expect, it } from 'vitest';
import { Guide, Quote, Region, sequelize } from '../../src/lib/server/db';
import { seeder } from '../../src/lib/server/db/seeders';
import { seedDemoCommunity } from '../../src/lib/server/db/seeders/demo-community';
import { demoGuides } from '../../src/lib/server/db/seeders/demo-data';
import * as guideBrowse from '../../src/lib/server/services/guide-browse';
import * as guidePrices from '../../src/lib/server/services/guide-prices';
import * as guides from '../../src/lib/server/services/guides';
import { resetDatabase } from '../support/db';

describe('guides service on the real MariaDB', () => {
	beforeAll(async () => {
		await resetDatabase();
		await seedDemoCommunity(sequelize);
		// The community seeder alone does not store list figures (the seeder chain does).
		await guidePrices.refreshAll();
	});

	it('lists every published demo guide with its base region and budget', async () => {
		const list = await guideBrowse.listPublished();
		expect(list.map((g) => g.slug).sort()).toEqual(demoGuides.map((g) => g.slug).sort());
		for (const card of list) {
			const demo = demoGuides.find((g) => g.slug === card.slug);
			expect(card.baseRegion.code).toBe(demo?.baseRegionCode);
			expect(card.targetBudget.amountMinor).toBe(demo?.targetBudgetMinor);
			expect(card.targetBudget.currency).toBe(card.baseRegion.currency);
		}
	});

	it('totals the picks exactly as SQL sums quantity × quoted amount', async () => {
		for (const card of await guideBrowse.listPublished()) {
			const [row] = await sequelize.query<{ total: string | number }>(
				`SELECT SUM(s.quantity * q.amount_minor) AS total
				   FROM guides g
				   JOIN guide_slots s ON s.revision_id = g.published_revision_id
				   JOIN quotes q ON q.id = s.price_quote_id
				  WHERE g.slug = :slug`,
				{ type: QueryTypes.SELECT, replacements: { slug: card.slug } }
			);
			expect(card.picksTotal?.amountMinor).toBe(Number(row?.total));
		}
	});

	it('shows slots in order with their picks, prices and ranked alternates', async () => {
		const demo = demoGuides[0];
		if (!demo) throw new Error('no demo guide');
		const guide = await guides.getPublishedBySlug(demo.slug);
		expect(guide?.slots.map((s) => s.pick.slug)).toEqual(demo.slots.map((s) => s.pickSlug));
		for (const [i, slot] of (guide?.slots ?? []).entries()) {
			expect(slot.position).toBe(i + 1);
			expect(slot.price?.unit.currency).toBe(guide?.baseRegion.currency);
			expect(slot.alternates.map((a) => a.part.slug)).toEqual(
				demo.slots[i]?.alternates.map((a) => a.partSlug)
			);
			expect(slot.alternates.map((a) => a.rank)).toEqual(slot.alternates.map((_, r) => r + 1));
		}
		const range = guide?.totalRange;
		expect(
			range && guide?.picksTotal && range.min.amountMinor <= guide.picksTotal.amountMinor
		).toBe(true);
		expect(
			range && guide?.picksTotal && range.max.amountMinor >= guide.picksTotal.amountMinor
		).toBe(true);
	});

	it('gives nothing for an unknown slug or a guide that is not published', async () => {
		expect(await guides.getPublishedBySlug('no-such-guide')).toBeNull();
		const demo = demoGuides[0];
		if (!demo) throw new Error('no demo guide');
		await Guide.update({ state: 'archived' }, { where: { slug: demo.slug } });
		expect(await guides.getPublishedBySlug(demo.slug)).toBeNull();
		expect((await guideBrowse.listPublished()).some((g) => g.slug === demo.slug)).toBe(false);
		await Guide.update({ state: 'published' }, { where: { slug: demo.slug } });
	});
});

describe('guide pricing in another region (region adjust on the real MariaDB)', () => {
	beforeAll(async () => {
		await resetDatabase();
		await seeder(sequelize).up(); // community and the ECB 2 Jan 2024 demo rates
	});

	it('prices a US guide in Germany: each line quoted by a German store or estimated from the US price', async () => {
		const outcome = await guides.getPriced('steady-1080p-starter', 'de');
		if (outcome.kind !== 'ok') throw new Error(outcome.kind);
		const g = outcome.guide;
		expect(g.region.code).toBe('de');
		expect(g.picksTotal?.currency).toBe('EUR');
		expect(g.picks.quoted + g.picks.estimated + g.picks.unpriced).toBe(g.slots.length);
		for (const slot of g.slots) {
			expect(slot.price?.unit.currency ?? 'EUR').toBe('EUR');
			if (slot.price?.status === 'estimated') expect(slot.price.observedAt).toBe('2024-01-02');
		}
		const de = await Region.findOne({ where: { code: 'de' } });
		if (!de) throw new Error('no de region');
		// A quoted line is the latest German quote of that part.
		const quoted = g.slots.find((s) => s.price?.status === 'quoted');
		expect(quoted, 'the demo has German quotes for some picks').toBeDefined();
		if (quoted?.price) {
			const latest = await Quote.findOne({
				where: { partId: quoted.pick.id, regionId: de.id },
				order: [['observedAt', 'DESC']]
			});
			expect(quoted.price.unit.amountMinor).toBe(Number(latest?.amountMinor));
		}
	});

	it('estimates a line by hand: strip 10 % consumption tax, convert yen at the ECB rate, apply the factor, add 19 % VAT (D)', async () => {
		const outcome = await guides.getPriced('pocket-itx-1440p', 'de');
		if (outcome.kind !== 'ok') throw new Error(outcome.kind);
		// The demo's compact build has a pick without a German quote, so there is an estimate to check.
		const estimated = outcome.guide.slots.find((s) => s.price?.status === 'estimated');
		if (!estimated?.price) throw new Error('expected an estimated line in Germany');
		expect(estimated.price.observedAt).toBe('2024-01-02');
		const base = await guides.getPriced('pocket-itx-1440p', null);
		if (base.kind !== 'ok') throw new Error(base.kind);
		const yen = base.guide.slots.find((s) => s.id === estimated.id)?.price?.unit.amountMinor ?? 0;
		const de = await Region.findOne({ where: { code: 'de' } });
		const factorBp = de?.categoryFactorsBp?.[estimated.category] ?? 10000;
		// ECB 2 Jan 2024 (docs/sources.md 10c, V): 1 EUR = 155.68 JPY. JP consumption tax 10 %
		// (value from memory), DE VAT 19 % (docs/sources.md 11a, V2). EUR cents =
		// yen / 1.10 / 155.68 × factor × 1.19 × 100, rounded half-even once (D).
		const exact = (yen / 1.1 / 155.68) * (factorBp / 10000) * 1.19 * 100;
		expect(Math.abs(estimated.price.unit.amountMinor - exact)).toBeLessThanOrEqual(0.5 + 1e-6);
		expect(estimated.price.unit.currency).toBe('EUR');
	});

	it('keeps the author’s quotes in the base region, and refuses an unknown region', async () => {
		const outcome = await guides.getPriced('steady-1080p-starter', null);
		if (outcome.kind !== 'ok') throw new Error(outcome.kind);
		expect(outcome.guide.picks.estimated).toBe(0);
		expect(outcome.guide.regions.map((r) => r.code).sort()).toEqual(['de', 'jp', 'uk', 'us']);
		expect(await guides.getPriced('steady-1080p-starter', 'zz')).toEqual({
			kind: 'unknown_region'
		});
	});
});
