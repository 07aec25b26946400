/**
 * A build's shopping list as CSV (`/builds/[id]/export.csv`, GET /api/v1/builds/[id]/export.csv):
 * the build view (build-view.ts) written out, with the same access rules.
 */
import { stringify } from 'csv-stringify/sync';
import { minorToDecimal } from '$lib/domain/money';
import type { Money } from '$lib/domain/types';
import { neutraliseCell } from '$lib/server/csv-cells';
import type { Viewer } from './build-access';
import { getBuild } from './build-view';

export const BUILD_CSV_COLUMNS = [
	'slot',
	'part',
	'quantity',
	'unit price',
	'line total',
	'currency',
	'status',
	'store',
	'bought',
	'paid'
] as const;

/** Minor units as a plain decimal in the currency's digits: 69999 USD → "699.99", −500 → "-5.00". */
export function decimalOf(m: Money): string {
	return minorToDecimal(m.amountMinor, m.currency);
}

/**
 * The shopping list as CSV in the build's region and currency (or `opts.regionCode`), with
 * the same visibility as getBuild (null → 404). Rows: one per slot, then totals. Bought and
 * paid are the owner's only (empty for others). Text cells that a spreadsheet would run as a
 * formula get a leading quote (services/catalog-csv neutraliseCell); amounts we format
 * ourselves ("-12.50" left of budget) are plain numbers and stay numbers.
 */
export async function exportCsv(
	viewer: Viewer,
	id: number,
	opts: { shareToken?: string; regionCode?: string } = {}
): Promise<string | null> {
	const view = await getBuild(viewer, id, opts);
	if (!view) return null;
	const currency = view.region.currency;
	const amount = (m: Money | null) => (m ? decimalOf(m) : '');
	const rows: string[][] = [[...BUILD_CSV_COLUMNS]];
	for (const s of view.slots) {
		const paid = s.purchase.paid;
		rows.push([
			neutraliseCell(s.label),
			neutraliseCell(`${s.part.brand} ${s.part.model}`),
			String(s.quantity),
			amount(s.price?.unit ?? null),
			amount(s.lineTotal),
			currency,
			s.price?.status ?? 'unpriced',
			neutraliseCell(s.price?.storeName ?? ''),
			view.isOwner ? (s.purchase.purchased ? 'yes' : 'no') : '',
			paid
				? paid.currency === currency
					? decimalOf(paid)
					: neutraliseCell(`${decimalOf(paid)} ${paid.currency}`)
				: ''
		]);
	}
	const total = (label: string, m: Money | null) => [
		label,
		'',
		'',
		'',
		amount(m),
		currency,
		'',
		'',
		'',
		''
	];
	rows.push(total('Planned total', view.totals.planned));
	if (view.isOwner) {
		rows.push(total('Spent', view.totals.spent));
		rows.push(total('Remaining to buy', view.totals.remainingToBuy));
		if (view.totals.leftOfBudget) rows.push(total('Left of budget', view.totals.leftOfBudget));
	}
	if (view.totals.unpricedSlots > 0)
		rows.push([
			`Slots without a price (not in the totals): ${view.totals.unpricedSlots}`,
			'',
			'',
			'',
			'',
			'',
			'',
			'',
			'',
			''
		]);
	return stringify(rows, { record_delimiter: '\r\n' });
}

/** "slotwise-build-12-2026-12-02.csv" */
export function csvFilename(id: number, now = new Date()): string {
	return `slotwise-build-${id}-${now.toISOString().slice(0, 10)}.csv`;
}
