import { z } from 'zod';
import { wholeNumberFromText } from './primitives';

const revisionNumber = z.preprocess(
	wholeNumberFromText,
	z
		.number({ error: 'A revision number is a whole number.' })
		.int('A revision number is a whole number.')
		.min(1, 'Revision numbers start at 1.')
		.max(100_000, 'There are not that many revisions.')
);

/** ?from=1&to=2 on the guide page: two revision numbers to compare. */
export const revisionCompareQuery = z
	.object({
		from: revisionNumber,
		to: revisionNumber
	})
	.refine((q) => q.from !== q.to, { message: 'Pick two different revisions.', path: ['to'] });

export type RevisionCompareQuery = z.infer<typeof revisionCompareQuery>;
