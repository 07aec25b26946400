/*
 * A compact, readable difference between an audit event's before and after snapshots:
 * only the keys whose values differ, each value as short text. Pure: no framework imports.
 */

export interface ChangedKey {
	key: string;
	/** null when the key is absent on that side. */
	before: string | null;
	after: string | null;
}

/** Longest value text shown; longer values are cut with an ellipsis. */
export const DIFF_VALUE_MAX_CHARS = 120;

/** One value as text: strings as they are, everything else as compact JSON. */
export function valueText(value: unknown, max = DIFF_VALUE_MAX_CHARS): string {
	const text = typeof value === 'string' ? value : (JSON.stringify(value) ?? String(value));
	return text.length > max ? `${text.slice(0, max - 1)}…` : text;
}

/**
 * Keys (sorted) whose values differ between `before` and `after` (deep comparison through
 * JSON text, so key order inside nested objects matters — snapshots are written by one
 * code path each, so it is stable). A missing side counts as an empty snapshot.
 */
export function changedKeys(
	before: Record<string, unknown> | null,
	after: Record<string, unknown> | null
): ChangedKey[] {
	const a = before ?? {};
	const b = after ?? {};
	const keys = [...new Set([...Object.keys(a), ...Object.keys(b)])].sort();
	const changes: ChangedKey[] = [];
	for (const key of keys) {
		const inA = Object.hasOwn(a, key);
		const inB = Object.hasOwn(b, key);
		if (inA && inB && JSON.stringify(a[key]) === JSON.stringify(b[key])) continue;
		changes.push({
			key,
			before: inA ? valueText(a[key]) : null,
			after: inB ? valueText(b[key]) : null
		});
	}
	return changes;
}
