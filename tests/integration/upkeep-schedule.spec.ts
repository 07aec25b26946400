import { QueryTypes } from 'sequelize';
import { beforeEach, describe, expect, it } from 'vitest';
import { Quote, User, sequelize } from '../../src/lib/server/db';
import { seedDemoCommunity } from '../../src/lib/server/db/seeders/demo-community';
import { Scheduler } from '../../src/lib/server/schedule/scheduler';
import * as catalogStores from '../../src/lib/server/services/catalog-stores';
import { setDigest } from '../../src/lib/server/services/upkeep-dashboard';
import { queueWeeklyDigests } from '../../src/lib/server/services/upkeep-digest';
import { countRows, resetDatabase } from '../support/db';
import { drainMailQueue } from '../support/mail-queue';
import { clearMailbox, listMessages, type MailboxMessage } from '../support/mailbox';
import { quoteAt, store, upkeepGuide, type UpkeepGuide } from '../support/upkeep-fixtures';

/*
 * The scheduler (src/lib/server/schedule) on the real MariaDB, with its clock set by the
 * test, and the weekly digest read back from the shared SMTP fake (MAILBOX_URL) after the
 * real mail worker has sent the queue.
 *
 * The guide (tests/support/upkeep-fixtures.ts): base region us, CPU pick Tollan K6 Test
 * ($100.00) with the drop-in alternate Tollan K6 Lite Test ($120.00), graphics card Tollan
 * G8 Test ($300.00), budget $450.00; the quotes' ages are set per test. A pick is stale when
 * its newest quote is more than 30 whole days old (common practice, no published source;
 * src/lib/domain/upkeep.ts).
 */

const DAY_MS = 86_400_000;
const ORIGIN = 'https://slotwise.example';
const SUBJECT = 'Your guides this week: upkeep alerts';
let t0: number;
let author: User;

/** `days` days after the test started, as the scheduler's clock. */
const at = (days: number) => new Date(t0 + days * DAY_MS);

function scheduler(days: number): Scheduler {
	return new Scheduler({ sequelize, origin: ORIGIN, now: () => at(days), log: () => {} });
}

/** Alerts stored for the guide as (kind region slot) lines, sorted. */
async function stored(g: UpkeepGuide): Promise<string[]> {
	const rows = await sequelize.query<{ kind: string; code: string | null; slotKey: string | null }>(
		`SELECT a.kind, r.code, a.slot_key AS slotKey FROM guide_upkeep_alerts a
		   LEFT JOIN regions r ON r.id = a.region_id WHERE a.guide_id = :id`,
		{ type: QueryTypes.SELECT, replacements: { id: g.guide.id } }
	);
	return rows.map((r) => `${r.kind} ${r.code ?? '-'} ${r.slotKey ?? '-'}`).sort();
}

/** Digests the SMTP fake received for the demo author, after the worker sent the queue. */
async function digestsReceived(): Promise<MailboxMessage[]> {
	await drainMailQueue();
	return (await listMessages()).filter(
		(m) => m.to.some((a) => a.toLowerCase() === author.email) && m.subject === SUBJECT
	);
}

/** The guide with its graphics card's only quote `gpuDays` days old, CPU quotes 1 day old. */
function guideWithCardQuoted(gpuDays: number): Promise<UpkeepGuide> {
	return upkeepGuide(45000, async ({ cpuA, cpuB, gpu }) => {
		await quoteAt(cpuA, 'us', 10000, 1);
		await quoteAt(cpuB, 'us', 12000, 1);
		await quoteAt(gpu, 'us', 30000, gpuDays);
	});
}

beforeEach(async () => {
	await resetDatabase();
	await clearMailbox();
	await seedDemoCommunity(sequelize);
	t0 = Date.now();
	author = (await User.findOne({ where: { email: 'author@slotwise.test' } }))!;
});

describe('the daily upkeep pass', () => {
	it('raises a stale-quote alert when the newest quote passes 30 days, with no other event', async () => {
		const g = await guideWithCardQuoted(20);
		// At publication the card's quote is 20 days old: nothing holds ($400.00 ≤ $450.00).
		expect(await stored(g)).toEqual([]);
		// An hour short of ten days on it is 29 days and 23 hours old: not stale. (Exactly ten
		// days on would be a boundary: MariaDB keeps whole seconds, so the stored quote can be
		// up to a second older than the test's clock says.)
		const almost10 = 10 - 1 / 24;
		expect((await scheduler(almost10).runOnce()).staleness).toBe(
			at(almost10).toISOString().slice(0, 10)
		);
		expect(await stored(g)).toEqual([]);
		// Twelve days on it is nearly 32 days old, over 30: stale, with no quote, rate or review event.
		const day12 = await scheduler(12).runOnce();
		expect(day12.staleness).toBe(at(12).toISOString().slice(0, 10));
		expect(await stored(g)).toEqual(['stale_quote us gpu-main']);
	});

	it('runs once per day however many schedulers tick', async () => {
		await guideWithCardQuoted(20);
		const ticks = await Promise.all([
			scheduler(12).runOnce(),
			scheduler(12).runOnce(),
			scheduler(12).runOnce()
		]);
		expect(ticks.filter((t) => t.staleness !== null)).toHaveLength(1);
		expect((await scheduler(12).runOnce()).staleness).toBeNull();
		expect((await scheduler(13).runOnce()).staleness).toBe(at(13).toISOString().slice(0, 10));
		expect(await countRows('scheduled_runs')).toBeGreaterThanOrEqual(2);
	});
});

