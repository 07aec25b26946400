import { sveltekit } from '@sveltejs/kit/vite';
import tailwindcss from '@tailwindcss/vite';
import { defineConfig } from 'vitest/config';

export default defineConfig({
	plugins: [tailwindcss(), sveltekit()],
	server: { host: '127.0.0.1' },
	test: {
		projects: [
			{
				extends: true,
				test: {
					name: 'unit',
					environment: 'node',
					include: ['tests/unit/**/*.spec.ts']
				}
			},
			{
				extends: true,
				test: {
					name: 'integration',
					environment: 'node',
					include: ['tests/integration/**/*.spec.ts'],
					env: {
						DB_NAME: process.env.DB_NAME ?? 'slotwise_test',
						LOG_LEVEL: 'silent',
						// The local SMTP fake that npm test starts (scripts/smtp-fake.sh).
						SMTP_HOST: process.env.SMTP_HOST ?? '127.0.0.1',
						SMTP_PORT: process.env.SMTP_PORT ?? '2525',
						MAILBOX_URL: process.env.MAILBOX_URL ?? 'http://127.0.0.1:2580'
					},
					globalSetup: ['tests/support/global-setup.ts'],
					setupFiles: ['tests/support/integration-setup.ts'],
					// One real MariaDB database: files run one after another.
					fileParallelism: false,
					testTimeout: 30_000,
					hookTimeout: 60_000
				}
			}
		]
	}
});
