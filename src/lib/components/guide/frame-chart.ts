/*
 * Layout for the frame-results chart: one horizontal bar per result (average FPS) with a
 * tick at its 1 % low, on one shared linear scale from zero so bar lengths compare.
 */
import { scaleLinear } from 'd3-scale';
import type { FrameResultView } from '$lib/views';
import { fixedDecimals } from '$lib/components/ui/number-format';

export const CHART_WIDTH = 640;
const LABEL_H = 20;
const BAR_H = 16;
const ROW_GAP = 14;
const AXIS_H = 24;
/** Room at the right of the longest bar for its value label. */
const VALUE_ROOM = 170;

export interface FrameBar {
	key: string;
	label: string;
	y: number;
	barWidth: number;
	lowX: number | null;
	valueX: number;
	valueLabel: string;
}

export interface FrameChart {
	width: number;
	height: number;
	bars: FrameBar[];
	ticks: { x: number; label: string }[];
	axisY: number;
	summary: string;
}

const fps = (n: number) => fixedDecimals(n, 1);

export function resultLabel(r: FrameResultView): string {
	return [r.workload, r.resolution.replace('x', '×'), r.preset].filter(Boolean).join(' · ');
}

export function frameChart(results: readonly FrameResultView[]): FrameChart {
	const max = Math.max(1, ...results.map((r) => Math.max(r.averageFps, r.low1Fps ?? 0)));
	const x = scaleLinear()
		.domain([0, max])
		.nice()
		.range([0, CHART_WIDTH - VALUE_ROOM]);
	const rowH = LABEL_H + BAR_H + ROW_GAP;
	const bars = results.map((r, i) => {
		const y = i * rowH;
		const barWidth = Math.max(1, x(r.averageFps));
		const valueLabel = `${fps(r.averageFps)} avg${r.low1Fps !== null ? ` · ${fps(r.low1Fps)} 1 % low` : ''}`;
		return {
			key: `${i}-${r.workload}`,
			label: resultLabel(r),
			y,
			barWidth,
			lowX: r.low1Fps !== null ? x(r.low1Fps) : null,
			valueX: barWidth + 8,
			valueLabel
		};
	});
	const axisY = results.length * rowH;
	return {
		width: CHART_WIDTH,
		height: axisY + AXIS_H,
		bars,
		ticks: x.ticks(5).map((t) => ({ x: x(t), label: String(t) })),
		axisY,
		summary: results
			.map(
				(r) =>
					`${resultLabel(r)}: ${fps(r.averageFps)} FPS average${r.low1Fps !== null ? `, ${fps(r.low1Fps)} 1 % low` : ''}`
			)
			.join('; ')
	};
}

export const BAR_HEIGHT = BAR_H;
export const LABEL_HEIGHT = LABEL_H;
