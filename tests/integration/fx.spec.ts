/*
 * Exchange rates end to end: the ECB client fetches over real HTTP from the local ECB fake
 * (scripts/ecb-fake.ts, serving the real reference rates of 2 January 2024 — docs/sources.md 10c,
 * status V), and the fx service stores them in the real MariaDB.
 *
 * This file starts nothing itself. `npm test` starts the fake (scripts/lib.sh start_ecb_fake)
 * and exports ECB_RATES_URL, so a missing fake is a failure, not a skip. By hand:
 *   bash scripts/ecb-fake.sh start
 *   npx vitest run --project integration tests/integration/fx.spec.ts
 * Fault cases (404, refused connection, silence, garbage) use small servers on loopback here.
 */
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { money } from '../../src/lib/domain/money';
import { adjustToRegion, type RegionPricing } from '../../src/lib/domain/region';
import { FxRate, sequelize } from '../../src/lib/server/db';
import * as demoFx from '../../src/lib/server/db/seeders/2026.12.02T11.00.00.demo-fx-rates';
import { EcbRatesError, fetchEcbDailyRates } from '../../src/lib/server/fx/ecb';
import * as fx from '../../src/lib/server/services/fx';
import { countRows, resetDatabase } from '../support/db';

const FAKE_URL =
	process.env.ECB_RATES_URL ?? 'http://127.0.0.1:2590/stats/eurofxref/eurofxref-daily.xml';
// The service reads ECB_RATES_URL itself, as the app does; npm test sets it.
process.env.ECB_RATES_URL = FAKE_URL;

// docs/sources.md 10c (V): ECB reference rates, 2 January 2024.
const PUBLISHED: Record<string, string> = {
	AUD: '1.6147',
	CAD: '1.4565',
	CHF: '0.9305',
	CZK: '24.687',
	DKK: '7.4551',
	GBP: '0.86645',
	HUF: '382.1', // published "382.10"; DECIMAL storage drops the trailing zero, the value is equal
	JPY: '155.68',
	PLN: '4.3708',
	SEK: '11.1545',
	USD: '1.0956'
};
const SOURCE = 'ECB euro foreign exchange reference rates, 2 January 2024';

const servers: Server[] = [];
async function loopbackServer(handler: Parameters<typeof createServer>[1]): Promise<string> {
	const server = createServer(handler);
	servers.push(server);
	await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
	return `http://127.0.0.1:${(server.address() as AddressInfo).port}/eurofxref-daily.xml`;
}

async function refused(): Promise<EcbRatesError> {
	try {
		await fx.refresh();
	} catch (e) {
		if (e instanceof EcbRatesError) return e;
		throw e;
	}
	throw new Error('expected refresh() to fail');
}

beforeAll(async () => {
	const health = new URL('/health', FAKE_URL).toString();
	try {
		const response = await fetch(health, { signal: AbortSignal.timeout(2_000) });
		if (!response.ok) throw new Error(`HTTP ${response.status}`);
	} catch (e) {
		throw new Error(
			`The local ECB fake does not answer at ${health} (${String(e)}). ` +
				'`npm test` starts it; by hand run `bash scripts/ecb-fake.sh start`.',
			{ cause: e }
		);
	}
});

afterAll(async () => {
	for (const server of servers) {
		server.closeAllConnections();
		await new Promise((resolve) => server.close(resolve));
	}
});

beforeEach(async () => {
	await resetDatabase();
});

describe('ECB client over HTTP against the local fake', () => {
	it('fetches the 2 January 2024 rates as published decimal strings (10c, V)', async () => {
		const daily = await fetchEcbDailyRates({ url: FAKE_URL });
		expect(daily.asOf).toBe('2024-01-02');
		expect(daily.rates).toEqual({ ...PUBLISHED, HUF: '382.10' });
	});

	it('says which stage failed: HTTP status, refused connection, timeout, not XML', async () => {
		const notFound = await fetchEcbDailyRates({
			url: new URL('/no-such-file.xml', FAKE_URL).toString()
		}).catch((e) => e);
		expect(notFound).toBeInstanceOf(EcbRatesError);
		expect(notFound).toMatchObject({
			reason: 'http',
			message: expect.stringMatching(/answered HTTP 404/)
		});

		// A port that was just free: nothing listens there any more.
		const gone = await loopbackServer(() => {});
		const server = servers.pop() as Server;
		await new Promise((resolve) => server.close(resolve));
		await expect(fetchEcbDailyRates({ url: gone })).rejects.toMatchObject({
			reason: 'unreachable',
			message: expect.stringMatching(/Could not reach/)
		});

		const silent = await loopbackServer(() => {
			/* accepts the request and never answers */
		});
		const started = Date.now();
		await expect(fetchEcbDailyRates({ url: silent, timeoutMs: 300 })).rejects.toMatchObject({
			reason: 'timeout',
			message: expect.stringMatching(/did not answer within 300 ms/)
		});
		expect(Date.now() - started).toBeLessThan(5_000);

		const garbage = await loopbackServer((_req, res) =>
			res
				.writeHead(200, { 'content-type': 'text/html' })
				.end('<html><body>Maintenance</body></html>')
		);
		await expect(fetchEcbDailyRates({ url: garbage })).rejects.toMatchObject({
			reason: 'unexpected-shape'
		});

		const huge = await loopbackServer((_req, res) => {
			res.writeHead(200, { 'content-type': 'text/xml' });
			res.end('<'.padEnd(600 * 1024, 'x'));
		});
		await expect(fetchEcbDailyRates({ url: huge })).rejects.toMatchObject({ reason: 'too-large' });

		await expect(fetchEcbDailyRates({ url: 'file:///etc/passwd' })).rejects.toMatchObject({
			reason: 'config'
		});
	});
});

