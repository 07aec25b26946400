import { describe, expect, it } from 'vitest';
import { minorToDecimal, parseAmount } from '../../src/lib/domain/money';
import { slugify, startsLikeFormula, validateSpecs } from '../../src/lib/schemas/catalog-upkeep';
import { bpToPercent, percentToBp } from '../../src/lib/schemas/regions';
import { specFields, specLabel, specsFromForm } from '../../src/lib/schemas/spec-form';

describe('amounts in minor units (domain/money.ts, read as a point region writes them)', () => {
	// Exponents per ISO 4217 List One (docs/sources.md 10a, V): JPY 0, USD 2, KWD 3.
	it.each([
		['129.99', 2, 'USD', 12999],
		['129.9', 2, 'USD', 12990],
		['129', 2, 'USD', 12900],
		['0.01', 2, 'USD', 1],
		['77838', 0, 'JPY', 77838],
		['1.234', 3, 'KWD', 1234],
		['1.2', 3, 'KWD', 1200]
	])('%s %s → %i minor units', (text, _digits, currency, expected) => {
		// `digits` is the ISO exponent the expectation was worked out with (10a).
		expect(parseAmount(text as string, currency as string)).toEqual({
			ok: true,
			amountMinor: expected
		});
	});

	it.each([
		['12.345', 2, 'USD', 'USD allows at most 2 decimals, e.g. 129.99.'],
		['100.5', 0, 'JPY', 'JPY has no minor unit: enter a whole amount, e.g. 15800.'],
		['1.2345', 3, 'KWD', 'KWD allows at most 3 decimals, e.g. 129.990.'],
		['12,99', 2, 'EUR', 'Enter an amount in EUR with digits and a point, e.g. 129.99.'],
		['-5', 2, 'USD', 'Enter an amount in USD with digits and a point, e.g. 129.99.'],
		['1e3', 2, 'USD', 'Enter an amount in USD with digits and a point, e.g. 129.99.'],
		['', 2, 'USD', 'Enter an amount in USD with digits and a point, e.g. 129.99.']
	])('refuses %j in %s', (text, _digits, currency, message) => {
		expect(parseAmount(text as string, currency as string)).toMatchObject({
			ok: false,
			message
		});
	});

	it('goes back to the decimal text a form shows', () => {
		expect(minorToDecimal(12999, 'USD')).toBe('129.99');
		expect(minorToDecimal(5, 'USD')).toBe('0.05');
		expect(minorToDecimal(77838, 'JPY')).toBe('77838');
		expect(minorToDecimal(1234, 'KWD')).toBe('1.234');
	});
});

describe('percent ↔ basis points (1 bp = 0.01 %)', () => {
	it.each([
		['104.00', 10400],
		['104', 10400],
		['104.00 %', 10400],
		['97.5', 9750],
		['19', 1900],
		['25.5', 2550],
		['0', 0]
	])('%j → %i', (text, bp) => {
		expect(percentToBp(text)).toBe(bp);
		expect(percentToBp(bpToPercent(bp))).toBe(bp);
	});

	it('refuses more than two decimals, signs and words', () => {
		for (const text of ['9.975', '-1', '+5', 'ten', '', '1,5'])
			expect(percentToBp(text)).toBeNull();
	});

	it('shows two decimals', () => {
		expect(bpToPercent(10400)).toBe('104.00');
		expect(bpToPercent(2550)).toBe('25.50');
		expect(bpToPercent(5)).toBe('0.05');
	});
});

describe('slugs and formula-like text', () => {
	it('makes a slug from brand and model', () => {
		expect(slugify('Brückner', 'Ærø 5 — Pro')).toBe('bruckner-aero-5-pro');
		expect(slugify('Example Graphics', 'Lumen 60 "Dual"')).toBe('example-graphics-lumen-60-dual');
		expect(slugify('---')).toBe('');
	});

	it('spots cells a spreadsheet would run', () => {
		for (const text of ['=1', '+1', '-1', '@A1', '\t1', '\r1', ' =1'])
			expect(startsLikeFormula(text)).toBe(true);
		for (const text of ['a=1', '1-2', '', ' ', 'x@y']) expect(startsLikeFormula(text)).toBe(false);
	});
});

