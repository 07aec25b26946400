/* eslint-disable @typescript-eslint/no-non-null-assertion -- slot and option indexes come from
   the solver, which only returns positions of the arrays built here. */
/**
 * Within budget for a build (docs/architecture.md "Computations" §8): the domain solver
 * (domain/within-budget.ts) over each slot's current part plus its source slot's pick and
 * alternates, priced in the build's region, with the real fit report as the conflict rule.
 *
 * Options per slot. A slot that came from the guide offers its current part first, then the
 * base revision's pick for that slot, then its alternates (each part once). A slot the
 * reader added, a slot whose source slot is gone, and a slot already bought offer only
 * their current part (a bought part is not swapped; it still counts in the total).
 *
 * Prices (line = unit × quantity, integer minor units of the build region's currency) come
 * from build-pricing.ts pricedOptions, so they are the prices the build page shows: the
 * reader's override for the current part when it is in the region's currency, else a quote in
 * the build region, else an estimate from the source guide's base region (domain/region.ts).
 * A bought slot counts what was paid when that is in the region's currency. An option with
 * no price is ruled out (`unusable`); a slot with no priced option at all makes the answer
 * "no fit", naming the slot.
 *
 * Conflicts. Pairwise: two options conflict when the fit report on a build of just those
 * two parts has a conflict finding naming both slots (socket, memory type, form factor,
 * clearances, connectors, M.2 — the rules about two parts). Rules that fire on a missing
 * part (a CPU without a cooler slot) name one slot and are left out of the pairwise masks.
 * Full check: every complete candidate the solver would accept is run through the full fit
 * report and rejected if it has any conflict (PSU rating against the whole load, and any
 * rule that needs three parts), so a proposal never has a fit conflict. Cautions are not
 * conflicts and do not rule anything out.
 */
import type { Transaction } from 'sequelize';
import { fitReport } from '$lib/domain/fit';
import type { BuildPart } from '$lib/domain/fit';
import { decimalMarkOf, formatMoney, money, parseAmount } from '$lib/domain/money';
import type { Money, PartCategory } from '$lib/domain/types';
import { withinBudget } from '$lib/domain/within-budget';
import type { BudgetSlot, OptionRef, WithinBudgetResult } from '$lib/domain/within-budget';
import type { Invalid, NotFound, Stale } from '$lib/schemas/issues';
import { Build, BuildSlot, Region, sequelize } from '$lib/server/db';
import type { BudgetNoFit, BudgetProposal, BudgetSwapView, BuildView } from '$lib/views';
import { pricedOptions } from './build-pricing';
import type { PricedOption } from './build-pricing';
import { getBuild } from './build-view';

export type ProposeOutcome = BudgetProposal | BudgetNoFit | Invalid | NotFound;

export type ApplyBudgetOutcome =
	| {
			kind: 'ok';
			version: number;
			budget: Money;
			total: Money;
			changes: number;
			swaps: BudgetSwapView[];
	  }
	| BudgetNoFit
	| Stale<BuildView>
	| Invalid
	| NotFound;

interface SlotOptions {
	slotId: number;
	label: string;
	category: PartCategory;
	quantity: number;
	/** Current part first, then the source pick (unless current) and the alternates by rank. */
	options: PricedOption[];
	/** Line price per option, null when unpriced. */
	prices: (number | null)[];
}

interface Problem {
	currency: string;
	slots: SlotOptions[];
}

/** The slots with their options and line prices in the build's region. */
async function loadProblem(
	build: Build,
	region: Region,
	transaction?: Transaction
): Promise<Problem> {
	const priced = await pricedOptions(build, region);
	const bought = new Map(
		(
			await BuildSlot.findAll({
				where: { buildId: build.id },
				attributes: ['id', 'purchased', 'paidMinor', 'paidCurrency'],
				transaction
			})
		).map((s) => [s.id, s])
	);
	const currency = region.currency.toUpperCase();
	const slots = priced.map((p): SlotOptions => {
		const purchase = bought.get(p.slotId);
		const options = purchase?.purchased ? [p.current] : [p.current, ...p.options];
		const prices = options.map((o) => (o.lineTotal ? o.lineTotal.amountMinor : null));
		if (
			purchase?.purchased &&
			purchase.paidMinor !== null &&
			purchase.paidCurrency?.toUpperCase() === currency
		)
			prices[0] = Number(purchase.paidMinor);
		return {
			slotId: p.slotId,
			label: p.label,
			category: p.category,
			quantity: p.quantity,
			options,
			prices
		};
	});
	return { currency, slots };
}

