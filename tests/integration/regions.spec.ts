import { beforeEach, describe, expect, it } from 'vitest';
import { PART_CATEGORIES } from '../../src/lib/domain/types';
import { AuditEvent, Region, RegionTaxRate, User } from '../../src/lib/server/db';
import * as regionReads from '../../src/lib/server/services/region-reads';
import * as regions from '../../src/lib/server/services/regions';
import { countRows, resetDatabase } from '../support/db';

/*
 * Regions with effective-dated tax rates on the real MariaDB. The rate histories are the
 * published ones (sources beside each test); the regions themselves are test fixtures.
 */

const SET_UP = new Date('2022-06-01T09:00:00Z');

async function editor() {
	return User.create({ email: 'ed@example.test', name: 'Eda Ledger', role: 'editor' });
}

async function region(code: string, name: string, currency: string, taxRateBp: number) {
	const row = await Region.create({
		code,
		name,
		currency,
		taxMode: 'inclusive',
		taxRateBp,
		categoryFactorsBp: {}
	});
	// As if the region had been set up in mid-2022, before the rate changes below.
	await Region.update({ createdAt: SET_UP }, { where: { id: row.id }, silent: true });
	return row;
}

function factorsForm(percent: string) {
	return Object.fromEntries(PART_CATEGORIES.map((c) => [`factor.${c}`, percent]));
}

