import { describe, expect, it } from 'vitest';
import { money } from '$lib/domain/money';
import { listTotals } from '$lib/domain/totals';

// Worked examples; every expected value is derived by hand (status D), arithmetic shown.
describe('list totals (worked examples, D)', () => {
	const eur = (amount: number) => money(amount, 'EUR');

	it('sums picks × quantity and the cheapest/dearest alternates per slot', () => {
		const totals = listTotals(
			[
				// CPU: pick €199.00, alternates €179.00 and €249.00
				{ quantity: 1, pick: eur(19900), alternates: [eur(17900), eur(24900)] },
				// Fans: 3 × €12.50, alternate 3 × €9.90
				{ quantity: 3, pick: eur(1250), alternates: [eur(990)] }
			],
			'EUR'
		);
		// picks: 199.00 + 3 × 12.50 = 236.50
		expect(totals.picksTotal).toEqual(eur(23650));
		// min: 179.00 + 3 × 9.90 = 208.70; max: 249.00 + 3 × 12.50 = 286.50
		expect(totals.range).toEqual({ min: eur(20870), max: eur(28650) });
		expect(totals.unpricedSlots).toBe(0);
	});

	it('counts unpriced picks instead of treating them as zero', () => {
		const totals = listTotals(
			[
				{ quantity: 1, pick: null, alternates: [eur(5000)] },
				{ quantity: 1, pick: eur(10000), alternates: [null] }
			],
			'EUR'
		);
		// picks: only 100.00 is priced; one slot unpriced
		expect(totals.picksTotal).toEqual(eur(10000));
		expect(totals.unpricedSlots).toBe(1);
		// range over priced options: slot 1 only €50.00, slot 2 only €100.00 → 150.00 both ends
		expect(totals.range).toEqual({ min: eur(15000), max: eur(15000) });
	});

	it('has no total at all when nothing is priced', () => {
		const totals = listTotals([{ quantity: 2, pick: null, alternates: [] }], 'JPY');
		expect(totals).toEqual({ picksTotal: null, unpricedSlots: 1, range: null });
	});
});
