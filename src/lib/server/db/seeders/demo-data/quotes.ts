import { STORE } from './stores';
import type { DemoQuote } from './types';

/*
 * Invented shelf prices in each store's own display convention: US quotes are pre-tax,
 * EUR/GBP/JPY quotes include VAT or consumption tax. Minor units throughout (JPY has
 * none). Some parts are deliberately missing from some regions so the region adjust has
 * to estimate them, and a few carry a price history for the part page chart.
 */

function q(
	partSlug: string,
	storeName: string,
	amountMinor: number,
	daysAgo: number,
	shippingMinor?: number
): DemoQuote {
	return shippingMinor === undefined
		? { partSlug, storeName, amountMinor, daysAgo }
		: { partSlug, storeName, amountMinor, daysAgo, shippingMinor };
}

/** Several observations of one part at one store, as [daysAgo, amountMinor] pairs. */
function history(
	partSlug: string,
	storeName: string,
	points: Array<[number, number]>
): DemoQuote[] {
	return points.map(([daysAgo, amountMinor]) => q(partSlug, storeName, amountMinor, daysAgo));
}

const { kestrel, bayline, lindenhof, brueckner, ashgrove, tidewell, kairo, sakuragi } = STORE;

const us: DemoQuote[] = [
	q('halvard-strata-406', kestrel, 10999, 1),
	q('halvard-strata-406', bayline, 11299, 3),
	q('halvard-strata-406g', bayline, 12499, 2),
	q('halvard-strata-406g', kestrel, 12999, 5),
	q('halvard-strata-408', kestrel, 13999, 2),
	q('halvard-strata-606', kestrel, 17999, 4),
	q('halvard-strata-606x', bayline, 19999, 2),
	q('halvard-strata-708x', kestrel, 32999, 1),
	q('halvard-strata-916x', kestrel, 54999, 6),
	q('orrin-labs-meridian-510f', bayline, 16999, 3),
	q('orrin-labs-meridian-780k', kestrel, 37999, 7),
	q('orrin-labs-meridian-745k', bayline, 24999, 4),
	q('orrin-labs-meridian-765kf', kestrel, 28999, 2),
	q('orrin-labs-meridian-785k', kestrel, 54999, 5),

	q('tessel-frostline-120', bayline, 3499, 1),
	q('tessel-frostline-dual-140', kestrel, 7999, 3),
	q('tessel-lowrise-47', bayline, 4499, 8),
	q('kelda-flatline-58', kestrel, 5499, 6),
	q('kelda-slimtower-135', bayline, 2499, 2),
	q('brightwater-aqualoop-240', kestrel, 9999, 4),
	q('brightwater-aqualoop-360', kestrel, 12999, 4),

	...history('arkwell-s550m-daily', kestrel, [
		[110, 10999],
		[60, 9999],
		[1, 9499]
	]),
	q('arkwell-s450m-basic', bayline, 6999, 2),
	q('vantor-s550-atx-wifi', kestrel, 12999, 3),
	q('vantor-s650m-base', bayline, 12999, 5),
	q('vantor-s650-atx-wifi', kestrel, 17999, 2),
	q('vantor-s670e-atx-pro', kestrel, 32999, 9),
	q('vantor-s650i-wifi', bayline, 18999, 3),
	q('vantor-s670e-itx', kestrel, 29999, 6),
	q('pellworth-m870-atx', bayline, 22999, 4),
	q('pellworth-m860m-plus', kestrel, 15999, 2),
	q('arkwell-m760m-d4', bayline, 11999, 5),
	q('arkwell-m790-atx', kestrel, 21999, 7),

	q('aldmere-pulse-ddr4-3200-16gb', bayline, 3499, 1),
	q('aldmere-pulse-ddr4-3200-16gb', kestrel, 3699, 2),
	...history('aldmere-pulse-ddr4-3600-32gb', bayline, [
		[90, 6499],
		[45, 5799],
		[0, 5299]
	]),
	q('brisk-ddr4-3200-32gb', kestrel, 5499, 3),
	q('aldmere-flux-ddr5-5600-32gb', bayline, 8499, 2),
	q('aldmere-flux-ddr5-6000-32gb', kestrel, 9999, 1),
	q('brisk-ddr5-6000-64gb', kestrel, 17999, 4),
	q('brisk-ddr5-4800-32gb', bayline, 7499, 5),
	q('brisk-ddr5-6400-32gb', kestrel, 11999, 8),

	q('cindral-c3-1tb', kestrel, 5299, 1),
	q('cindral-c4-1tb', bayline, 7499, 2),
	...history('cindral-c4-2tb', kestrel, [
		[120, 14999],
		[70, 13999],
		[30, 13499],
		[5, 12999]
	]),
	q('cindral-c4-2tb', bayline, 12799, 3),
	q('cindral-c5-2tb', kestrel, 19999, 4),
	q('verrow-v4-lite-1tb', bayline, 5499, 2),
	q('verrow-v4-4tb', kestrel, 24999, 6),
	q('verrow-s2-2tb', bayline, 10999, 3),

	q('ironvale-auric-a52-8g', bayline, 21999, 1),
	...history('solenne-cobalt-c6-8g', kestrel, [
		[110, 26999],
		[75, 25999],
		[40, 24999],
		[12, 23999],
		[2, 22999]
	]),
	q('solenne-auric-a64-12g', kestrel, 31999, 3),
	q('ironvale-auric-a64-mini-12g', bayline, 32999, 5),
	q('ironvale-cobalt-c7-16g', kestrel, 49999, 2),
	q('solenne-cobalt-c8-20g', bayline, 64999, 4),
	q('ironvale-auric-a78-16g', kestrel, 74999, 3),
	q('solenne-auric-a90-24g', kestrel, 119999, 6),

	q('voltren-vp550-bronze', bayline, 5499, 1),
	q('voltren-vp650-gold', bayline, 7999, 2),
	q('voltren-vp650-gold', kestrel, 8499, 4),
	q('voltren-vp750-gold', kestrel, 10499, 3),
	q('voltren-vp850-gold', kestrel, 12499, 5),
	q('voltren-vp1000-gold', bayline, 15999, 6),
	q('stillwater-sw1000-platinum', kestrel, 19999, 7),
	q('stillwater-sfx600-gold', bayline, 9999, 4),
	q('stillwater-sfx750-gold', kestrel, 13999, 5),
	q('voltren-sfxl850-platinum', kestrel, 17999, 9),

	q('cairnhouse-m-mesh', kestrel, 6499, 1, 999),
	q('cairnhouse-atrium-atx', bayline, 9999, 3),
	q('cairnhouse-basis-atx', bayline, 5999, 2),
	q('norrow-glassline-m', kestrel, 7999, 4, 999),
	q('norrow-atlas-silent', kestrel, 13999, 5, 999),
	q('norrow-pocket-itx', bayline, 9999, 6),
	q('norrow-shoebox-itx', kestrel, 12999, 7, 999),
	q('cairnhouse-cube-itx', bayline, 10999, 8),

	q('tessel-breeze-120-3pack', bayline, 2499, 1),
	q('tessel-breeze-140-2pack', kestrel, 2499, 3),
	q('tessel-breeze-92', bayline, 999, 2),
	q('kelda-quietwing-120-2pack', kestrel, 2999, 2),
	q('kelda-quietwing-140-3pack', kestrel, 4499, 4),
	q('kelda-quietwing-92', bayline, 1499, 5),

	q('orchard-os-12-home', kestrel, 11999, 2),
	q('orchard-os-12-pro', kestrel, 14999, 4),
	q('larkspur-os-24-lts', bayline, 1299, 1),

	q('tessel-tx4-thermal-paste', kestrel, 799, 2),
	q('ironvale-anchor-gpu-bracket', bayline, 1999, 4),
	q('cairnhouse-sag-stand', kestrel, 999, 3),
	q('cairnhouse-wrist-strap', bayline, 699, 2)
];

