/**
 * Price sightings: prices the community saw, verified or rejected by editors (the form's
 * choices and the lists are price-sighting-reads.ts's). Every write
 * runs in one transaction; a verification creates the Quote and its audit event in the
 * same transaction, so a sighting is never verified without its quote or vice versa.
 *
 * Duplicates: a report of the same part, store, region, amount and UTC day as a pending
 * or verified sighting is merged into it: the reporter is added (one report per person),
 * `seenCount` goes up, the first submitter stays. Merging into a verified sighting creates
 * no second quote (the price is already in the history for that day); the reporter is told
 * so. A rejected sighting is not merged into: a new report of it starts a new pending one,
 * since an editor may have rejected an earlier, wrong report of a price that is real.
 * A price already in the history from another source (an editor's quote, say) for that
 * day is answered politely and nothing is written.
 *
 * Locks: submit and verify both lock the part's row first, then the sighting, so they queue
 * instead of deadlocking, and two submits of the same price cannot both create a row.
 * Decisions use a conditional UPDATE … WHERE state = 'pending': of two editors deciding at
 * once, one changes the row and the other changes nothing and gets a conflict.
 */
import { Op } from 'sequelize';
import type { Transaction } from 'sequelize';
import { decimalMarkOf, parseAmount } from '$lib/domain/money';
import { fieldIssues } from '$lib/schemas/issues';
import { priceSightingInput } from '$lib/schemas/price-sightings';
import {
	Part,
	PriceSighting,
	PriceSightingReport,
	Quote,
	Region,
	Store,
	sequelize
} from '$lib/server/db';
import type { PriceSightingState } from '$lib/server/db/models/PriceSighting';
import * as audit from './audit';
import type { Invalid, Issues, NotFound, Outcome } from '$lib/schemas/issues';
import * as guidePrices from './guide-prices';

export type { PriceSightingState } from '$lib/server/db/models/PriceSighting';

export type SubmitOutcome =
	| { kind: 'created'; sightingId: number }
	/** Merged into a pending sighting, which `seenCount` people have now reported. */
	| { kind: 'merged'; sightingId: number; seenCount: number }
	/** Merged into a sighting an editor already verified: the price is in the history. */
	| { kind: 'merged_verified'; sightingId: number; seenCount: number }
	/** This person already reported this price for that day. */
	| { kind: 'already_reported'; sightingId: number; state: PriceSightingState }
	/** The same price for that day is already a quote from another source. */
	| { kind: 'already_quoted' }
	| Invalid
	| NotFound;

export type DecideOutcome = Outcome<{ quoteId: number | null }>;

function add(issues: Issues, key: string, message: string) {
	(issues[key] ??= []).push(message);
}

/** Start and end (exclusive) of a UTC day given as YYYY-MM-DD. */
function dayBounds(day: string): [Date, Date] {
	const start = new Date(`${day}T00:00:00Z`);
	return [start, new Date(start.getTime() + 24 * 60 * 60 * 1000)];
}

/**
 * Files a sighting by `userId` for the part with `partSlug`. `raw` is the form (see
 * priceSightingInput); `now` fixes "today" for the date checks.
 */
export async function submit(
	userId: string,
	partSlug: string,
	raw: unknown,
	now = new Date()
): Promise<SubmitOutcome> {
	const input = priceSightingInput(now).safeParse(raw);
	if (!input.success) return { kind: 'invalid', issues: fieldIssues(input.error) };
	const data = input.data;

	return sequelize.transaction(async (transaction): Promise<SubmitOutcome> => {
		const part = await Part.findOne({
			where: { slug: partSlug },
			attributes: ['id'],
			transaction,
			lock: transaction.LOCK.UPDATE
		});
		if (!part) return { kind: 'not_found' };

		const issues: Issues = {};
		const region = await Region.findOne({ where: { code: data.regionCode }, transaction });
		if (!region) add(issues, 'regionCode', 'Choose a region from the list.');
		const store = await Store.findByPk(data.storeId, { transaction });
		if (!store) add(issues, 'storeId', 'Choose a store from the list.');
		else if (region && store.regionId !== region.id) {
			add(
				issues,
				'storeId',
				`${store.name} does not sell in ${region.name}: choose one of that region's stores.`
			);
		}
		let amountMinor = 0;
		if (region) {
			// Read as the region writes amounts: "129,90" where it writes the decimal comma.
			const amount = parseAmount(data.price, region.currency, decimalMarkOf(region.code));
			if (!amount.ok) add(issues, 'price', amount.message);
			else if (amount.amountMinor <= 0) add(issues, 'price', 'The price must be more than zero.');
			else amountMinor = amount.amountMinor;
		}
		if (Object.keys(issues).length > 0 || !region || !store) return { kind: 'invalid', issues };

		const same = {
			partId: part.id,
			storeId: store.id,
			regionId: region.id,
			amountMinor,
			observedOn: data.observedOn
		};
		const existing = await PriceSighting.findAll({
			where: { ...same, state: { [Op.in]: ['pending', 'verified'] } },
			// Pending first, then verified: a report joins the one an editor still has to decide.
			order: [
				['state', 'ASC'],
				['id', 'ASC']
			],
			transaction,
			lock: transaction.LOCK.UPDATE
		});
		const match = existing[0];
		if (match) {
			const mine = await PriceSightingReport.findOne({
				where: { sightingId: match.id, userId },
				transaction
			});
			if (mine) return { kind: 'already_reported', sightingId: match.id, state: match.state };
			await PriceSightingReport.create({ sightingId: match.id, userId }, { transaction });
			await match.update({ seenCount: match.seenCount + 1 }, { transaction });
			const kind = match.state === 'verified' ? 'merged_verified' : 'merged';
			return { kind, sightingId: match.id, seenCount: match.seenCount };
		}

		const [dayStart, dayEnd] = dayBounds(data.observedOn);
		const quoted = await Quote.findOne({
			where: {
				partId: part.id,
				storeId: store.id,
				regionId: region.id,
				amountMinor,
				status: { [Op.ne]: 'withdrawn' },
				observedAt: { [Op.gte]: dayStart, [Op.lt]: dayEnd }
			},
			attributes: ['id'],
			transaction
		});
		if (quoted) return { kind: 'already_quoted' };

		const sighting = await PriceSighting.create(
			{ ...same, currency: region.currency, url: data.url, submittedById: userId },
			{ transaction }
		);
		await PriceSightingReport.create({ sightingId: sighting.id, userId }, { transaction });
		return { kind: 'created', sightingId: sighting.id };
	});
}

