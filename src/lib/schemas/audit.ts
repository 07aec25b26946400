import { z } from 'zod';
import { isoDate } from './primitives';
import { pageNumber } from './query-params';

/*
 * GET /admin/audit filters. Every value arrives as a string from a GET form; an empty
 * field means "no filter". Dates are whole UTC days; `to` includes its whole day.
 */
export const AUDIT_EVENTS_PER_PAGE = 50;

const emptyAsUndefined = (value: unknown) => (value === '' || value === null ? undefined : value);
/** A real calendar day as YYYY-MM-DD (2026-02-30 is refused, not rolled over). */
const isoDay = isoDate({
	shape: 'Use a real date like 2026-12-01.',
	real: 'Use a real date like 2026-12-01.'
});

export const auditQuery = z
	.strictObject({
		action: z.preprocess(
			emptyAsUndefined,
			z
				.string()
				.regex(/^[a-z][a-z_]*\.[a-z][a-z_]*$/, 'Pick an action from the list.')
				.max(64)
				.optional()
		),
		actor: z.preprocess(
			emptyAsUndefined,
			z.string().trim().max(254, 'Search for at most 254 characters.').optional()
		),
		subject: z.preprocess(
			emptyAsUndefined,
			z
				.string()
				.regex(/^[a-z][a-z_]{0,31}$/, 'Pick a subject type from the list.')
				.optional()
		),
		from: z.preprocess(emptyAsUndefined, isoDay.optional()),
		to: z.preprocess(emptyAsUndefined, isoDay.optional()),
		page: pageNumber
	})
	.superRefine((q, ctx) => {
		if (q.from && q.to && q.from > q.to) {
			ctx.addIssue({
				code: 'custom',
				path: ['to'],
				message: 'The end date is before the start date.'
			});
		}
	});
export type AuditQuery = z.infer<typeof auditQuery>;

/** The query as the service's time window: `from` at 00:00 UTC, `to` the next day's 00:00 (exclusive). */
export function auditWindow(q: Pick<AuditQuery, 'from' | 'to'>): { from?: Date; to?: Date } {
	const DAY_MS = 24 * 60 * 60 * 1000;
	return {
		from: q.from ? new Date(`${q.from}T00:00:00Z`) : undefined,
		to: q.to ? new Date(Date.parse(`${q.to}T00:00:00Z`) + DAY_MS) : undefined
	};
}
