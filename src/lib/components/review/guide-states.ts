/** Guide states as editors and authors read them (docs/architecture.md's words). */
export const GUIDE_STATE_LABELS: Record<string, string> = {
	draft: 'Draft',
	in_review: 'In review',
	changes_requested: 'Changes requested',
	published: 'Published',
	declined: 'Declined',
	archived: 'Archived'
};

/** A revision's own state (services/guide-reviews revisionStatus). */
export const REVISION_STATUS_LABELS: Record<string, string> = {
	draft: 'Draft, not submitted',
	in_review: 'In review',
	approve: 'Approved',
	request_changes: 'Changes requested',
	decline: 'Declined'
};