const de: DemoQuote[] = [
	q('halvard-strata-406', lindenhof, 11990, 3),
	q('halvard-strata-406g', brueckner, 13490, 4),
	q('halvard-strata-408', lindenhof, 14990, 5),
	q('halvard-strata-606', lindenhof, 18900, 2),
	q('halvard-strata-606', brueckner, 18490, 4),
	...history('halvard-strata-606x', lindenhof, [
		[100, 22900],
		[60, 21500],
		[25, 20500],
		[2, 19900]
	]),
	q('halvard-strata-606x', brueckner, 20490, 3),
	q('halvard-strata-708x', brueckner, 33900, 2),
	q('halvard-strata-916x', lindenhof, 56900, 6),
	q('orrin-labs-meridian-510f', brueckner, 17990, 5),
	q('orrin-labs-meridian-745k', lindenhof, 25900, 6),
	q('orrin-labs-meridian-765kf', lindenhof, 29900, 4),
	q('orrin-labs-meridian-785k', brueckner, 56900, 8),

	q('tessel-frostline-120', brueckner, 3690, 1),
	q('tessel-frostline-120', lindenhof, 3890, 3),
	q('tessel-frostline-dual-140', lindenhof, 8490, 2),
	q('tessel-lowrise-47', brueckner, 4990, 7),
	q('kelda-slimtower-135', brueckner, 2790, 2),
	q('brightwater-aqualoop-240', lindenhof, 10900, 5),
	q('brightwater-aqualoop-360', lindenhof, 13900, 5),

	q('arkwell-s550m-daily', brueckner, 9990, 4),
	q('arkwell-s450m-basic', lindenhof, 7290, 6),
	q('vantor-s550-atx-wifi', lindenhof, 13900, 7),
	q('vantor-s650m-base', brueckner, 13900, 2),
	q('vantor-s650-atx-wifi', lindenhof, 16990, 1),
	q('vantor-s670e-atx-pro', lindenhof, 33900, 3),
	q('vantor-s650i-wifi', brueckner, 19900, 5),
	q('vantor-s670e-itx', lindenhof, 31900, 8),
	q('pellworth-m870-atx', brueckner, 23900, 6),
	q('pellworth-m860m-plus', lindenhof, 16490, 4),
	q('arkwell-m760m-d4', brueckner, 12490, 9),
	q('arkwell-m790-atx', lindenhof, 22900, 7),

	q('aldmere-pulse-ddr4-3200-16gb', lindenhof, 3990, 3),
	q('aldmere-pulse-ddr4-3600-32gb', brueckner, 6990, 4),
	q('brisk-ddr4-3200-32gb', lindenhof, 6490, 5),
	q('aldmere-flux-ddr5-5600-32gb', lindenhof, 9490, 2),
	q('aldmere-flux-ddr5-6000-32gb', brueckner, 10490, 1),
	q('aldmere-flux-ddr5-6000-32gb', lindenhof, 10690, 2),
	q('brisk-ddr5-6000-64gb', brueckner, 18900, 3),
	q('brisk-ddr5-4800-32gb', lindenhof, 8490, 6),
	q('brisk-ddr5-6400-32gb', brueckner, 12900, 5),

	q('cindral-c3-1tb', lindenhof, 5490, 4),
	q('cindral-c4-1tb', brueckner, 7990, 2),
	q('cindral-c4-2tb', lindenhof, 11990, 1),
	q('cindral-c5-2tb', brueckner, 20900, 3),
	q('verrow-v4-lite-1tb', lindenhof, 5990, 5),
	q('verrow-v4-4tb', lindenhof, 23900, 2),
	q('verrow-s2-2tb', brueckner, 11990, 6),

	q('ironvale-auric-a52-8g', brueckner, 23900, 4),
	q('solenne-cobalt-c6-8g', lindenhof, 25900, 5),
	q('solenne-auric-a64-12g', brueckner, 33900, 2),
	q('ironvale-auric-a64-mini-12g', lindenhof, 34900, 7),
	...history('ironvale-cobalt-c7-16g', lindenhof, [
		[120, 59900],
		[90, 57900],
		[60, 56900],
		[30, 54900],
		[1, 53900]
	]),
	q('solenne-cobalt-c8-20g', brueckner, 68900, 5),
	q('ironvale-auric-a78-16g', lindenhof, 81900, 3),
	q('solenne-auric-a90-24g', brueckner, 129900, 6),

	q('voltren-vp550-bronze', brueckner, 5990, 4),
	q('voltren-vp650-gold', lindenhof, 8490, 2),
	q('voltren-vp750-gold', brueckner, 10990, 1),
	q('voltren-vp850-gold', brueckner, 12990, 3),
	q('voltren-vp1000-gold', lindenhof, 16900, 5),
	q('stillwater-sw1000-platinum', lindenhof, 20900, 6),
	q('stillwater-sfx600-gold', brueckner, 10900, 7),
	q('stillwater-sfx750-gold', lindenhof, 14900, 8),

	q('cairnhouse-m-mesh', lindenhof, 6990, 3),
	q('cairnhouse-atrium-atx', lindenhof, 9490, 2),
	q('cairnhouse-basis-atx', brueckner, 6490, 2),
	q('norrow-glassline-m', lindenhof, 8490, 6),
	q('norrow-atlas-silent', brueckner, 14900, 3, 599),
	q('norrow-shoebox-itx', lindenhof, 13900, 9),
	q('cairnhouse-cube-itx', brueckner, 11490, 7),

	q('tessel-breeze-120-3pack', lindenhof, 2790, 4),
	q('tessel-breeze-140-2pack', brueckner, 2490, 1),
	q('tessel-breeze-92', lindenhof, 1090, 6),
	q('kelda-quietwing-120-2pack', brueckner, 3290, 5),
	q('kelda-quietwing-140-3pack', lindenhof, 4990, 2),

	q('orchard-os-12-home', lindenhof, 13500, 4),
	q('orchard-os-12-pro', brueckner, 15900, 6),
	q('larkspur-os-24-lts', lindenhof, 1290, 3),

	q('tessel-tx4-thermal-paste', brueckner, 890, 3),
	q('ironvale-anchor-gpu-bracket', lindenhof, 2190, 5),
	q('cairnhouse-sag-stand', brueckner, 1090, 4),
	q('cairnhouse-wrist-strap', lindenhof, 790, 2)
];

