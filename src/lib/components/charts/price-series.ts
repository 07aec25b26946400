/*
 * Price history geometry: quotes over time → one chart per currency, one step line per
 * region and store. Pure (d3-scale and d3-shape compute numbers and path strings, no DOM),
 * so the chart is drawn on the server and works without JavaScript.
 *
 * Amounts are turned into floats in major units here only to place pixels; every label
 * comes from the integer minor units.
 */
import { scaleLinear, scaleUtc } from 'd3-scale';
import {
	curveStepAfter,
	line,
	symbol,
	symbolCircle,
	symbolCross,
	symbolDiamond,
	symbolSquare,
	symbolStar,
	symbolTriangle,
	symbolWye
} from 'd3-shape';
import type { SymbolType } from 'd3-shape';
import { formatMoney, minorUnitDigits } from '$lib/domain/money';

export interface SeriesInput {
	regionName: string;
	storeName: string;
	currency: string;
	points: { observedAt: string; amountMinor: number }[];
}

export interface PlottedPoint {
	x: number;
	y: number;
	observedAt: string;
	amountMinor: number;
	priceLabel: string;
	dateLabel: string;
}

interface ShapeDef {
	name: string;
	type: SymbolType;
}

/** Marker shapes in the order series get them: the line reads without colour. */
export const SHAPES: [ShapeDef, ...ShapeDef[]] = [
	{ name: 'circle', type: symbolCircle },
	{ name: 'square', type: symbolSquare },
	{ name: 'triangle', type: symbolTriangle },
	{ name: 'diamond', type: symbolDiamond },
	{ name: 'cross', type: symbolCross },
	{ name: 'star', type: symbolStar },
	{ name: 'wye', type: symbolWye }
];

interface Tone {
	line: string;
	mark: string;
}

/** Token colours as whole class names (Tailwind only sees complete names). */
export const TONES: [Tone, ...Tone[]] = [
	{ line: 'stroke-teal', mark: 'fill-teal' },
	{ line: 'stroke-copper', mark: 'fill-copper' },
	{ line: 'stroke-ink', mark: 'fill-ink' },
	{ line: 'stroke-amber-ink', mark: 'fill-amber-ink' },
	{ line: 'stroke-brick-ink', mark: 'fill-brick-ink' },
	{ line: 'stroke-muted', mark: 'fill-muted' }
];

/** The i-th entry, wrapping round; a non-empty list always has one. */
function cycle<T>(list: readonly [T, ...T[]], i: number): T {
	return list[i % list.length] ?? list[0];
}

export interface PlottedSeries {
	label: string;
	shape: string;
	/** A marker path centred on 0,0; translate it to each point. */
	symbolPath: string;
	tone: Tone;
	/** The step line: a price holds until the next observation. */
	path: string;
	points: PlottedPoint[];
}

export interface PriceChart {
	currency: string;
	width: number;
	height: number;
	plot: { left: number; top: number; right: number; bottom: number };
	xTicks: { x: number; label: string }[];
	yTicks: { y: number; label: string }[];
	series: PlottedSeries[];
	observations: number;
	/** One sentence for the chart's accessible name. */
	summary: string;
}

export const CHART_SIZE = { width: 720, height: 300, top: 16, right: 32, bottom: 52, left: 116 };

const DAY_MS = 86_400_000;

/** Quotes are dated by the day: each sits on its UTC day, in line with the date ticks. */
function dayOf(iso: string): number {
	return Math.floor(Date.parse(iso) / DAY_MS) * DAY_MS;
}

function dateFormatter(withYear: boolean) {
	return new Intl.DateTimeFormat('en-GB', {
		day: 'numeric',
		month: 'short',
		...(withYear ? { year: 'numeric' } : {}),
		timeZone: 'UTC'
	});
}

/** Charts for every currency in `input`, in the order currencies first appear. */
export function priceCharts(input: SeriesInput[], size = CHART_SIZE): PriceChart[] {
	const currencies = [...new Set(input.filter((s) => s.points.length > 0).map((s) => s.currency))];
	return currencies.map((currency) =>
		chartFor(
			currency,
			input.filter((s) => s.currency === currency),
			size
		)
	);
}

