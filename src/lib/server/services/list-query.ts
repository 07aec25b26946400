/*
 * Helpers every paged, searchable list shares (users, audit, catalog, reviews, reports),
 * kept in one place so the page clamping and LIKE escaping are written once.
 */

/** Page arithmetic: clamps `page` into 1..pageCount ("page 1 of 1" for an empty list). */
export function pageWindow(total: number, page: number, perPage: number) {
	const pageCount = Math.max(1, Math.ceil(total / perPage));
	const current = Math.min(Math.max(1, Math.trunc(page)), pageCount);
	return { page: current, pageCount, offset: (current - 1) * perPage };
}

/** `%`, `_` and the escape character itself match literally (MariaDB's default escape is `\`). */
export function escapeLike(text: string): string {
	return text.replace(/[\\%_]/g, (ch) => `\\${ch}`);
}