describe('fx service on the real MariaDB', () => {
	it('refresh() stores one row per currency for the as-of date and reports them as created', async () => {
		const result = await fx.refresh();
		expect(result).toEqual({
			asOf: '2024-01-02',
			source: SOURCE,
			created: Object.keys(PUBLISHED).sort(),
			updated: [],
			unchanged: []
		});
		const rows = await FxRate.findAll({ order: [['currency', 'ASC']] });
		expect(rows.map((r) => [r.currency, fx.normalizeRate(r.ratePerEur), r.asOf, r.source])).toEqual(
			Object.entries(PUBLISHED).map(([c, rate]) => [c, rate, '2024-01-02', SOURCE])
		);
	});

	it('a second refresh of the same day changes nothing and adds no row', async () => {
		await fx.refresh();
		const again = await fx.refresh();
		expect(again.created).toEqual([]);
		expect(again.updated).toEqual([]);
		expect(again.unchanged).toHaveLength(11);
		expect(await countRows('fx_rates')).toBe(11);
	});

	it('a corrected rate for a stored day is updated in place and reported with both values', async () => {
		await fx.refresh();
		await FxRate.update(
			{ ratePerEur: '1.0900' },
			{ where: { currency: 'USD', asOf: '2024-01-02' } }
		);
		const result = await fx.refresh();
		expect(result.updated).toEqual([{ currency: 'USD', from: '1.09', to: '1.0956' }]);
		expect(result.unchanged).toHaveLength(10);
		expect(await countRows('fx_rates')).toBe(11);
	});

	it('a failed fetch writes nothing', async () => {
		await FxRate.create({
			currency: 'USD',
			ratePerEur: '1.0900',
			asOf: '2023-12-29',
			source: 'older'
		});
		process.env.ECB_RATES_URL = await loopbackServer((_req, res) =>
			res.writeHead(200).end('<gesmes:Envelope><Cube/></gesmes:Envelope>')
		);
		try {
			const error = await refused();
			expect(error.reason).toBe('unexpected-shape');
		} finally {
			process.env.ECB_RATES_URL = FAKE_URL;
		}
		expect(await countRows('fx_rates')).toBe(1);
	});

	it('latest() picks each currency’s newest day and flags rates older than 7 days as stale', async () => {
		await FxRate.create({
			currency: 'USD',
			ratePerEur: '1.1050',
			asOf: '2023-12-29',
			source: 'older day'
		});
		await fx.refresh();
		const at = async (iso: string) =>
			(await fx.latest(new Date(iso))).find((r) => r.currency === 'USD');
		// 2 Jan → 9 Jan is 7 days: not yet stale; 10 Jan is 8 days: stale.
		expect(await at('2024-01-09T18:00:00Z')).toEqual({
			currency: 'USD',
			ratePerEur: '1.0956',
			asOf: '2024-01-02',
			source: SOURCE,
			ageDays: 7,
			stale: false
		});
		expect(await at('2024-01-10T00:00:00Z')).toMatchObject({ ageDays: 8, stale: true });
		const all = await fx.latest(new Date('2024-01-03T00:00:00Z'));
		expect(all.map((r) => r.currency)).toEqual(Object.keys(PUBLISHED).sort());
		expect(fx.STALE_AFTER_DAYS).toBe(7);
	});

	it('latest() is empty before any refresh', async () => {
		expect(await fx.latest()).toEqual([]);
		expect(await fx.ratesForPricing()).toEqual({});
	});

	it('ratesForPricing() feeds region adjust: €499.99 → US$547.79 (10d, D)', async () => {
		await fx.refresh();
		const rates = await fx.ratesForPricing();
		expect(rates.USD).toEqual({ ratePerEur: '1.0956', asOf: '2024-01-02' });
		const base: RegionPricing = {
			code: 'de',
			currency: 'EUR',
			taxMode: 'exclusive',
			taxRateBp: 0,
			categoryFactorsBp: {}
		};
		const target: RegionPricing = {
			code: 'us',
			currency: 'USD',
			taxMode: 'exclusive',
			taxRateBp: 0,
			categoryFactorsBp: {}
		};
		const result = adjustToRegion({
			base,
			target,
			rates,
			slots: [
				{
					key: 1,
					category: 'gpu',
					quantity: 1,
					pick: {
						partId: 1,
						targetQuote: null,
						basePrice: { unit: money(49999, 'EUR'), taxIncluded: false, observedAt: '2024-01-02' }
					},
					alternates: []
				}
			]
		});
		expect(result.picksTotal).toEqual(money(54779, 'USD'));
		expect(result.slots[0]?.pick).toMatchObject({ status: 'estimated', date: '2024-01-02' });
	});
});

describe('demo seed of exchange rates', () => {
	it('loads the 2 January 2024 rates idempotently, shown as stale today', async () => {
		await demoFx.up({ name: 'demo-fx-rates', context: sequelize });
		await demoFx.up({ name: 'demo-fx-rates', context: sequelize });
		expect(await countRows('fx_rates')).toBe(11);
		const latest = await fx.latest();
		expect(latest.map((r) => [r.currency, r.ratePerEur, r.asOf, r.source])).toEqual(
			Object.entries(PUBLISHED).map(([c, rate]) => [c, rate, '2024-01-02', SOURCE])
		);
		expect(latest.every((r) => r.stale)).toBe(true);
		// A refresh from the fake finds the very same values.
		expect((await fx.refresh()).unchanged).toHaveLength(11);
		await demoFx.down({ name: 'demo-fx-rates', context: sequelize });
		expect(await countRows('fx_rates')).toBe(0);
	});
});
