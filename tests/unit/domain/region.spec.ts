import { describe, expect, it } from 'vitest';
import { convertAt, divideHalfEven, money, parseDecimal, ratioToDecimal } from '$lib/domain/money';
import {
	MissingRateError,
	addTax,
	adjustToRegion,
	convertThroughEur,
	crossRate,
	priceOption,
	stripTax,
	type OptionInput,
	type RatesPerEur,
	type RegionPricing
} from '$lib/domain/region';

/*
 * Sources (docs/sources.md):
 * 10c ECB euro foreign exchange reference rates, 2 January 2024 (V).
 * 10d worked conversions, half-even (D), and €100.00 net × 1.19 → €119.00 (D).
 * 11a EU standard VAT: DE 19 %, HU 27 % (EC "VAT rates applied in the Member States"; V2).
 * 11b UK VAT 20 % (GOV.UK, V2); AU GST 10 % (ATO, V).
 * 11c EU shelf prices include VAT (Directive 98/6/EC Art. 2(a), V); US prices are shown
 *     before sales tax (common practice, M).
 * Everything else is a worked example (D) with its arithmetic beside it. Category factors are
 * parameters of the computation, not published values.
 */
const ECB_2024_01_02: RatesPerEur = {
	USD: { ratePerEur: '1.0956', asOf: '2024-01-02' },
	JPY: { ratePerEur: '155.68', asOf: '2024-01-02' },
	GBP: { ratePerEur: '0.86645', asOf: '2024-01-02' },
	AUD: { ratePerEur: '1.6147', asOf: '2024-01-02' },
	HUF: { ratePerEur: '382.10', asOf: '2024-01-02' }
};

const eur = (minor: number) => money(minor, 'EUR');

// Tax display per 11c; tax rates per 11a/11b.
const DE: RegionPricing = {
	code: 'de',
	currency: 'EUR',
	taxMode: 'inclusive',
	taxRateBp: 1900,
	categoryFactorsBp: {}
};
const US: RegionPricing = {
	code: 'us',
	currency: 'USD',
	taxMode: 'exclusive',
	taxRateBp: 0,
	categoryFactorsBp: {}
};
const UK: RegionPricing = {
	code: 'uk',
	currency: 'GBP',
	taxMode: 'inclusive',
	taxRateBp: 2000,
	categoryFactorsBp: { gpu: 10400 }
};
const AU: RegionPricing = {
	code: 'au',
	currency: 'AUD',
	taxMode: 'inclusive',
	taxRateBp: 1000,
	categoryFactorsBp: {}
};
const JP_NO_TAX: RegionPricing = {
	code: 'jp',
	currency: 'JPY',
	taxMode: 'exclusive',
	taxRateBp: 0,
	categoryFactorsBp: {}
};

describe('tax in basis points, integers only', () => {
	it('€100.00 net + 19 % DE VAT = €119.00 (docs/sources.md 10d, D; DE 19 % 11a, V2)', () => {
		// 10000 × (10000 + 1900) / 10000 = 11900 minor units
		expect(addTax(eur(10000), 1900)).toEqual(eur(11900));
	});

	it('€119.00 gross at 19 % DE VAT strips to €100.00 net (D: 11900 × 10000 / 11900 = 10000)', () => {
		expect(stripTax(eur(11900), 1900)).toEqual(eur(10000));
	});

	it('£100.00 net + 20 % UK VAT = £120.00 (11b, V2); HUF 100.00 + 27 % = HUF 127.00 (11a HU, V2); A$100.00 + 10 % GST = A$110.00 (11b AU, V)', () => {
		expect(addTax(money(10000, 'GBP'), 2000)).toEqual(money(12000, 'GBP'));
		expect(addTax(money(10000, 'HUF'), 2700)).toEqual(money(12700, 'HUF'));
		expect(addTax(money(10000, 'AUD'), 1000)).toEqual(money(11000, 'AUD'));
	});

	it('rounds tax half-even at the minor unit (D)', () => {
		// €0.50 × 1.19 = 0.595 → 0.60 (nearest, not a tie); €0.25 × 1.10 = 0.275 → 0.28 (tie → even 8)
		expect(addTax(eur(50), 1900)).toEqual(eur(60));
		expect(addTax(eur(25), 1000)).toEqual(eur(28));
		// €0.05 × 1.10 = 0.055 → 0.06 (tie → even 6); €0.15 × 1.10 = 0.165 → 0.16 (tie → even 6)
		expect(addTax(eur(5), 1000)).toEqual(eur(6));
		expect(addTax(eur(15), 1000)).toEqual(eur(16));
		// €9.99 gross at 19 %: 999 / 1.19 = 839.495… → €8.39
		expect(stripTax(eur(999), 1900)).toEqual(eur(839));
	});

	it('refuses a tax rate that is not whole basis points', () => {
		expect(() => addTax(eur(100), 19.5)).toThrow(/basis points/);
		expect(() => stripTax(eur(100), -1)).toThrow(/basis points/);
	});
});