function chartFor(currency: string, input: SeriesInput[], size: typeof CHART_SIZE): PriceChart {
	const plot = {
		left: size.left,
		top: size.top,
		right: size.width - size.right,
		bottom: size.height - size.bottom
	};
	const scale = 10 ** minorUnitDigits(currency);
	const sorted = input
		.filter((s) => s.points.length > 0)
		.map((s) => ({
			...s,
			points: [...s.points].sort((a, b) => a.observedAt.localeCompare(b.observedAt))
		}));
	const all = sorted.flatMap((s) => s.points);
	const times = all.map((p) => dayOf(p.observedAt));
	const majors = all.map((p) => p.amountMinor / scale);

	// A day of room on each side, so a lone point or the first and last sit inside the axes.
	const x = scaleUtc()
		.domain([new Date(Math.min(...times) - DAY_MS), new Date(Math.max(...times) + DAY_MS)])
		.range([plot.left, plot.right]);
	const low = Math.min(...majors);
	const high = Math.max(...majors);
	const pad = high > low ? (high - low) * 0.15 : Math.max(1, high * 0.1);
	// Not zero-based: week-to-week moves of a few percent must stay visible; the axis says where it starts.
	const y = scaleLinear()
		.domain([Math.max(0, low - pad), high + pad])
		.nice(5)
		.range([plot.bottom, plot.top]);

	const [start, end] = x.domain() as [Date, Date];
	const formatDate = dateFormatter(start.getUTCFullYear() !== end.getUTCFullYear());
	const pointDate = dateFormatter(true);
	const tickMoney = new Intl.NumberFormat('en-GB', {
		style: 'currency',
		currency,
		minimumFractionDigits: 0,
		maximumFractionDigits: minorUnitDigits(currency)
	});

	const series = sorted.map((s, i): PlottedSeries => {
		const shape = cycle(SHAPES, i);
		const points = s.points.map((p) => ({
			x: x(new Date(dayOf(p.observedAt))),
			y: y(p.amountMinor / scale),
			observedAt: p.observedAt,
			amountMinor: p.amountMinor,
			priceLabel: formatMoney({ amountMinor: p.amountMinor, currency }),
			dateLabel: pointDate.format(new Date(p.observedAt))
		}));
		const path =
			line<PlottedPoint>(
				(p) => p.x,
				(p) => p.y
			).curve(curveStepAfter)(points) ?? '';
		return {
			label: `${s.regionName} · ${s.storeName}`,
			shape: shape.name,
			symbolPath: symbol(shape.type, 90)() ?? '',
			tone: cycle(TONES, i),
			path,
			points
		};
	});

	return {
		currency,
		width: size.width,
		height: size.height,
		plot,
		xTicks: dateTicks(x.ticks(5), start, end).map((t) => ({
			x: x(t),
			label: formatDate.format(t)
		})),
		// Only whole minor units are prices (no half yen): other ticks would repeat a label.
		yTicks: y
			.ticks(5)
			.filter((t) => Math.abs(t * scale - Math.round(t * scale)) < 1e-6)
			.map((t) => ({ y: y(t), label: tickMoney.format(t) })),
		series,
		observations: all.length,
		summary: summarise(currency, series)
	};
}

/**
 * Date ticks on UTC midnights only: quotes are dated by the day, and a tick at noon would
 * print the same date twice. d3's own ticks (days, weeks, months) when it gives at least
 * two such; on a chart a few days wide, every day or so instead.
 */
export function dateTicks(d3Ticks: Date[], start: Date, end: Date, count = 5): Date[] {
	const midnights = d3Ticks.filter((t) => t.getTime() % DAY_MS === 0);
	if (midnights.length >= 2) return midnights;
	const first = Math.ceil(start.getTime() / DAY_MS);
	const last = Math.floor(end.getTime() / DAY_MS);
	const days = last - first + 1;
	if (days <= 0) return [];
	const steps = [1, 2, 7, 14, 30, 61, 91, 182, 365];
	const step = steps.find((s) => days / s <= count) ?? Math.ceil(days / count);
	const ticks: Date[] = [];
	for (let day = first; day <= last; day += step) ticks.push(new Date(day * DAY_MS));
	return ticks;
}

function summarise(currency: string, series: PlottedSeries[]): string {
	const points = series.flatMap((s) => s.points.map((p) => ({ ...p, label: s.label })));
	const byDate = [...points].sort((a, b) => a.observedAt.localeCompare(b.observedAt));
	const byPrice = [...points].sort((a, b) => a.amountMinor - b.amountMinor);
	const first = byDate[0];
	const last = byDate[byDate.length - 1];
	const lowest = byPrice[0];
	const highest = byPrice[byPrice.length - 1];
	if (!first || !last || !lowest || !highest) return `No prices in ${currency}.`;
	const lines = series.length === 1 ? '1 store' : `${series.length} stores`;
	const count = points.length === 1 ? '1 observation' : `${points.length} observations`;
	const span =
		first.dateLabel === last.dateLabel
			? `on ${first.dateLabel}`
			: `from ${first.dateLabel} to ${last.dateLabel}`;
	const range =
		lowest.amountMinor === highest.amountMinor
			? `All at ${lowest.priceLabel}.`
			: `Lowest ${lowest.priceLabel} (${lowest.label}, ${lowest.dateLabel}); ` +
				`highest ${highest.priceLabel} (${highest.label}, ${highest.dateLabel}).`;
	return `Prices in ${currency} at ${lines}, ${count} ${span}. ${range}`;
}
