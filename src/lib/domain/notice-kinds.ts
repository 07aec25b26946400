/** What a notice is about; each kind has its own in-app and e-mail setting. */
export const NOTICE_KINDS = [
	'author_published',
	'source_revised',
	'revision_decided',
	'queue_gained'
] as const;
export type NoticeKind = (typeof NOTICE_KINDS)[number];