const uk: DemoQuote[] = [
	q('halvard-strata-406', tidewell, 10499, 3),
	q('halvard-strata-408', ashgrove, 13499, 4),
	q('halvard-strata-606', ashgrove, 16999, 2),
	q('halvard-strata-606x', tidewell, 18999, 3),
	q('halvard-strata-708x', ashgrove, 30999, 2),
	q('orrin-labs-meridian-510f', tidewell, 16499, 6),
	q('orrin-labs-meridian-780k', ashgrove, 35999, 8),
	q('orrin-labs-meridian-745k', tidewell, 22999, 2),
	q('orrin-labs-meridian-765kf', ashgrove, 26999, 1),
	q('orrin-labs-meridian-765kf', tidewell, 27499, 3),
	q('orrin-labs-meridian-785k', ashgrove, 51999, 4),

	q('tessel-frostline-120', tidewell, 3499, 2),
	q('tessel-frostline-dual-140', tidewell, 7999, 2),
	q('kelda-flatline-58', ashgrove, 5499, 7),
	q('kelda-slimtower-135', tidewell, 2499, 5),
	q('brightwater-aqualoop-240', ashgrove, 9499, 3),
	...history('brightwater-aqualoop-360', tidewell, [
		[90, 12999],
		[50, 11999],
		[1, 10999]
	]),

	q('arkwell-s550m-daily', ashgrove, 8999, 5),
	q('vantor-s550-atx-wifi', tidewell, 12499, 6),
	q('vantor-s650m-base', ashgrove, 12499, 4),
	q('vantor-s650-atx-wifi', tidewell, 16499, 3),
	q('vantor-s670e-atx-pro', ashgrove, 30999, 5),
	q('vantor-s650i-wifi', tidewell, 17999, 6),
	q('vantor-s670e-itx', ashgrove, 28999, 7),
	q('pellworth-m870-atx', ashgrove, 20999, 2),
	q('pellworth-m860m-plus', tidewell, 14499, 3),
	q('arkwell-m760m-d4', ashgrove, 10999, 8),

	q('aldmere-pulse-ddr4-3200-16gb', tidewell, 3499, 4),
	q('aldmere-pulse-ddr4-3600-32gb', ashgrove, 5999, 5),
	q('brisk-ddr4-3200-32gb', tidewell, 5699, 6),
	q('aldmere-flux-ddr5-5600-32gb', ashgrove, 8499, 3),
	q('aldmere-flux-ddr5-6000-32gb', ashgrove, 9499, 2),
	q('brisk-ddr5-6000-64gb', tidewell, 15499, 1),
	q('brisk-ddr5-6000-64gb', ashgrove, 15999, 2),
	q('brisk-ddr5-4800-32gb', tidewell, 7499, 6),
	q('brisk-ddr5-6400-32gb', ashgrove, 11499, 5),

	q('cindral-c3-1tb', tidewell, 4999, 3),
	q('cindral-c4-1tb', ashgrove, 6999, 4),
	q('cindral-c4-2tb', tidewell, 11999, 2),
	q('cindral-c5-2tb', ashgrove, 17999, 1),
	q('verrow-v4-lite-1tb', tidewell, 5299, 5),
	q('verrow-v4-4tb', tidewell, 18999, 2),
	q('verrow-s2-2tb', ashgrove, 9999, 3),

	q('ironvale-auric-a52-8g', tidewell, 20999, 5),
	q('solenne-cobalt-c6-8g', ashgrove, 22999, 6),
	q('solenne-auric-a64-12g', tidewell, 29999, 4),
	q('ironvale-auric-a64-mini-12g', ashgrove, 30999, 8),
	q('ironvale-cobalt-c7-16g', tidewell, 49999, 3),
	q('solenne-cobalt-c8-20g', tidewell, 61999, 2),
	...history('ironvale-auric-a78-16g', ashgrove, [
		[120, 77999],
		[80, 74999],
		[45, 72999],
		[20, 71999],
		[2, 69999]
	]),
	q('solenne-auric-a90-24g', ashgrove, 114999, 3),

	q('voltren-vp550-bronze', tidewell, 4999, 6),
	q('voltren-vp650-gold', ashgrove, 7499, 5),
	q('voltren-vp750-gold', ashgrove, 9999, 4),
	q('voltren-vp850-gold', tidewell, 11499, 3),
	q('voltren-vp1000-gold', tidewell, 14499, 2),
	q('stillwater-sw1000-platinum', ashgrove, 16999, 1),
	q('stillwater-sfx600-gold', tidewell, 9499, 7),
	q('stillwater-sfx750-gold', ashgrove, 12999, 6),
	q('voltren-sfxl850-platinum', ashgrove, 16999, 9),

	q('cairnhouse-m-mesh', tidewell, 5999, 4),
	q('cairnhouse-atrium-atx', ashgrove, 9499, 3),
	q('cairnhouse-basis-atx', tidewell, 5499, 5),
	q('norrow-glassline-m', ashgrove, 7499, 7),
	q('norrow-atlas-silent', tidewell, 12999, 1),
	q('norrow-pocket-itx', ashgrove, 9499, 8),
	q('norrow-shoebox-itx', tidewell, 11999, 6),

	q('tessel-breeze-120-3pack', ashgrove, 2499, 5),
	q('tessel-breeze-140-2pack', ashgrove, 2299, 2),
	q('tessel-breeze-92', tidewell, 899, 4, 399),
	q('kelda-quietwing-120-2pack', tidewell, 2799, 6),
	q('kelda-quietwing-140-3pack', tidewell, 3999, 1),
	q('kelda-quietwing-92', ashgrove, 1299, 6),

	q('orchard-os-12-home', ashgrove, 9999, 3),
	q('orchard-os-12-pro', ashgrove, 11999, 5),
	q('larkspur-os-24-lts', tidewell, 999, 4, 399),

	q('tessel-tx4-thermal-paste', ashgrove, 699, 4),
	q('ironvale-anchor-gpu-bracket', tidewell, 1699, 2),
	q('cairnhouse-sag-stand', ashgrove, 899, 3),
	q('cairnhouse-wrist-strap', tidewell, 599, 5, 399)
];

