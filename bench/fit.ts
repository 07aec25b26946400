/*
 * Benchmark (not a test): fit report + power budget for a 12-slot guide, and the drop-in
 * pass over its 60 alternates (5 per slot). Goal: the whole drop-in pass under 5 ms.
 * Run: npm run bench:fit  (plain Node via tsx; relative imports, no Vite).
 *
 * Parts are invented, with realistic specs on real standards. Region adjust prices the same
 * 12 slots × 6 options from a USD base into EUR with VAT: half quoted, half estimated
 * through the ECB 2 Jan 2024 cross rates.
 */
import { performance } from 'node:perf_hooks';
import type { PartInfo } from '../src/lib/domain/build-parts';
import { dropIns, type GuideSlot } from '../src/lib/domain/dropins';
import { fitReport, summarize } from '../src/lib/domain/fit';
import { money } from '../src/lib/domain/money';
import { powerBudget } from '../src/lib/domain/power';
import { adjustToRegion, type SlotInput } from '../src/lib/domain/region';
import type { PartCategory } from '../src/lib/domain/types';
import type { SpecsByCategory } from '../src/lib/schemas/part-specs';

function part<C extends PartCategory>(
	brand: string,
	model: string,
	specs: SpecsByCategory[C]
): PartInfo<C> {
	return { brand, model, specs };
}

function guideSlot<C extends PartCategory>(
	category: C,
	key: string,
	pick: PartInfo<C>,
	alternates: PartInfo<C>[]
): GuideSlot {
	return {
		key,
		label: key,
		category,
		quantity: 1,
		pick,
		alternates: alternates.map((p, i) => ({ id: `${key}-${i + 1}`, part: p }))
	} as unknown as GuideSlot;
}

const ALL: SpecsByCategory['cooler']['sockets'] = ['AM4', 'AM5', 'LGA1700', 'LGA1851'];

const cpu = (model: string, tdpW: number, cores: number, igpu = true, bundled = false) =>
	part<'cpu'>('Tarnwick', model, {
		socket: 'AM5',
		cores,
		threads: cores * 2,
		baseClockGhz: 4.2,
		boostClockGhz: 5.4,
		tdpW,
		memoryTypes: ['DDR5'],
		integratedGraphics: igpu,
		bundledCooler: bundled
	});
const air = (model: string, heightMm: number, ratedHeatW: number) =>
	part<'cooler'>('Ostery', model, { type: 'air', heightMm, sockets: ALL, ratedHeatW });
const board = (
	model: string,
	formFactor: SpecsByCategory['motherboard']['formFactor'],
	gens: (3 | 4 | 5)[]
) =>
	part<'motherboard'>('Quellbrook', model, {
		socket: 'AM5',
		chipset: 'Q650',
		formFactor,
		memoryType: 'DDR5',
		memorySlots: formFactor === 'Mini-ITX' ? 2 : 4,
		maxMemoryGb: 192,
		m2Slots: gens.map((pcieGen) => ({ pcieGen, maxLengthMm: 80 as const })),
		sataPorts: 4,
		wifi: true
	});
const kit = (
	model: string,
	type: 'DDR4' | 'DDR5',
	moduleGb: number,
	speedMts: number,
	casLatency: number
) =>
	part<'memory'>('Halden', model, {
		type,
		modules: 2,
		moduleGb,
		speedMts,
		casLatency,
		voltage: 1.35
	});
const nvme = (model: string, pcieGen: 3 | 4 | 5, capacityGb: number) =>
	part<'storage'>('Brightmoor', model, {
		interface: 'nvme',
		formFactor: 'm2-2280',
		pcieGen,
		capacityGb,
		readMbs: 7000,
		writeMbs: 6000
	});
const card = (
	model: string,
	lengthMm: number,
	boardPowerW: number,
	pin8: number,
	h12v2x6: number
) =>
	part<'gpu'>('Ferrant', model, {
		chip: model,
		vramGb: 16,
		lengthMm,
		slotWidth: 2.5,
		boardPowerW,
		powerConnectors: { pin6: 0, pin8, h12v2x6 },
		pcieGen: 4
	});
const supply = (
	model: string,
	ratedW: number,
	pin8: number,
	h12v2x6: number,
	formFactor: 'ATX' | 'SFX' = 'ATX'
) =>
	part<'psu'>('Ostery', model, {
		ratedW,
		formFactor,
		efficiency: '80 PLUS Gold',
		modular: 'full',
		connectors: { pin6: 0, pin8, h12v2x6, eps8: 2 },
		atx3: h12v2x6 > 0
	});
const tower = (
	model: string,
	maxGpuLengthMm: number,
	boards: SpecsByCategory['case']['boardFormFactors']
) =>
	part<'case'>('Halden', model, {
		boardFormFactors: boards,
		maxGpuLengthMm,
		maxCoolerHeightMm: 165,
		psuFormFactors: ['ATX'],
		radiatorMm: 360,
		includedFans: 3,
		fanMounts: 9,
		bays25: 2,
		bays35: 2
	});
