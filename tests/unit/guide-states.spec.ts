import { describe, expect, it } from 'vitest';
import { guideStatus } from '../../src/lib/components/review/guide-states';

/*
 * One accurate sentence for where a guide stands (issue 15): the author and the editor used
 * to read "In review · revision 1: In review", or "submitted for review" for a revision that
 * had come back. The wording is ours (docs/architecture.md, words); the cases are the guide
 * lifecycle of docs/architecture.md (draft → waiting → published / returned / declined).
 */
describe('guideStatus', () => {
	it('says a never-published guide waits, came back, or is a draft, once', () => {
		expect(
			guideStatus({
				state: 'in_review',
				live: false,
				latestRevision: { number: 1, status: 'in_review' }
			})
		).toBe('Waiting for an editor (revision 1)');
		expect(
			guideStatus({
				state: 'changes_requested',
				live: false,
				latestRevision: { number: 1, status: 'request_changes' }
			})
		).toBe('Returned to the author with notes (revision 1)');
		expect(
			guideStatus({ state: 'draft', live: false, latestRevision: { number: 1, status: 'draft' } })
		).toBe('Draft, not submitted');
	});

	it('tells both halves of a published guide with a newer revision', () => {
		expect(
			guideStatus({
				state: 'published',
				live: true,
				latestRevision: { number: 3, status: 'in_review' }
			})
		).toBe('Published · revision 3 waits for an editor');
		expect(
			guideStatus({
				state: 'published',
				live: true,
				latestRevision: { number: 2, status: 'request_changes' }
			})
		).toBe('Published · revision 2 returned to the author with notes');
		expect(
			guideStatus({
				state: 'published',
				live: true,
				latestRevision: { number: 2, status: 'approve' }
			})
		).toBe('Published (revision 2)');
	});

	it('says archived and declined plainly', () => {
		expect(
			guideStatus({
				state: 'archived',
				live: false,
				latestRevision: { number: 4, status: 'approve' }
			})
		).toBe('Archived');
		expect(
			guideStatus({
				state: 'declined',
				live: false,
				latestRevision: { number: 1, status: 'decline' }
			})
		).toBe('Declined');
	});
});
