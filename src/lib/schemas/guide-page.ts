import { z } from 'zod';

/** ?from=1&to=2 on the guide page: two revision numbers to compare. */
export const revisionCompareQuery = z
	.object({
		from: z.coerce
			.number()
			.int('A revision number is a whole number.')
			.min(1, 'Revision numbers start at 1.')
			.max(100_000),
		to: z.coerce
			.number()
			.int('A revision number is a whole number.')
			.min(1, 'Revision numbers start at 1.')
			.max(100_000)
	})
	.refine((q) => q.from !== q.to, { message: 'Pick two different revisions.', path: ['to'] });

export type RevisionCompareQuery = z.infer<typeof revisionCompareQuery>;
