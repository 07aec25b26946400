/**
 * Totals of a parts list: the picks' total and the cheapest/dearest build reachable by
 * swapping slots to their alternates. Unpriced options are left out and counted, so a
 * partial total is never mistaken for a full one.
 */
import { money, multiply, sum } from './money';
import type { Money } from './types';

export interface SlotPricing {
	quantity: number;
	/** Unit price of the pick, or null when it has no price in this currency. */
	pick: Money | null;
	/** Unit prices of the alternates (nulls for unpriced ones). */
	alternates: (Money | null)[];
}

export interface ListTotals {
	picksTotal: Money | null;
	unpricedSlots: number;
	range: { min: Money; max: Money } | null;
}

export function listTotals(slots: SlotPricing[], currency: string): ListTotals {
	const pickLines: Money[] = [];
	const minLines: Money[] = [];
	const maxLines: Money[] = [];
	let unpricedSlots = 0;
	for (const slot of slots) {
		if (slot.pick) pickLines.push(multiply(slot.pick, slot.quantity));
		else unpricedSlots += 1;
		const options = [slot.pick, ...slot.alternates].filter((m): m is Money => m !== null);
		if (options.length === 0) continue;
		const amounts = options.map((m) => m.amountMinor);
		minLines.push(multiply(money(Math.min(...amounts), currency), slot.quantity));
		maxLines.push(multiply(money(Math.max(...amounts), currency), slot.quantity));
	}
	const priced = pickLines.length > 0;
	return {
		picksTotal: priced ? sum(pickLines, currency) : null,
		unpricedSlots,
		range:
			minLines.length > 0 ? { min: sum(minLines, currency), max: sum(maxLines, currency) } : null
	};
}