describe('exact decimal helpers', () => {
	it('parses published rates without losing digits', () => {
		expect(parseDecimal('1.0956')).toEqual({ units: 10956n, scale: 4 });
		expect(parseDecimal('382.10')).toEqual({ units: 38210n, scale: 2 });
		expect(() => parseDecimal('1e3')).toThrow();
		expect(() => parseDecimal('-1.2')).toThrow();
	});

	it('divides half-even: ties go to the even neighbour, in both signs (D)', () => {
		expect(divideHalfEven(5n, 2n)).toBe(2n); // 2.5 → 2
		expect(divideHalfEven(7n, 2n)).toBe(4n); // 3.5 → 4
		expect(divideHalfEven(-5n, 2n)).toBe(-2n); // −2.5 → −2
		expect(divideHalfEven(-7n, 2n)).toBe(-4n); // −3.5 → −4
		expect(divideHalfEven(10n, 3n)).toBe(3n); // 3.33 → 3
		expect(divideHalfEven(20n, 3n)).toBe(7n); // 6.67 → 7
		expect(ratioToDecimal(1n, 3n, 4)).toBe('0.3333');
		expect(ratioToDecimal(1n, 8n, 2)).toBe('0.12'); // 0.125 → 0.12 (tie → even)
	});
});

describe('cross rates through EUR (ECB 2 Jan 2024 rates, 10c V; arithmetic D)', () => {
	it('USD→GBP = 0.86645 / 1.0956 = 0.790845198977… → "0.790845199" at 10 decimals', () => {
		const rate = crossRate('USD', 'GBP', ECB_2024_01_02);
		// 0.7908451989|777… rounds to 0.7908451990; the trailing zero is dropped
		expect(rate).toEqual({ from: 'USD', to: 'GBP', rate: '0.790845199', asOf: '2024-01-02' });
	});

	it('GBP→USD = 1.0956 / 0.86645 = 1.26446996364… and JPY→GBP = 0.86645 / 155.68 = 0.00556558324…', () => {
		expect(crossRate('GBP', 'USD', ECB_2024_01_02).rate).toBe('1.2644699636');
		expect(crossRate('JPY', 'GBP', ECB_2024_01_02).rate).toBe('0.0055655832');
	});

	it('EUR legs use the published rate itself, and EUR needs no rate', () => {
		expect(crossRate('EUR', 'USD', ECB_2024_01_02).rate).toBe('1.0956');
		expect(crossRate('EUR', 'EUR', {})).toEqual({ from: 'EUR', to: 'EUR', rate: '1', asOf: null });
	});

	it('names the missing currency when a rate is absent', () => {
		expect(() => crossRate('USD', 'KWD', ECB_2024_01_02)).toThrow(MissingRateError);
		expect(() => crossRate('USD', 'KWD', ECB_2024_01_02)).toThrow(/KWD/);
	});
});

