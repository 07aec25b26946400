/**
 * Prices authors type into a guide's slots (issue 12, item 2). Saving a draft records them
 * as proposals of that revision; nothing public reads proposals, so a draft cannot re-price
 * a guide, a part or anyone's build. Approving the revision turns each proposal into a quote
 * in the editor's transaction (guide-reviews.ts). The review page lists them with an outlier
 * verdict against the part's recent quotes ($lib/domain/price-outlier).
 */
import { Op } from 'sequelize';
import type { Transaction } from 'sequelize';
import { formatMoney, money } from '$lib/domain/money';
import { OUTLIER_WINDOW_DAYS, priceOutlier } from '$lib/domain/price-outlier';
import { GuidePriceProposal, GuideSlot, Part, Quote, Region, Store } from '$lib/server/db';
import type { ReviewPriceProposal } from '$lib/views';
import { partName } from './mappers';

const DAY_MS = 86_400_000;

type Loaded = GuidePriceProposal & { part: Part; store: Store; region: Region };

/** Records the price typed into slot `position` of a revision (a working copy; callers clear the old ones first). */
export async function proposePrice(
	revisionId: number,
	position: number,
	partId: number,
	price: { storeId: number; amountMinor: number; observedAt: string },
	region: Region,
	transaction: Transaction
): Promise<void> {
	await GuidePriceProposal.create(
		{
			revisionId,
			position,
			partId,
			storeId: price.storeId,
			regionId: region.id,
			amountMinor: price.amountMinor,
			currency: region.currency,
			taxIncluded: region.taxMode === 'inclusive',
			observedAt: new Date(`${price.observedAt}T00:00:00Z`)
		},
		{ transaction }
	);
}

export async function clearProposals(revisionId: number, transaction: Transaction): Promise<void> {
	await GuidePriceProposal.destroy({ where: { revisionId }, transaction });
}

/** A revision's proposals by slot position, for the author's editor. */
export async function proposalsByPosition(
	revisionId: number,
	transaction?: Transaction
): Promise<Map<number, GuidePriceProposal>> {
	const rows = await GuidePriceProposal.findAll({ where: { revisionId }, transaction });
	return new Map(rows.map((p) => [p.position, p]));
}

/**
 * On approval, inside the decision's transaction: each proposal becomes a quote (source
 * 'author'; an identical quote of the same store, part, amount and UTC day is reused) and
 * the slot at its position points at it. Returns the adopted quotes' ids: other published
 * guides with those parts are re-priced from them after commit.
 */
export async function adoptProposals(
	revisionId: number,
	transaction: Transaction
): Promise<number[]> {
	const adopted: number[] = [];
	const proposals = await GuidePriceProposal.findAll({
		where: { revisionId, quoteId: null },
		transaction
	});
	for (const p of proposals) {
		const quoteId = await quoteOf(p, transaction);
		await p.update({ quoteId }, { transaction });
		await GuideSlot.update(
			{ priceQuoteId: quoteId },
			{ where: { revisionId, position: p.position, pickPartId: p.partId }, transaction }
		);
		adopted.push(quoteId);
	}
	return adopted;
}

async function quoteOf(p: GuidePriceProposal, transaction: Transaction): Promise<number> {
	const next = new Date(p.observedAt.getTime() + DAY_MS);
	const existing = await Quote.findOne({
		where: {
			partId: p.partId,
			storeId: p.storeId,
			regionId: p.regionId,
			amountMinor: p.amountMinor,
			observedAt: { [Op.gte]: p.observedAt, [Op.lt]: next }
		},
		transaction
	});
	if (existing) return existing.id;
	const created = await Quote.create(
		{
			partId: p.partId,
			storeId: p.storeId,
			regionId: p.regionId,
			amountMinor: Number(p.amountMinor),
			currency: p.currency,
			taxIncluded: p.taxIncluded,
			observedAt: p.observedAt,
			url: null,
			source: 'author'
		},
		{ transaction }
	);
	return created.id;
}

/** The review page's list: each proposal against the part's active quotes in its region over the last 90 days. */
export async function reviewProposals(
	revisionId: number,
	slotLabels: Map<number, string>,
	now: Date
): Promise<ReviewPriceProposal[]> {
	const proposals = (await GuidePriceProposal.findAll({
		where: { revisionId },
		include: [
			{ model: Part, as: 'part' },
			{ model: Store, as: 'store' },
			{ model: Region, as: 'region' }
		],
		order: [['position', 'ASC']]
	})) as Loaded[];
	const since = new Date(now.getTime() - OUTLIER_WINDOW_DAYS * DAY_MS);
	const result: ReviewPriceProposal[] = [];
	for (const p of proposals) {
		const recent = await Quote.findAll({
			where: {
				partId: p.partId,
				regionId: p.regionId,
				currency: p.currency,
				status: 'active',
				observedAt: { [Op.gte]: since, [Op.lte]: now },
				// Once approved, the proposal's own quote is not its own yardstick.
				...(p.quoteId ? { id: { [Op.ne]: p.quoteId } } : {})
			},
			attributes: ['amountMinor']
		});
		const amount = Number(p.amountMinor);
		const verdict = priceOutlier(
			amount,
			recent.map((q) => Number(q.amountMinor))
		);
		const show = (minor: number) => formatMoney(money(Math.round(minor), p.currency));
		result.push({
			position: p.position,
			slotLabel: slotLabels.get(p.position) ?? `Slot ${p.position}`,
			part: partName(p.part),
			store: p.store.name,
			regionCode: p.region.code,
			amount: show(amount),
			observedOn: p.observedAt.toISOString().slice(0, 10),
			verdict: verdict.kind,
			median: verdict.kind === 'no_history' ? null : show(verdict.medianMinor),
			sampleSize: verdict.kind === 'no_history' ? 0 : verdict.sampleSize,
			quoteId: p.quoteId ?? null
		});
	}
	return result;
}
