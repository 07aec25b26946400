import { describe, expect, it } from 'vitest';
import { fixedDecimals, upToDecimals } from '$lib/components/ui/number-format';

// British English groups thousands with a comma and marks decimals with a point
// (common practice in en-GB publishing, from memory).
describe('interface number formats', () => {
	it('show exactly the asked decimals, grouped', () => {
		expect(fixedDecimals(1234.5, 2)).toBe('1,234.50');
		expect(fixedDecimals(61, 1)).toBe('61.0');
		expect(fixedDecimals(0.125, 2)).toBe('0.13'); // halves round away from zero
	});

	it('show at most the asked decimals, dropping trailing zeros', () => {
		expect(upToDecimals(19, 2)).toBe('19');
		expect(upToDecimals(8.1, 2)).toBe('8.1');
		expect(upToDecimals(12345.678, 2)).toBe('12,345.68');
	});
});
