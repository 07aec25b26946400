import type { DemoStore } from './types';

/*
 * Quotes and guide slots refer to stores by name, so the names live in one place and
 * must stay unique across regions. Two stores per region let a slot's price quote come
 * from a store other than the cheapest one, as happens when an author prefers a shop
 * with reliable stock.
 */
export const STORE = {
	kestrel: 'Kestrel Components',
	bayline: 'Bayline PC Supply',
	lindenhof: 'Lindenhof Rechnerteile',
	brueckner: 'Brückner Technikhaus',
	ashgrove: 'Ashgrove Systems',
	tidewell: 'Tidewell Parts',
	kairo: 'Kairo Denki',
	sakuragi: 'Sakuragi PC Koubou'
} as const;

export const demoStores: DemoStore[] = [
	{ name: STORE.kestrel, regionCode: 'us', url: 'https://kestrel-components.example' },
	{ name: STORE.bayline, regionCode: 'us', url: 'https://bayline-pc-supply.example' },
	{ name: STORE.lindenhof, regionCode: 'de', url: 'https://lindenhof-rechnerteile.example' },
	{ name: STORE.brueckner, regionCode: 'de', url: 'https://brueckner-technikhaus.example' },
	{ name: STORE.ashgrove, regionCode: 'uk', url: 'https://ashgrove-systems.example' },
	{ name: STORE.tidewell, regionCode: 'uk', url: 'https://tidewell-parts.example' },
	{ name: STORE.kairo, regionCode: 'jp', url: 'https://kairo-denki.example' },
	{ name: STORE.sakuragi, regionCode: 'jp', url: 'https://sakuragi-pc.example' }
];
