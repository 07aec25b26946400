import type { BuildCount, InsightChoice } from '$lib/views';

/** "12", "0" or "fewer than 5": how a count of builds reads everywhere. */
export function countText(c: BuildCount): string {
	return c.fewerThan5 ? 'fewer than 5' : String(c.count);
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
