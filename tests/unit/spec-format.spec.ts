import { describe, expect, it } from 'vitest';
import {
	formatSpecValue,
	keySpecs,
	specLabel,
	specRows,
	specUnit
} from '$lib/components/parts/spec-format';
import { SPEC_SCHEMAS } from '$lib/schemas/part-specs';
import { demoParts } from '$lib/server/db/seeders/demo-data';

// Units come from the field names of the spec contract (docs/architecture.md "Spec fields").
describe('spec units and labels from field names', () => {
	it.each([
		['lengthMm', 'mm'],
		['maxGpuLengthMm', 'mm'],
		['boardPowerW', 'W'],
		['tdpW', 'W'],
		['ratedW', 'W'],
		['speedMts', 'MT/s'],
		['readMbs', 'MB/s'],
		['vramGb', 'GB'],
		['boostClockGhz', 'GHz'],
		['maxRpm', 'rpm'],
		['voltage', 'V'],
		['wifi', ''],
		['cores', ''],
		['bays25', '']
	])('%s → "%s"', (field, unit) => {
		expect(specUnit(field)).toBe(unit);
	});

	it('labels fields without their unit suffix', () => {
		expect(specLabel('lengthMm')).toBe('Length');
		expect(specLabel('boardPowerW')).toBe('Board power');
		expect(specLabel('heightMm')).toBe('Height');
		expect(specLabel('baseClockGhz')).toBe('Base clock');
		expect(specLabel('maxGpuLengthMm')).toBe('Graphics card clearance');
	});

	it('writes values with their units and the trade’s names', () => {
		expect(formatSpecValue('lengthMm', 336)).toBe('336 mm');
		expect(formatSpecValue('boardPowerW', 300)).toBe('300 W');
		expect(formatSpecValue('speedMts', 6000)).toBe('6,000 MT/s');
		expect(formatSpecValue('boostClockGhz', 5.4)).toBe('5.4 GHz');
		expect(formatSpecValue('pcieGen', 5)).toBe('PCIe 5.0');
		expect(formatSpecValue('slotWidth', 2.5)).toBe('2.5 slots');
		expect(formatSpecValue('radiatorMm', 0)).toBe('none');
		expect(formatSpecValue('wifi', true)).toBe('Yes');
		expect(formatSpecValue('formFactor', 'm2-2280')).toBe('M.2 2280');
		expect(formatSpecValue('interface', 'nvme')).toBe('NVMe');
		expect(formatSpecValue('boardFormFactors', ['ATX', 'microATX'])).toBe('ATX, microATX');
		expect(formatSpecValue('powerConnectors', { pin6: 0, pin8: 2, h12v2x6: 1 })).toBe(
			'2 × 8-pin PCIe, 1 × 12V-2x6'
		);
		expect(formatSpecValue('powerConnectors', { pin6: 0, pin8: 0, h12v2x6: 0 })).toBe('none');
		expect(
			formatSpecValue('m2Slots', [
				{ pcieGen: 5, maxLengthMm: 80 },
				{ pcieGen: 4, maxLengthMm: 80 }
			])
		).toBe('PCIe 5.0, up to 80 mm; PCIe 4.0, up to 80 mm');
	});

	it('gives every demo part a row per stored spec and some key specs, with no raw object text', () => {
		for (const part of demoParts) {
			expect(SPEC_SCHEMAS[part.category].safeParse(part.specs).success).toBe(true);
			const rows = specRows(part.specs);
			expect(rows.map((r) => r.field)).toEqual(Object.keys(part.specs));
			for (const row of rows) expect(row.value).not.toMatch(/\[object|undefined|NaN/);
			expect(keySpecs(part.category, part.specs).length, part.slug).toBeGreaterThan(0);
		}
	});
});
