import { describe, expect, it } from 'vitest';
import { SPEC_SCHEMAS, parseSpecs } from '$lib/schemas/part-specs';
import { PART_CATEGORIES } from '$lib/domain/types';

// The spec-field contract of docs/architecture.md: invented example values, real field names and units.
describe('part spec schemas', () => {
	it('has a schema for every catalog category', () => {
		for (const category of PART_CATEGORIES) expect(SPEC_SCHEMAS[category]).toBeDefined();
	});

	const gpu = {
		chip: 'Example chip',
		vramGb: 12,
		lengthMm: 336,
		slotWidth: 2.5,
		boardPowerW: 285,
		powerConnectors: { pin6: 0, pin8: 0, h12v2x6: 1 },
		pcieGen: 4
	};

	it('accepts a complete graphics card record', () => {
		expect(parseSpecs('gpu', gpu).success).toBe(true);
	});

	it('rejects an unknown field, so a typo in an import is never silently dropped', () => {
		const result = parseSpecs('gpu', { ...gpu, lenghtMm: 300 });
		expect(result.success).toBe(false);
		expect(result.error?.issues[0]?.code).toBe('unrecognized_keys');
	});

	it('rejects a memory type that is not DDR4 or DDR5', () => {
		const result = parseSpecs('memory', {
			type: 'DDR3',
			modules: 2,
			moduleGb: 16,
			speedMts: 6000,
			casLatency: 30,
			voltage: 1.35
		});
		expect(result.success).toBe(false);
		expect(result.error?.issues[0]?.path).toEqual(['type']);
	});

	it('requires a height for an air cooler and a radiator size for a liquid one', () => {
		const base = { sockets: ['AM5'], ratedHeatW: 220 };
		expect(parseSpecs('cooler', { ...base, type: 'air', heightMm: 158 }).success).toBe(true);
		expect(parseSpecs('cooler', { ...base, type: 'air' }).success).toBe(false);
		expect(parseSpecs('cooler', { ...base, type: 'liquid', radiatorMm: 360 }).success).toBe(true);
		expect(parseSpecs('cooler', { ...base, type: 'liquid', heightMm: 50 }).success).toBe(false);
	});

	it('accepts only M.2 lengths that exist (30/42/60/80/110 mm; PCI-SIG M.2 naming, V2)', () => {
		const board = {
			socket: 'AM5',
			chipset: 'X-example',
			formFactor: 'ATX',
			memoryType: 'DDR5',
			memorySlots: 4,
			maxMemoryGb: 192,
			sataPorts: 4,
			wifi: true
		};
		expect(
			parseSpecs('motherboard', { ...board, m2Slots: [{ pcieGen: 5, maxLengthMm: 80 }] }).success
		).toBe(true);
		expect(
			parseSpecs('motherboard', { ...board, m2Slots: [{ pcieGen: 5, maxLengthMm: 75 }] }).success
		).toBe(false);
	});
});
