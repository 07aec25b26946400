/**
 * Value (docs/architecture.md, Computations §5): how many frames a build gives for its money.
 *
 * - Geometric mean of the average FPS over the frame results. Benchmark suites summarise
 *   several workloads with the geometric mean (SPEC CPU reports the geometric mean of its
 *   per-benchmark ratios; Fleming & Wallace, "How not to lie with statistics: the correct way
 *   to summarize benchmark results", CACM 29(3), 1986, argue it is the only mean that gives
 *   the same ranking whatever machine the results are normalised to). It keeps one very
 *   high-FPS title from dominating the summary the way an arithmetic mean would.
 * - FPS per 100 units of the region's currency (per €100, per $100, per ¥100).
 * - Cost per frame: the total divided by the geometric-mean FPS, as Money rounded half-even
 *   to the currency's minor unit.
 *
 * FPS are measurements, not money, so they are plain numbers; money stays integer minor units.
 */
import { money } from './money';
import { divideHalfEven, minorUnitsPerMajor } from './money';
import type { Money } from './types';

/** Geometric mean of positive finite numbers: exp(mean(ln x)). Throws on an empty list or a value ≤ 0. */
export function geometricMean(values: readonly number[]): number {
	if (values.length === 0) throw new RangeError('The geometric mean needs at least one value');
	let logSum = 0;
	for (const value of values) {
		if (!Number.isFinite(value) || value <= 0) {
			throw new RangeError(`The geometric mean needs positive finite values, got ${value}`);
		}
		logSum += Math.log(value);
	}
	return Math.exp(logSum / values.length);
}

/** Geometric mean of the results' average FPS, or null when there are no results. */
export function geometricMeanFps(results: readonly { averageFps: number }[]): number | null {
	return results.length === 0 ? null : geometricMean(results.map((r) => r.averageFps));
}

/**
 * Frames per second per 100 major units of the total's currency:
 * fps × 100 × (minor units per major unit) / total in minor units.
 * Null when the total is not positive (nothing to divide by).
 */
export function fpsPer100(fps: number, total: Money): number | null {
	checkFps(fps);
	if (total.amountMinor <= 0) return null;
	return (fps * 100 * Number(minorUnitsPerMajor(total.currency))) / total.amountMinor;
}

/** FPS are taken to 6 decimal places (micro-frames) for the division below: far finer than any measurement. */
const FPS_SCALE = 1_000_000;

/**
 * Cost of one frame per second: total / fps, rounded half-even to the currency's minor unit.
 * The division is done on big integers (fps scaled to 6 decimals), so the only rounding is
 * the final one.
 */
export function costPerFrame(total: Money, fps: number): Money {
	checkFps(fps);
	const fpsMicro = BigInt(Math.round(fps * FPS_SCALE));
	if (fpsMicro === 0n) throw new RangeError(`FPS too small to price: ${fps}`);
	const cost = divideHalfEven(BigInt(total.amountMinor) * BigInt(FPS_SCALE), fpsMicro);
	return money(Number(cost), total.currency);
}

export interface ValueSummary {
	resultCount: number;
	/** null without frame results. */
	geometricMeanFps: number | null;
	fpsPer100: number | null;
	costPerFrame: Money | null;
}

/** Everything the value panel shows for a total and a set of frame results. */
export function valueOf(
	results: readonly { averageFps: number }[],
	total: Money | null
): ValueSummary {
	const fps = geometricMeanFps(results);
	return {
		resultCount: results.length,
		geometricMeanFps: fps,
		fpsPer100: fps !== null && total ? fpsPer100(fps, total) : null,
		costPerFrame: fps !== null && total ? costPerFrame(total, fps) : null
	};
}

function checkFps(fps: number) {
	if (!Number.isFinite(fps) || fps <= 0)
		throw new RangeError(`FPS must be a positive number, got ${fps}`);
}