describe('the per-category form generated from the spec schemas', () => {
	it('describes every control kind the schemas need', () => {
		const gpu = specFields('gpu');
		expect(gpu.map((f) => [f.key, f.kind])).toEqual([
			['chip', 'text'],
			['vramGb', 'number'],
			['lengthMm', 'number'],
			['slotWidth', 'number'],
			['boardPowerW', 'number'],
			['powerConnectors', 'group'],
			['pcieGen', 'select']
		]);
		expect(gpu.find((f) => f.key === 'pcieGen')).toMatchObject({
			options: ['3', '4', '5'],
			numeric: true
		});
		expect(gpu.find((f) => f.key === 'lengthMm')).toMatchObject({
			label: 'Length (mm)',
			integer: true,
			unit: 'mm'
		});
		expect(gpu.find((f) => f.key === 'slotWidth')).toMatchObject({ integer: false, max: 5 });
		const cpu = specFields('cpu');
		expect(cpu.find((f) => f.key === 'memoryTypes')).toMatchObject({
			kind: 'multi',
			options: ['DDR4', 'DDR5']
		});
		expect(cpu.find((f) => f.key === 'packagePowerW')).toMatchObject({
			kind: 'number',
			optional: true
		});
		expect(cpu.find((f) => f.key === 'bundledCooler')).toMatchObject({ kind: 'checkbox' });
		const board = specFields('motherboard');
		expect(board.find((f) => f.key === 'm2Slots')).toMatchObject({ kind: 'rows', maxRows: 8 });
		expect(specFields('case').find((f) => f.key === 'boardFormFactors')).toMatchObject({
			kind: 'multi',
			options: ['ATX', 'microATX', 'Mini-ITX', 'E-ATX']
		});
		expect(specFields('cooler').find((f) => f.key === 'radiatorMm')).toMatchObject({
			kind: 'select',
			optional: true,
			options: ['120', '140', '240', '280', '360', '420']
		});
		expect(specLabel('boostClockGhz')).toBe('Boost clock (GHz)');
		expect(specLabel('maxGpuLengthMm')).toBe('Maximum graphics card length (mm)');
		expect(specLabel('ratedHeatW')).toBe('Rated heat (W)');
	});

	function form(entries: Array<[string, string]>) {
		return (name: string) => entries.filter(([k]) => k === name).map(([, v]) => v);
	}

	it('turns form values into specs the schema accepts, dropping blank repeated rows', () => {
		const specs = specsFromForm(
			specFields('motherboard'),
			form([
				['spec.socket', 'AM5'],
				['spec.chipset', 'B650'],
				['spec.formFactor', 'microATX'],
				['spec.memoryType', 'DDR5'],
				['spec.memorySlots', '4'],
				['spec.maxMemoryGb', '192'],
				['spec.m2Slots.0.pcieGen', ''],
				['spec.m2Slots.0.maxLengthMm', ''],
				['spec.m2Slots.1.pcieGen', '5'],
				['spec.m2Slots.1.maxLengthMm', '80'],
				['spec.sataPorts', '4'],
				['spec.wifi', 'on']
			])
		);
		expect(specs).toEqual({
			socket: 'AM5',
			chipset: 'B650',
			formFactor: 'microATX',
			memoryType: 'DDR5',
			memorySlots: 4,
			maxMemoryGb: 192,
			m2Slots: [{ pcieGen: 5, maxLengthMm: 80 }],
			sataPorts: 4,
			wifi: true
		});
		expect(validateSpecs('motherboard', specs)).toEqual({ ok: true, specs });
	});

	it('keeps text that is not a number, so the schema names the field', () => {
		const specs = specsFromForm(
			specFields('fan'),
			form([
				['spec.sizeMm', '120'],
				['spec.count', 'two'],
				['spec.maxRpm', '']
			])
		);
		expect(specs).toEqual({ sizeMm: 120, count: 'two' });
		expect(validateSpecs('fan', specs)).toEqual({
			ok: false,
			issues: [
				{ path: 'count', message: 'Enter a number.' },
				{ path: 'maxRpm', message: 'Required.' }
			]
		});
		expect(validateSpecs('fan', { sizeMm: 120, count: 1.5, maxRpm: 1000 })).toEqual({
			ok: false,
			issues: [{ path: 'count', message: 'Enter a whole number.' }]
		});
		expect(validateSpecs('fan', null)).toEqual({
			ok: false,
			issues: [{ path: '', message: 'Must be an object of fields.' }]
		});
		const cpu = specsFromForm(
			specFields('cpu'),
			form([
				['spec.memoryTypes', 'DDR4'],
				['spec.memoryTypes', 'DDR5']
			])
		);
		expect(cpu.memoryTypes).toEqual(['DDR4', 'DDR5']);
		expect(cpu.bundledCooler).toBe(false);
	});
});
