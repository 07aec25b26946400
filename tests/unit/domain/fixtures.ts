/*
 * Test fixtures for the fit report, power budget and drop-in pass. Brands and models are
 * invented; the specs sit on real standards (AM5, LGA1700, DDR5, ATX, PCIe 4.0/5.0,
 * 12V-2x6). Checks against published values live in the specs, with their sources.
 */
import type { BuildPart, BuildPartOf } from '../../../src/lib/domain/build-parts';
import type { PartCategory } from '../../../src/lib/domain/types';
import type { SpecsByCategory } from '../../../src/lib/schemas/part-specs';
import { SPEC_SCHEMAS } from '../../../src/lib/schemas/part-specs';

/** A build slot; specs are validated against the zod contract so fixtures stay honest. */
export function slot<C extends PartCategory>(
	category: C,
	key: string,
	brand: string,
	model: string,
	specs: SpecsByCategory[C],
	quantity = 1
): BuildPartOf<C> {
	const parsed = SPEC_SCHEMAS[category].safeParse(specs);
	if (!parsed.success) throw new Error(`fixture ${brand} ${model}: ${parsed.error.message}`);
	return { key, label: key, category, quantity, part: { brand, model, specs } };
}

export const cpuAm5 = slot('cpu', 'cpu', 'Tarnwick', 'Vela 65X', {
	socket: 'AM5',
	cores: 6,
	threads: 12,
	baseClockGhz: 4.7,
	boostClockGhz: 5.3,
	tdpW: 105,
	memoryTypes: ['DDR5'],
	integratedGraphics: true,
	bundledCooler: false
});
export const cooler150 = slot('cooler', 'cooler', 'Ostery', 'Pillar 150', {
	type: 'air',
	heightMm: 150,
	sockets: ['AM4', 'AM5', 'LGA1700', 'LGA1851'],
	ratedHeatW: 200
});
export const boardAm5Atx = slot('motherboard', 'board', 'Quellbrook', 'B6 ATX', {
	socket: 'AM5',
	chipset: 'Q650',
	formFactor: 'ATX',
	memoryType: 'DDR5',
	memorySlots: 4,
	maxMemoryGb: 192,
	m2Slots: [
		{ pcieGen: 5, maxLengthMm: 80 },
		{ pcieGen: 4, maxLengthMm: 80 }
	],
	sataPorts: 4,
	wifi: true
});
export const ddr5Kit = slot('memory', 'memory', 'Halden', 'Flux DDR5-6000 2 × 16 GB', {
	type: 'DDR5',
	modules: 2,
	moduleGb: 16,
	speedMts: 6000,
	casLatency: 30,
	voltage: 1.35
});
export const nvmeGen4 = slot('storage', 'storage', 'Brightmoor', 'N4 2 TB', {
	interface: 'nvme',
	formFactor: 'm2-2280',
	pcieGen: 4,
	capacityGb: 2000,
	readMbs: 7000,
	writeMbs: 6500
});
export const gpu2x8 = slot('gpu', 'gpu', 'Ferrant', 'Kestrel 16G', {
	chip: 'K70',
	vramGb: 16,
	lengthMm: 300,
	slotWidth: 2.5,
	boardPowerW: 263,
	powerConnectors: { pin6: 0, pin8: 2, h12v2x6: 0 },
	pcieGen: 4
});
export const psu850 = slot('psu', 'psu', 'Ostery', 'Current 850', {
	ratedW: 850,
	formFactor: 'ATX',
	efficiency: '80 PLUS Gold',
	modular: 'full',
	connectors: { pin6: 0, pin8: 3, h12v2x6: 1, eps8: 2 },
	atx3: true
});
export const caseAtx = slot('case', 'case', 'Halden', 'Atrium', {
	boardFormFactors: ['ATX', 'microATX', 'Mini-ITX'],
	maxGpuLengthMm: 330,
	maxCoolerHeightMm: 165,
	psuFormFactors: ['ATX'],
	radiatorMm: 360,
	includedFans: 3,
	fanMounts: 9,
	bays25: 2,
	bays35: 2
});

/** A build where everything fits: the baseline each test changes one slot of. */
export function goodBuild(): BuildPart[] {
	return [cpuAm5, cooler150, boardAm5Atx, ddr5Kit, nvmeGen4, gpu2x8, psu850, caseAtx];
}

/** The good build with one or more slots replaced (matched by key) or added. */
export function withSlots(...replacements: BuildPart[]): BuildPart[] {
	const build = goodBuild();
	for (const r of replacements) {
		const i = build.findIndex((s) => s.key === r.key);
		if (i >= 0) build[i] = r;
		else build.push(r);
	}
	return build;
}

/** The good build without the given slot keys. */
export function without(...keys: string[]): BuildPart[] {
	return goodBuild().filter((s) => !keys.includes(s.key));
}
