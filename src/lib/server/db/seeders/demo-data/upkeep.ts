/*
 * The upkeep demo's price drift (seeders/2026.12.12T10.00.00.demo-upkeep.ts): two picks of the
 * demo author's guide get dearer at one German store. Plain data, so tests that count the
 * demo's quotes can count these too.
 */
export const DRIFT_STORE = 'Lindenhof Rechnerteile';
export const DRIFT = [
	{ part: 'solenne-cobalt-c6-8g', amountMinor: 33900 },
	{ part: 'aldmere-pulse-ddr4-3600-32gb', amountMinor: 8990 }
];
