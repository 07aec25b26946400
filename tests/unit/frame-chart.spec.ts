import { describe, expect, it } from 'vitest';
import { CHART_WIDTH, frameChart } from '../../src/lib/components/guide/frame-chart';

const result = (workload: string, averageFps: number, low1Fps: number | null) => ({
	workload,
	resolution: '1920x1080',
	preset: 'High',
	averageFps,
	low1Fps,
	notes: ''
});

describe('frameChart', () => {
	it('draws bars on one zero-based scale with the 1 % low tick inside its bar', () => {
		const chart = frameChart([
			result('Hollow Meridian', 120, 90),
			result('Rustwake Rally', 60, null)
		]);
		const [a, b] = chart.bars;
		if (!a || !b) throw new Error('two bars expected');
		// Half the frames, half the length: the scale starts at zero.
		expect(b.barWidth / a.barWidth).toBeCloseTo(0.5, 6);
		expect(a.lowX).not.toBeNull();
		expect(a.lowX! / a.barWidth).toBeCloseTo(0.75, 6);
		expect(b.lowX).toBeNull();
		expect(a.valueLabel).toBe('120.0 avg · 90.0 1 % low');
		expect(b.valueLabel).toBe('60.0 avg');
		expect(a.label).toBe('Hollow Meridian · 1920×1080 · High');
		for (const bar of chart.bars) expect(bar.valueX + 150).toBeLessThanOrEqual(CHART_WIDTH);
		expect(chart.summary).toContain('Rustwake Rally · 1920×1080 · High: 60.0 FPS average');
		expect(chart.ticks[0]?.label).toBe('0');
	});
});
