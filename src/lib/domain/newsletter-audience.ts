/*
 * Who gets a mailing (docs/architecture.md "Mailing"). Pure: services/mailings.ts loads the
 * confirmed subscribers, the guide's total in each subscriber's home region and who follows
 * the author, and asks this module, one subscriber at a time.
 *
 * A subscriber chooses what they want:
 * - filters: guides for the regions they picked (none picked: any region), sharing a tag with
 *   theirs (none picked: any tag), whose picks total in their home region falls within their
 *   budget (no bound: any; a guide that cannot be fully priced there does not match a budget);
 * - follows: new guides from authors they follow;
 * - both: either of the two.
 * The editor narrows a mailing with the same words: the regions and tags it is for (empty:
 * any), and whether the author's followers get it.
 */
import type { Money } from './types';

export const SUBSCRIBER_AUDIENCES = ['filters', 'follows', 'both'] as const;
export type SubscriberAudience = (typeof SUBSCRIBER_AUDIENCES)[number];

export interface AudienceSubscriber {
	/** Region codes of the guides wanted; empty: every region. */
	regions: readonly string[];
	tags: readonly string[];
	/** In the home region's currency; null: no bound. */
	budgetMinMinor: number | null;
	budgetMaxMinor: number | null;
	audience: SubscriberAudience;
	followsAuthor: boolean;
}

export interface AudienceMailing {
	/** The regions the mailing is for; empty: any. */
	regions: readonly string[];
	tags: readonly string[];
	followers: boolean;
}

/** Why a subscriber gets the mailing, or null when they do not. */
export type AudienceReason = 'preferences' | 'follows' | null;

function overlaps(a: readonly string[], b: readonly string[]): boolean {
	return a.length === 0 || b.length === 0 || a.some((x) => b.includes(x));
}

function withinBudget(s: AudienceSubscriber, total: Money | null): boolean {
	if (s.budgetMinMinor === null && s.budgetMaxMinor === null) return true;
	if (total === null) return false;
	if (s.budgetMinMinor !== null && total.amountMinor < s.budgetMinMinor) return false;
	if (s.budgetMaxMinor !== null && total.amountMinor > s.budgetMaxMinor) return false;
	return true;
}

/**
 * @param totalInHome the guide's picks total in the subscriber's home region and currency,
 *   or null when some pick has no price there.
 */
export function audienceReason(
	s: AudienceSubscriber,
	m: AudienceMailing,
	totalInHome: Money | null
): AudienceReason {
	const byPreferences =
		s.audience !== 'follows' &&
		overlaps(s.regions, m.regions) &&
		overlaps(s.tags, m.tags) &&
		withinBudget(s, totalInHome);
	if (byPreferences) return 'preferences';
	const byFollowing = s.audience !== 'filters' && m.followers && s.followsAuthor;
	return byFollowing ? 'follows' : null;
}
