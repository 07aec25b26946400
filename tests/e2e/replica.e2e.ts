import { expect, test } from '@playwright/test';
import { execFileSync } from 'node:child_process';
import { join } from 'node:path';
import {
	type AppProcess,
	type ScratchDb,
	ROOT,
	api,
	cleanUp,
	cookiesOf,
	scratchDb,
	signIn,
	startApp
} from './processes';
import { freePort } from './support';

/*
 * Read/write splitting against a real binlog replica: a scratch primary (scripts/db.sh, binary
 * log on) and its replica (scripts/db-replica.sh, seeded from a dump, following by GTID), and
 * `node build` with DB_REPLICA_PORT set. With the replica's SQL thread stopped, a row changed
 * only on the primary shows which server answered a read: plain reads come from the replica;
 * a reader's reads right after their own write come from the primary.
 */
test.describe.configure({ mode: 'serial', timeout: 180_000 });

const DB = 'slotwise_replica';
const READER = 'reader@slotwise.test';
// A short window so the test can also watch it end (the default is 5 s).
const WINDOW_SECONDS = 3;

let primary: ScratchDb;
let replicaPort = 0;
let app: AppProcess;

const replicaSql = (query: string) =>
	execFileSync(
		'mariadb',
		[
			'--no-defaults',
			`--socket=${join(primary.dataDir, 'mariadb-replica.sock')}`,
			'-uroot',
			'-N',
			'-B',
			'-e',
			query
		],
		{ encoding: 'utf8' }
	).trim();

/** Waits until the replica has applied everything the primary has logged so far. */
function caughtUp(): void {
	const position = primary.sql('SELECT @@gtid_binlog_pos')[0]?.[0] ?? '';
	expect(replicaSql(`SELECT MASTER_GTID_WAIT('${position}', 20)`)).toBe('0');
}

test.beforeAll(async () => {
	// Set-up starts real processes: minutes on a loaded machine, not the 30 s default.
	test.setTimeout(180_000);
	primary = await scratchDb('replica', [DB]);
	primary.migrateAndSeed(DB);
	replicaPort = await freePort();
	execFileSync('bash', [join(ROOT, 'scripts/db-replica.sh'), 'start'], {
		env: { ...primary.env, DB_REPLICA_PORT: String(replicaPort) },
		stdio: 'pipe'
	});
	caughtUp();
	app = await startApp({
		DB_PORT: String(primary.port),
		DB_REPLICA_PORT: String(replicaPort),
		DB_NAME: DB,
		READ_PRIMARY_AFTER_WRITE_SECONDS: String(WINDOW_SECONDS)
	});
});

test.afterAll(cleanUp);

test('the primary logs every commit for the replica, which is read-only and follows it', () => {
	const variables = Object.fromEntries(
		primary.sql(
			"SHOW GLOBAL VARIABLES WHERE Variable_name IN ('log_bin','sync_binlog','innodb_flush_log_at_trx_commit','server_id','binlog_format')"
		) as [string, string][]
	);
	// docs/security.md §9: sync_binlog=1 whenever the binary log is on; flush at every commit.
	expect(variables).toEqual({
		binlog_format: 'ROW',
		innodb_flush_log_at_trx_commit: '1',
		log_bin: 'ON',
		server_id: '1',
		sync_binlog: '1'
	});
	expect(replicaSql('SELECT @@read_only, @@server_id, @@port')).toBe(`1\t2\t${replicaPort}`);
	// The script's own status check: both replication threads run.
	execFileSync('bash', [join(ROOT, 'scripts/db-replica.sh'), 'status'], {
		env: primary.env,
		stdio: 'pipe'
	});
	// The app's account cannot write on the replica (ERROR 1290, --read-only).
	expect(() =>
		execFileSync(
			'mariadb',
			[
				'--no-defaults',
				'-h127.0.0.1',
				`-P${replicaPort}`,
				'-uslotwise',
				'-pslotwise-dev',
				DB,
				'-e',
				"UPDATE guides SET title = 'written on the replica'"
			],
			{ stdio: 'pipe' }
		)
	).toThrow(/read-only/);
});

