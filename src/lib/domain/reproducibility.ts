/**
 * Reproducibility (docs/architecture.md, Computations §10): how copyable a guide is in one region.
 *
 * Inputs per slot: when its pick was last quoted in the region, and whether at least one of
 * its alternates fits the rest of the build as a drop-in (computed elsewhere, by dropins.ts).
 *
 * - "Recent" means observed at most 30 days ago (RECENT_DAYS): common practice for shop
 *   prices, which move weekly; no published source.
 * - Score 0–100, Slotwise's own weighting (no published source):
 *     50 points × share of slots with a recent quote in the region
 *   + 30 points × share of slots with a drop-in alternate
 *   + 20 points × freshness: per slot max(0, 30 − age in days) / 30, averaged over all slots
 *     (an unquoted slot scores 0), so quotes from yesterday count more than quotes from day 29.
 *   Computed as one integer fraction and rounded half-even once.
 * - The score always comes with its reasons as sentences; a page never shows it bare.
 */
import { divideHalfEven } from './money';

/** Quotes older than this many days do not count as recent (common practice, no published source). */
export const RECENT_DAYS = 30;

export const SCORE_WEIGHTS = { recentQuotes: 50, dropIns: 30, freshness: 20 } as const;

const DAY_MS = 86_400_000;
const LISTED_NAMES = 4;

export interface ReproSlotInput {
	/** The slot's label as the guide shows it ("Graphics card", "Storage 2"). */
	label: string;
	/** Newest quote for the pick in this region (ISO date or timestamp), or null when never quoted here. */
	latestQuoteAt: string | null;
	/** At least one alternate fits the rest of the build as a drop-in. */
	hasDropInAlternate: boolean;
}

export interface ReproducibilityInput {
	/** Region name for the sentences ("Germany"). */
	regionName: string;
	slots: readonly ReproSlotInput[];
	now: Date;
}

export interface ReproducibilityParts {
	slotCount: number;
	/** Slots whose pick has a quote in the region no older than RECENT_DAYS. */
	recentlyQuotedSlots: number;
	/** Slots whose pick has a quote in the region, but an older one. */
	staleQuotedSlots: number;
	/** Slots whose pick has no quote in the region at all. */
	unquotedSlots: number;
	dropInSlots: number;
	/** Median age in whole days over quoted slots; null when none is quoted. */
	medianQuoteAgeDays: number | null;
	oldestQuoteAgeDays: number | null;
	oldestQuoteSlot: string | null;
	recentDays: number;
}

export interface Reproducibility {
	score: number;
	reasons: string[];
	parts: ReproducibilityParts;
}

/** Whole days from an ISO date/timestamp to now; dates in the future count as 0. A date alone is read as UTC midnight. */
export function ageInDays(observedAt: string, now: Date): number {
	const time = Date.parse(
		/^\d{4}-\d{2}-\d{2}$/.test(observedAt) ? `${observedAt}T00:00:00Z` : observedAt
	);
	if (Number.isNaN(time)) throw new RangeError(`Not an ISO date: "${observedAt}"`);
	return Math.max(0, Math.floor((now.getTime() - time) / DAY_MS));
}

function median(sorted: number[]): number | null {
	if (sorted.length === 0) return null;
	const mid = Math.floor(sorted.length / 2);
	return sorted.length % 2 === 1
		? (sorted[mid] as number)
		: ((sorted[mid - 1] as number) + (sorted[mid] as number)) / 2;
}

function plural(n: number, one: string, many: string): string {
	return `${n} ${n === 1 ? one : many}`;
}

function nameList(labels: string[]): string {
	if (labels.length <= LISTED_NAMES) return labels.join(', ');
	return `${labels.slice(0, LISTED_NAMES).join(', ')} and ${labels.length - LISTED_NAMES} more`;
}

