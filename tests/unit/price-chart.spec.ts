import { describe, expect, it } from 'vitest';
import { CHART_SIZE, priceCharts } from '$lib/components/charts/price-series';
import type { SeriesInput } from '$lib/components/charts/price-series';

/*
 * Geometry of the price history chart (invented quotes). SVG's y axis points down, so a
 * dearer price sits higher on screen: a smaller y.
 */
const eur = (storeName: string, points: [string, number][]): SeriesInput => ({
	regionName: 'Germany',
	storeName,
	currency: 'EUR',
	points: points.map(([day, amountMinor]) => ({ observedAt: `${day}T12:00:00.000Z`, amountMinor }))
});

const lindenhof = eur('Lindenhof', [
	['2026-08-01', 22900],
	['2026-09-10', 21500],
	['2026-10-16', 20500],
	['2026-11-28', 19900]
]);
const brueckner = eur('Brückner', [['2026-11-25', 20900]]);
const kairo: SeriesInput = {
	regionName: 'Japan',
	storeName: 'Kairo',
	currency: 'JPY',
	points: [
		{ observedAt: '2026-10-01T00:00:00.000Z', amountMinor: 64800 },
		{ observedAt: '2026-11-01T00:00:00.000Z', amountMinor: 60800 }
	]
};

describe('price history geometry', () => {
	it('draws one chart per currency, never mixing currencies on an axis', () => {
		const charts = priceCharts([lindenhof, kairo, brueckner]);
		expect(charts.map((c) => c.currency)).toEqual(['EUR', 'JPY']);
		expect(charts[0]?.series.map((s) => s.label)).toEqual([
			'Germany · Lindenhof',
			'Germany · Brückner'
		]);
		expect(charts[1]?.series.map((s) => s.label)).toEqual(['Japan · Kairo']);
		expect(charts[0]?.observations).toBe(5);
	});

	it('places later dates further right and dearer prices higher, inside the plot', () => {
		const [chart] = priceCharts([lindenhof]);
		const points = chart?.series[0]?.points ?? [];
		expect(points).toHaveLength(4);
		for (let i = 1; i < points.length; i++) {
			const [prev, cur] = [points[i - 1], points[i]];
			if (!prev || !cur) throw new Error('missing point');
			expect(cur.x).toBeGreaterThan(prev.x);
			// Each price here is lower than the one before, so it sits lower on screen.
			expect(cur.y).toBeGreaterThan(prev.y);
		}
		for (const p of points) {
			expect(p.x).toBeGreaterThan(CHART_SIZE.left);
			expect(p.x).toBeLessThan(CHART_SIZE.width - CHART_SIZE.right);
			expect(p.y).toBeGreaterThanOrEqual(CHART_SIZE.top);
			expect(p.y).toBeLessThanOrEqual(CHART_SIZE.height - CHART_SIZE.bottom);
		}
	});

	it('sorts points by date even when given out of order', () => {
		const shuffled = { ...lindenhof, points: [...lindenhof.points].reverse() };
		const [chart] = priceCharts([shuffled]);
		expect(chart?.series[0]?.points.map((p) => p.amountMinor)).toEqual([
			22900, 21500, 20500, 19900
		]);
	});

	it('draws a step line: the price holds level until the next observation, then moves', () => {
		const [chart] = priceCharts([lindenhof]);
		const series = chart?.series[0];
		const [a, b] = series?.points ?? [];
		if (!series || !a || !b) throw new Error('no points');
		const coords = [...series.path.matchAll(/(-?[\d.]+),(-?[\d.]+)/g)].map((m) => [
			Number(m[1]),
			Number(m[2])
		]);
		expect(series.path.startsWith('M')).toBe(true);
		// First point, then along at the first price to the second date, then to the second price.
		expect(coords[0]?.[0]).toBeCloseTo(a.x, 2);
		expect(coords[0]?.[1]).toBeCloseTo(a.y, 2);
		expect(coords[1]?.[0]).toBeCloseTo(b.x, 2);
		expect(coords[1]?.[1]).toBeCloseTo(a.y, 2);
		expect(coords[2]?.[0]).toBeCloseTo(b.x, 2);
		expect(coords[2]?.[1]).toBeCloseTo(b.y, 2);
	});

	it('gives every series in a chart its own marker shape and legend label', () => {
		const many = ['A', 'B', 'C', 'D', 'E'].map((name, i) =>
			eur(name, [['2026-11-0' + (i + 1), 10000 + i * 100]])
		);
		const [chart] = priceCharts(many);
		const shapes = chart?.series.map((s) => s.shape) ?? [];
		expect(new Set(shapes).size).toBe(5);
		for (const s of chart?.series ?? []) expect(s.symbolPath).toMatch(/^M/);
	});

	it('labels the axes in the currency and in dates, from integer minor units', () => {
		const [euro, yen] = priceCharts([lindenhof, kairo]);
		expect(euro?.yTicks.length).toBeGreaterThan(1);
		for (const tick of euro?.yTicks ?? []) expect(tick.label).toMatch(/^€[\d,]+(\.\d\d?)?$/);
		for (const tick of yen?.yTicks ?? []) expect(tick.label).toMatch(/^JP¥[\d,]+$/);
		// The axis spans every price.
		const ys = euro?.yTicks.map((t) => t.y) ?? [];
		const pointYs = euro?.series.flatMap((s) => s.points.map((p) => p.y)) ?? [];
		expect(Math.max(...ys)).toBeGreaterThanOrEqual(Math.max(...pointYs));
		expect(Math.min(...ys)).toBeLessThanOrEqual(Math.min(...pointYs));
		expect(euro?.xTicks.length).toBeGreaterThan(1);
		expect(euro?.xTicks.every((t) => /^\d{1,2} [A-Z][a-z]{2,3}/.test(t.label))).toBe(true);
		const first = euro?.series[0]?.points[0];
		expect(first?.priceLabel).toBe('€229.00');
		expect(first?.dateLabel).toBe('1 Aug 2026');
		expect(yen?.series[0]?.points[1]?.priceLabel).toBe('JP¥60,800');
	});

	it('handles a single observation: a point mid-chart, no crash on a flat domain', () => {
		const [chart] = priceCharts([brueckner]);
		const point = chart?.series[0]?.points[0];
		expect(point?.x).toBeCloseTo((CHART_SIZE.left + CHART_SIZE.width - CHART_SIZE.right) / 2, 2);
		expect(Number.isFinite(point?.y)).toBe(true);
		expect(chart?.summary).toBe(
			'Prices in EUR at 1 store, 1 observation on 25 Nov 2026. All at €209.00.'
		);
	});

	it('puts date ticks on distinct days, even when the chart spans only a day or two', () => {
		for (const input of [
			brueckner,
			eur('Short', [
				['2026-11-25', 100],
				['2026-11-27', 120]
			]),
			lindenhof
		]) {
			const [chart] = priceCharts([input]);
			const labels = chart?.xTicks.map((t) => t.label) ?? [];
			expect(labels.length, input.storeName).toBeGreaterThanOrEqual(2);
			expect(new Set(labels).size, labels.join(' | ')).toBe(labels.length);
		}
	});

	it('puts price ticks on whole minor units, so no two ticks read the same', () => {
		const cheapYen: SeriesInput = {
			...kairo,
			points: [
				{ observedAt: '2026-11-01T00:00:00.000Z', amountMinor: 100 },
				{ observedAt: '2026-11-02T00:00:00.000Z', amountMinor: 101 }
			]
		};
		for (const input of [cheapYen, brueckner, kairo]) {
			const [chart] = priceCharts([input]);
			const labels = chart?.yTicks.map((t) => t.label) ?? [];
			expect(labels.length).toBeGreaterThanOrEqual(2);
			expect(new Set(labels).size, labels.join(' | ')).toBe(labels.length);
		}
	});

	it('summarises the chart in words for its accessible name', () => {
		const [chart] = priceCharts([lindenhof, brueckner]);
		expect(chart?.summary).toBe(
			'Prices in EUR at 2 stores, 5 observations from 1 Aug 2026 to 28 Nov 2026. ' +
				'Lowest €199.00 (Germany · Lindenhof, 28 Nov 2026); highest €229.00 (Germany · Lindenhof, 1 Aug 2026).'
		);
	});

	it('draws nothing for series without points', () => {
		expect(priceCharts([])).toEqual([]);
		expect(priceCharts([{ ...lindenhof, points: [] }])).toEqual([]);
	});
});
