/*
 * Spec fields as text for people. Field names end in their unit (docs/architecture.md "Spec
 * fields"), so the unit shown comes from the name: lengthMm → "mm", boardPowerW → "W",
 * speedMts → "MT/s". Pure functions: the pages and tests share them.
 */
import type { PartCategory } from '$lib/domain/types';
import { upToDecimals } from '$lib/components/ui/number-format';

/** Unit suffixes of field names, longest first so "Mbs" is not read as "s". */
const UNIT_SUFFIXES: [suffix: string, unit: string][] = [
	['Mts', 'MT/s'],
	['Mbs', 'MB/s'],
	['Ghz', 'GHz'],
	['Rpm', 'rpm'],
	['Mm', 'mm'],
	['Gb', 'GB'],
	['W', 'W']
];

/** Fields whose unit is not in the name (kept by the trade's habit). */
const UNIT_OVERRIDES: Record<string, string> = { voltage: 'V' };

/** Labels the trade writes differently from a split of the field name. */
const LABELS: Record<string, string> = {
	tdpW: 'TDP',
	packagePowerW: 'Sustained package power',
	memoryTypes: 'Memory types',
	integratedGraphics: 'Integrated graphics',
	bundledCooler: 'Cooler in the box',
	ratedHeatW: 'Rated heat load',
	formFactor: 'Form factor',
	memoryType: 'Memory type',
	memorySlots: 'Memory slots',
	maxMemoryGb: 'Maximum memory',
	m2Slots: 'M.2 slots',
	sataPorts: 'SATA ports',
	wifi: 'Wi-Fi',
	moduleGb: 'Module size',
	speedMts: 'Speed',
	casLatency: 'CAS latency',
	interface: 'Interface',
	pcieGen: 'PCIe generation',
	capacityGb: 'Capacity',
	readMbs: 'Sequential read',
	writeMbs: 'Sequential write',
	vramGb: 'Video memory',
	slotWidth: 'Slot width',
	boardPowerW: 'Board power',
	powerConnectors: 'Power connectors',
	ratedW: 'Rated power',
	atx3: 'ATX 3 compliant',
	boardFormFactors: 'Board form factors',
	maxGpuLengthMm: 'Graphics card clearance',
	maxCoolerHeightMm: 'CPU cooler clearance',
	psuFormFactors: 'Power supply form factors',
	radiatorMm: 'Radiator size',
	includedFans: 'Fans included',
	fanMounts: 'Fan mounts',
	bays25: '2.5-inch bays',
	bays35: '3.5-inch bays',
	sizeMm: 'Fan size',
	maxRpm: 'Maximum speed',
	licence: 'Licence'
};

const CONNECTOR_NAMES: Record<string, string> = {
	pin6: '6-pin PCIe',
	pin8: '8-pin PCIe',
	h12v2x6: '12V-2x6',
	eps8: '8-pin EPS'
};

const STORAGE_FORM_FACTOR_NAMES: Record<string, string> = {
	'm2-2280': 'M.2 2280',
	'm2-2242': 'M.2 2242',
	'm2-2230': 'M.2 2230',
	'2.5in': '2.5-inch',
	'3.5in': '3.5-inch'
};

const VALUE_NAMES: Record<string, string> = {
	nvme: 'NVMe',
	sata: 'SATA',
	air: 'Air',
	liquid: 'Liquid'
};

/** The unit suffix a field name ends in, if any. */
function unitSuffix(field: string): [suffix: string, unit: string] | null {
	for (const entry of UNIT_SUFFIXES) {
		const [suffix] = entry;
		// The suffix must follow a lower-case word: "tdpW" has one, "wifi" does not.
		if (field.endsWith(suffix) && /[a-z0-9]$/.test(field.slice(0, -suffix.length))) return entry;
	}
	return null;
}

/** The unit of a field, from its name; '' when it has none. */
export function specUnit(field: string): string {
	return UNIT_OVERRIDES[field] ?? unitSuffix(field)?.[1] ?? '';
}