function buildPart(key: string, slot: SlotOptions, option: PricedOption): BuildPart {
	return {
		key,
		label: slot.label,
		category: slot.category,
		quantity: slot.quantity,
		part: option.info
	} as unknown as BuildPart;
}

type Solved =
	| { ok: true; result: Extract<WithinBudgetResult, { ok: true }>; problem: Problem }
	| { ok: false; noFit: BudgetNoFit };

function solve(problem: Problem, budgetMinor: number): Solved {
	const { currency, slots } = problem;
	const m = (minor: number) => money(minor, currency);
	const unpriced = slots.filter((s) => s.prices.every((p) => p === null));
	if (unpriced.length > 0) {
		const names = unpriced
			.map((s) => `${s.label} (${s.options[0]!.part.brand} ${s.options[0]!.part.model})`)
			.join(', ');
		return {
			ok: false,
			noFit: {
				kind: 'no_fit',
				code: 'unpriced',
				reason: `No price in this region for ${names}, so the total cannot be checked against a budget. Add a price override for ${unpriced.length === 1 ? 'it' : 'them'} first.`,
				budget: m(budgetMinor)
			}
		};
	}
	const keyOf = (i: number) => String(slots[i]!.slotId);
	const optionOf = (o: OptionRef) => slots[o.slot]!.options[o.option]!;
	const budgetSlots: BudgetSlot[] = slots.map((s, i) => ({
		key: keyOf(i),
		// Unpriced options carry 0 and are ruled out by `unusable`.
		current: { id: s.options[0]!.part.id, price: s.prices[0] ?? 0 },
		alternates: s.options.slice(1).map((o, j) => ({ id: o.part.id, price: s.prices[j + 1] ?? 0 }))
	}));
	const result = withinBudget({
		slots: budgetSlots,
		budget: budgetMinor,
		unusable: (o) => slots[o.slot]!.prices[o.option] === null,
		conflicts: (a, b) => {
			const ka = keyOf(a.slot);
			const kb = keyOf(b.slot);
			const pair = [
				buildPart(ka, slots[a.slot]!, optionOf(a)),
				buildPart(kb, slots[b.slot]!, optionOf(b))
			];
			return fitReport(pair).some(
				(f) => f.severity === 'conflict' && f.slots.includes(ka) && f.slots.includes(kb)
			);
		},
		fullCheck: (picks) =>
			!fitReport(picks.map((o) => buildPart(keyOf(o.slot), slots[o.slot]!, optionOf(o)))).some(
				(f) => f.severity === 'conflict'
			),
		formatAmount: (minor) => formatMoney(m(minor))
	});
	if (result.ok) return { ok: true, result, problem };
	return {
		ok: false,
		noFit: {
			kind: 'no_fit',
			code: result.reason,
			reason: result.message,
			budget: m(budgetMinor),
			...(result.cheapestTotal !== null ? { cheapestTotal: m(result.cheapestTotal) } : {})
		}
	};
}

function swapsOf(problem: Problem, choice: number[]): BudgetSwapView[] {
	const m = (minor: number) => money(minor, problem.currency);
	const swaps: BudgetSwapView[] = [];
	problem.slots.forEach((s, i) => {
		const o = choice[i] ?? 0;
		if (o === 0) return;
		const from = s.prices[0] ?? 0;
		const to = s.prices[o] ?? 0;
		swaps.push({
			slotId: s.slotId,
			label: s.label,
			from: { part: s.options[0]!.part, price: m(from) },
			to: { part: s.options[o]!.part, price: m(to) },
			delta: m(to - from)
		});
	});
	return swaps;
}