describe('conversion through EUR, one half-even rounding at the minor unit', () => {
	const cases: [string, number, string][] = [
		// 10d: €499.99 × 1.0956 = 547.789044 → 547.79; × 155.68 = 77838.4432 → 77838; × 0.86645 = 433.2163355 → 433.22
		['USD', 54779, 'US$547.79'],
		['JPY', 77838, '¥77,838'],
		['GBP', 43322, '£433.22']
	];
	it.each(cases)(
		'€499.99 → %s (docs/sources.md 10d, D), same as dinero convertAt',
		(code, minor) => {
			expect(convertThroughEur(eur(49999), code, ECB_2024_01_02)).toEqual(money(minor, code));
			expect(convertAt(eur(49999), code, ECB_2024_01_02[code]?.ratePerEur ?? '')).toEqual(
				money(minor, code)
			);
		}
	);

	it('US$547.79 → GBP: 547.79 × 0.86645 / 1.0956 = 433.21709… → £433.22 (D)', () => {
		expect(convertThroughEur(money(54779, 'USD'), 'GBP', ECB_2024_01_02)).toEqual(
			money(43322, 'GBP')
		);
	});

	it('¥77,838 → USD: 77838 × 1.0956 / 155.68 = 547.78592… → US$547.79 (D; JPY has 0 decimals)', () => {
		expect(convertThroughEur(money(77838, 'JPY'), 'USD', ECB_2024_01_02)).toEqual(
			money(54779, 'USD')
		);
	});

	it('US$100.00 → JPY: 100 × 155.68 / 1.0956 = 14209.565… → ¥14,210 (D)', () => {
		expect(convertThroughEur(money(10000, 'USD'), 'JPY', ECB_2024_01_02)).toEqual(
			money(14210, 'JPY')
		);
	});
});

