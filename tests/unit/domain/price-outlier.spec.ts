import { describe, expect, it } from 'vitest';
import { medianOf, priceOutlier } from '../../../src/lib/domain/price-outlier';

/*
 * The review page's outlier check on prices an author proposes (issue 12, item 2). The rule
 * is common practice, no published source: more than 50 % below or above the median of the
 * part's quotes over the last 90 days. Medians and bounds below are worked by hand.
 */
describe('median of recent prices', () => {
	it('takes the middle value, or the mean of the middle two', () => {
		// 799, 849, 899 sorted: the middle one is 849.
		expect(medianOf([899, 799, 849])).toBe(849);
		// 700 and 800 are the middle two: (700 + 800) / 2 = 750.
		expect(medianOf([800, 700])).toBe(750);
		expect(medianOf([])).toBeNull();
	});
});

describe('price outlier against the 90-day median', () => {
	const recent = [799, 849, 899]; // median 849: low bound 424.5, high bound 1273.5
	it('flags a price more than 50 % below the median', () => {
		expect(priceOutlier(1, recent)).toEqual({ kind: 'low', medianMinor: 849, sampleSize: 3 });
		expect(priceOutlier(424, recent).kind).toBe('low');
	});
	it('accepts prices within 50 % either side', () => {
		expect(priceOutlier(425, recent).kind).toBe('in_range');
		expect(priceOutlier(849, recent).kind).toBe('in_range');
		expect(priceOutlier(1273, recent).kind).toBe('in_range');
	});
	it('flags a price more than 50 % above the median', () => {
		expect(priceOutlier(1274, recent).kind).toBe('high');
	});
	it('says so when there is nothing to compare with', () => {
		expect(priceOutlier(500, [])).toEqual({ kind: 'no_history' });
	});
});
