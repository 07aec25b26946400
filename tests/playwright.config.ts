import { defineConfig } from '@playwright/test';

/*
 * End-to-end tests against the production build (`node build`) on a migrated, seeded
 * database, in Debian's Chromium: no browser is ever downloaded.
 */
const PORT = Number(process.env.E2E_PORT ?? 4173);
export const BASE_URL = `http://127.0.0.1:${PORT}`;

function passThrough(...names: string[]): Record<string, string> {
	const env: Record<string, string> = {};
	for (const name of names) {
		const value = process.env[name];
		if (value) env[name] = value;
	}
	return env;
}

export default defineConfig({
	testDir: './e2e',
	testMatch: '**/*.e2e.ts',
	// Playwright empties its output folder at start: keep it apart from the run's reports.
	outputDir: '../.reports/playwright-artifacts',
	fullyParallel: false,
	workers: 1,
	// The catalog import adds 200 parts to the shared e2e database: it runs after every
	// test that reads the demo catalog.
	projects: [
		{ name: 'main', testIgnore: /editor-catalog\.e2e\.ts$/ },
		{ name: 'catalog-writes', testMatch: /editor-catalog\.e2e\.ts$/, dependencies: ['main'] }
	],
	retries: 0,
	timeout: 30_000,
	use: {
		baseURL: BASE_URL,
		trace: 'off',
		launchOptions: {
			executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
			args: [
				'--headless',
				'--no-sandbox',
				'--disable-gpu',
				'--disable-quic',
				'--no-first-run',
				'--disable-background-networking',
				'--disable-component-update',
				'--disable-sync'
			]
		}
	},
	webServer: {
		command: 'node build',
		cwd: '..',
		url: `${BASE_URL}/api/health`,
		reuseExistingServer: false,
		timeout: 60_000,
		env: {
			PORT: String(PORT),
			HOST: '127.0.0.1',
			ORIGIN: BASE_URL,
			BODY_SIZE_LIMIT: '16M',
			DB_NAME: process.env.DB_NAME ?? 'slotwise_e2e',
			LOG_LEVEL: 'silent',
			// The scheduler's daily pass would recompute every stored figure under the running
			// tests; it is tested with a controlled clock in tests/integration/upkeep-schedule.spec.ts.
			SCHEDULER: 'off',
			// Mail goes to the SMTP fake, rates come from the ECB fake and payments go to the provider
			// fake that npm test starts;
			// unset values are left out.
			...passThrough(
				'SMTP_HOST',
				'SMTP_PORT',
				'MAILBOX_URL',
				'ECB_RATES_URL',
				'STRIPE_API_URL',
				'STRIPE_SECRET_KEY',
				'STRIPE_WEBHOOK_SECRET'
			)
		}
	}
});