describe('the weekly upkeep digest', () => {
	it('sends nothing to an author who did not turn it on', async () => {
		const g = await guideWithCardQuoted(40);
		expect(await stored(g)).toEqual(['stale_quote us gpu-main']);
		const tick = await scheduler(1).runOnce();
		expect(tick.digests).toMatchObject({ queued: 0, nothingNew: 0, alreadyDecided: 0 });
		expect(await countRows('mail_jobs')).toBe(0);
		expect(await countRows('upkeep_digests')).toBe(0);
		expect(await digestsReceived()).toEqual([]);
	});

	it('does not mail the alerts that were already on the dashboard when it was turned on', async () => {
		await guideWithCardQuoted(40);
		await setDigest(author.id, true);
		const tick = await scheduler(1).runOnce();
		expect(tick.digests).toMatchObject({ queued: 0, nothingNew: 1 });
		expect(await digestsReceived()).toEqual([]);
	});

	it('sends exactly one digest in the week, with two schedulers and repeated runs', async () => {
		await setDigest(author.id, true, new Date(t0 - 60_000));
		const g = await guideWithCardQuoted(40);
		expect(await stored(g)).toEqual(['stale_quote us gpu-main']);
		// Two processes tick at the same moment: one runs the week's digests.
		const ticks = await Promise.all([scheduler(1).runOnce(), scheduler(1).runOnce()]);
		expect(ticks.map((t) => t.digests?.queued ?? null).sort()).toEqual([1, null]);
		// The same week decided again directly, twice at once (as after a lease was taken over):
		// the author's row is found and nothing more is queued.
		const again = await Promise.all([
			queueWeeklyDigests(ORIGIN, at(1)),
			queueWeeklyDigests(ORIGIN, at(1))
		]);
		expect(again.map((r) => [r.queued, r.alreadyDecided])).toEqual([
			[0, 1],
			[0, 1]
		]);
		expect((await scheduler(1).runOnce()).digests).toBeNull();

		const received = await digestsReceived();
		expect(received).toHaveLength(1);
		const quote = await Quote.findOne({ where: { partId: g.parts.gpu.id } });
		const quoted = quote!.observedAt.toISOString().slice(0, 10);
		expect(received[0]?.text).toContain(
			`One new upkeep alert on your guides since your last digest:\n\n△ caution · Upkeep test rig: Tollan G8 Test (Graphics card) has no quote newer than 30 days in us; the newest is from ${quoted}.`
		);
		expect(received[0]?.text).toContain(`${ORIGIN}/my/guides`);
	});

	it('lists only the newer alerts the next week, and sends nothing in a week with none', async () => {
		await setDigest(author.id, true, new Date(t0 - 60_000));
		await guideWithCardQuoted(40);
		expect((await scheduler(1).runOnce()).digests).toMatchObject({ queued: 1 });
		expect(await digestsReceived()).toHaveLength(1);
		await clearMailbox();

		// A new quote makes the CPU pick $130.00, dearer than its drop-in alternate ($120.00).
		const editor = (await User.findOne({ where: { email: 'editor@slotwise.test' } }))!;
		const added = await catalogStores.addQuote(editor.id, {
			partSlug: 'tollan-k6-test',
			storeId: String((await store('us')).id),
			amount: '130.00',
			observedOn: new Date().toISOString().slice(0, 10)
		});
		expect(added.kind).toBe('ok');

		// Seven days on is always another ISO week.
		expect((await scheduler(8).runOnce()).digests).toMatchObject({ queued: 1 });
		const [second, ...more] = await digestsReceived();
		expect(more).toEqual([]);
		expect(second?.text).toContain(
			'One new upkeep alert on your guides since your last digest:\n\n△ caution · Upkeep test rig: Tollan K6 Lite Test is now cheaper than the pick Tollan K6 Test in us (US$120.00 against US$130.00) and fits as a drop-in.'
		);
		expect(second?.text).not.toContain('no quote newer than 30 days');
		await clearMailbox();

		// Fourteen days on: both alerts still hold, neither is new.
		expect((await scheduler(15).runOnce()).digests).toMatchObject({ queued: 0, nothingNew: 1 });
		expect(await digestsReceived()).toEqual([]);
		expect(await countRows('upkeep_digests')).toBe(3);
	});
});
