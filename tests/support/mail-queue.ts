/* Sends everything queued, through the shared SMTP fake that npm test runs (MAILBOX_URL). */
import { sequelize } from '../../src/lib/server/db';
import { MailWorker, deliveryCheckFromEnv } from '../../src/lib/server/mail/queue';

export async function drainMailQueue(): Promise<void> {
	const worker = new MailWorker({
		sequelize,
		settings: {
			batchSize: 50,
			concurrency: 3,
			leaseMs: 5_000,
			sendGuardMs: 1_000,
			idleMs: 20,
			retry: { baseMs: 50, maxMs: 200, maxAttempts: 3 }
		},
		check: deliveryCheckFromEnv(),
		log: () => {}
	});
	try {
		await worker.drain();
	} finally {
		await worker.stop();
	}
}
