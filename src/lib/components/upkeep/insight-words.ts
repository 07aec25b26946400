import type { BuildCount, InsightChoice } from '$lib/views';

/**
 * "12", "0", "fewer than 5", or "hidden" (a larger count hidden so that a small one beside
 * it cannot be worked out from the totals): how a count of builds reads everywhere.
 */
export function countText(c: BuildCount): string {
	if (c.fewerThan5) return 'fewer than 5';
	return c.count === null ? 'hidden' : String(c.count);
}

/** "12 builds", "fewer than 5 builds" or "number of builds hidden". */
export function buildsText(c: BuildCount): string {
	return c.count === null && !c.fewerThan5 ? 'number of builds hidden' : `${countText(c)} builds`;
}

/** What a choice was, in words. */
export function choiceLabel(c: InsightChoice): string {
	switch (c.kind) {
		case 'pick':
			return `Kept the pick (${c.partName})`;
		case 'alternate':
			return `Alternate ${c.rank} (${c.partName})`;
		case 'other':
			return `Swapped to ${c.partName}`;
		case 'removed':
			return 'Removed the slot';
	}
}
