/**
 * A guide's target budget in another region's currency, converted as every page shows it:
 * the guide page, the guide lists and the upkeep alerts use this one conversion, so an alert
 * never names a budget the reader does not see.
 */
import { convertThroughEur, crossRate, type RatesPerEur } from './region';
import type { Money } from './types';

/** The budget in another currency at the reference rates; null when a rate is missing. */
export function budgetIn(
	budget: Money,
	currency: string,
	rates: RatesPerEur
): { money: Money | null; asOf: string | null } {
	if (budget.currency === currency) return { money: budget, asOf: null };
	try {
		return {
			money: convertThroughEur(budget, currency, rates),
			asOf: crossRate(budget.currency, currency, rates).asOf
		};
	} catch {
		return { money: null, asOf: null };
	}
}