describe('tax rates with effective dates', () => {
	beforeEach(resetDatabase);

	// Luxembourg: standard VAT 17 %, temporarily 16 % for calendar year 2023 only
	// (docs/sources.md 11a "LU 17 %", V2, and note 9 "LU was 16 % in 2023 only"; the exact
	// boundaries 1 Jan 2023 / 1 Jan 2024 are derived from "in 2023 only", D).
	it('gives the rate in force on each day (LU 17 → 16 % in 2023 → 17 %; docs/sources.md 11a V2, note 9)', async () => {
		const me = await editor();
		await region('lu', 'Luxembourg', 'EUR', 1700);
		const now = new Date('2024-03-01T12:00:00Z');
		expect(
			await regions.addTaxRate(
				me.id,
				'lu',
				{ rate: '16', effectiveFrom: '2023-01-01', note: 'Temporary cut for 2023' },
				now
			)
		).toMatchObject({ kind: 'ok' });
		expect(
			await regions.addTaxRate(
				me.id,
				'lu',
				{ rate: '17.00', effectiveFrom: '2024-01-01', note: '' },
				now
			)
		).toMatchObject({ kind: 'ok' });

		expect(await regionReads.taxRateOn('lu', '2022-12-31')).toBe(1700);
		expect(await regionReads.taxRateOn('lu', '2023-01-01')).toBe(1600);
		expect(await regionReads.taxRateOn('lu', '2023-12-31')).toBe(1600);
		expect(await regionReads.taxRateOn('lu', '2024-01-01')).toBe(1700);
		// Before the region was set up nothing is on record.
		expect(await regionReads.taxRateOn('lu', '2022-05-31')).toBeNull();
		expect(await regionReads.taxRateOn('xx', '2024-01-01')).toBeNull();

		const detail = await regionReads.getRegion('lu', now);
		expect(detail?.taxRates.map((r) => [r.effectiveFrom, r.rateBp, r.current])).toEqual([
			['2024-01-01', 1700, true],
			['2023-01-01', 1600, false],
			['2022-06-01', 1700, false]
		]);
		expect(detail?.taxRates[2]?.note).toBe('Rate recorded when the region was set up');
		expect(detail?.taxRates[0]?.recordedBy).toBe('Eda Ledger');
		expect((await AuditEvent.findAll()).map((e) => e.action)).toEqual([
			'region.tax_rate_added',
			'region.tax_rate_added'
		]);
	});

	// Finland: standard VAT 24 % → 25.5 % from September 2024 (docs/sources.md note 9, V2;
	// the day, 1 September 2024, and the previous 24 % are from memory, M).
	it('keeps the cached column on the old rate until a future rate takes effect (FI 24 → 25.5 % from Sep 2024; note 9)', async () => {
		const me = await editor();
		const fi = await region('fi', 'Finland', 'EUR', 2400);
		const before = new Date('2024-08-15T12:00:00Z');
		expect(
			await regions.addTaxRate(
				me.id,
				'fi',
				{ rate: '25.50 %', effectiveFrom: '2024-09-01' },
				before
			)
		).toMatchObject({ kind: 'ok' });

		await fi.reload();
		expect(fi.taxRateBp).toBe(2400);
		expect(await regionReads.getRegion('fi', before)).toMatchObject({
			taxRateBp: 2400,
			taxRateSince: '2022-06-01',
			nextTaxRate: { rateBp: 2550, effectiveFrom: '2024-09-01' }
		});
		expect(await regions.syncCurrentTaxRates(before)).toEqual([]);

		const after = new Date('2024-09-01T00:00:01Z');
		expect(await regionReads.getRegion('fi', after)).toMatchObject({
			taxRateBp: 2550,
			taxRateSince: '2024-09-01',
			nextTaxRate: null
		});
		expect(await regions.syncCurrentTaxRates(after)).toEqual(['fi']);
		await fi.reload();
		expect(fi.taxRateBp).toBe(2550);
		expect(await regions.syncCurrentTaxRates(after)).toEqual([]);
		expect(
			await AuditEvent.count({ where: { action: 'region.tax_rate_in_force', subjectId: 'fi' } })
		).toBe(1);
	});

	it('refuses bad rates and dates with field messages and writes nothing', async () => {
		const me = await editor();
		await region('lu', 'Luxembourg', 'EUR', 1700);
		const now = new Date('2024-03-01T12:00:00Z');
		const cases: Array<[Record<string, string>, string]> = [
			[{ rate: '17.125', effectiveFrom: '2024-01-01' }, 'rate'],
			[{ rate: '-1', effectiveFrom: '2024-01-01' }, 'rate'],
			[{ rate: '75', effectiveFrom: '2024-01-01' }, 'rate'],
			[{ rate: 'seventeen', effectiveFrom: '2024-01-01' }, 'rate'],
			[{ rate: '17', effectiveFrom: '2024-02-30' }, 'effectiveFrom'],
			[{ rate: '17', effectiveFrom: '01/01/2024' }, 'effectiveFrom'],
			[{ rate: '17', effectiveFrom: '2024-01-01', note: 'x'.repeat(201) }, 'note'],
			[{ rate: '17', effectiveFrom: '2024-01-01', regionId: '9' }, '_form']
		];
		for (const [input, field] of cases) {
			const outcome = await regions.addTaxRate(me.id, 'lu', input, now);
			expect(outcome.kind, JSON.stringify(input)).toBe('invalid');
			if (outcome.kind === 'invalid')
				expect(Object.keys(outcome.issues), JSON.stringify(input)).toEqual([field]);
		}
		expect(
			await regions.addTaxRate(me.id, 'xx', { rate: '17', effectiveFrom: '2024-01-01' }, now)
		).toEqual({ kind: 'not_found' });
		await regions.addTaxRate(me.id, 'lu', { rate: '16', effectiveFrom: '2023-01-01' }, now);
		const sameDay = await regions.addTaxRate(
			me.id,
			'lu',
			{ rate: '15', effectiveFrom: '2023-01-01' },
			now
		);
		expect(sameDay).toMatchObject({
			kind: 'invalid',
			issues: { effectiveFrom: [expect.stringMatching(/already starts on 2023-01-01/)] }
		});
		expect(await countRows('region_tax_rates')).toBe(2);
		expect(await countRows('audit_events')).toBe(1);
	});

	it('removes a mistaken rate and re-derives the current one, but never leaves today without a rate', async () => {
		const me = await editor();
		const lu = await region('lu', 'Luxembourg', 'EUR', 1700);
		const now = new Date('2024-03-01T12:00:00Z');
		await regions.addTaxRate(
			me.id,
			'lu',
			{ rate: '18', effectiveFrom: '2024-02-01', note: 'typo' },
			now
		);
		await lu.reload();
		expect(lu.taxRateBp).toBe(1800);
		const rows = await RegionTaxRate.findAll({ order: [['effectiveFrom', 'ASC']] });
		const [baseline, typo] = rows;
		if (!baseline || !typo) throw new Error('expected two rows');

		expect(await regions.removeTaxRate(me.id, 'lu', typo.id, now)).toEqual({ kind: 'ok' });
		await lu.reload();
		expect(lu.taxRateBp).toBe(1700);
		expect(await regions.removeTaxRate(me.id, 'lu', baseline.id, now)).toMatchObject({
			kind: 'conflict',
			message: expect.stringMatching(/only rate/)
		});

		await regions.addTaxRate(me.id, 'lu', { rate: '16', effectiveFrom: '2025-01-01' }, now);
		expect(await regions.removeTaxRate(me.id, 'lu', baseline.id, now)).toMatchObject({
			kind: 'conflict',
			message: expect.stringMatching(/no rate in force today/)
		});
		expect(await regions.removeTaxRate(me.id, 'lu', 999_999, now)).toEqual({ kind: 'not_found' });
		expect((await AuditEvent.findAll({ order: [['id', 'ASC']] })).map((e) => e.action)).toEqual([
			'region.tax_rate_added',
			'region.tax_rate_removed',
			'region.tax_rate_added'
		]);
	});
});

