import { beforeEach, describe, expect, it } from 'vitest';
import { fitReport } from '../../src/lib/domain/fit';
import type { BuildPart } from '../../src/lib/domain/fit';
import { formatMoney, money } from '../../src/lib/domain/money';
import { Build, BuildSlot, Part, Quote, User, sequelize } from '../../src/lib/server/db';
import { seedDemoCommunity } from '../../src/lib/server/db/seeders/demo-community';
import { applyWithinBudget, proposeWithinBudget } from '../../src/lib/server/services/build-budget';
import { demoGuide, forkBuild, newReader, partId, slotRows } from '../support/buildsync-fixtures';
import { resetDatabase } from '../support/db';

/*
 * Within budget on the real MariaDB (docs/architecture.md "Computations" §8, services/build-budget.ts):
 * the solver itself is checked against brute force in tests/unit/domain/within-budget.spec.ts;
 * here the proposals on the demo guide are worked out by hand from its seeded US prices
 * (pre-tax, region "us", so no conversion or estimate is involved), the fit report is the
 * real one, and apply changes exactly the proposed slots in one versioned change.
 *
 * Seeded US line prices in minor units (latest active quote per part; demo data):
 *   CPU Strata 406 10999 (alts 406G 12499, 408 13999) · Motherboard S550M 9499 (S450M 6999,
 *   ATX S550 12999) · Memory 3600 32GB 5299 (3200 32GB 5499, 3200 16GB 3499) · Storage C3 5299
 *   (V4 Lite 5499, C4 2TB 12799) · Graphics card C6 22999 (A52 21999, A64 31999) · PSU 550 5499
 *   (650 7999) · Case M Mesh 6499 (Glassline M 7999, Basis ATX 5999) · Case fans 2499 (2999)
 *   · Operating system 1299 (11999). Picks total 69891.
 */

let owner: User;
let build: Build;

beforeEach(async () => {
	await resetDatabase();
	await seedDemoCommunity(sequelize);
	owner = await newReader('budget-owner');
	build = await forkBuild(owner, await demoGuide());
});

const usd = (minor: number) => money(minor, 'USD');

/** A newer US quote that makes the full-ATX board alternate the cheapest board. */
async function cheapAtxBoard(): Promise<void> {
	const id = await partId('vantor-s550-atx-wifi');
	const seen = (await Quote.findOne({ where: { partId: id } }))!;
	await Quote.create({
		partId: id,
		storeId: seen.storeId,
		regionId: seen.regionId,
		amountMinor: 5000,
		currency: 'USD',
		taxIncluded: false,
		observedAt: new Date(),
		url: null,
		source: 'editor'
	});
}

async function buildParts(buildId: number): Promise<BuildPart[]> {
	const slots = (await BuildSlot.findAll({
		where: { buildId },
		include: [{ model: Part, as: 'part' }]
	})) as (BuildSlot & { part: Part })[];
	return slots.map(
		(s) =>
			({
				key: String(s.id),
				label: s.label,
				category: s.category,
				quantity: s.quantity,
				part: { brand: s.part.brand, model: s.part.model, specs: s.part.specs }
			}) as unknown as BuildPart
	);
}

