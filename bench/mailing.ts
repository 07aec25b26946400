/*
 * Benchmark (not a test): one mailing to 10,000 confirmed subscribers through the mail queue
 * (issue 17), against what the same SMTP server takes from a plain nodemailer loop.
 *
 * - A scratch MariaDB started by scripts/db.sh itself (its own datadir and free port),
 *   migrated, with the demo community and exchange rates seeded; the subscribers are spread
 *   over every region, so each recipient's job carries its own region's total.
 * - A private copy of the local SMTP fake (scripts/smtp-fake.ts) on free ports, counting
 *   messages without keeping their bodies.
 * - Queue: the editor's "start" (every recipient priced and one mail_jobs row each, timed on
 *   its own), then one MailWorker with the default settings drains the queue: claim with
 *   SKIP LOCKED, compose, send through the pooled transport, record each 250.
 * - Baseline: nodemailer's pooled transport with the same number of connections sends the
 *   same count of one composed recipient's message (same size, same list headers) in a loop,
 *   no database. It runs before and after the queue and the figure is their mean, so other
 *   work on a shared machine falls on both sides.
 *
 * The fake's count is checked after each side: every message arrived exactly once.
 *
 * Run: npm run bench:mailing. Options (env): BENCH_RECIPIENTS (10000), BENCH_WRITE=0.
 */
import { execFileSync } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createTransport } from 'nodemailer';
import type SMTPTransport from 'nodemailer/lib/smtp-transport';
import { startFakeSmtp, type FakeSmtp } from '../tests/support/smtp-fake-process';
import { ROOT, freePort, machineNotes, writeBenchSection } from './lib/harness';

const RECIPIENTS = Number(process.env.BENCH_RECIPIENTS ?? 10_000);
const DATABASE = 'mailing_bench';
const ORIGIN = 'https://slotwise.example';

const seconds = (ms: number) => ms / 1000;

async function waitForCount(fake: FakeSmtp, count: number, timeoutMs = 60_000): Promise<number> {
	const until = Date.now() + timeoutMs;
	for (;;) {
		const accepted = await fake.accepted();
		if (accepted >= count || Date.now() > until) return accepted;
		await new Promise((r) => setTimeout(r, 50));
	}
}

/** A plain nodemailer loop: `count` copies of one message, `connections` at a time. */
async function baseline(
	fake: FakeSmtp,
	options: SMTPTransport.Options,
	connections: number,
	message: { from: string; subject: string; text: string; html: string; headers: object }
): Promise<number> {
	await fake.clear();
	// The same connection options the worker uses (server/mail/transport.ts), pooled.
	const transport = createTransport({
		...options,
		pool: true,
		maxConnections: connections,
		maxMessages: 500
	} as SMTPTransport.Options);
	let next = 0;
	const started = performance.now();
	await Promise.all(
		Array.from({ length: connections }, async () => {
			while (next < RECIPIENTS) {
				const i = next++;
				await transport.sendMail({
					...message,
					to: `baseline-${String(i).padStart(5, '0')}@example.test`
				});
			}
		})
	);
	const ms = performance.now() - started;
	transport.close();
	const arrived = await waitForCount(fake, RECIPIENTS);
	if (arrived !== RECIPIENTS) throw new Error(`baseline: the fake counted ${arrived}`);
	return ms;
}

