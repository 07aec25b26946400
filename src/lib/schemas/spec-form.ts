import type { z } from 'zod';
import type { PartCategory } from '$lib/domain/types';
import { SPEC_SCHEMAS } from './part-specs';

/*
 * The per-category part form, generated from the spec schemas (SPEC_SCHEMAS), so a
 * field added to a schema shows up in the form without another edit. Descriptors are
 * plain data: the server builds them and the page renders them, so zod stays out of the
 * browser bundle. Form names are `spec.<path>` (`spec.powerConnectors.pin6`,
 * `spec.m2Slots.0.pcieGen`); multi-choice fields repeat their name once per ticked box.
 */

interface Base {
	/** Key inside its parent object (e.g. "pin6" within powerConnectors). */
	key: string;
	label: string;
	optional: boolean;
}

export type SpecField =
	| (Base & { kind: 'number'; integer: boolean; min?: number; max?: number; unit?: string })
	| (Base & { kind: 'select'; options: string[]; numeric: boolean })
	| (Base & { kind: 'checkbox' })
	| (Base & { kind: 'multi'; options: string[] })
	| (Base & { kind: 'text'; maxLength?: number })
	| (Base & { kind: 'group'; fields: SpecField[] })
	| (Base & { kind: 'rows'; maxRows: number; fields: SpecField[] });

/** Names that a camelCase split cannot produce; everything else is derived from the key. */
const LABELS: Record<string, string> = {
	pin6: '6-pin',
	pin8: '8-pin',
	h12v2x6: '12V-2x6',
	eps8: 'EPS 8-pin',
	m2Slots: 'M.2 slots',
	pcieGen: 'PCIe generation',
	casLatency: 'CAS latency',
	atx3: 'ATX 3.x',
	wifi: 'Wi-Fi',
	bays25: '2.5-inch bays',
	bays35: '3.5-inch bays',
	tdpW: 'TDP (W)',
	vramGb: 'VRAM (GB)',
	maxMemoryGb: 'Maximum memory (GB)',
	memoryTypes: 'Memory types',
	boardFormFactors: 'Board form factors',
	psuFormFactors: 'PSU form factors',
	powerConnectors: 'Power connectors',
	connectors: 'Connectors',
	ratedW: 'Rated power (W)',
	readMbs: 'Read speed (MB/s)',
	writeMbs: 'Write speed (MB/s)',
	speedMts: 'Speed (MT/s)',
	voltage: 'Voltage (V)',
	sataPorts: 'SATA ports',
	maxGpuLengthMm: 'Maximum graphics card length (mm)',
	maxCoolerHeightMm: 'Maximum cooler height (mm)',
	moduleGb: 'Module size (GB)',
	maxRpm: 'Maximum speed (rpm)',
	slotWidth: 'Slot width (slots)',
	maxLengthMm: 'Maximum length (mm)'
};

/** Trailing unit words in spec names, as the form shows them. */
const UNITS: Array<[RegExp, string]> = [
	[/Mm$/, 'mm'],
	[/Ghz$/, 'GHz'],
	[/Gb$/, 'GB'],
	[/Mts$/, 'MT/s'],
	[/Mbs$/, 'MB/s'],
	[/Rpm$/, 'rpm'],
	[/W$/, 'W']
];

/** "boostClockGhz" → "Boost clock (GHz)". */
export function specLabel(key: string): string {
	const known = LABELS[key];
	if (known) return known;
	let stem = key;
	let unit: string | undefined;
	for (const [pattern, name] of UNITS) {
		if (pattern.test(stem)) {
			stem = stem.replace(pattern, '');
			unit = name;
			break;
		}
	}
	const words = stem.replace(/([a-z0-9])([A-Z])/g, '$1 $2').toLowerCase();
	const text = words.charAt(0).toUpperCase() + words.slice(1);
	return unit ? `${text} (${unit})` : text;
}

function unitOf(key: string): string | undefined {
	return UNITS.find(([pattern]) => pattern.test(key))?.[1];
}

type AnySchema = z.ZodType & { def: { type: string } & Record<string, unknown> } & Record<
		string,
		unknown
	>;

function unwrapOptional(schema: AnySchema): { inner: AnySchema; optional: boolean } {
	if (schema.def.type === 'optional') {
		return { inner: (schema as unknown as { unwrap(): AnySchema }).unwrap(), optional: true };
	}
	return { inner: schema, optional: false };
}

function literalValues(schema: AnySchema): unknown[] | null {
	if (schema.def.type === 'literal') return [...((schema.def.values as unknown[]) ?? [])];
	if (schema.def.type === 'enum')
		return [...((schema as unknown as { options: unknown[] }).options ?? [])];
	if (schema.def.type === 'union') {
		const options = schema.def.options as AnySchema[];
		const values = options.map(literalValues);
		return values.every((v) => v !== null) ? values.flat() : null;
	}
	return null;
}