describe('region adjust: one option', () => {
	const quote = (
		unit: ReturnType<typeof money>,
		taxIncluded: boolean,
		observedAt = '2024-01-10T09:00:00Z'
	) => ({
		unit,
		taxIncluded,
		observedAt,
		storeName: 'Invented Store'
	});

	it('a quote in the target region wins and is marked quoted with its date', () => {
		const option: OptionInput = {
			partId: 1,
			targetQuote: quote(money(12999, 'USD'), false, '2024-01-05T12:00:00Z'),
			basePrice: quote(eur(11900), true)
		};
		const line = priceOption(option, 'gpu', DE, US, ECB_2024_01_02);
		expect(line).toMatchObject({
			status: 'quoted',
			unit: money(12999, 'USD'),
			date: '2024-01-05',
			storeName: 'Invented Store'
		});
		expect(line.basis).toBeNull();
	});

	it('DE → US estimate: strip 19 % VAT, convert, no tax added for a pre-tax region (11a, 11c; D)', () => {
		// €119.00 × 10000/11900 = €100.00 net; × 1.0956 = $109.56; US shows pre-tax prices
		const line = priceOption(
			{ partId: 2, targetQuote: null, basePrice: quote(eur(11900), true) },
			'cpu',
			DE,
			US,
			ECB_2024_01_02
		);
		expect(line).toMatchObject({
			status: 'estimated',
			unit: money(10956, 'USD'),
			date: '2024-01-02'
		});
		expect(line.basis).toEqual({
			from: eur(11900),
			baseTaxRemovedBp: 1900,
			rate: '1.0956',
			rateAsOf: '2024-01-02',
			factorBp: 10000,
			targetTaxAddedBp: 0
		});
	});

	it('DE → UK estimate with a ×1.04 GPU factor and 20 % UK VAT, rounded once (D)', () => {
		// €119.00 → €100.00 net → × 0.86645 = £86.645 → × 1.04 = £90.1108 → × 1.20 = £108.13296 → £108.13
		const line = priceOption(
			{ partId: 3, targetQuote: null, basePrice: quote(eur(11900), true) },
			'gpu',
			DE,
			UK,
			ECB_2024_01_02
		);
		expect(line.unit).toEqual(money(10813, 'GBP'));
		expect(line.basis?.factorBp).toBe(10400);
		expect(line.basis?.targetTaxAddedBp).toBe(2000);
	});

	it('rounds once at the end, not after every step (D)', () => {
		// €1.02 gross: exact chain 102 × 10000/11900 × 0.86645 × 1.04 × 1.20 = 92.685… → £0.93.
		// Rounding each step would give 85.71→86, 74.51→75, 78.0→78, 93.6→94: £0.94, a penny off.
		const line = priceOption(
			{ partId: 12, targetQuote: null, basePrice: quote(eur(102), true) },
			'gpu',
			DE,
			UK,
			ECB_2024_01_02
		);
		expect(line.unit).toEqual(money(93, 'GBP'));
	});

	it('DE → AU estimate with 10 % GST (11b AU, V): €100.00 net × 1.6147 × 1.10 = A$177.617 → A$177.62 (D)', () => {
		const line = priceOption(
			{ partId: 4, targetQuote: null, basePrice: quote(eur(11900), true) },
			'case',
			DE,
			AU,
			ECB_2024_01_02
		);
		expect(line.unit).toEqual(money(17762, 'AUD'));
	});

	it('US → JPY (pre-tax both sides): $100.00 × 155.68 / 1.0956 = ¥14,209.57 → ¥14,210 (D)', () => {
		const line = priceOption(
			{ partId: 5, targetQuote: null, basePrice: quote(money(10000, 'USD'), false) },
			'memory',
			US,
			JP_NO_TAX,
			ECB_2024_01_02
		);
		expect(line).toMatchObject({ status: 'estimated', unit: money(14210, 'JPY') });
	});

	it('rounds an estimate once: halves go to the even neighbour (D)', () => {
		// Pre-tax €0.05 and €0.15 at a rate of 0.5: 0.025 → 0.02 and 0.075 → 0.08
		const half: RatesPerEur = { USD: { ratePerEur: '0.5', asOf: '2024-01-02' } };
		const EU_NET: RegionPricing = { ...DE, taxMode: 'exclusive' };
		const at = (minor: number) =>
			priceOption(
				{ partId: 6, targetQuote: null, basePrice: quote(eur(minor), false) },
				'fan',
				EU_NET,
				US,
				half
			).unit;
		expect(at(5)).toEqual(money(2, 'USD'));
		expect(at(15)).toEqual(money(8, 'USD'));
	});

	it('adds the region’s tax to a pre-tax quote in a tax-inclusive region, still quoted (D)', () => {
		const line = priceOption(
			{ partId: 7, targetQuote: quote(eur(10000), false), basePrice: null },
			'psu',
			US,
			DE,
			ECB_2024_01_02
		);
		expect(line).toMatchObject({ status: 'quoted', unit: eur(11900) });
		expect(line.note).toMatch(/Tax added/);
	});

	it('between two EUR regions no rate is needed: the as-of date is null', () => {
		const FR_LIKE: RegionPricing = {
			code: 'fr',
			currency: 'EUR',
			taxMode: 'inclusive',
			taxRateBp: 2000,
			categoryFactorsBp: {}
		};
		// €119.00 at 19 % → €100.00 net → + 20 % = €120.00 (FR 20 %, 11a V2)
		const line = priceOption(
			{ partId: 8, targetQuote: null, basePrice: quote(eur(11900), true) },
			'cpu',
			DE,
			FR_LIKE,
			{}
		);
		expect(line).toMatchObject({ status: 'estimated', unit: eur(12000), date: null });
	});

	it('is unpriced, with a reason, without a quote and base price, or without a rate', () => {
		const none = priceOption(
			{ partId: 9, targetQuote: null, basePrice: null },
			'os',
			DE,
			US,
			ECB_2024_01_02
		);
		expect(none).toMatchObject({ status: 'unpriced', unit: null });
		expect(none.note).toMatch(/No price/);
		const KW: RegionPricing = {
			code: 'kw',
			currency: 'KWD',
			taxMode: 'exclusive',
			taxRateBp: 0,
			categoryFactorsBp: {}
		};
		const noRate = priceOption(
			{ partId: 10, targetQuote: null, basePrice: quote(eur(11900), true) },
			'cpu',
			DE,
			KW,
			ECB_2024_01_02
		);
		expect(noRate).toMatchObject({ status: 'unpriced', unit: null });
		expect(noRate.note).toMatch(/KWD/);
	});

	it('refuses a target-region quote in another currency (a data error, not an estimate)', () => {
		expect(() =>
			priceOption(
				{ partId: 11, targetQuote: quote(eur(100), true), basePrice: null },
				'cpu',
				DE,
				US,
				ECB_2024_01_02
			)
		).toThrow(/must be in USD/);
	});
});

