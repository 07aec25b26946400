import { describe, expect, it } from 'vitest';
import { money } from '$lib/domain/money';
import {
	costPerFrame,
	fpsPer100,
	geometricMean,
	geometricMeanFps,
	valueOf
} from '$lib/domain/value';

/*
 * Sources:
 * - Geometric mean as the summary of benchmark results: P. J. Fleming and J. J. Wallace,
 *   "How not to lie with statistics: the correct way to summarize benchmark results",
 *   Communications of the ACM 29(3), March 1986, pp. 218–221 (docs/sources.md s3); SPEC CPU
 *   reports the geometric mean of its per-benchmark ratios. Both from memory, not re-read
 *   here: status M.
 * - The expected means are worked by hand (products and roots written out beside each
 *   check), never taken from geometricMean itself.
 * - Every expected number below is a worked example (status D) with its arithmetic shown.
 */

describe('geometric mean of average FPS (Fleming & Wallace 1986 / SPEC CPU practice — M; values D)', () => {
	it('√(50 × 200) = √10000 = 100, where the arithmetic mean would say 125', () => {
		expect(geometricMean([50, 200])).toBeCloseTo(100, 10);
	});

	it('∛(30 × 60 × 120) = ∛216000 = 60', () => {
		expect(geometricMean([30, 60, 120])).toBeCloseTo(60, 10);
	});

	it('one value is its own mean; equal values give that value', () => {
		expect(geometricMean([144])).toBeCloseTo(144, 10);
		expect(geometricMean([75, 75, 75, 75])).toBeCloseTo(75, 10);
	});

	it('√(144 × 81) = √11664 = 108; ⁴√(30 × 60 × 90 × 120) = ⁴√19440000 ≈ 66.4009 (worked by hand, D)', () => {
		expect(geometricMean([144, 81])).toBeCloseTo(108, 10);
		expect(geometricMean([30, 60, 90, 120])).toBeCloseTo(66.4009, 4);
	});

	it('normalising to any reference machine keeps the comparison, which the arithmetic mean does not (Fleming & Wallace 1986, M; numbers worked by hand, D)', () => {
		// Builds A and B on three titles; the per-title ratios A/B are 240/60 = 4, 30/60 = 0.5
		// and 360/90 = 4, whose product is 8, so GM(A) / GM(B) = ∛8 = 2 exactly.
		const a = [240, 30, 360];
		const b = [60, 60, 90];
		const normalised = (x: number[], r: number[]) => x.map((v, i) => v / (r[i] as number));
		// Reference R1 = [60, 30, 150]: A/R1 = [4, 1, 2.4] (product 9.6), B/R1 = [1, 2, 0.6]
		// (product 1.2): ∛9.6 ≈ 2.1253 and ∛1.2 ≈ 1.0627, ratio ∛(9.6 / 1.2) = ∛8 = 2.
		const r1 = [60, 30, 150];
		expect(geometricMean(normalised(a, r1))).toBeCloseTo(2.1253, 4);
		expect(geometricMean(normalised(b, r1))).toBeCloseTo(1.0627, 4);
		expect(geometricMean(normalised(a, r1)) / geometricMean(normalised(b, r1))).toBeCloseTo(2, 10);
		// Reference R2 = [1000, 1, 1000]: A/R2 = [0.24, 30, 0.36] (product 2.592), B/R2 =
		// [0.06, 60, 0.09] (product 0.324): ratio ∛(2.592 / 0.324) = ∛8 = 2 again.
		const r2 = [1000, 1, 1000];
		expect(geometricMean(normalised(a, r2)) / geometricMean(normalised(b, r2))).toBeCloseTo(2, 10);
		expect(geometricMean(a) / geometricMean(b)).toBeCloseTo(2, 10);
		// The arithmetic mean of the same ratios ranks them both ways: via R1 (4 + 1 + 2.4) /
		// (1 + 2 + 0.6) = 7.4 / 3.6 ≈ 2.056, A ahead; via R2 (0.24 + 30 + 0.36) / (0.06 + 60 +
		// 0.09) = 30.6 / 60.15 ≈ 0.509, B ahead.
		const mean = (x: number[]) => x.reduce((t, v) => t + v, 0) / x.length;
		expect(mean(normalised(a, r1)) / mean(normalised(b, r1))).toBeCloseTo(2.0556, 4);
		expect(mean(normalised(a, r2)) / mean(normalised(b, r2))).toBeCloseTo(0.5087, 4);
	});

	it('reads averageFps from frame results; null without results', () => {
		expect(geometricMeanFps([{ averageFps: 40 }, { averageFps: 90 }])).toBeCloseTo(60, 10); // √3600
		expect(geometricMeanFps([])).toBeNull();
	});

	it('refuses zero, negative and non-finite FPS instead of returning 0 or NaN', () => {
		expect(() => geometricMean([])).toThrow(/at least one/);
		expect(() => geometricMean([60, 0])).toThrow(/positive/);
		expect(() => geometricMean([60, -5])).toThrow(/positive/);
		expect(() => geometricMean([60, Number.NaN])).toThrow(/positive/);
	});
});