function maxLength(schema: AnySchema): number | undefined {
	const checks =
		(schema.def.checks as
			Array<{ _zod: { def: { check: string; maximum?: number } } }> | undefined) ?? [];
	return checks.find((c) => c._zod.def.check === 'max_length')?._zod.def.maximum;
}

function describe(key: string, schema: AnySchema): SpecField {
	const { inner, optional } = unwrapOptional(schema);
	const label = specLabel(key);
	const type = inner.def.type;
	if (type === 'number') {
		const n = inner as unknown as {
			minValue: number | null;
			maxValue: number | null;
			isInt: boolean;
		};
		const max =
			n.maxValue !== null && n.maxValue < Number.MAX_SAFE_INTEGER ? n.maxValue : undefined;
		const min =
			n.minValue !== null && n.minValue > Number.MIN_SAFE_INTEGER ? n.minValue : undefined;
		return { kind: 'number', key, label, optional, integer: n.isInt, min, max, unit: unitOf(key) };
	}
	if (type === 'boolean') return { kind: 'checkbox', key, label, optional };
	if (type === 'string') return { kind: 'text', key, label, optional, maxLength: maxLength(inner) };
	if (type === 'object') {
		const shape = (inner as unknown as { shape: Record<string, AnySchema> }).shape;
		return {
			kind: 'group',
			key,
			label,
			optional,
			fields: Object.entries(shape).map(([k, s]) => describe(k, s))
		};
	}
	if (type === 'array') {
		const element = (inner as unknown as { element: AnySchema }).element;
		const values = literalValues(element);
		if (values) return { kind: 'multi', key, label, optional, options: values.map(String) };
		const shape = (element as unknown as { shape?: Record<string, AnySchema> }).shape;
		if (shape) {
			return {
				kind: 'rows',
				key,
				label,
				optional,
				maxRows: maxLength(inner) ?? 8,
				fields: Object.entries(shape).map(([k, s]) => describe(k, s))
			};
		}
	}
	const values = literalValues(inner);
	if (values) {
		return {
			kind: 'select',
			key,
			label,
			optional,
			options: values.map(String),
			numeric: values.every((v) => typeof v === 'number')
		};
	}
	throw new Error(`spec-form: no form control for ${key} (${type})`);
}

/** The form fields of a category, in the schema's order. */
export function specFields(category: PartCategory): SpecField[] {
	const shape = (SPEC_SCHEMAS[category] as unknown as { shape: Record<string, AnySchema> }).shape;
	return Object.entries(shape).map(([key, schema]) => describe(key, schema));
}

const NUMBER_TEXT = /^-?\d+(?:\.\d+)?$/;

/**
 * Form values → a specs object for validateSpecs. Empty fields are left out (the schema
 * then says "Required." where a value is needed); text that is not a number is kept as
 * typed, so the schema refuses it and the form shows it again. Repeated rows (M.2 slots)
 * with every field empty are dropped, so a form can always offer a few blank rows.
 */
export function specsFromForm(
	fields: SpecField[],
	values: (name: string) => string[],
	prefix = 'spec'
): Record<string, unknown> {
	const specs: Record<string, unknown> = {};
	convertInto(fields, values, prefix, specs);
	return specs;
}

function convertInto(
	fields: SpecField[],
	values: (name: string) => string[],
	prefix: string,
	target: Record<string, unknown>
) {
	for (const field of fields) {
		const name = `${prefix}.${field.key}`;
		const first = (values(name)[0] ?? '').trim();
		switch (field.kind) {
			case 'number':
				if (first === '') break;
				target[field.key] = NUMBER_TEXT.test(first) ? Number(first) : first;
				break;
			case 'select':
				if (first !== '')
					target[field.key] = field.numeric && NUMBER_TEXT.test(first) ? Number(first) : first;
				break;
			case 'text':
				if (first !== '') target[field.key] = first;
				break;
			case 'checkbox':
				target[field.key] = first === 'on' || first === 'true';
				break;
			case 'multi':
				target[field.key] = values(name)
					.map((v) => v.trim())
					.filter((v) => v !== '');
				break;
			case 'group': {
				const inner: Record<string, unknown> = {};
				convertInto(field.fields, values, name, inner);
				target[field.key] = inner;
				break;
			}
			case 'rows': {
				const rows: Record<string, unknown>[] = [];
				for (let i = 0; i < field.maxRows; i++) {
					const rowName = `${name}.${i}`;
					const blank = field.fields.every(
						(f) => (values(`${rowName}.${f.key}`)[0] ?? '').trim() === ''
					);
					if (blank) continue;
					const row: Record<string, unknown> = {};
					// Kept rows close up, so issue paths count rows as the re-shown form lists them.
					convertInto(field.fields, values, rowName, row);
					rows.push(row);
				}
				target[field.key] = rows;
				break;
			}
		}
	}
}

/** The text a form control shows for a stored or drafted value. */
export function formText(value: unknown): string {
	if (value === undefined || value === null) return '';
	return String(value);
}
