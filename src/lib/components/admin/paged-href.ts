/**
 * Links for a paged, filtered list: the filters that differ from their defaults, plus
 * `page` after the first, so every page has its own shareable address.
 */
export function pagedHref(
	filters: Record<string, string | number | null | undefined>,
	defaults: Record<string, string | number> = {}
): (page: number) => string {
	return (page) => {
		const params = new URLSearchParams();
		for (const [key, value] of Object.entries(filters)) {
			if (value === undefined || value === null || value === '' || value === defaults[key])
				continue;
			params.set(key, String(value));
		}
		if (page > 1) params.set('page', String(page));
		const text = params.toString();
		return text ? `?${text}` : '?';
	};
}