const fans = (model: string, count: number) =>
	part<'fan'>('Ostery', model, { sizeMm: 120, count, maxRpm: 1500 });

const guide: GuideSlot[] = [
	guideSlot('cpu', 'cpu', cpu('Vela 65X', 105, 6), [
		cpu('Vela 65', 65, 6, true, true),
		cpu('Vela 87X', 120, 8),
		cpu('Vela 169X', 170, 16),
		cpu('Vela 65F', 105, 6, false),
		cpu('Vela 129X', 120, 12)
	]),
	guideSlot('cooler', 'cooler', air('Pillar 150', 150, 220), [
		air('Pillar 160', 160, 250),
		air('Low 47', 47, 95),
		air('Tower 172', 172, 280),
		air('Slim 135', 135, 180),
		part<'cooler'>('Ostery', 'Loop 360', {
			type: 'liquid',
			radiatorMm: 360,
			sockets: ALL,
			ratedHeatW: 330
		})
	]),
	guideSlot('motherboard', 'board', board('B6 ATX', 'ATX', [5, 4, 4]), [
		board('B6M', 'microATX', [4, 4]),
		board('B6I', 'Mini-ITX', [4]),
		board('X6 Pro', 'ATX', [5, 5, 4, 4]),
		board('X6 Extended', 'E-ATX', [5, 5, 4]),
		board('B6 Lite', 'ATX', [4])
	]),
	guideSlot('memory', 'memory', kit('Flux DDR5-6000 2 × 16 GB', 'DDR5', 16, 6000, 30), [
		kit('Flux DDR5-5600 2 × 16 GB', 'DDR5', 16, 5600, 36),
		kit('Flux DDR5-6000 2 × 32 GB', 'DDR5', 32, 6000, 30),
		kit('Pulse DDR4-3200 2 × 16 GB', 'DDR4', 16, 3200, 16),
		kit('Studio DDR5-6400 2 × 16 GB', 'DDR5', 16, 6400, 32),
		kit('Base DDR5-4800 2 × 16 GB', 'DDR5', 16, 4800, 40)
	]),
	guideSlot('storage', 'system-drive', nvme('N4 1 TB', 4, 1000), [
		nvme('N3 1 TB', 3, 1000),
		nvme('N5 1 TB', 5, 1000),
		nvme('N4 2 TB', 4, 2000),
		nvme('N4 Lite 1 TB', 4, 1000),
		nvme('N5 2 TB', 5, 2000)
	]),
	guideSlot('storage', 'games-drive', nvme('N4 2 TB', 4, 2000), [
		nvme('N4 4 TB', 4, 4000),
		nvme('N5 2 TB', 5, 2000),
		nvme('N3 2 TB', 3, 2000),
		part<'storage'>('Brightmoor', 'S2 2 TB', {
			interface: 'sata',
			formFactor: '2.5in',
			capacityGb: 2000,
			readMbs: 560,
			writeMbs: 530
		}),
		nvme('N4 Lite 2 TB', 4, 2000)
	]),
	guideSlot('gpu', 'gpu', card('Kestrel 16G', 300, 263, 2, 0), [
		card('Kestrel 12G', 242, 200, 1, 0),
		card('Kestrel XL', 336, 300, 0, 1),
		card('Kestrel 20G', 320, 315, 2, 0),
		card('Kestrel Mini', 182, 200, 1, 0),
		card('Kestrel 24G', 348, 450, 0, 1)
	]),
	guideSlot('psu', 'psu', supply('Current 1000', 1000, 4, 1), [
		supply('Current 650', 650, 3, 0),
		supply('Current 750', 750, 2, 1),
		supply('Current 850', 850, 3, 1),
		supply('Small 750', 750, 2, 1, 'SFX'),
		supply('Basic 550', 550, 2, 0)
	]),
	guideSlot('case', 'case', tower('Atrium', 360, ['ATX', 'microATX', 'Mini-ITX']), [
		tower('Mesh M', 330, ['microATX', 'Mini-ITX']),
		tower('Basis', 345, ['ATX', 'microATX', 'Mini-ITX']),
		tower('Atlas', 365, ['E-ATX', 'ATX', 'microATX', 'Mini-ITX']),
		tower('Pocket', 220, ['Mini-ITX']),
		tower('Plain', 400, ['ATX'])
	]),
	guideSlot('fan', 'fans', fans('Draft 120 (3-pack)', 3), [
		fans('Draft 120 (2-pack)', 2),
		fans('Quiet 120 (3-pack)', 3),
		fans('Draft 120', 1),
		fans('Quiet 120 (2-pack)', 2),
		fans('Draft 120 (5-pack)', 5)
	]),
	guideSlot(
		'os',
		'os',
		part<'os'>('Orrel', 'Desk OS Home', { edition: 'Home', licence: 'retail' }),
		['Pro', 'Free', 'Lite', 'Studio', 'LTS'].map((e) =>
			part<'os'>('Orrel', `Desk OS ${e}`, { edition: e, licence: 'oem' })
		)
	),
	guideSlot(
		'extra',
		'extra',
		part<'extra'>('Ostery', 'Paste 4 g', { kind: 'Thermal paste' }),
		['Bracket', 'Stand', 'Strap', 'Cable kit', 'Paste 8 g'].map((k) =>
			part<'extra'>('Ostery', k, { kind: k })
		)
	)
];

