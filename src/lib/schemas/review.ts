import { z } from 'zod';
import { pageNumber } from './query-params';

/*
 * Editors' review input: the queue's URL query, a decision on a revision, and the
 * guide-level moderation actions (unpublish, archive). Notes are what the author reads
 * by e-mail, so a decision that sends the guide back or refuses it must say why.
 */

export const REVIEW_NOTE_MAX_CHARS = 5000;
export const SLOT_NOTE_MAX_CHARS = 1000;

const note = (max: number) =>
	z
		.string()
		.default('')
		.transform((v) => v.replace(/\r\n?/g, '\n').trim())
		.pipe(z.string().max(max, `Keep the note to at most ${max} characters.`));

export const reviewQueueQuery = z.strictObject({
	page: pageNumber,
	kind: z
		.enum(['all', 'new', 'revision'], { error: 'Show all, new guides or revisions.' })
		.default('all'),
	sort: z.enum(['oldest', 'newest'], { error: 'Sort by oldest or newest.' }).default('oldest'),
	author: z.string().trim().max(100, 'Keep the author search to 100 characters.').default('')
});
export type ReviewQueueQuery = z.output<typeof reviewQueueQuery>;

export const guideStateQuery = z.strictObject({
	page: reviewQueueQuery.shape.page,
	state: z
		.enum(['all', 'draft', 'in_review', 'changes_requested', 'published', 'declined', 'archived'], {
			error: 'Choose a state from the list.'
		})
		.default('all'),
	q: z.string().trim().max(100, 'Keep the search to 100 characters.').default('')
});
export type GuideStateQuery = z.output<typeof guideStateQuery>;

export const decisionInput = z
	.strictObject({
		decision: z.enum(['approve', 'request_changes', 'decline'], {
			error: 'Choose approve, request changes or decline.'
		}),
		note: note(REVIEW_NOTE_MAX_CHARS),
		slotNotes: z
			.array(
				z.strictObject({ label: z.string().trim().min(1).max(80), note: note(SLOT_NOTE_MAX_CHARS) })
			)
			.max(40, 'At most 40 slot notes.')
			.default([])
			.transform((notes) => notes.filter((n) => n.note !== ''))
	})
	.superRefine((input, ctx) => {
		if (input.decision === 'decline' && input.note === '') {
			ctx.addIssue({
				code: 'custom',
				path: ['note'],
				message: 'Say why the revision is declined: the author receives this reason.'
			});
		}
		if (input.decision === 'request_changes' && input.note === '' && input.slotNotes.length === 0) {
			ctx.addIssue({
				code: 'custom',
				path: ['note'],
				message: 'Say what should change, in the note or on a slot.'
			});
		}
	});
export type DecisionInput = z.output<typeof decisionInput>;

export const moderationInput = z.strictObject({
	action: z.enum(['unpublish', 'archive'], { error: 'Choose unpublish or archive.' }),
	reason: note(REVIEW_NOTE_MAX_CHARS).pipe(
		z.string().min(1, 'Say why: the author receives this reason.')
	)
});
export type ModerationInput = z.output<typeof moderationInput>;