/** A readable label: known trade terms, else the field name without its unit, split at capitals. */
export function specLabel(field: string): string {
	const known = LABELS[field];
	if (known) return known;
	const suffix = unitSuffix(field)?.[0];
	const stem = suffix ? field.slice(0, -suffix.length) : field;
	const words = stem.replace(/([a-z0-9])([A-Z])/g, '$1 $2').toLowerCase();
	return words.charAt(0).toUpperCase() + words.slice(1);
}

const numberText = (n: number) => upToDecimals(n, 2);

function withUnit(field: string, n: number): string {
	if (field === 'pcieGen') return `PCIe ${n}.0`;
	if (field === 'slotWidth') return `${numberText(n)} slots`;
	// A case that takes no radiator stores 0.
	if (field === 'radiatorMm' && n === 0) return 'none';
	const unit = specUnit(field);
	return unit ? `${numberText(n)} ${unit}` : numberText(n);
}

function connectorsText(counts: Record<string, unknown>): string {
	const parts = Object.entries(counts)
		.filter(([, n]) => typeof n === 'number' && n > 0)
		.map(([name, n]) => `${n} × ${CONNECTOR_NAMES[name] ?? name}`);
	return parts.length > 0 ? parts.join(', ') : 'none';
}

function m2SlotText(slot: unknown): string {
	if (!slot || typeof slot !== 'object') return String(slot);
	const { pcieGen, maxLengthMm } = slot as { pcieGen?: number; maxLengthMm?: number };
	return `PCIe ${pcieGen}.0, up to ${maxLengthMm} mm`;
}

/** A field's value as text, with its unit. */
export function formatSpecValue(field: string, value: unknown): string {
	if (value === null || value === undefined) return '—';
	if (typeof value === 'boolean') return value ? 'Yes' : 'No';
	if (typeof value === 'number') return withUnit(field, value);
	if (field === 'm2Slots' && Array.isArray(value)) {
		return value.length > 0 ? value.map(m2SlotText).join('; ') : 'none';
	}
	if (Array.isArray(value))
		return value.length > 0 ? value.map((v) => formatSpecValue(field, v)).join(', ') : 'none';
	if (typeof value === 'object') return connectorsText(value as Record<string, unknown>);
	const text = String(value);
	return STORAGE_FORM_FACTOR_NAMES[text] ?? VALUE_NAMES[text] ?? text;
}

export interface SpecRow {
	field: string;
	label: string;
	value: string;
}

/** Every spec of a part, in the order of the stored record. */
export function specRows(specs: Record<string, unknown>): SpecRow[] {
	return Object.entries(specs).map(([field, value]) => ({
		field,
		label: specLabel(field),
		value: formatSpecValue(field, value)
	}));
}

/** The few specs that tell parts of a category apart in a result list. */
const KEY_FIELDS: Record<PartCategory, string[]> = {
	cpu: ['socket', 'cores', 'boostClockGhz', 'tdpW'],
	cooler: ['type', 'heightMm', 'radiatorMm', 'ratedHeatW'],
	motherboard: ['socket', 'formFactor', 'memoryType'],
	memory: ['type', 'speedMts', 'casLatency', 'moduleGb', 'modules'],
	storage: ['interface', 'formFactor', 'capacityGb'],
	gpu: ['vramGb', 'lengthMm', 'boardPowerW'],
	psu: ['ratedW', 'formFactor', 'efficiency'],
	case: ['boardFormFactors', 'maxGpuLengthMm', 'maxCoolerHeightMm'],
	fan: ['sizeMm', 'count', 'maxRpm'],
	os: ['edition', 'licence'],
	extra: ['kind']
};

export function keySpecs(category: PartCategory, specs: Record<string, unknown>): SpecRow[] {
	return (KEY_FIELDS[category] ?? [])
		.filter((field) => specs[field] !== undefined)
		.map((field) => ({
			field,
			label: specLabel(field),
			value: formatSpecValue(field, specs[field])
		}));
}
