import { describe, expect, it } from 'vitest';
import { isoWeek, utcDay } from '../../../src/lib/domain/iso-week';

/*
 * ISO 8601 week dates (from memory: weeks start on Monday; week 1 is the week holding the
 * year's first Thursday). Worked by hand: 1 January 2026 is a Thursday (1 January 2025 was a
 * Wednesday and 2025 has 365 days), so 2026-W01 runs from Monday 29 December 2025 to Sunday
 * 4 January 2026, and a year that starts on a Thursday has 53 weeks.
 */
describe('isoWeek', () => {
	it('puts Monday 29 December 2025 in week 1 of 2026 (its Thursday is 1 January)', () => {
		expect(isoWeek(new Date('2025-12-29T00:00:00Z'))).toBe('2026-W01');
		expect(isoWeek(new Date('2025-12-28T23:59:59Z'))).toBe('2025-W52');
	});

	it('starts week 51 of 2026 on Monday 14 December (350 days after 29 December 2025 = 50 weeks)', () => {
		expect(isoWeek(new Date('2026-12-13T23:59:59Z'))).toBe('2026-W50');
		expect(isoWeek(new Date('2026-12-14T00:00:00Z'))).toBe('2026-W51');
		expect(isoWeek(new Date('2026-12-20T23:59:59Z'))).toBe('2026-W51');
	});

	it('gives 2026 a week 53 that holds Friday 1 January 2027, and 2027-W01 from Monday 4 January', () => {
		expect(isoWeek(new Date('2027-01-01T12:00:00Z'))).toBe('2026-W53');
		expect(isoWeek(new Date('2027-01-03T23:59:59Z'))).toBe('2026-W53');
		expect(isoWeek(new Date('2027-01-04T00:00:00Z'))).toBe('2027-W01');
	});

	it('reads the instant in UTC, not local time', () => {
		// 23:30 on Sunday at UTC−2 is already Monday 01:30 UTC.
		expect(isoWeek(new Date('2026-12-13T23:30:00-02:00'))).toBe('2026-W51');
		expect(utcDay(new Date('2026-12-13T23:30:00-02:00'))).toBe('2026-12-14');
	});
});
