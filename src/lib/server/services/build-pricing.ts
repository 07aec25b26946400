/**
 * A build priced in a region, through the pricing service (services/pricing.ts) like a guide:
 * each slot's current part and every option its source offers (the source pick, with the
 * author's chosen quote, and the ranked alternates), plus the source revision's own picks for
 * value against the source, all in one batched pass. Estimates start from the source guide's
 * base region (the build's own region without a source). The reader's own price for the
 * current part wins when it is in the region's currency.
 *
 * Read by the build view (build-view.ts) and within-budget (build-budget.ts).
 */
import type { Transaction } from 'sequelize';
import type { PartInfo } from '$lib/domain/build-parts';
import { money, multiply } from '$lib/domain/money';
import type { PricedLine, RatesPerEur, RegionAdjustment } from '$lib/domain/region';
import type { Money, PartCategory } from '$lib/domain/types';
import { Build, BuildSlot, Guide, GuideRevision, Part, Region, User } from '$lib/server/db';
import type { BuildPriceLine, PartRef, PriceLine } from '$lib/views';
import { chosenQuote, loadBuildSource, optionsFor } from './build-source';
import type { LoadedGuide } from './guides';
import type { BuildSource, SourceOption } from './build-source';
import { partInfo, partRef } from './mappers';
import { priceLine, priceSlotSets } from './pricing';

export type LoadedBuild = Build & {
	owner?: User | null;
	region: Region;
	sourceGuide?: LoadedGuide | null;
	baseRevision?: GuideRevision | null;
};
export type LoadedSlot = BuildSlot & { part: Part };

/** The build with its owner, region, source guide (author, base region, published revision) and base revision. */
export async function loadBuild(
	id: number,
	transaction?: Transaction
): Promise<LoadedBuild | null> {
	return (await Build.findByPk(id, {
		include: [
			{ model: User, as: 'owner', attributes: ['id', 'name'] },
			{ model: Region, as: 'region' },
			{
				model: Guide,
				as: 'sourceGuide',
				include: [
					{ model: User, as: 'author', attributes: ['name'] },
					{ model: Region, as: 'baseRegion' },
					{ model: GuideRevision, as: 'publishedRevision' }
				]
			},
			{ model: GuideRevision, as: 'baseRevision' }
		],
		transaction
	})) as LoadedBuild | null;
}

/** The build's slots with their parts, in position order. */
export async function loadSlots(buildId: number, transaction?: Transaction): Promise<LoadedSlot[]> {
	return (await BuildSlot.findAll({
		where: { buildId },
		include: [{ model: Part, as: 'part' }],
		order: [
			['position', 'ASC'],
			['id', 'ASC']
		],
		transaction
	})) as LoadedSlot[];
}

/** One option of a build slot, priced. */
export interface PricedSourceOption extends SourceOption {
	line: PricedLine;
	price: PriceLine | null;
}

export interface PricedBuildSlot {
	slot: LoadedSlot;
	/** The current part as region adjust priced it (the reader's override aside). */
	line: PricedLine;
	/** The unit price shown: the reader's override when it applies, else `line`. */
	price: BuildPriceLine | null;
	options: PricedSourceOption[];
}

export interface BuildPricing {
	region: Region;
	source: BuildSource;
	slots: PricedBuildSlot[];
	/** The source revision's picks priced the same way (value against the source). */
	sourcePicks: RegionAdjustment;
	/** The rates the pass used (loaded when estimates or `withRates` needed them). */
	rates: RatesPerEur;
}

