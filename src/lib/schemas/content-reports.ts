import { z } from 'zod';
import type { FormReader } from './form-data';
import { wholeNumberFromText } from './primitives';
import {
	HIDE_REASON_MAX_CHARS,
	HIDE_REASON_MIN_CHARS,
	REPORT_CATEGORY_KEYS,
	REPORT_DETAIL_MAX_CHARS,
	REPORT_DETAIL_MIN_CHARS,
	REPORT_SUBJECT_TYPES
} from '../domain/content-reports.js';

/*
 * Content reports: the reader's report and the editor's decisions. Line breaks are
 * normalised to LF before lengths are checked, so the browser's maxlength and the server agree.
 */
const normaliseLineBreaks = (value: string) => value.replace(/\r\n?/g, '\n').trim();

const pageNumber = z.preprocess(
	(value) => (value === '' || value === null ? undefined : value),
	z
		.preprocess(
			wholeNumberFromText,
			z
				.number({ error: 'The page must be a whole number.' })
				.int('The page must be a whole number.')
				.min(1, 'Pages start at 1.')
				.max(100_000, 'There are not that many pages.')
		)
		.default(1)
);

/** POST ?/report on the guide page (the subject comes from the URL). */
export const reportInput = z.strictObject({
	category: z.enum(REPORT_CATEGORY_KEYS, { error: 'Pick the reason that fits best.' }),
	detail: z
		.string({ error: 'Say what is wrong, so an editor can check it.' })
		.transform(normaliseLineBreaks)
		.pipe(
			z
				.string()
				.min(
					REPORT_DETAIL_MIN_CHARS,
					`Write at least ${REPORT_DETAIL_MIN_CHARS} characters about what is wrong.`
				)
				.max(REPORT_DETAIL_MAX_CHARS, `Keep it to at most ${REPORT_DETAIL_MAX_CHARS} characters.`)
		)
});
export type ReportInput = z.infer<typeof reportInput>;

/** The "Report this …" form on guide and build pages. */
export function reportForm(f: FormReader) {
	return { category: f.text('category'), detail: f.text('detail') };
}

const subjectFields = {
	subjectType: z.enum(REPORT_SUBJECT_TYPES, { error: 'Unknown kind of content.' }),
	subjectId: z
		.string({ error: 'Unknown content.' })
		.trim()
		.regex(/^[1-9][0-9]{0,18}$/, 'Unknown content.')
};

/** POST ?/dismiss and ?/restore on the editors' queue. */
export const reportSubjectInput = z.strictObject(subjectFields);
export type ReportSubjectInput = z.infer<typeof reportSubjectInput>;

/** POST ?/hide: the reason is shown to the content's owner. */
export const hideInput = z.strictObject({
	...subjectFields,
	reason: z
		.string({ error: 'Say why it is hidden: its owner sees this.' })
		.transform(normaliseLineBreaks)
		.pipe(
			z
				.string()
				.min(
					HIDE_REASON_MIN_CHARS,
					`Write at least ${HIDE_REASON_MIN_CHARS} characters: its owner sees this reason.`
				)
				.max(
					HIDE_REASON_MAX_CHARS,
					`Keep the reason to at most ${HIDE_REASON_MAX_CHARS} characters.`
				)
		)
});
export type HideInput = z.infer<typeof hideInput>;

/** GET /editor/reports?state=open|closed&page= */
export const reportQueueQuery = z.strictObject({
	state: z.preprocess(
		(value) => (value === '' || value === null ? undefined : value),
		z.enum(['open', 'closed'], { error: 'Show open or closed reports.' }).default('open')
	),
	page: pageNumber
});
export type ReportQueueQuery = z.infer<typeof reportQueueQuery>;