async function main(): Promise<void> {
	const dataDir = mkdtempSync(join(tmpdir(), 'slotwise-mailing-'));
	const dbEnv = {
		...process.env,
		SLOTWISE_DATA_DIR: dataDir,
		DB_PORT: String(await freePort()),
		DB_NAMES: DATABASE
	};
	execFileSync('bash', [join(ROOT, 'scripts/db.sh'), 'start'], { env: dbEnv, stdio: 'pipe' });
	const fake = await startFakeSmtp({ keepBodies: false });
	try {
		// The app's modules read these when first imported.
		Object.assign(process.env, {
			DB_HOST: '127.0.0.1',
			DB_PORT: dbEnv.DB_PORT,
			DB_NAME: DATABASE,
			SMTP_HOST: '127.0.0.1',
			SMTP_PORT: String(fake.smtpPort),
			MAILBOX_URL: fake.mailboxUrl,
			LOG_LEVEL: 'silent',
			AUTH_SECRET: process.env.AUTH_SECRET ?? randomBytes(32).toString('base64url')
		});
		const db = await import('../src/lib/server/db');
		const { migrator } = await import('../src/lib/server/db/umzug');
		const { seeder } = await import('../src/lib/server/db/seeders');
		const queue = await import('../src/lib/server/mail/queue');
		const { MailingContentCache, compose } = await import('../src/lib/server/mail/queue/compose');
		const { prepareMessage } = await import('../src/lib/server/mail');
		const { mailConfigFromEnv, transportOptions } =
			await import('../src/lib/server/mail/transport');
		const mailings = await import('../src/lib/server/services/mailings');
		const mailingSend = await import('../src/lib/server/services/mailing-send');
		const { Guide, MailJob, Mailing, Region, Subscriber, User, sequelize } = db;

		await migrator(sequelize).up();
		await seeder(sequelize).up({ to: '2026.12.02T11.00.00.demo-fx-rates' });
		const guide = await Guide.findOne({ where: { slug: 'steady-1080p-starter' } });
		const editor = await User.findOne({ where: { email: 'editor@slotwise.test' } });
		const regions = await Region.findAll({ order: [['id', 'ASC']] });
		if (!guide?.publishedRevisionId || !editor || regions.length === 0)
			throw new Error('the demo seed has no published starter guide, editor or regions');
		const now = new Date();
		for (let from = 0; from < RECIPIENTS; from += 2000) {
			await Subscriber.bulkCreate(
				Array.from({ length: Math.min(2000, RECIPIENTS - from) }, (_, k) => {
					const i = from + k;
					return {
						email: `reader-${String(i).padStart(5, '0')}@example.test`,
						status: 'confirmed' as const,
						homeRegionId: regions[i % regions.length]!.id,
						confirmedAt: now
					};
				})
			);
		}
		const created = await mailings.createMailing(editor.id, guide.publishedRevisionId);
		if (created.kind !== 'ok') throw new Error(JSON.stringify(created));
		await mailings.updateMailing(created.id, {
			subject: 'A new guide for your budget',
			intro: 'A guide our editors approved this week, priced for where you live.',
			regions: [],
			tags: [],
			followers: false
		});
		// The editor's own test send is a precondition of starting; it is not what is measured.
		await Mailing.update({ testSentAt: new Date() }, { where: { id: created.id } });

		const enqueueStarted = performance.now();
		const started = await mailingSend.start(created.id, editor.id, ORIGIN);
		const enqueueMs = performance.now() - enqueueStarted;
		if (started.kind !== 'ok' || started.recipients !== RECIPIENTS)
			throw new Error(`start: ${JSON.stringify(started)}`);

		// The baseline's message: one recipient's composed copy, as the worker would send it.
		const first = await MailJob.findOne({
			where: { mailingId: created.id },
			order: [['id', 'ASC']]
		});
		if (!first) throw new Error('no job was queued');
		const composed = await compose(first, new MailingContentCache());
		const settings = queue.queueSettingsFromEnv();
		const mailConfig = mailConfigFromEnv();
		const smtpOptions = transportOptions(mailConfig);
		const prepared = prepareMessage(mailConfig.from, first.toEmail, composed.message, {
			headers: composed.headers
		});
		const sample = {
			from: prepared.from,
			subject: prepared.subject,
			text: prepared.text,
			html: prepared.html,
			headers: prepared.headers ?? {}
		};

		console.log(`baseline 1: ${RECIPIENTS} messages through a plain nodemailer loop …`);
		const baseline1 = await baseline(fake, smtpOptions, settings.concurrency, sample);
		await fake.clear();

		console.log(`queue: ${RECIPIENTS} jobs through one MailWorker …`);
		const worker = new queue.MailWorker({
			sequelize,
			settings,
			check: queue.deliveryCheckFromEnv(),
			log: () => {}
		});
		const drainStarted = performance.now();
		await worker.drain(30 * 60_000);
		const drainMs = performance.now() - drainStarted;
		await worker.stop();
		const arrived = await waitForCount(fake, RECIPIENTS);
		const counts = await fake.counts();
		const notOnce = Object.values(counts.recipients).filter((n) => n !== 1).length;
		const mailing = await Mailing.findByPk(created.id);
		if (arrived !== RECIPIENTS || notOnce > 0 || mailing?.status !== 'finished')
			throw new Error(
				`queue: the fake counted ${arrived} (${notOnce} recipients not once), mailing ${mailing?.status}`
			);

		console.log(`baseline 2 …`);
		const baseline2 = await baseline(fake, smtpOptions, settings.concurrency, sample);
		await sequelize.close();

		const baselineMs = (baseline1 + baseline2) / 2;
		const queueRate = RECIPIENTS / seconds(drainMs);
		const baseRate = RECIPIENTS / seconds(baselineMs);
		const totalMs = enqueueMs + drainMs;
		const bytes = Buffer.byteLength(sample.text) + Buffer.byteLength(sample.html);
		const lines = [
			'## Mailing through the mail queue (`npm run bench:mailing`)',
			'',
			`Run ${new Date().toISOString().slice(0, 16).replace('T', ' ')} UTC on ${machineNotes()}.`,
			'',
			`${RECIPIENTS.toLocaleString('en')} confirmed subscribers over ${regions.length} regions, one mailing of the demo starter guide`,
			`(text + HTML ${(bytes / 1024).toFixed(1)} KB, both list headers) to a private copy of the local SMTP fake.`,
			`Queue: one MailWorker, default settings (${settings.concurrency} pooled connections, batches of ${settings.batchSize}),`,
			'on a scratch MariaDB. Baseline: a plain nodemailer pooled loop, same connections, the same',
			'composed message, no database; run before and after the queue, mean of the two.',
			'',
			'| side | messages | seconds | messages/s |',
			'| --- | ---: | ---: | ---: |',
			`| baseline: plain nodemailer loop (runs ${seconds(baseline1).toFixed(1)} s, ${seconds(baseline2).toFixed(1)} s) | ${RECIPIENTS} | ${seconds(baselineMs).toFixed(1)} | ${baseRate.toFixed(0)} |`,
			`| queue: start (price every recipient, one job row each) | ${RECIPIENTS} | ${seconds(enqueueMs).toFixed(1)} | — |`,
			`| queue: worker drains it | ${RECIPIENTS} | ${seconds(drainMs).toFixed(1)} | ${queueRate.toFixed(0)} |`,
			`| queue: total, start to last message | ${RECIPIENTS} | ${seconds(totalMs).toFixed(1)} | ${(RECIPIENTS / seconds(totalMs)).toFixed(0)} |`,
			'',
			`Ratio queue/baseline (sending only): **${(queueRate / baseRate).toFixed(2)}**. The fake counted`,
			'every message exactly once on each side.'
		];
		console.log(lines.join('\n'));
		if (process.env.BENCH_WRITE !== '0')
			console.log(`written: ${writeBenchSection('mailing', lines)}`);
	} finally {
		await fake.stop();
		execFileSync('bash', [join(ROOT, 'scripts/db.sh'), 'stop'], { env: dbEnv, stdio: 'pipe' });
		rmSync(dataDir, { recursive: true, force: true });
	}
}

main().then(
	() => process.exit(0),
	(error: unknown) => {
		console.error(error);
		process.exit(1);
	}
);