describe('region settings', () => {
	beforeEach(resetDatabase);

	it('updates currency, tax mode and factors (percent ↔ basis points) with an audit event', async () => {
		const me = await editor();
		await region('de', 'Germany', 'EUR', 1900);
		const outcome = await regions.updateSettings(me.id, 'de', {
			name: 'Germany',
			currency: 'eur',
			taxMode: 'inclusive',
			...factorsForm('100'),
			'factor.gpu': '104.00 %',
			'factor.case': '97.5'
		});
		expect(outcome).toEqual({ kind: 'ok', changed: true });
		const de = await regionReads.getRegion('de');
		expect(de?.categoryFactorsBp.gpu).toBe(10400);
		expect(de?.categoryFactorsBp.case).toBe(9750);
		expect(de?.categoryFactorsBp.cpu).toBe(10000);
		const event = await AuditEvent.findOne({ where: { action: 'region.updated' } });
		expect(event?.before).toMatchObject({ currency: 'EUR', categoryFactorsBp: { gpu: 10000 } });
		expect(event?.after).toMatchObject({ categoryFactorsBp: { gpu: 10400, case: 9750 } });
		const again = await regions.updateSettings(me.id, 'de', {
			name: 'Germany',
			currency: 'EUR',
			taxMode: 'inclusive',
			...factorsForm('100'),
			'factor.gpu': '104',
			'factor.case': '97.50'
		});
		expect(again).toEqual({ kind: 'ok', changed: false });
	});

	it('refuses an unknown currency, a bad tax mode and absurd factors, writing nothing', async () => {
		const me = await editor();
		await region('de', 'Germany', 'EUR', 1900);
		const unknown = await regions.updateSettings(me.id, 'de', {
			name: 'Germany',
			currency: 'XYZ',
			taxMode: 'inclusive',
			...factorsForm('100')
		});
		expect(unknown).toEqual({
			kind: 'invalid',
			issues: { currency: ['Unknown currency code "XYZ" (ISO 4217).'] }
		});
		const bad = await regions.updateSettings(me.id, 'de', {
			name: '',
			currency: 'EUR',
			taxMode: 'sometimes',
			...factorsForm('100'),
			'factor.gpu': '900',
			'factor.cpu': '1.005',
			'factor.fan': '-3'
		});
		expect(bad.kind).toBe('invalid');
		if (bad.kind === 'invalid')
			expect(Object.keys(bad.issues).sort()).toEqual([
				'factor.cpu',
				'factor.fan',
				'factor.gpu',
				'name',
				'taxMode'
			]);
		if (bad.kind === 'invalid')
			expect(bad.issues['factor.gpu']).toEqual(['Use a value from 25.00 % to 400.00 %.']);
		const missing = await regions.updateSettings(me.id, 'de', {
			name: 'Germany',
			currency: 'EUR',
			taxMode: 'inclusive'
		});
		expect(missing.kind).toBe('invalid');
		expect(
			await regions.updateSettings(me.id, 'zz', {
				name: 'Z',
				currency: 'EUR',
				taxMode: 'inclusive',
				...factorsForm('100')
			})
		).toEqual({ kind: 'not_found' });
		expect((await Region.findOne({ where: { code: 'de' } }))?.currency).toBe('EUR');
		expect(await countRows('audit_events')).toBe(0);
	});

	it('lists regions for the public API with the rate in force and every factor', async () => {
		await region('de', 'Germany', 'EUR', 1900);
		await Region.create({
			code: 'us',
			name: 'United States',
			currency: 'USD',
			taxMode: 'exclusive',
			taxRateBp: 0,
			categoryFactorsBp: { gpu: 9800 }
		});
		const listed = await regionReads.publicRegions();
		expect(listed.map((r) => r.code)).toEqual(['de', 'us']);
		expect(listed[1]).toEqual({
			code: 'us',
			name: 'United States',
			currency: 'USD',
			taxMode: 'exclusive',
			taxRateBp: 0,
			taxRateSince: null,
			nextTaxRate: null,
			categoryFactorsBp: Object.fromEntries(
				PART_CATEGORIES.map((c) => [c, c === 'gpu' ? 9800 : 10000])
			)
		});
	});
});