/** Prices `slots` of `build` in `region` (see the header); `withRates` also loads the rates. */
export async function priceBuild(
	build: LoadedBuild,
	region: Region,
	slots: readonly LoadedSlot[],
	opts: { withRates?: boolean } = {}
): Promise<BuildPricing> {
	const base = build.sourceGuide?.baseRegion ?? region;
	const source = await loadBuildSource(build.baseRevisionId);
	const offered = slots.map((slot) => optionsFor(source, slot));
	const run = await priceSlotSets(
		[
			{
				base,
				slots: slots.map((slot, i) => ({
					category: slot.category,
					quantity: slot.quantity,
					pick: {
						partId: slot.partId,
						chosenQuote: chosenQuote(source, slot.sourceSlotKey, slot.partId)
					},
					alternates: (offered[i] ?? []).map((o) => ({ partId: o.part.id, chosenQuote: o.chosen }))
				}))
			},
			{
				base,
				slots: source.slots.map(({ slot }) => ({
					category: slot.category,
					quantity: slot.quantity,
					pick: { partId: slot.pickPartId, chosenQuote: slot.priceQuote },
					alternates: []
				}))
			}
		],
		region,
		opts
	);
	const [own, sourcePicks] = [nth(run.sets, 0), nth(run.sets, 1)];
	return {
		region,
		source,
		rates: run.rates,
		sourcePicks: sourcePicks.adjustment,
		slots: slots.map((slot, i) => {
			const adjusted = nth(own.adjustment.slots, i);
			const prices = nth(own.prices, i);
			return {
				slot,
				line: adjusted.pick,
				price: currentPrice(adjusted.pick, slot, region),
				options: nth(offered, i).map((o, j) => ({
					...o,
					line: nth(adjusted.alternates, j),
					price: prices.alternates[j] ?? null
				}))
			};
		})
	};
}

/** The pricing service answers every set and slot it is given, in order. */
function nth<T>(list: readonly T[], i: number): T {
	const item = list[i];
	if (item === undefined) throw new RangeError(`No priced entry ${i}`);
	return item;
}

/** The reader's own price wins when it is in the region's currency (a region change leaves it aside). */
function currentPrice(line: PricedLine, slot: LoadedSlot, region: Region): BuildPriceLine | null {
	if (slot.priceOverrideMinor !== null && slot.priceOverrideCurrency === region.currency) {
		return {
			unit: money(Number(slot.priceOverrideMinor), region.currency),
			status: 'override',
			storeName: slot.priceOverrideStore,
			observedAt: slot.priceOverrideDate,
			taxIncluded: region.taxMode === 'inclusive'
		};
	}
	return priceLine(line, region);
}

/** One option of a slot priced in a region, with what the fit report needs about its part. */
export interface PricedOption {
	part: PartRef;
	info: PartInfo;
	kind: 'current' | 'source_pick' | 'alternate';
	/** 0 for the current part and the source pick; the alternate's rank otherwise. */
	rank: number;
	/** Unit price; the current part's carries the reader's override when it applies. */
	price: BuildPriceLine | null;
	/** price × the slot's quantity. */
	lineTotal: Money | null;
}

/** A build slot with its current part and every option the base revision offers for it. */
export interface PricedSlotOptions {
	slotId: number;
	/** String(slotId): the key the build's fit report uses for this slot. */
	key: string;
	sourceSlotKey: string | null;
	label: string;
	category: PartCategory;
	quantity: number;
	current: PricedOption;
	/** The base revision's pick (unless it is the current part) and its alternates (except the current part), by rank. */
	options: PricedOption[];
}

/**
 * Loads the build's slots and prices the current part and every option of each slot in
 * `region` (quoted, else estimated from the source guide's base region; the current part's
 * override wins when it is in the region's currency). Used by build-budget.
 */
export async function pricedOptions(build: Build, region: Region): Promise<PricedSlotOptions[]> {
	const loaded = await loadBuild(build.id);
	if (!loaded) return [];
	const priced = await priceBuild(loaded, region, await loadSlots(build.id));
	return priced.slots.map(({ slot, price, options }) => {
		const option = (
			part: Part,
			kind: PricedOption['kind'],
			rank: number,
			p: BuildPriceLine | null
		): PricedOption => ({
			part: partRef(part),
			info: partInfo(part),
			kind,
			rank,
			price: p,
			lineTotal: p ? multiply(p.unit, slot.quantity) : null
		});
		return {
			slotId: slot.id,
			key: String(slot.id),
			sourceSlotKey: slot.sourceSlotKey,
			label: slot.label,
			category: slot.category,
			quantity: slot.quantity,
			current: option(slot.part, 'current', 0, price),
			options: options.map((o) => option(o.part, o.kind, o.rank, o.price))
		};
	});
}
