/** Guide states as editors and authors read them (docs/architecture.md's words, our own). */
export const GUIDE_STATE_LABELS: Record<string, string> = {
	draft: 'Draft',
	in_review: 'Waiting for an editor',
	changes_requested: 'Returned to the author',
	published: 'Published',
	declined: 'Declined',
	archived: 'Archived'
};

/** A revision's own state (services/guide-reviews revisionStatus). */
export const REVISION_STATUS_LABELS: Record<string, string> = {
	draft: 'Draft, not submitted',
	in_review: 'Waiting for an editor',
	approve: 'Published',
	request_changes: 'Returned to the author',
	decline: 'Declined'
};

/** An editor's decision as the review log and the author read it. */
export const DECISION_LABELS: Record<string, string> = {
	approve: 'Published',
	request_changes: 'Returned to the author',
	decline: 'Declined'
};

/**
 * One accurate sentence for where a guide stands, from its lifecycle state and its newest
 * revision's own state. A published guide keeps its live revision while a newer one is
 * drafted, waits or comes back, so both halves are told, once each.
 */
export function guideStatus(guide: {
	state: string;
	live: boolean;
	latestRevision: { number: number; status: string } | null;
}): string {
	if (guide.state === 'archived') return 'Archived';
	const latest = guide.latestRevision;
	if (!latest) return GUIDE_STATE_LABELS[guide.state] ?? guide.state;
	const n = latest.number;
	if (!guide.live) {
		switch (latest.status) {
			case 'draft':
				return n > 1 ? `Draft (revision ${n}), not submitted` : 'Draft, not submitted';
			case 'in_review':
				return `Waiting for an editor (revision ${n})`;
			case 'request_changes':
				return `Returned to the author with notes (revision ${n})`;
			case 'decline':
				return 'Declined';
			default:
				return GUIDE_STATE_LABELS[guide.state] ?? guide.state;
		}
	}
	switch (latest.status) {
		case 'draft':
			return `Published · your changes (revision ${n}) are not submitted yet`;
		case 'in_review':
			return `Published · revision ${n} waits for an editor`;
		case 'request_changes':
			return `Published · revision ${n} returned to the author with notes`;
		case 'decline':
			return `Published · revision ${n} was declined; the live revision stays`;
		default:
			return `Published (revision ${n})`;
	}
}
