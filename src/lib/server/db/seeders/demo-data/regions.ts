import type { DemoRegion } from './types';

/*
 * Tax modes and rates follow each market's real display rules (US shelf prices are
 * pre-tax because sales tax is added at checkout; EU, UK and JP prices include VAT or
 * consumption tax). The category factors are invented but kept modest, so estimated
 * prices stay believable next to real quotes.
 */
export const demoRegions: DemoRegion[] = [
	{
		code: 'us',
		name: 'United States',
		currency: 'USD',
		taxMode: 'exclusive',
		taxRateBp: 0,
		categoryFactorsBp: {
			cpu: 10000,
			cooler: 10000,
			motherboard: 10000,
			memory: 10000,
			storage: 10000,
			gpu: 9800,
			psu: 10000,
			case: 10000,
			fan: 10000,
			os: 10000,
			extra: 10000
		}
	},
	{
		code: 'de',
		name: 'Germany',
		currency: 'EUR',
		taxMode: 'inclusive',
		taxRateBp: 1900,
		categoryFactorsBp: {
			cpu: 9800,
			cooler: 10200,
			motherboard: 10300,
			memory: 10100,
			storage: 9700,
			gpu: 10400,
			psu: 10200,
			case: 10500,
			fan: 10300,
			os: 10000,
			extra: 10200
		}
	},
	{
		code: 'uk',
		name: 'United Kingdom',
		currency: 'GBP',
		taxMode: 'inclusive',
		taxRateBp: 2000,
		categoryFactorsBp: {
			cpu: 10100,
			cooler: 10300,
			motherboard: 10500,
			memory: 10200,
			storage: 9900,
			gpu: 10600,
			psu: 10400,
			case: 10800,
			fan: 10400,
			os: 10000,
			extra: 10300
		}
	},
	{
		code: 'jp',
		name: 'Japan',
		currency: 'JPY',
		taxMode: 'inclusive',
		taxRateBp: 1000,
		categoryFactorsBp: {
			cpu: 10500,
			cooler: 9600,
			motherboard: 10900,
			memory: 10300,
			storage: 10200,
			gpu: 11200,
			psu: 10600,
			case: 9800,
			fan: 9400,
			os: 10000,
			extra: 9500
		}
	}
];
