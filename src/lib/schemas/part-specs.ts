import { z } from 'zod';
import type { PartCategory } from '$lib/domain/types';

/*
 * The spec-field contract shared by the catalog, fit report, power budget and API
 * (docs/architecture.md "Spec fields"). Lengths in mm, power in W, speeds in MT/s or MB/s;
 * field names end in their unit. Strict objects: an unknown field is an error, so a
 * typo in an import never silently drops a value.
 */

const positiveInt = z.number().int().positive();
const nonNegativeInt = z.number().int().nonnegative();

export const SOCKETS = ['AM4', 'AM5', 'LGA1700', 'LGA1851'] as const;
export const MEMORY_TYPES = ['DDR4', 'DDR5'] as const;
export const BOARD_FORM_FACTORS = ['ATX', 'microATX', 'Mini-ITX', 'E-ATX'] as const;
export const PSU_FORM_FACTORS = ['ATX', 'SFX', 'SFX-L'] as const;
export const STORAGE_FORM_FACTORS = ['m2-2280', 'm2-2242', 'm2-2230', '2.5in', '3.5in'] as const;
/** 80 PLUS levels (docs/sources.md 4a). */
export const EFFICIENCY_LEVELS = [
	'80 PLUS',
	'80 PLUS Bronze',
	'80 PLUS Silver',
	'80 PLUS Gold',
	'80 PLUS Platinum',
	'80 PLUS Titanium'
] as const;
export const PCIE_GENS = [3, 4, 5] as const;

const socket = z.enum(SOCKETS);
const memoryType = z.enum(MEMORY_TYPES);
const pcieGen = z.union([z.literal(3), z.literal(4), z.literal(5)]);

export const cpuSpecs = z.strictObject({
	socket,
	cores: positiveInt.max(256),
	threads: positiveInt.max(512),
	baseClockGhz: z.number().positive().max(10),
	boostClockGhz: z.number().positive().max(10),
	tdpW: positiveInt.max(1000),
	/** Sustained package power; when absent it is derived from tdpW by the vendor's rule. */
	packagePowerW: positiveInt.max(1500).optional(),
	memoryTypes: z.array(memoryType).min(1),
	integratedGraphics: z.boolean(),
	bundledCooler: z.boolean()
});

export const coolerSpecs = z
	.strictObject({
		type: z.enum(['air', 'liquid']),
		heightMm: positiveInt.max(250).optional(),
		radiatorMm: z
			.union([
				z.literal(120),
				z.literal(140),
				z.literal(240),
				z.literal(280),
				z.literal(360),
				z.literal(420)
			])
			.optional(),
		sockets: z.array(socket).min(1),
		ratedHeatW: positiveInt.max(1000)
	})
	.refine((c) => (c.type === 'air' ? c.heightMm !== undefined : c.radiatorMm !== undefined), {
		message: 'An air cooler needs heightMm; a liquid cooler needs radiatorMm',
		path: ['type']
	});

export const m2Slot = z.strictObject({
	pcieGen,
	maxLengthMm: z.union([z.literal(30), z.literal(42), z.literal(60), z.literal(80), z.literal(110)])
});

export const motherboardSpecs = z.strictObject({
	socket,
	chipset: z.string().min(1).max(40),
	formFactor: z.enum(BOARD_FORM_FACTORS),
	memoryType,
	memorySlots: positiveInt.max(8),
	maxMemoryGb: positiveInt.max(8192),
	m2Slots: z.array(m2Slot).max(8),
	sataPorts: nonNegativeInt.max(12),
	wifi: z.boolean()
});

export const memorySpecs = z.strictObject({
	type: memoryType,
	modules: positiveInt.max(8),
	moduleGb: positiveInt.max(512),
	speedMts: positiveInt.max(12_000),
	casLatency: positiveInt.max(100),
	voltage: z.number().positive().max(2)
});

export const storageSpecs = z.strictObject({
	interface: z.enum(['nvme', 'sata']),
	formFactor: z.enum(STORAGE_FORM_FACTORS),
	pcieGen: pcieGen.optional(),
	capacityGb: positiveInt.max(100_000),
	readMbs: positiveInt.max(30_000),
	writeMbs: positiveInt.max(30_000)
});