describe('FPS per 100 units of the region’s currency (worked examples, D)', () => {
	it('100 FPS for €1,000.00 = 10 FPS per €100 (100 × 100 / 1000)', () => {
		expect(fpsPer100(100, money(100000, 'EUR'))).toBeCloseTo(10, 12);
	});

	it('uses the currency’s minor unit: 90 FPS for ¥150,000 = 0.06 FPS per ¥100 (JPY has 0 decimals)', () => {
		// 90 × 100 / 150000 = 0.06
		expect(fpsPer100(90, money(150000, 'JPY'))).toBeCloseTo(0.06, 12);
	});

	it('KWD has 3 decimals: 120 FPS for KWD 400.000 = 30 FPS per KWD 100', () => {
		expect(fpsPer100(120, money(400000, 'KWD'))).toBeCloseTo(30, 12);
	});

	it('is null for a zero total', () => {
		expect(fpsPer100(100, money(0, 'EUR'))).toBeNull();
	});
});

describe('cost per frame, half-even at the minor unit (worked examples, D)', () => {
	it('€1,000.00 / 100 FPS = €10.00', () => {
		expect(costPerFrame(money(100000, 'EUR'), 100)).toEqual(money(1000, 'EUR'));
	});

	it('€1,234.56 / 60 FPS = 20.576 → €20.58', () => {
		expect(costPerFrame(money(123456, 'EUR'), 60)).toEqual(money(2058, 'EUR'));
	});

	it('¥150,000 / 90 FPS = 1666.67 → ¥1,667 (0 decimals)', () => {
		expect(costPerFrame(money(150000, 'JPY'), 90)).toEqual(money(1667, 'JPY'));
	});

	it('ties go to the even minor unit: 1 cent / 2 FPS = 0.5 → 0; 3 cents / 2 = 1.5 → 2; 5 / 2 = 2.5 → 2', () => {
		expect(costPerFrame(money(1, 'USD'), 2)).toEqual(money(0, 'USD'));
		expect(costPerFrame(money(3, 'USD'), 2)).toEqual(money(2, 'USD'));
		expect(costPerFrame(money(5, 'USD'), 2)).toEqual(money(2, 'USD'));
	});

	it('refuses zero FPS', () => {
		expect(() => costPerFrame(money(100, 'EUR'), 0)).toThrow(/positive/);
	});
});

describe('value summary for a list of frame results', () => {
	it('€1,200.00 with 40 and 90 FPS: GM 60, 5 FPS per €100, €20.00 per frame (D)', () => {
		// √(40 × 90) = 60; 60 × 100 / 1200 = 5; 1200 / 60 = 20
		const v = valueOf([{ averageFps: 40 }, { averageFps: 90 }], money(120000, 'EUR'));
		expect(v.resultCount).toBe(2);
		expect(v.geometricMeanFps).toBeCloseTo(60, 10);
		expect(v.fpsPer100).toBeCloseTo(5, 10);
		expect(v.costPerFrame).toEqual(money(2000, 'EUR'));
	});

	it('has no value figures without results or without a total', () => {
		expect(valueOf([], money(120000, 'EUR'))).toEqual({
			resultCount: 0,
			geometricMeanFps: null,
			fpsPer100: null,
			costPerFrame: null
		});
		expect(valueOf([{ averageFps: 60 }], null)).toMatchObject({
			fpsPer100: null,
			costPerFrame: null
		});
	});
});
