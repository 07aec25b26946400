import { describe, expect, it } from 'vitest';
import {
	RECENT_DAYS,
	SCORE_WEIGHTS,
	ageInDays,
	reproducibility
} from '$lib/domain/reproducibility';

/*
 * No published source exists for a "reproducibility" score: the 30-day recency window is
 * common practice for shop prices (common practice, no published source) and the 50/30/20
 * weighting is Slotwise's own. The expected values are worked examples (D), arithmetic shown.
 */
const now = new Date('2024-02-01T12:00:00Z');

describe('quote age in whole days', () => {
	it('counts whole days; a bare date is UTC midnight; the future counts as 0 (D)', () => {
		expect(ageInDays('2024-01-30', now)).toBe(2); // 2.5 days → 2
		expect(ageInDays('2024-01-02T00:00:00Z', now)).toBe(30); // 30.5 → 30
		expect(ageInDays('2023-12-18', now)).toBe(45); // 14 (Dec) + 31 (Jan) + 0.5 → 45
		expect(ageInDays('2024-03-01', now)).toBe(0);
		expect(() => ageInDays('last week', now)).toThrow(/ISO date/);
	});
});

describe('reproducibility score with reasons (Slotwise weighting; 30 days = common practice, no published source)', () => {
	it('uses a 30-day window and 50/30/20 weights', () => {
		expect(RECENT_DAYS).toBe(30);
		expect(SCORE_WEIGHTS).toEqual({ recentQuotes: 50, dropIns: 30, freshness: 20 });
	});

	const result = reproducibility({
		regionName: 'Germany',
		now,
		slots: [
			{ label: 'CPU', latestQuoteAt: '2024-01-30', hasDropInAlternate: true },
			{ label: 'Motherboard', latestQuoteAt: '2024-01-02', hasDropInAlternate: false },
			{ label: 'Graphics card', latestQuoteAt: '2023-12-18', hasDropInAlternate: true },
			{ label: 'Case', latestQuoteAt: null, hasDropInAlternate: true }
		]
	});

	it('scores a mixed guide 52 (D)', () => {
		// recent: CPU (2 d) and Motherboard (30 d, still ≤ 30) = 2 of 4; drop-ins 3 of 4;
		// freshness days: (30 − 2) + (30 − 30) + 0 + 0 = 28
		// (50 × 2 × 30 + 30 × 3 × 30 + 20 × 28) / (4 × 30) = (3000 + 2700 + 560) / 120 = 52.17 → 52
		expect(result.score).toBe(52);
	});

	it('returns the numbers behind the score', () => {
		expect(result.parts).toEqual({
			slotCount: 4,
			recentlyQuotedSlots: 2,
			staleQuotedSlots: 1,
			unquotedSlots: 1,
			dropInSlots: 3,
			medianQuoteAgeDays: 30, // median of 2, 30, 45
			oldestQuoteAgeDays: 45,
			oldestQuoteSlot: 'Graphics card',
			recentDays: 30
		});
	});

	it('explains the score in sentences naming the slots and the region', () => {
		expect(result.reasons).toEqual([
			'2 of 4 slots have a price quoted in Germany within the last 30 days.',
			'1 slot’s newest quote in Germany is older than 30 days: Graphics card (45 days).',
			'1 slot has no quote in Germany at all, so its price is estimated: Case.',
			'3 of 4 slots have at least one alternate that fits as a drop-in.',
			'No drop-in alternate for: Motherboard.',
			'Quotes in Germany are 30 days old at the median; the oldest is 45 days (Graphics card).',
			'Score 52 of 100: up to 50 points for recent quotes, 30 for drop-in alternates and 20 for how fresh the quotes are.'
		]);
	});

	it('gives 100 when every slot was quoted today and has a drop-in (D: 50 + 30 + 20)', () => {
		const r = reproducibility({
			regionName: 'United States',
			now,
			slots: [
				{ label: 'CPU', latestQuoteAt: '2024-02-01T08:00:00Z', hasDropInAlternate: true },
				{ label: 'Memory', latestQuoteAt: '2024-02-01T09:30:00Z', hasDropInAlternate: true }
			]
		});
		expect(r.score).toBe(100);
		expect(r.reasons.length).toBeGreaterThan(1);
	});

	it('counts day 30 as recent and day 31 as not (boundary, D)', () => {
		const at = (date: string) =>
			reproducibility({
				regionName: 'Japan',
				now,
				slots: [{ label: 'CPU', latestQuoteAt: date, hasDropInAlternate: false }]
			}).parts;
		expect(at('2024-01-02').recentlyQuotedSlots).toBe(1); // 30 days
		expect(at('2024-01-01').recentlyQuotedSlots).toBe(0); // 31 days
		expect(at('2024-01-01').staleQuotedSlots).toBe(1);
	});

	it('rounds an exact half to even (D)', () => {
		// One of four slots recent at exactly 30 days (freshness 0), no drop-ins:
		// 50 × 1 × 30 / (4 × 30) = 12.5 → 12
		const r = reproducibility({
			regionName: 'Japan',
			now,
			slots: [
				{ label: 'CPU', latestQuoteAt: '2024-01-02', hasDropInAlternate: false },
				{ label: 'Cooler', latestQuoteAt: null, hasDropInAlternate: false },
				{ label: 'Memory', latestQuoteAt: null, hasDropInAlternate: false },
				{ label: 'Storage', latestQuoteAt: null, hasDropInAlternate: false }
			]
		});
		expect(r.score).toBe(12);
		expect(r.reasons).toContain(
			'3 slots have no quote in Japan at all, so their prices are estimated: Cooler, Memory, Storage.'
		);
		expect(r.reasons).toContain('0 of 4 slots have at least one alternate that fits as a drop-in.');
	});

	it('names at most four slots and counts the rest', () => {
		const slots = ['A', 'B', 'C', 'D', 'E', 'F'].map((label) => ({
			label,
			latestQuoteAt: null,
			hasDropInAlternate: true
		}));
		const r = reproducibility({ regionName: 'Japan', now, slots });
		expect(r.reasons).toContain(
			'6 slots have no quote in Japan at all, so their prices are estimated: A, B, C, D and 2 more.'
		);
		expect(r.parts.medianQuoteAgeDays).toBeNull();
	});

	it('never returns a bare number for an empty guide', () => {
		const r = reproducibility({ regionName: 'Japan', now, slots: [] });
		expect(r.score).toBe(0);
		expect(r.reasons).toEqual(['The guide has no slots yet, so there is nothing to reproduce.']);
	});
});
