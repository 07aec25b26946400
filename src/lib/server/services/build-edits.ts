/**
 * Edits of a build (docs/architecture.md "Build"): title, notes, region, visibility, budget
 * and the new-revision e-mail; each slot's part, quantity, the reader's own price and the
 * purchase tracker; adding and removing slots. The two bulk changes follow the same rule in
 * their own modules: build-sync (take a newer revision, undo it) and build-budget (apply the
 * within-budget swaps).
 *
 * Every change is the owner's only, one transaction, guarded by builds.version
 * (UPDATE … WHERE id AND owner AND version = expected): a stale version changes nothing
 * and answers with the build as it is now.
 */
import type { Transaction } from 'sequelize';
import { decimalMarkOf, minorUnitDigits, money, parseAmount } from '$lib/domain/money';
import { convertThroughEur, MissingRateError } from '$lib/domain/region';
import type { PartCategory } from '$lib/domain/types';
import { Build, BuildSlot, Part, Region, sequelize } from '$lib/server/db';
import type { BuildView, BuildVisibility } from '$lib/views';
import { loadBuild } from './build-pricing';
import type { LoadedBuild } from './build-pricing';
import { loadBuildSource, originOf } from './build-source';
import { getBuild } from './build-view';
import * as fx from './fx';
import type { Issues, VersionedOutcome } from '$lib/schemas/issues';

export type MutationOutcome = VersionedOutcome<{ build: BuildView }, BuildView>;

/** Most slots a build may have (a guide has a dozen; this leaves room for extras). */
export const MAX_BUILD_SLOTS = 40;

/**
 * Runs one change: bumps the version with `WHERE id AND owner AND version = expected` first
 * (no row: someone changed the build in between, nothing is written), then `work` in the
 * same transaction. The view is read after the commit.
 */
async function change(
	ownerId: string,
	id: number,
	expectedVersion: number,
	buildFields: Partial<
		Pick<
			Build,
			'title' | 'notes' | 'regionId' | 'visibility' | 'budgetMinor' | 'notifyOnNewRevision'
		>
	>,
	work?: (transaction: Transaction) => Promise<void>
): Promise<MutationOutcome> {
	const committed = await sequelize.transaction(async (transaction) => {
		const [affected] = await Build.update(
			{ ...buildFields, version: expectedVersion + 1 },
			{ where: { id, ownerId, version: expectedVersion }, transaction }
		);
		if (affected !== 1) return false;
		if (work) await work(transaction);
		return true;
	});
	const view = await getBuild({ id: ownerId }, id);
	if (!view) return { kind: 'not_found' };
	return committed ? { kind: 'ok', build: view } : { kind: 'conflict', current: view };
}

/** Whether `ownerId` owns build `id` (one indexed lookup; for handlers that check ownership before reading a body). */
export async function ownsBuild(ownerId: string, id: number): Promise<boolean> {
	return (await Build.count({ where: { id, ownerId } })) === 1;
}

async function ownBuild(ownerId: string, id: number): Promise<LoadedBuild | null> {
	const build = await loadBuild(id);
	return build && build.ownerId === ownerId ? build : null;
}

function digitsIssue(currency: string): string {
	const digits = minorUnitDigits(currency);
	return digits === 0 ? `${currency} has no decimals.` : `${currency} has ${digits} decimals.`;
}

/**
 * An amount the reader typed, in the region's currency and read the way the region writes
 * amounts ("129,90" where it writes the decimal comma; domain/money.ts parseAmount). Too many
 * decimals keep the short message the build page has always given.
 */
function amountIn(
	text: string,
	region: { code: string; currency: string }
): { ok: true; amountMinor: number } | { ok: false; message: string } {
	const parsed = parseAmount(text, region.currency, decimalMarkOf(region.code));
	if (parsed.ok || parsed.reason !== 'digits') return parsed;
	return { ok: false, message: digitsIssue(region.currency) };
}

export interface BuildPatch {
	title?: string;
	notes?: string;
	regionCode?: string;
	visibility?: BuildVisibility;
	/** Decimal amount in the (new) region's currency; null removes the budget. */
	budget?: string | null;
	notifyOnNewRevision?: boolean;
}

