/*
 * One date formatter for the whole process. Formatted in UTC so the server render and the
 * browser agree on the day, whatever the reader's time zone. Built once: creating an
 * Intl.DateTimeFormat per <DateText> cost a guide page about a tenth of its render time.
 */
const mediumDate = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeZone: 'UTC' });

/** "4 Dec 2026" for an ISO timestamp; the input itself when it is not a date. */
export function formatMediumDate(iso: string): string {
	const date = new Date(iso);
	return Number.isNaN(date.getTime()) ? iso : mediumDate.format(date);
}