/** Score, reasons and the numbers behind them for one guide in one region. */
export function reproducibility({ regionName, slots, now }: ReproducibilityInput): Reproducibility {
	const n = slots.length;
	const aged = slots.map((s) => ({
		label: s.label,
		ageDays: s.latestQuoteAt === null ? null : ageInDays(s.latestQuoteAt, now),
		dropIn: s.hasDropInAlternate
	}));
	const recent = aged.filter((s) => s.ageDays !== null && s.ageDays <= RECENT_DAYS);
	const stale = aged.filter((s) => s.ageDays !== null && s.ageDays > RECENT_DAYS);
	const unquoted = aged.filter((s) => s.ageDays === null);
	const withoutDropIn = aged.filter((s) => !s.dropIn);
	const ages = aged.flatMap((s) => (s.ageDays === null ? [] : [s.ageDays])).sort((a, b) => a - b);
	const oldest = aged.reduce<(typeof aged)[number] | null>(
		(worst, s) =>
			s.ageDays !== null && (worst === null || s.ageDays > (worst.ageDays ?? -1)) ? s : worst,
		null
	);

	const parts: ReproducibilityParts = {
		slotCount: n,
		recentlyQuotedSlots: recent.length,
		staleQuotedSlots: stale.length,
		unquotedSlots: unquoted.length,
		dropInSlots: n - withoutDropIn.length,
		medianQuoteAgeDays: median(ages),
		oldestQuoteAgeDays: oldest?.ageDays ?? null,
		oldestQuoteSlot: oldest?.label ?? null,
		recentDays: RECENT_DAYS
	};

	if (n === 0) {
		return {
			score: 0,
			reasons: ['The guide has no slots yet, so there is nothing to reproduce.'],
			parts
		};
	}

	const freshnessDays = aged.reduce(
		(acc, s) => acc + (s.ageDays === null ? 0 : Math.max(0, RECENT_DAYS - s.ageDays)),
		0
	);
	const w = SCORE_WEIGHTS;
	const score = Number(
		divideHalfEven(
			BigInt(
				w.recentQuotes * recent.length * RECENT_DAYS +
					w.dropIns * parts.dropInSlots * RECENT_DAYS +
					w.freshness * freshnessDays
			),
			BigInt(n * RECENT_DAYS)
		)
	);

	const reasons: string[] = [];
	reasons.push(
		`${recent.length} of ${plural(n, 'slot has', 'slots have')} a price quoted in ${regionName} within the last ${RECENT_DAYS} days.`
	);
	if (stale.length > 0) {
		reasons.push(
			`${
				stale.length === 1
					? `1 slot’s newest quote in ${regionName} is`
					: `${stale.length} slots’ newest quotes in ${regionName} are`
			} older than ${RECENT_DAYS} days: ${nameList(
				stale.map((s) => `${s.label} (${s.ageDays} days)`)
			)}.`
		);
	}
	if (unquoted.length > 0) {
		reasons.push(
			`${plural(unquoted.length, 'slot has', 'slots have')} no quote in ${regionName} at all, so ${
				unquoted.length === 1 ? 'its price is' : 'their prices are'
			} estimated: ${nameList(unquoted.map((s) => s.label))}.`
		);
	}
	reasons.push(
		`${parts.dropInSlots} of ${plural(n, 'slot has', 'slots have')} at least one alternate that fits as a drop-in.`
	);
	if (withoutDropIn.length > 0 && withoutDropIn.length < n) {
		reasons.push(`No drop-in alternate for: ${nameList(withoutDropIn.map((s) => s.label))}.`);
	}
	if (parts.medianQuoteAgeDays !== null && oldest) {
		reasons.push(
			`Quotes in ${regionName} are ${plural(parts.medianQuoteAgeDays, 'day', 'days')} old at the median; the oldest is ${plural(
				oldest.ageDays ?? 0,
				'day',
				'days'
			)} (${oldest.label}).`
		);
	}
	reasons.push(
		`Score ${score} of 100: up to ${w.recentQuotes} points for recent quotes, ${w.dropIns} for drop-in alternates and ${w.freshness} for how fresh the quotes are.`
	);
	return { score, reasons, parts };
}