/**
 * Moves a pending sighting to `state` with a conditional UPDATE. Returns the sighting when
 * this call made the change; otherwise the outcome to answer with.
 */
async function claim(
	sightingId: number,
	changes: {
		state: PriceSightingState;
		decidedById: string;
		decidedAt: Date;
		rejectReason?: string;
	},
	transaction: Transaction
): Promise<PriceSighting | Exclude<DecideOutcome, { kind: 'ok' }>> {
	const found = await PriceSighting.findByPk(sightingId, {
		attributes: ['id', 'partId'],
		transaction
	});
	if (!found) return { kind: 'not_found' };
	// Same lock order as submit (part, then sighting): no deadlock with a report merging in.
	await Part.findByPk(found.partId, {
		attributes: ['id'],
		transaction,
		lock: transaction.LOCK.UPDATE
	});
	const [changed] = await PriceSighting.update(changes, {
		where: { id: sightingId, state: 'pending' },
		transaction
	});
	const sighting = await PriceSighting.findByPk(sightingId, { transaction });
	if (!sighting) return { kind: 'not_found' };
	if (changed === 0) {
		return {
			kind: 'conflict',
			message: `This sighting was already ${sighting.state} by another editor; nothing was changed.`
		};
	}
	return sighting;
}

function snapshot(s: PriceSighting, extra: Record<string, string | number | null> = {}) {
	return {
		state: s.state,
		partId: s.partId,
		storeId: s.storeId,
		regionId: s.regionId,
		amountMinor: Number(s.amountMinor),
		currency: s.currency,
		observedOn: s.observedOn,
		seenCount: s.seenCount,
		...extra
	};
}

/** Verifies a pending sighting: it becomes a Quote (source 'sighting') in the price history. */
export async function verify(
	editorId: string,
	sightingId: number,
	now = new Date()
): Promise<DecideOutcome> {
	const outcome = await sequelize.transaction(async (transaction): Promise<DecideOutcome> => {
		const claimed = await claim(
			sightingId,
			{ state: 'verified', decidedById: editorId, decidedAt: now },
			transaction
		);
		if (!(claimed instanceof PriceSighting)) return claimed;
		const region = await Region.findByPk(claimed.regionId, { transaction });
		if (!region) throw new Error(`Region ${claimed.regionId} of sighting ${claimed.id} vanished`);
		const quote = await Quote.create(
			{
				partId: claimed.partId,
				storeId: claimed.storeId,
				regionId: claimed.regionId,
				amountMinor: Number(claimed.amountMinor),
				currency: claimed.currency,
				// A shelf price as shown: tax-inclusive regions show prices with tax.
				taxIncluded: region.taxMode === 'inclusive',
				// Midday UTC, as editors' quotes for a past day: the same day in zones near UTC.
				observedAt: new Date(`${claimed.observedOn}T12:00:00Z`),
				url: claimed.url,
				source: 'sighting'
			},
			{ transaction }
		);
		await claimed.update({ quoteId: quote.id }, { transaction });
		await audit.record(
			{
				actorId: editorId,
				action: 'price_sighting.verified',
				subjectType: 'price_sighting',
				subjectId: claimed.id,
				before: { state: 'pending' },
				after: snapshot(claimed, { quoteId: quote.id })
			},
			transaction
		);
		return { kind: 'ok', quoteId: quote.id };
	});
	// The verified price is now a quote: re-store the figures of the guides that use its part.
	if (outcome.kind === 'ok' && outcome.quoteId !== null)
		await guidePrices.refreshForQuotes([outcome.quoteId]);
	return outcome;
}

/** Rejects a pending sighting with a reason its reporters see. */
export async function reject(
	editorId: string,
	sightingId: number,
	reason: string,
	now = new Date()
): Promise<DecideOutcome> {
	const trimmed = reason.trim();
	if (trimmed.length < 3) {
		return {
			kind: 'invalid',
			issues: {
				reason: ['Say why the sighting is rejected: the people who reported it see this reason.']
			}
		};
	}
	return sequelize.transaction(async (transaction): Promise<DecideOutcome> => {
		const claimed = await claim(
			sightingId,
			{ state: 'rejected', decidedById: editorId, decidedAt: now, rejectReason: trimmed },
			transaction
		);
		if (!(claimed instanceof PriceSighting)) return claimed;
		await audit.record(
			{
				actorId: editorId,
				action: 'price_sighting.rejected',
				subjectType: 'price_sighting',
				subjectId: claimed.id,
				before: { state: 'pending' },
				after: snapshot(claimed, { rejectReason: trimmed })
			},
			transaction
		);
		return { kind: 'ok', quoteId: null };
	});
}