describe('region adjust: a whole list with totals (worked example, D)', () => {
	const q = (minor: number, currency: string, taxIncluded: boolean, observedAt: string) => ({
		unit: money(minor, currency),
		taxIncluded,
		observedAt
	});

	const result = adjustToRegion({
		base: DE,
		target: US,
		rates: ECB_2024_01_02,
		slots: [
			{
				key: 'cpu',
				category: 'cpu',
				quantity: 1,
				// quoted in the US: $199.00; alternate estimated from €238.00 gross
				pick: {
					partId: 1,
					targetQuote: q(19900, 'USD', false, '2024-01-08'),
					basePrice: q(23800, 'EUR', true, '2024-01-01')
				},
				alternates: [
					{ partId: 2, targetQuote: null, basePrice: q(23800, 'EUR', true, '2024-01-01') }
				]
			},
			{
				key: 'fans',
				category: 'fan',
				quantity: 3,
				// estimated from €11.90 gross each; alternate unpriced
				pick: { partId: 3, targetQuote: null, basePrice: q(1190, 'EUR', true, '2024-01-01') },
				alternates: [{ partId: 4, targetQuote: null, basePrice: null }]
			},
			{
				key: 'os',
				category: 'os',
				quantity: 1,
				pick: { partId: 5, targetQuote: null, basePrice: null },
				alternates: []
			}
		]
	});

	it('marks each line and totals the picks: $199.00 + 3 × $10.96 = $231.88, one unpriced slot', () => {
		// €238.00 → €200.00 net → × 1.0956 = $219.12; €11.90 → €10.00 net → $10.956 → $10.96
		const [cpu, fans, os] = result.slots;
		expect(cpu?.pick).toMatchObject({
			status: 'quoted',
			unit: money(19900, 'USD'),
			date: '2024-01-08'
		});
		expect(cpu?.alternates[0]).toMatchObject({
			status: 'estimated',
			unit: money(21912, 'USD'),
			date: '2024-01-02'
		});
		expect(fans?.pick).toMatchObject({ status: 'estimated', unit: money(1096, 'USD') });
		expect(fans?.lineTotal).toEqual(money(3288, 'USD'));
		expect(fans?.alternates[0]?.status).toBe('unpriced');
		expect(os?.pick.status).toBe('unpriced');
		expect(os?.lineTotal).toBeNull();
		// 19900 + 3 × 1096 = 23188
		expect(result.picksTotal).toEqual(money(23188, 'USD'));
		expect(result.unpricedSlots).toBe(1);
		expect(result.picks).toEqual({ quoted: 1, estimated: 1, unpriced: 1 });
		expect(result.oldestRateAsOf).toBe('2024-01-02');
		expect(result).toMatchObject({ region: 'us', currency: 'USD', taxMode: 'exclusive' });
	});

	it('spans min–max over alternates: min $199.00 + $32.88, max $219.12 + $32.88 (D)', () => {
		// min = 19900 + 3 × 1096 = 23188; max = 21912 + 3 × 1096 = 25200
		expect(result.range).toEqual({ min: money(23188, 'USD'), max: money(25200, 'USD') });
	});
});
