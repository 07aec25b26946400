/*
 * The mail worker as its own process: npm run worker (scripts/worker.sh sets the ports and
 * starts what is missing), or directly: tsx scripts/worker.ts with DB_* and SMTP_* set.
 * Any number of workers may run against one MariaDB; they share the queue through row locks
 * (src/lib/server/mail/queue/worker.ts). Each also runs the scheduler (src/lib/server/schedule:
 * the daily upkeep pass and the weekly digest; ORIGIN makes the digest's links). SIGTERM or SIGINT: finish the messages in hand,
 * put unstarted ones back, exit.
 */
import { closeDb, db } from '../src/lib/server/db/connection';
import {
	MailWorker,
	deliveryCheckFromEnv,
	queueSettingsFromEnv
} from '../src/lib/server/mail/queue';
import { startScheduler, stopScheduler } from '../src/lib/server/schedule';

const worker = new MailWorker({
	sequelize: db(),
	settings: queueSettingsFromEnv(),
	check: deliveryCheckFromEnv()
});
worker.start();
// The periodic upkeep jobs (daily staleness pass, weekly digest) run beside every worker.
startScheduler();

let stopping = false;
async function shutdown(signal: string) {
	if (stopping) return;
	stopping = true;
	console.log(
		JSON.stringify({ t: new Date().toISOString(), kind: 'mail_worker', event: 'signal', signal })
	);
	await stopScheduler();
	await worker.stop();
	await closeDb();
	process.exit(0);
}
process.once('SIGTERM', () => void shutdown('SIGTERM'));
process.once('SIGINT', () => void shutdown('SIGINT'));