/**
 * Title, notes, region (re-prices everything), visibility, budget and the new-revision
 * e-mail switch. A region with another currency converts a kept budget through EUR at the
 * stored ECB rates (rounded half-even once); without a rate the reader is asked to enter
 * the budget again. Price overrides stay in the currency they were entered in and apply
 * again only in a region with that currency.
 */
export async function updateBuild(
	ownerId: string,
	id: number,
	patch: BuildPatch,
	expectedVersion: number
): Promise<MutationOutcome> {
	const build = await ownBuild(ownerId, id);
	if (!build) return { kind: 'not_found' };
	const issues: Issues = {};
	let region = build.region;
	if (patch.regionCode !== undefined && patch.regionCode !== region.code) {
		const found = await Region.findOne({ where: { code: patch.regionCode } });
		if (!found) issues.regionCode = ['Choose a region from the list.'];
		else region = found;
	}
	const fields: Parameters<typeof change>[3] = {};
	if (patch.title !== undefined) fields.title = patch.title;
	if (patch.notes !== undefined) fields.notes = patch.notes;
	if (patch.visibility !== undefined) fields.visibility = patch.visibility;
	if (patch.notifyOnNewRevision !== undefined)
		fields.notifyOnNewRevision = patch.notifyOnNewRevision;
	if (region.id !== build.regionId) fields.regionId = region.id;
	if (patch.budget !== undefined) {
		if (patch.budget === null) fields.budgetMinor = null;
		else {
			const budget = amountIn(patch.budget, region);
			if (!budget.ok) issues.budget = [budget.message];
			else fields.budgetMinor = budget.amountMinor;
		}
	} else if (
		build.budgetMinor !== null &&
		region.currency !== build.region.currency &&
		!issues.regionCode
	) {
		try {
			fields.budgetMinor = convertThroughEur(
				money(Number(build.budgetMinor), build.region.currency),
				region.currency,
				await fx.ratesForPricing()
			).amountMinor;
		} catch (e) {
			if (!(e instanceof MissingRateError)) throw e;
			issues.budget = [
				`There is no exchange rate to convert your budget to ${region.currency}; enter it again in ${region.currency}.`
			];
		}
	}
	if (Object.keys(issues).length > 0) return { kind: 'invalid', issues };
	return change(ownerId, id, expectedVersion, fields);
}

export interface SlotPatch {
	partId?: number;
	quantity?: number;
	/** null removes the override. */
	priceOverride?: { amount: string; store: string; date: string } | null;
	purchase?: {
		purchased: boolean;
		paid?: string | null;
		purchasedAt?: string | null;
		store?: string | null;
	};
}

/**
 * Swap the part (any catalog part of the slot's category; origin follows: the source pick →
 * 'source', one of the base slot's alternates → 'alternate', else 'custom'; a swap drops the
 * price override, which was for the old part), quantity, price override, purchase tracker.
 * Amounts are in the build region's currency with its digits; dates are checked by the schema.
 * `purchased: false` clears what was paid, when and where.
 */