/** The build as the owner sees it now (sent back with a stale-version answer). */
async function currentView(ownerId: string, buildId: number): Promise<BuildView> {
	const view = await getBuild({ id: ownerId }, buildId);
	if (!view) throw new Error(`build ${buildId} vanished while locked`);
	return view;
}

async function ownBuild(
	ownerId: string,
	buildId: number,
	transaction?: Transaction
): Promise<Build | null> {
	return Build.findOne({
		where: { id: buildId, ownerId },
		...(transaction ? { transaction, lock: transaction.LOCK.UPDATE } : {})
	});
}

/**
 * A budget as the reader gave it: minor units of the region's currency, or an amount as typed
 * in that currency, read the way the region writes amounts (domain/money.ts parseAmount).
 */
export type BudgetInput = number | string;

function budgetInMinor(budget: BudgetInput, region: Region): number | Invalid {
	if (typeof budget === 'number') return budget;
	const parsed = parseAmount(budget, region.currency, decimalMarkOf(region.code));
	return parsed.ok ? parsed.amountMinor : { kind: 'invalid', issues: { budget: [parsed.message] } };
}

/** The swaps that bring the owner's build within `budget` (in its region's currency), or why none do. */
export async function proposeWithinBudget(
	ownerId: string,
	buildId: number,
	budget: BudgetInput
): Promise<ProposeOutcome> {
	const build = await ownBuild(ownerId, buildId);
	if (!build) return { kind: 'not_found' };
	const region = (await Region.findByPk(build.regionId)) as Region;
	const budgetMinor = budgetInMinor(budget, region);
	if (typeof budgetMinor !== 'number') return budgetMinor;
	const solved = solve(await loadProblem(build, region), budgetMinor);
	if (!solved.ok) return solved.noFit;
	const { result, problem } = solved;
	const m = (minor: number) => money(minor, problem.currency);
	return {
		kind: 'proposal',
		budget: m(budgetMinor),
		currentTotal: m(result.currentTotal),
		total: m(result.total),
		changes: result.changes,
		swaps: swapsOf(problem, result.choice)
	};
}

/**
 * Solves again on the locked build and applies the swaps as one change: one transaction,
 * version checked, the build's budget set. A swapped slot loses its price override (it was
 * for the old part). When nothing fits, nothing is written.
 */
export async function applyWithinBudget(
	ownerId: string,
	buildId: number,
	budget: BudgetInput,
	expectedVersion: number
): Promise<ApplyBudgetOutcome> {
	return sequelize.transaction(async (transaction): Promise<ApplyBudgetOutcome> => {
		const build = await ownBuild(ownerId, buildId, transaction);
		if (!build) return { kind: 'not_found' };
		if (build.version !== expectedVersion)
			return { kind: 'conflict', current: await currentView(ownerId, build.id) };
		const region = (await Region.findByPk(build.regionId, { transaction })) as Region;
		const budgetMinor = budgetInMinor(budget, region);
		if (typeof budgetMinor !== 'number') return budgetMinor;
		const solved = solve(await loadProblem(build, region, transaction), budgetMinor);
		if (!solved.ok) return solved.noFit;
		const { result, problem } = solved;
		const [affected] = await Build.update(
			{ budgetMinor, version: expectedVersion + 1 },
			{ where: { id: build.id, version: expectedVersion }, transaction }
		);
		if (affected !== 1) throw new Error('build version moved while locked');
		for (const [i, s] of problem.slots.entries()) {
			const o = result.choice[i] ?? 0;
			if (o === 0) continue;
			const option = s.options[o]!;
			// The override was a price for the old part.
			await BuildSlot.update(
				{
					partId: option.part.id,
					origin: option.kind === 'source_pick' ? 'source' : 'alternate',
					priceOverrideMinor: null,
					priceOverrideCurrency: null,
					priceOverrideStore: null,
					priceOverrideDate: null
				},
				{ where: { id: s.slotId, buildId: build.id }, transaction }
			);
		}
		const m = (minor: number) => money(minor, problem.currency);
		return {
			kind: 'ok',
			version: expectedVersion + 1,
			budget: m(budgetMinor),
			total: m(result.total),
			changes: result.changes,
			swaps: swapsOf(problem, result.choice)
		};
	});
}
