import { QueryTypes } from 'sequelize';
import { beforeAll, describe, expect, it } from 'vitest';
import { Guide, sequelize } from '../../src/lib/server/db';
import { seedDemoCommunity } from '../../src/lib/server/db/seeders/demo-community';
import { demoGuides } from '../../src/lib/server/db/seeders/demo-data';
import * as guides from '../../src/lib/server/services/guides';
import { resetDatabase } from '../support/db';

describe('guides service on the real MariaDB', () => {
	beforeAll(async () => {
		await resetDatabase();
		await seedDemoCommunity(sequelize);
	});

	it('lists every published demo guide with its base region and budget', async () => {
		const list = await guides.listPublished();
		expect(list.map((g) => g.slug).sort()).toEqual(demoGuides.map((g) => g.slug).sort());
		for (const card of list) {
			const demo = demoGuides.find((g) => g.slug === card.slug);
			expect(card.baseRegion.code).toBe(demo?.baseRegionCode);
			expect(card.targetBudget.amountMinor).toBe(demo?.targetBudgetMinor);
			expect(card.targetBudget.currency).toBe(card.baseRegion.currency);
		}
	});

	it('totals the picks exactly as SQL sums quantity × quoted amount', async () => {
		for (const card of await guides.listPublished()) {
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
			expect(slot.alternates.map((a) => a.part.slug)).toEqual(demo.slots[i]?.alternates.map((a) => a.partSlug));
			expect(slot.alternates.map((a) => a.rank)).toEqual(slot.alternates.map((_, r) => r + 1));
		}
		const range = guide?.totalRange;
		expect(range && guide?.picksTotal && range.min.amountMinor <= guide.picksTotal.amountMinor).toBe(true);
		expect(range && guide?.picksTotal && range.max.amountMinor >= guide.picksTotal.amountMinor).toBe(true);
	});

	it('gives nothing for an unknown slug or a guide that is not published', async () => {
		expect(await guides.getPublishedBySlug('no-such-guide')).toBeNull();
		const demo = demoGuides[0];
		if (!demo) throw new Error('no demo guide');
		await Guide.update({ state: 'archived' }, { where: { slug: demo.slug } });
		expect(await guides.getPublishedBySlug(demo.slug)).toBeNull();
		expect((await guides.listPublished()).some((g) => g.slug === demo.slug)).toBe(false);
		await Guide.update({ state: 'published' }, { where: { slug: demo.slug } });
	});
});