export async function updateSlot(
	ownerId: string,
	id: number,
	slotId: number,
	patch: SlotPatch,
	expectedVersion: number
): Promise<MutationOutcome> {
	const build = await ownBuild(ownerId, id);
	if (!build) return { kind: 'not_found' };
	const slot = await BuildSlot.findOne({ where: { id: slotId, buildId: id } });
	if (!slot) return { kind: 'not_found' };
	const currency = build.region.currency;
	const issues: Issues = {};
	const fields: Partial<BuildSlot> = {};

	if (patch.partId !== undefined && patch.partId !== slot.partId) {
		const part = await Part.findByPk(patch.partId, { attributes: ['id', 'category'] });
		if (!part) issues.partId = ['No such part in the catalog.'];
		else if (part.category !== slot.category)
			issues.partId = [`Choose a part of this slot's category (${slot.category}).`];
		else {
			const source = await loadBuildSource(build.baseRevisionId);
			fields.partId = part.id;
			fields.origin = originOf(source, slot.sourceSlotKey, part.id);
			if (patch.priceOverride === undefined) Object.assign(fields, clearedOverride());
		}
	}
	if (patch.quantity !== undefined) fields.quantity = patch.quantity;
	if (patch.priceOverride === null) Object.assign(fields, clearedOverride());
	else if (patch.priceOverride) {
		const amount = amountIn(patch.priceOverride.amount, build.region);
		if (!amount.ok) issues['priceOverride.amount'] = [amount.message];
		else
			Object.assign(fields, {
				priceOverrideMinor: amount.amountMinor,
				priceOverrideCurrency: currency,
				priceOverrideStore: patch.priceOverride.store,
				priceOverrideDate: patch.priceOverride.date
			});
	}
	if (patch.purchase) {
		const p = patch.purchase;
		if (!p.purchased) {
			Object.assign(fields, {
				purchased: false,
				paidMinor: null,
				paidCurrency: null,
				purchasedAt: null,
				purchaseStore: null
			});
		} else {
			fields.purchased = true;
			if (p.paid === null) Object.assign(fields, { paidMinor: null, paidCurrency: null });
			else if (p.paid !== undefined) {
				const paid = amountIn(p.paid, build.region);
				if (!paid.ok) issues['purchase.paid'] = [paid.message];
				else Object.assign(fields, { paidMinor: paid.amountMinor, paidCurrency: currency });
			}
			if (p.purchasedAt !== undefined) fields.purchasedAt = p.purchasedAt ?? null;
			if (p.store !== undefined) fields.purchaseStore = p.store ? p.store : null;
		}
	}
	if (Object.keys(issues).length > 0) return { kind: 'invalid', issues };
	return change(ownerId, id, expectedVersion, {}, async (transaction) => {
		if (Object.keys(fields).length > 0)
			await BuildSlot.update(fields, { where: { id: slot.id, buildId: id }, transaction });
	});
}

function clearedOverride(): Partial<BuildSlot> {
	return {
		priceOverrideMinor: null,
		priceOverrideCurrency: null,
		priceOverrideStore: null,
		priceOverrideDate: null
	};
}

/** A slot of the reader's own (no source key, origin 'custom'), placed last. */
export async function addSlot(
	ownerId: string,
	id: number,
	input: { category: PartCategory; label: string; partId: number; quantity: number },
	expectedVersion: number
): Promise<MutationOutcome> {
	const build = await ownBuild(ownerId, id);
	if (!build) return { kind: 'not_found' };
	const issues: Issues = {};
	const part = await Part.findByPk(input.partId, { attributes: ['id', 'category'] });
	if (!part) issues.partId = ['No such part in the catalog.'];
	else if (part.category !== input.category)
		issues.partId = [`Choose a part of the slot's category (${input.category}).`];
	const count = await BuildSlot.count({ where: { buildId: id } });
	if (count >= MAX_BUILD_SLOTS) issues._form = [`A build has at most ${MAX_BUILD_SLOTS} slots.`];
	if (Object.keys(issues).length > 0) return { kind: 'invalid', issues };
	return change(ownerId, id, expectedVersion, {}, async (transaction) => {
		const last = (await BuildSlot.max('position', { where: { buildId: id }, transaction })) as
			number | null;
		await BuildSlot.create(
			{
				buildId: id,
				sourceSlotKey: null,
				category: input.category,
				label: input.label,
				position: (last ?? 0) + 1,
				partId: input.partId,
				quantity: input.quantity,
				origin: 'custom'
			},
			{ transaction }
		);
	});
}

export async function removeSlot(
	ownerId: string,
	id: number,
	slotId: number,
	expectedVersion: number
): Promise<MutationOutcome> {
	const build = await ownBuild(ownerId, id);
	if (!build) return { kind: 'not_found' };
	const slot = await BuildSlot.findOne({ where: { id: slotId, buildId: id }, attributes: ['id'] });
	if (!slot) return { kind: 'not_found' };
	return change(ownerId, id, expectedVersion, {}, async (transaction) => {
		await BuildSlot.destroy({ where: { id: slotId, buildId: id }, transaction });
	});
}
