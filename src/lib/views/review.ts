/*
 * Review, as the editors' queue and review pages and the author's dashboard show it. Types only.
 */
import type { Finding, FindingCounts } from '$lib/domain/fit';
import type { PowerBudget } from '$lib/domain/power';
import type { ReviewFlag } from '$lib/domain/review-flags';
import type { RevisionDiff } from '$lib/domain/revision-diff';
import type { ReviewDecision, SlotNote } from '$lib/server/db/models/Review';

export type { SlotNote } from '$lib/server/db/models/Review';

export interface QueueItem {
	revisionId: number;
	slug: string;
	title: string;
	authorName: string;
	revisionNumber: number;
	kind: 'new' | 'revision';
	/** A revision sent back with "request changes" before, now submitted again. */
	resubmitted: boolean;
	submittedAt: string;
	ageDays: number;
}

export interface ReviewLogEntry {
	decision: ReviewDecision;
	revisionNumber: number | null;
	reviewerName: string;
	note: string | null;
	slotNotes: SlotNote[];
	selfReviewOverride: boolean;
	createdAt: string;
}

export interface ReviewSlot {
	/** The slot's own key (guide_slots.slot_key); labels may repeat. */
	key: string;
	label: string;
	category: string;
	pick: string;
	quantity: number;
	reason: string;
	price: string | null;
	alternates: string[];
}

export interface ReviewPage {
	revisionId: number;
	revisionNumber: number;
	guide: {
		slug: string;
		title: string;
		summary: string;
		state: string;
		authorName: string;
		live: boolean;
		disclosure: string;
		disclosureNote: string | null;
	};
	/** This revision is the one the public sees. */
	isLiveRevision: boolean;
	submittedAt: string | null;
	/** 'pending' while waiting; otherwise what was decided. */
	status: 'pending' | 'draft' | 'approve' | 'request_changes' | 'decline';
	slots: ReviewSlot[];
	/** Prices the author typed into this revision: proposals until it is approved. */
	priceProposals: ReviewPriceProposal[];
	/** Against the live revision, or against nothing for a new guide. */
	diff: RevisionDiff;
	/** Against the revision last sent back with notes, when that is not the live one. */
	sinceLastReview: RevisionDiff | null;
	fit: { findings: Finding[]; summary: FindingCounts; slotLabels: Record<string, string> };
	power: PowerBudget;
	flags: ReviewFlag[];
	log: ReviewLogEntry[];
	/** The viewer wrote this guide: an editor may not decide on it; an admin may, recorded as an override. */
	ownGuide: boolean;
	canDecide: boolean;
}

export interface ModeratedGuide {
	slug: string;
	title: string;
	state: string;
	authorName: string;
	updatedAt: string;
	pendingRevisionId: number | null;
}

export interface GuideModeration {
	slug: string;
	title: string;
	state: string;
	authorName: string;
	revisions: {
		id: number;
		number: number;
		status: string;
		submittedAt: string | null;
		reviewedAt: string | null;
		live: boolean;
	}[];
	log: ReviewLogEntry[];
}

export interface DashboardGuide {
	slug: string;
	title: string;
	state: string;
	live: boolean;
	updatedAt: string;
	latestRevision: { number: number; status: string } | null;
	lastDecision: ReviewLogEntry | null;
	/** What the author changed after the last decision on a revision, when anything did. */
	changedSinceDecision: RevisionDiff | null;
	/** Set while an editor has hidden the guide after a content report. */
	hiddenReason: string | null;
}

/** A price the author proposes in the revision under review, with its outlier verdict. */
export interface ReviewPriceProposal {
	position: number;
	slotLabel: string;
	part: string;
	store: string;
	regionCode: string;
	/** "7.99 EUR", as typed, in the region's currency. */
	amount: string;
	observedOn: string;
	/** Against the median of the part's quotes in that region over the last 90 days. */
	verdict: 'no_history' | 'in_range' | 'low' | 'high';
	/** The median it was compared with, formatted like `amount`; null without history. */
	median: string | null;
	sampleSize: number;
	/** Set once approved: the quote it became. */
	quoteId: number | null;
}
