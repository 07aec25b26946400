import { z } from 'zod';
import { MAX_ID, wholeNumberText } from './primitives';
import { pageNumber } from './query-params';
import {
	DECISION_NOTE_MAX_CHARS,
	PITCH_MAX_CHARS,
	PITCH_MIN_CHARS
} from './author-request-limits.js';

export { DECISION_NOTE_MAX_CHARS, PITCH_MAX_CHARS, PITCH_MIN_CHARS };

/*
 * Becoming an author: the reader's pitch and the editor's decision. Browsers submit
 * textarea line breaks as CRLF but count them as one character for `maxlength`, so line
 * breaks are normalised to LF before lengths are checked: the limit the reader sees while
 * typing is the one the server applies.
 */

const normaliseLineBreaks = (value: string) => value.replace(/\r\n?/g, '\n').trim();

/** POST ?/requestAuthor on the account page. */
export const authorRequestInput = z.strictObject({
	pitch: z
		.string({ error: 'Tell the editors what you would like to write about.' })
		.transform(normaliseLineBreaks)
		.pipe(
			z
				.string()
				.min(
					PITCH_MIN_CHARS,
					`Write at least ${PITCH_MIN_CHARS} characters about what you would like to publish.`
				)
				.max(PITCH_MAX_CHARS, `Keep the pitch to at most ${PITCH_MAX_CHARS} characters.`)
		)
});
export type AuthorRequestInput = z.infer<typeof authorRequestInput>;

/**
 * POST ?/decide on the editor's list. The submit button carries `decision`; the output is
 * the shape authorRequests.decide() takes. A decline must say why, because the note is
 * what the reader receives by e-mail.
 */
export const decideAuthorRequestInput = z
	.strictObject({
		requestId: wholeNumberText('Unknown request.', 1, MAX_ID),
		decision: z.enum(['approve', 'decline'], { error: 'Choose approve or decline.' }),
		note: z
			.string()
			.default('')
			.transform(normaliseLineBreaks)
			.pipe(
				z
					.string()
					.max(
						DECISION_NOTE_MAX_CHARS,
						`Keep the note to at most ${DECISION_NOTE_MAX_CHARS} characters.`
					)
			)
	})
	.superRefine((input, ctx) => {
		if (input.decision === 'decline' && input.note === '') {
			ctx.addIssue({
				code: 'custom',
				path: ['note'],
				message: 'Say why the request is declined: the reader receives this note.'
			});
		}
	})
	.transform(({ requestId, decision, note }) => ({
		requestId,
		approve: decision === 'approve',
		note: note === '' ? null : note
	}));
export type DecideAuthorRequestInput = z.output<typeof decideAuthorRequestInput>;

/** GET /editor/author-requests?page= */
export const pendingRequestsQuery = z.strictObject({
	page: pageNumber
});
export type PendingRequestsQuery = z.infer<typeof pendingRequestsQuery>;
