/*
 * Demo exchange rates: the real euro reference rates the European Central Bank published for
 * 2 January 2024 (source: ECB, "Euro foreign exchange reference rates", eurofxref-hist.csv row
 * 2024-01-02; two independent mirrors agree; docs/sources.md 10c, status V). The same values
 * as the local ECB fake's file (tests/fixtures/ecb/eurofxref-2024-01-02.xml); a unit test
 * keeps the two equal.
 *
 * They are old on purpose and show as stale: an editor refreshes them from the ECB.
 * Idempotent by the natural key (currency, as-of date): existing rows are left as they are.
 */
import type { Seeder } from '../umzug.js';
import { FxRate } from '../models/index.js';

export const DEMO_FX_AS_OF = '2024-01-02';
export const DEMO_FX_SOURCE = 'ECB euro foreign exchange reference rates, 2 January 2024';

/** Units per 1 EUR, as published (decimal strings). */
export const DEMO_FX_RATES: Readonly<Record<string, string>> = {
	USD: '1.0956',
	JPY: '155.68',
	CZK: '24.687',
	DKK: '7.4551',
	GBP: '0.86645',
	HUF: '382.10',
	PLN: '4.3708',
	SEK: '11.1545',
	CHF: '0.9305',
	AUD: '1.6147',
	CAD: '1.4565'
};

export const up: Seeder = async ({ context: sequelize }) => {
	await sequelize.transaction(async (transaction) => {
		for (const [currency, ratePerEur] of Object.entries(DEMO_FX_RATES)) {
			await FxRate.findOrCreate({
				where: { currency, asOf: DEMO_FX_AS_OF },
				defaults: { currency, asOf: DEMO_FX_AS_OF, ratePerEur, source: DEMO_FX_SOURCE },
				transaction
			});
		}
	});
};

export const down: Seeder = async ({ context: sequelize }) => {
	await sequelize.transaction(async (transaction) => {
		await FxRate.destroy({ where: { asOf: DEMO_FX_AS_OF, source: DEMO_FX_SOURCE }, transaction });
	});
};
