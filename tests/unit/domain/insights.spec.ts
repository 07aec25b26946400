import { describe, expect, it } from 'vitest';
import { buildCount, suggested } from '../../../src/lib/domain/insights';

/*
 * The two thresholds of fork insights, from issue 19's own words: counts below 5 builds
 * read "fewer than 5"; a swap is suggested at "at least 20 % of builds (and at least 5)".
 */
describe('fork insight thresholds (issue 19)', () => {
	it('hides counts from 1 to 4 and shows 0 and 5 or more', () => {
		expect(buildCount(0)).toEqual({ count: 0, fewerThan5: false });
		expect(buildCount(1)).toEqual({ count: null, fewerThan5: true });
		expect(buildCount(4)).toEqual({ count: null, fewerThan5: true });
		expect(buildCount(5)).toEqual({ count: 5, fewerThan5: false });
	});

	it('suggests at 20 % and 5 builds, not just below either', () => {
		// 5 of 25 = 20 % exactly: yes. 5 of 26 = 19.2 %: no. 4 of 4 = 100 % but 4 builds: no.
		expect(suggested(5, 25)).toBe(true);
		expect(suggested(5, 26)).toBe(false);
		expect(suggested(4, 4)).toBe(false);
		expect(suggested(6, 14)).toBe(true);
	});
});
