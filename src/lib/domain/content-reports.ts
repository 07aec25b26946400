/*
 * Content reports: what can be reported and why. Plain data shared by the zod schema, the
 * service and the pages (no framework imports).
 */

/** Every kind of content a report may name (a tip_note is a supporter's public note on a guide). */
export const REPORT_SUBJECT_TYPES = ['guide', 'build', 'photo', 'tip_note'] as const;
export type ReportSubjectType = (typeof REPORT_SUBJECT_TYPES)[number];

/** How pages name each kind of content ("Hide this supporter note…"). */
export const REPORT_SUBJECT_NOUNS: Record<ReportSubjectType, string> = {
	guide: 'guide',
	build: 'build',
	photo: 'photo',
	tip_note: 'supporter note'
};

/** The fixed list of reasons a reader picks from, with the words the form shows. */
export const REPORT_CATEGORIES = {
	unsafe: 'Unsafe advice (electrical, thermal or handling risk)',
	misleading: 'Wrong or misleading information',
	undisclosed: 'Undisclosed sponsorship or affiliate links',
	spam: 'Spam or advertising',
	offensive: 'Offensive or abusive content',
	other: 'Something else'
} as const;
export type ReportCategory = keyof typeof REPORT_CATEGORIES;
export const REPORT_CATEGORY_KEYS = Object.keys(REPORT_CATEGORIES) as [
	ReportCategory,
	...ReportCategory[]
];

/** Open until an editor decides; `dismissed` (no action) or `actioned` (content hidden). */
export const REPORT_STATES = ['open', 'dismissed', 'actioned'] as const;
export type ReportState = (typeof REPORT_STATES)[number];

export const REPORT_DETAIL_MIN_CHARS = 10;
export const REPORT_DETAIL_MAX_CHARS = 1000;
export const HIDE_REASON_MIN_CHARS = 10;
export const HIDE_REASON_MAX_CHARS = 500;