test('plain reads come from the replica; a reader who just wrote reads from the primary', async () => {
	// Sign-in is a POST, so its answer marks the client as a recent writer too: keep only the
	// session cookie, as a client would hold it a few seconds later.
	const session = (await signIn(app.origin, READER))
		.split('; ')
		.filter((pair) => !pair.startsWith('slotwise-recent-write='))
		.join('; ');
	const forked = await api(
		app.origin,
		'POST',
		'/api/v1/guides/steady-1080p-starter/fork',
		session,
		{}
	);
	expect(forked.status).toBe(201);
	const { id } = (await forked.json()) as { id: number };
	caughtUp();
	// The app keeps read connections open on the replica.
	expect(
		Number(
			replicaSql("SELECT COUNT(*) FROM information_schema.processlist WHERE user = 'slotwise'")
		)
	).toBeGreaterThan(0);

	// Freeze the replica, then change the build on the primary only.
	replicaSql('STOP SLAVE');
	primary.sql(`UPDATE builds SET title = 'Changed on the primary only' WHERE id = ${id}`, DB);
	const titleSeenBy = async (cookie: string) => {
		const response = await api(app.origin, 'GET', `/api/v1/builds/${id}`, cookie);
		expect(response.status).toBe(200);
		return ((await response.json()) as { title: string }).title;
	};
	// The session alone (no recent write of this client): the replica answers, with the old title.
	expect(await titleSeenBy(session)).not.toBe('Changed on the primary only');
	const replicaTitle = await titleSeenBy(session);

	// The reader renames the build. The write goes to the primary (the replica is read-only
	// and frozen), and the answer marks this client as a recent writer.
	const current = await api(app.origin, 'GET', `/api/v1/builds/${id}`, session);
	const { version } = (await current.json()) as { version: number };
	const renamed = await api(app.origin, 'PATCH', `/api/v1/builds/${id}`, session, {
		version,
		title: 'Renamed by its reader'
	});
	expect(renamed.status, await renamed.clone().text()).toBe(200);
	const withMarker = cookiesOf(renamed, session);
	expect(withMarker).toContain('slotwise-recent-write=');

	// Right after: the reader's JSON and HTML reads see their own change (from the primary)…
	expect(await titleSeenBy(withMarker)).toBe('Renamed by its reader');
	const page = await fetch(`${app.origin}/builds/${id}`, { headers: { cookie: withMarker } });
	expect(await page.text()).toContain('Renamed by its reader');
	// …while the same session without the marker still reads the frozen replica.
	expect(await titleSeenBy(session)).toBe(replicaTitle);

	// Once the window has passed, the reader's reads go back to the (still frozen) replica.
	await new Promise((done) => setTimeout(done, (WINDOW_SECONDS + 1) * 1000));
	expect(await titleSeenBy(withMarker)).toBe(replicaTitle);

	// Replication resumes and catches up: every reader now sees the rename.
	replicaSql('START SLAVE');
	caughtUp();
	expect(await titleSeenBy(session)).toBe('Renamed by its reader');
});

test('health answers 503 when the primary is down, though the replica still answers', async () => {
	const health = () =>
		fetch(`${app.origin}/api/health`, { signal: AbortSignal.timeout(5_000) }).then(async (r) => ({
			status: r.status,
			body: await r.json()
		}));
	expect(await health()).toEqual({ status: 200, body: { status: 'ok', db: 'up' } });
	primary.stop();
	expect(replicaSql('SELECT 1')).toBe('1');
	const started = Date.now();
	expect(await health()).toEqual({ status: 503, body: { status: 'degraded', db: 'down' } });
	expect(Date.now() - started, 'answered within 2 s').toBeLessThan(2_000);
});