const picks = guide.map((s) => ({
	key: s.key,
	label: s.label,
	category: s.category,
	quantity: s.quantity,
	part: s.pick
})) as Parameters<typeof fitReport>[0];

function median(samples: number[]): number {
	const sorted = [...samples].sort((a, b) => a - b);
	const mid = Math.floor(sorted.length / 2);
	return sorted.length % 2 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
}

/** Median wall time of `fn` in ms over `runs` runs, after `warmup` untimed runs. */
function time(fn: () => unknown, runs: number, warmup: number): number {
	for (let i = 0; i < warmup; i++) fn();
	const samples: number[] = [];
	for (let i = 0; i < runs; i++) {
		const start = performance.now();
		fn();
		samples.push(performance.now() - start);
	}
	return median(samples);
}

const alternateCount = guide.reduce((n, s) => n + s.alternates.length, 0);
const oneReport = time(
	() => {
		fitReport(picks);
		powerBudget(picks);
	},
	5000,
	1000
);
const fitOnly = time(() => fitReport(picks), 5000, 1000);
const pass = time(() => dropIns(guide), 1000, 200);
// The same 61 fit reports without the comparison, to show what the comparison costs.
const swappedBuilds = guide.flatMap((s, i) =>
	s.alternates.map(
		(a) => picks.map((p, j) => (j === i ? { ...p, part: a.part } : p)) as typeof picks
	)
);
const reportsOnly = time(
	() => {
		fitReport(picks);
		for (const b of swappedBuilds) fitReport(b);
	},
	1000,
	200
);
// Region adjust: every other option has a German quote; the rest are estimated from US prices.
const usd = (cents: number) => ({
	unit: money(cents, 'USD'),
	taxIncluded: false,
	observedAt: '2026-11-30',
	storeName: 'Bench US'
});
const eur = (cents: number) => ({
	unit: money(cents, 'EUR'),
	taxIncluded: true,
	observedAt: '2026-11-30',
	storeName: 'Bench DE'
});
const pricingSlots: SlotInput[] = guide.map((s, i) => ({
	key: i,
	category: s.category,
	quantity: s.quantity,
	pick: {
		partId: i * 10,
		basePrice: usd(10_000 + i * 100),
		targetQuote: i % 2 ? eur(11_000 + i * 100) : null
	},
	alternates: s.alternates.map((_, j) => ({
		partId: i * 10 + j + 1,
		basePrice: usd(9_000 + j * 500),
		targetQuote: j % 2 ? eur(10_000 + j * 400) : null
	}))
}));
const regionInput = {
	base: {
		code: 'us',
		currency: 'USD',
		taxMode: 'exclusive' as const,
		taxRateBp: 0,
		categoryFactorsBp: {}
	},
	target: {
		code: 'de',
		currency: 'EUR',
		taxMode: 'inclusive' as const,
		taxRateBp: 1900,
		categoryFactorsBp: { gpu: 10400 }
	},
	slots: pricingSlots,
	rates: {
		USD: { ratePerEur: '1.0956', asOf: '2024-01-02' },
		EUR: { ratePerEur: '1', asOf: '2024-01-02' }
	}
};
const regionAdjust = time(() => adjustToRegion(regionInput), 2000, 400);
const everything = time(
	() => {
		fitReport(picks);
		powerBudget(picks);
		adjustToRegion(regionInput);
	},
	2000,
	400
);

const result = dropIns(guide);
const fitting = result.alternates.filter((a) => a.fits).length;

const us = (ms: number) => `${(ms * 1000).toFixed(1)} µs`;
console.log(`Slotwise fit benchmark (Node ${process.version}), medians`);
console.log(
	`guide: ${guide.length} slots, ${alternateCount} alternates; picks report ${JSON.stringify(summarize(result.picks))}`
);
console.log(`fit report + power budget (picks):   ${us(oneReport)}`);
console.log(`fit report alone (picks):            ${us(fitOnly)}`);
console.log(`region adjust (12 slots × 6 options): ${us(regionAdjust)}`);
console.log(`fit + power + region adjust:         ${us(everything)}`);
console.log(
	`drop-in pass (${alternateCount} alternates + picks): ${pass.toFixed(3)} ms  (${us(pass / (alternateCount + 1))} per evaluation)`
);
console.log(`the same 61 fit reports, no comparison: ${reportsOnly.toFixed(3)} ms`);
console.log(`ratio drop-in pass / one fit report: ${(pass / fitOnly).toFixed(1)}×`);
console.log(`alternates that fit as drop-ins:     ${fitting} of ${alternateCount}`);
console.log(`goal (drop-in pass under 5 ms):      ${pass < 5 ? 'met' : 'NOT met'}`);
