/*
 * Benchmark (not a test): what the binary log costs per commit. scripts/db.sh keeps it on
 * (GTID, row format, sync_binlog=1) so a replica can attach at any time; this measures the
 * price on this machine.
 *
 * One scratch MariaDB started by scripts/db.sh itself (its own datadir and free port), two
 * kinds of client session on it: ordinary ones, whose commits go through the binary log
 * (group commit, one fsync of the log per group plus InnoDB's), and ones that set
 * `sql_log_bin = 0`, whose commits skip it, as on a server without a binary log. Each
 * transaction inserts two rows and commits, like a small app write. Rounds alternate the
 * two kinds; figures are means over rounds.
 *
 * Run: npm run bench:binlog. Options (env): BENCH_ROUNDS (3), BENCH_SECONDS (5 per window),
 * BENCH_WRITE=0.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import mariadb from 'mariadb';
import { ROOT, freePort, machineNotes, writeBenchSection } from './lib/harness';

const ROUNDS = Number(process.env.BENCH_ROUNDS ?? 3);
const SECONDS = Number(process.env.BENCH_SECONDS ?? 5);
const CLIENTS = [1, 8];

async function commitsPerSecond(
	socketPath: string,
	clients: number,
	logged: boolean
): Promise<number> {
	const pool = mariadb.createPool({
		socketPath,
		user: 'root',
		database: 'binlog_bench',
		connectionLimit: clients
	});
	let commits = 0;
	const until = Date.now() + SECONDS * 1000;
	await Promise.all(
		Array.from({ length: clients }, async () => {
			const connection = await pool.getConnection();
			try {
				if (!logged) await connection.query('SET SESSION sql_log_bin = 0');
				while (Date.now() < until) {
					await connection.beginTransaction();
					await connection.query('INSERT INTO writes (note) VALUES (?)', ['first row']);
					await connection.query('INSERT INTO writes (note) VALUES (?)', ['second row']);
					await connection.commit();
					commits++;
				}
			} finally {
				await connection.release();
			}
		})
	);
	await pool.end();
	return commits / SECONDS;
}

async function main(): Promise<void> {
	const dataDir = mkdtempSync(join(tmpdir(), 'slotwise-binlog-'));
	const env = {
		...process.env,
		SLOTWISE_DATA_DIR: dataDir,
		DB_PORT: String(await freePort()),
		DB_NAMES: 'binlog_bench'
	};
	const socket = join(dataDir, 'mariadb.sock');
	execFileSync('bash', [join(ROOT, 'scripts/db.sh'), 'start'], { env, stdio: 'pipe' });
	try {
		const admin = await mariadb.createConnection({ socketPath: socket, user: 'root' });
		await admin.query(
			'CREATE TABLE binlog_bench.writes (id BIGINT AUTO_INCREMENT PRIMARY KEY, note VARCHAR(40) NOT NULL, at DATETIME(6) NOT NULL DEFAULT NOW(6)) ENGINE=InnoDB'
		);
		const settings = (await admin.query(
			"SHOW GLOBAL VARIABLES WHERE Variable_name IN ('log_bin','sync_binlog','innodb_flush_log_at_trx_commit','binlog_format')"
		)) as { Variable_name: string; Value: string }[];
		await admin.end();
		const results = new Map<string, number[]>();
		for (let round = 0; round < ROUNDS; round++) {
			for (const clients of CLIENTS) {
				for (const logged of [true, false]) {
					const key = `${clients}:${logged}`;
					const rate = await commitsPerSecond(socket, clients, logged);
					results.set(key, [...(results.get(key) ?? []), rate]);
					console.log(
						`round ${round + 1}, ${clients} client(s), binlog ${logged ? 'on' : 'skipped'}: ${rate.toFixed(0)} commits/s`
					);
				}
			}
		}
		const mean = (xs: number[]) => xs.reduce((a, b) => a + b, 0) / xs.length;
		const rows = CLIENTS.map((clients) => {
			const on = mean(results.get(`${clients}:true`) ?? [0]);
			const off = mean(results.get(`${clients}:false`) ?? [0]);
			return `| ${clients} | ${off.toFixed(0)} | ${on.toFixed(0)} | ${(on / off).toFixed(2)} |`;
		});
		const lines = [
			'## Binary log: commits per second with and without it (`npm run bench:binlog`)',
			'',
			`Run ${new Date().toISOString().slice(0, 16).replace('T', ' ')} UTC on ${machineNotes()}.`,
			'',
			`A scratch MariaDB started by \`scripts/db.sh\` (${settings.map((s) => `${s.Variable_name}=${s.Value}`).join(', ')}).`,
			`Each transaction inserts two rows and commits. Sessions with \`sql_log_bin = 0\` skip the binary log, as a server`,
			`without one would; ${ROUNDS} alternating rounds of ${SECONDS} s per line, means over rounds.`,
			'',
			'| clients | commits/s, binary log skipped | commits/s, binary log on (sync_binlog=1) | ratio on/skipped |',
			'| ---: | ---: | ---: | ---: |',
			...rows,
			'',
			'The app commits far fewer transactions than this under load (see the mixed-load figures), so the',
			'binary log is not what limits it; it is kept on for replicas and point-in-time recovery (docs/deployment.md).'
		];
		console.log(lines.join('\n'));
		if (process.env.BENCH_WRITE !== '0')
			console.log(`written: ${writeBenchSection('binlog', lines)}`);
	} finally {
		execFileSync('bash', [join(ROOT, 'scripts/db.sh'), 'stop'], { env, stdio: 'pipe' });
		rmSync(dataDir, { recursive: true, force: true });
	}
}

main().catch((error: unknown) => {
	console.error(error);
	process.exit(1);
});
