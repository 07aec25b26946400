import { error } from '@sveltejs/kit';
import type { LinkProblem } from '$lib/server/services/subscribers';

/** What a newsletter page says about a link that does not work; nothing was changed. */
export const LINK_PROBLEM_TEXT: Record<LinkProblem, string> = {
	malformed: 'This link is incomplete. Copy the whole link from the mail, or ask for a new one.',
	forged: 'This link is not one we sent. Nothing was changed.',
	expired: 'This link has expired. Nothing was changed; ask for a new one on the newsletter page.',
	used: 'This link has been used or replaced by a newer one. Nothing was changed.'
};

/** A link that does not work is the visitor's problem to fix (400), never a 500. */
export function linkError(problem: LinkProblem): never {
	error(problem === 'forged' ? 404 : 400, LINK_PROBLEM_TEXT[problem]);
}