const jp: DemoQuote[] = [
	q('halvard-strata-406', kairo, 17980, 4),
	q('halvard-strata-406g', sakuragi, 19800, 5),
	q('halvard-strata-606', kairo, 29800, 1),
	q('halvard-strata-606', sakuragi, 30580, 3),
	q('halvard-strata-606x', sakuragi, 33800, 4),
	q('halvard-strata-708x', kairo, 54800, 2),
	q('halvard-strata-916x', sakuragi, 89800, 7),
	q('orrin-labs-meridian-510f', kairo, 27980, 5),
	q('orrin-labs-meridian-780k', sakuragi, 62800, 8),
	q('orrin-labs-meridian-745k', kairo, 42800, 6),
	q('orrin-labs-meridian-765kf', kairo, 49800, 5),
	q('orrin-labs-meridian-785k', sakuragi, 92800, 9),

	q('tessel-frostline-120', kairo, 5480, 3),
	q('tessel-frostline-dual-140', sakuragi, 12800, 4),
	q('tessel-lowrise-47', sakuragi, 6980, 1),
	q('tessel-lowrise-47', kairo, 7480, 2),
	q('kelda-flatline-58', kairo, 8480, 2),
	q('kelda-slimtower-135', sakuragi, 3980, 6),
	q('brightwater-aqualoop-240', kairo, 16800, 5),
	q('brightwater-aqualoop-360', sakuragi, 21800, 6),

	q('arkwell-s550m-daily', sakuragi, 13980, 6),
	q('vantor-s650m-base', kairo, 19800, 5),
	q('vantor-s650-atx-wifi', sakuragi, 27800, 4),
	q('vantor-s670e-atx-pro', kairo, 54800, 7),
	q('vantor-s650i-wifi', kairo, 24800, 2),
	q('vantor-s670e-itx', sakuragi, 44800, 3),
	q('pellworth-m870-atx', kairo, 37800, 6),
	q('pellworth-m860m-plus', sakuragi, 24800, 7),
	q('arkwell-m760m-d4', kairo, 17800, 9),
	q('arkwell-m790-atx', sakuragi, 34800, 8),

	q('aldmere-pulse-ddr4-3200-16gb', kairo, 5980, 5),
	q('aldmere-pulse-ddr4-3600-32gb', sakuragi, 10980, 6),
	q('aldmere-flux-ddr5-5600-32gb', sakuragi, 13980, 1),
	...history('aldmere-flux-ddr5-6000-32gb', kairo, [
		[90, 18980],
		[50, 17800],
		[10, 16800]
	]),
	q('brisk-ddr5-6000-64gb', sakuragi, 29800, 5),
	q('brisk-ddr5-4800-32gb', kairo, 11980, 3),

	q('cindral-c3-1tb', sakuragi, 7980, 6),
	q('cindral-c4-1tb', kairo, 12980, 1),
	q('cindral-c4-2tb', sakuragi, 21800, 2),
	q('cindral-c5-2tb', kairo, 34800, 5),
	q('verrow-v4-lite-1tb', sakuragi, 8980, 2),
	q('verrow-v4-4tb', kairo, 39800, 6),
	q('verrow-s2-2tb', sakuragi, 16980, 7),

	q('ironvale-auric-a52-8g', sakuragi, 39800, 3),
	q('solenne-cobalt-c6-8g', kairo, 42800, 4),
	...history('ironvale-auric-a64-mini-12g', kairo, [
		[60, 64800],
		[30, 62800],
		[14, 60800],
		[2, 58800]
	]),
	q('ironvale-cobalt-c7-16g', sakuragi, 84800, 5),
	q('solenne-cobalt-c8-20g', kairo, 109800, 6),
	q('ironvale-auric-a78-16g', sakuragi, 129800, 7),
	q('solenne-auric-a90-24g', kairo, 219800, 8),

	q('voltren-vp550-bronze', kairo, 7480, 6),
	q('voltren-vp650-gold', sakuragi, 11800, 5),
	q('voltren-vp750-gold', kairo, 15800, 7),
	q('voltren-vp850-gold', sakuragi, 18800, 8),
	q('voltren-vp1000-gold', kairo, 24800, 9),
	q('stillwater-sw1000-platinum', sakuragi, 32800, 9),
	q('stillwater-sfx600-gold', sakuragi, 14800, 1),
	q('stillwater-sfx750-gold', kairo, 21800, 3),
	q('voltren-sfxl850-platinum', sakuragi, 27800, 6),

	q('cairnhouse-m-mesh', kairo, 8980, 7),
	q('cairnhouse-atrium-atx', sakuragi, 14800, 6, 880),
	q('cairnhouse-basis-atx', kairo, 7980, 8),
	q('norrow-atlas-silent', sakuragi, 21800, 7, 880),
	q('norrow-pocket-itx', kairo, 16280, 1),
	q('norrow-shoebox-itx', sakuragi, 19800, 3, 880),
	q('cairnhouse-cube-itx', kairo, 17800, 4),

	q('tessel-breeze-120-3pack', kairo, 3980, 5),
	q('tessel-breeze-140-2pack', sakuragi, 3680, 6),
	q('tessel-breeze-92', sakuragi, 1480, 1),
	q('kelda-quietwing-120-2pack', sakuragi, 4480, 6),
	q('kelda-quietwing-140-3pack', kairo, 6980, 7),
	q('kelda-quietwing-92', kairo, 1980, 2),

	q('orchard-os-12-home', kairo, 17800, 4),
	q('orchard-os-12-pro', sakuragi, 24800, 5),
	q('larkspur-os-24-lts', kairo, 1480, 5),

	q('tessel-tx4-thermal-paste', sakuragi, 1180, 3),
	q('ironvale-anchor-gpu-bracket', kairo, 2480, 6),
	q('cairnhouse-sag-stand', sakuragi, 1280, 4),
	q('cairnhouse-wrist-strap', kairo, 980, 5)
];

export const demoQuotes: DemoQuote[] = [...us, ...de, ...uk, ...jp];