describe('propose within budget', () => {
	it('changes the fewest slots: at 680.00 one swap, the motherboard (worked by hand)', async () => {
		// Need to save 1891. Single swaps that save money: board −2500, memory −1800, card −1000,
		// case −500; only the board reaches it: 69891 − 2500 = 67391.
		const outcome = await proposeWithinBudget(owner.id, build.id, 68000);
		expect(outcome).toMatchObject({
			kind: 'proposal',
			budget: usd(68000),
			currentTotal: usd(69891),
			total: usd(67391),
			changes: 1
		});
		if (outcome.kind !== 'proposal') throw new Error(outcome.kind);
		expect(
			outcome.swaps.map((s) => [s.label, s.from.part.slug, s.to.part.slug, s.delta.amountMinor])
		).toEqual([['Motherboard', 'arkwell-s550m-daily', 'arkwell-s450m-basic', -2500]]);
	});

	it('at 660.00 two swaps, board and memory, the only pair that reaches it (worked by hand)', async () => {
		// Need 3891: board + memory 4300 → 65591; board + card 3500, board + case 3000 fall short.
		const outcome = await proposeWithinBudget(owner.id, build.id, 66000);
		expect(outcome).toMatchObject({ kind: 'proposal', total: usd(65591), changes: 2 });
		if (outcome.kind !== 'proposal') throw new Error(outcome.kind);
		expect(outcome.swaps.map((s) => s.to.part.slug)).toEqual([
			'arkwell-s450m-basic',
			'aldmere-pulse-ddr4-3200-16gb'
		]);
	});

	it('never proposes a fit conflict: a cheaper full-ATX board is passed over until the case changes with it', async () => {
		await cheapAtxBoard();
		// Alone, the ATX board (−4499) would be the cheapest single swap, but it does not fit the
		// micro-ATX case, so at 680.00 the answer is still the S450M.
		const one = await proposeWithinBudget(owner.id, build.id, 68000);
		expect(one).toMatchObject({ kind: 'proposal', total: usd(67391), changes: 1 });
		// At 650.00 no single swap reaches it; of the pairs only ATX board + ATX case does:
		// 69891 − 4499 − 500 = 64892 (S450M + 16 GB memory is 65591).
		const two = await proposeWithinBudget(owner.id, build.id, 65000);
		expect(two).toMatchObject({ kind: 'proposal', total: usd(64892), changes: 2 });
		if (two.kind !== 'proposal') throw new Error(two.kind);
		expect(two.swaps.map((s) => [s.label, s.to.part.slug])).toEqual([
			['Motherboard', 'vantor-s550-atx-wifi'],
			['Case', 'cairnhouse-basis-atx']
		]);
	});

	it('keeps a bought part: with the board bought, 680.00 needs memory and card (worked by hand)', async () => {
		await BuildSlot.update(
			{ purchased: true, paidMinor: 9499, paidCurrency: 'USD', purchasedAt: '2026-11-30' },
			{ where: { buildId: build.id, label: 'Motherboard' } }
		);
		// Without the board: memory −1800 alone falls short; pairs memory + card −2800 → 67091,
		// memory + case −2300 → 67591; the lower total wins.
		const outcome = await proposeWithinBudget(owner.id, build.id, 68000);
		expect(outcome).toMatchObject({ kind: 'proposal', total: usd(67091), changes: 2 });
		if (outcome.kind !== 'proposal') throw new Error(outcome.kind);
		expect(outcome.swaps.map((s) => s.label)).toEqual(['Memory', 'Graphics card']);
	});

	it('explains when nothing fits, with the cheapest conflict-free total', async () => {
		// Every saving at once: 69891 − 2500 − 1800 − 1000 − 500 = 64091.
		const outcome = await proposeWithinBudget(owner.id, build.id, 60000);
		expect(outcome).toMatchObject({
			kind: 'no_fit',
			code: 'over_budget',
			budget: usd(60000),
			cheapestTotal: usd(64091)
		});
		if (outcome.kind !== 'no_fit') throw new Error(outcome.kind);
		expect(outcome.reason).toBe(
			`The cheapest combination without a conflict costs ${formatMoney(usd(64091))}, ${formatMoney(usd(4091))} over the budget of ${formatMoney(usd(60000))}.`
		);
	});

	it('is not_found for anyone but the owner', async () => {
		const stranger = await newReader('budget-stranger');
		expect(await proposeWithinBudget(stranger.id, build.id, 68000)).toEqual({ kind: 'not_found' });
		expect(await applyWithinBudget(stranger.id, build.id, 68000, 1)).toEqual({ kind: 'not_found' });
	});
});

describe('apply within budget', () => {
	it('changes exactly the proposed slots in one versioned change, sets the budget, and leaves no fit conflict', async () => {
		await cheapAtxBoard();
		await BuildSlot.update(
			{
				priceOverrideMinor: 6499,
				priceOverrideCurrency: 'USD',
				priceOverrideStore: 'Corner Shop',
				priceOverrideDate: '2026-11-30'
			},
			{ where: { buildId: build.id, label: 'Case' } }
		);
		const before = await slotRows(build.id);
		const proposal = await proposeWithinBudget(owner.id, build.id, 65000);
		if (proposal.kind !== 'proposal') throw new Error(proposal.kind);

		const applied = await applyWithinBudget(owner.id, build.id, 65000, 1);
		expect(applied).toMatchObject({
			kind: 'ok',
			version: 2,
			budget: usd(65000),
			total: proposal.total,
			changes: proposal.changes
		});
		const after = await slotRows(build.id);
		const changed = after.filter((s, i) => JSON.stringify(s) !== JSON.stringify(before[i]));
		expect(changed.map((s) => s.id).sort()).toEqual(proposal.swaps.map((s) => s.slotId).sort());
		for (const swap of proposal.swaps) {
			expect(after.find((s) => s.id === swap.slotId)).toMatchObject({
				part: swap.to.part.slug,
				origin: 'alternate',
				priceOverrideMinor: null
			});
		}
		const saved = (await Build.findByPk(build.id))!;
		expect([Number(saved.budgetMinor), saved.version]).toEqual([65000, 2]);
		expect(fitReport(await buildParts(build.id)).filter((f) => f.severity === 'conflict')).toEqual(
			[]
		);
	});

	it('writes nothing on a stale version or when nothing fits', async () => {
		const before = await slotRows(build.id);
		const stale = await applyWithinBudget(owner.id, build.id, 68000, 7);
		// The answer carries the build as it is now (services/build-view.ts getBuild).
		expect(stale).toMatchObject({
			kind: 'conflict',
			current: { id: build.id, version: 1, budget: null }
		});
		expect((await applyWithinBudget(owner.id, build.id, 60000, 1)).kind).toBe('no_fit');
		expect(await slotRows(build.id)).toEqual(before);
		const saved = (await Build.findByPk(build.id))!;
		expect([saved.budgetMinor, saved.version]).toEqual([null, 1]);
	});
});