const connectorCounts = {
	pin6: nonNegativeInt.max(8),
	pin8: nonNegativeInt.max(8),
	h12v2x6: nonNegativeInt.max(4)
};

export const gpuSpecs = z.strictObject({
	chip: z.string().min(1).max(40),
	vramGb: positiveInt.max(256),
	// Bounds catch unit slips (a length in cm or inches, a 5-metre card) at the edge.
	lengthMm: positiveInt.max(500),
	slotWidth: z.number().positive().max(5),
	boardPowerW: positiveInt.max(1500),
	powerConnectors: z.strictObject(connectorCounts),
	pcieGen
});

export const psuSpecs = z.strictObject({
	ratedW: positiveInt.max(3000),
	formFactor: z.enum(PSU_FORM_FACTORS),
	efficiency: z.enum(EFFICIENCY_LEVELS),
	modular: z.enum(['none', 'semi', 'full']),
	connectors: z.strictObject({ ...connectorCounts, eps8: nonNegativeInt.max(4) }),
	atx3: z.boolean()
});

export const caseSpecs = z.strictObject({
	boardFormFactors: z.array(z.enum(BOARD_FORM_FACTORS)).min(1),
	maxGpuLengthMm: positiveInt.max(600),
	maxCoolerHeightMm: positiveInt.max(300),
	psuFormFactors: z.array(z.enum(PSU_FORM_FACTORS)).min(1),
	/** Largest radiator the case takes, 0 when it takes none. */
	radiatorMm: nonNegativeInt,
	includedFans: nonNegativeInt,
	fanMounts: nonNegativeInt,
	bays25: nonNegativeInt,
	bays35: nonNegativeInt
});

export const fanSpecs = z.strictObject({
	sizeMm: z.union([z.literal(80), z.literal(92), z.literal(120), z.literal(140)]),
	count: positiveInt.max(10),
	maxRpm: positiveInt.max(10_000)
});

export const osSpecs = z.strictObject({
	edition: z.string().min(1).max(60),
	licence: z.enum(['retail', 'oem', 'free'])
});

export const extraSpecs = z.strictObject({
	kind: z.string().min(1).max(60)
});

export const SPEC_SCHEMAS = {
	cpu: cpuSpecs,
	cooler: coolerSpecs,
	motherboard: motherboardSpecs,
	memory: memorySpecs,
	storage: storageSpecs,
	gpu: gpuSpecs,
	psu: psuSpecs,
	case: caseSpecs,
	fan: fanSpecs,
	os: osSpecs,
	extra: extraSpecs
} satisfies Record<PartCategory, z.ZodType>;

export type CpuSpecs = z.infer<typeof cpuSpecs>;
export type CoolerSpecs = z.infer<typeof coolerSpecs>;
export type MotherboardSpecs = z.infer<typeof motherboardSpecs>;
export type MemorySpecs = z.infer<typeof memorySpecs>;
export type StorageSpecs = z.infer<typeof storageSpecs>;
export type GpuSpecs = z.infer<typeof gpuSpecs>;
export type PsuSpecs = z.infer<typeof psuSpecs>;
export type CaseSpecs = z.infer<typeof caseSpecs>;
export type FanSpecs = z.infer<typeof fanSpecs>;

export interface SpecsByCategory {
	cpu: CpuSpecs;
	cooler: CoolerSpecs;
	motherboard: MotherboardSpecs;
	memory: MemorySpecs;
	storage: StorageSpecs;
	gpu: GpuSpecs;
	psu: PsuSpecs;
	case: CaseSpecs;
	fan: FanSpecs;
	os: z.infer<typeof osSpecs>;
	extra: z.infer<typeof extraSpecs>;
}

/** Validates specs against the schema of their category. */
export function parseSpecs<C extends PartCategory>(category: C, specs: unknown) {
	return SPEC_SCHEMAS[category].safeParse(specs);
}
