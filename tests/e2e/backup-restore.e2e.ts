import { expect, test } from '@playwright/test';
import { execFileSync } from 'node:child_process';
import { createHash, randomBytes } from 'node:crypto';
import { cpSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, relative } from 'node:path';
import { runNote, writeReliabilitySection } from '../support/reliability-report';
import { type ScratchDb, ROOT, cleanUp, scratchDb, signIn, startApp } from './processes';

/*
 * The restore drill (docs/security.md §9, test 3): `npm run backup` of a seeded database on
 * this checkout's MariaDB plus an uploads folder, `npm run restore` into a scratch instance
 * (own datadir, free port), then every table's row count and CHECKSUM TABLE compared, every
 * uploaded file's SHA-256 compared, and the app started on the restored copy.
 */
test.describe.configure({ mode: 'serial', timeout: 180_000 });

const SOURCE = 'slotwise_backup_drill';
const RESTORED = 'slotwise_restored';

let work: string;
let target: ScratchDb;

// The checkout's own instance, as npm test started it.
const checkoutEnv = { ...process.env, DB_NAMES: SOURCE, DB_NAME: SOURCE };
const checkoutSql = (query: string) =>
	execFileSync(
		'mariadb',
		[
			'--no-defaults',
			`--socket=${join(process.env.SLOTWISE_DATA_DIR ?? join(ROOT, '.data'), 'mariadb.sock')}`,
			'-uroot',
			'--default-character-set=utf8mb4',
			'-N',
			'-B',
			'-e',
			query
		],
		{ encoding: 'utf8' }
	)
		.split('\n')
		.filter(Boolean)
		.map((line) => line.split('\t'));

function npm(args: string[], env: NodeJS.ProcessEnv): { ms: number; out: string } {
	const started = performance.now();
	const out = execFileSync('npm', ['run', '--silent', ...args], {
		cwd: ROOT,
		env,
		encoding: 'utf8',
		stdio: 'pipe'
	});
	return { ms: performance.now() - started, out };
}

/** Row count and CHECKSUM TABLE of every table of `database`. */
function fingerprint(sql: (q: string) => string[][], database: string) {
	const tables = sql(
		`SELECT table_name FROM information_schema.tables WHERE table_schema = '${database}' ORDER BY table_name`
	).map(([name]) => name!);
	const result: Record<string, { rows: number; checksum: string }> = {};
	for (const table of tables) {
		const rows = Number(sql(`SELECT COUNT(*) FROM \`${database}\`.\`${table}\``)[0]?.[0]);
		const checksum = sql(`CHECKSUM TABLE \`${database}\`.\`${table}\``)[0]?.[1] ?? '';
		result[table] = { rows, checksum };
	}
	return result;
}

function fileHashes(dir: string): Record<string, string> {
	const out: Record<string, string> = {};
	const walk = (d: string) => {
		for (const entry of execFileSync('find', [d, '-type', 'f'], { encoding: 'utf8' })
			.split('\n')
			.filter(Boolean))
			out[relative(dir, entry)] = createHash('sha256').update(readFileSync(entry)).digest('hex');
	};
	walk(dir);
	return out;
}

test.beforeAll(async () => {
	// Set-up starts real processes: minutes on a loaded machine, not the 30 s default.
	test.setTimeout(180_000);
	work = mkdtempSync(join(tmpdir(), 'slotwise-backup-'));
	// A database of its own on the checkout's instance, so nothing else writes to it meanwhile.
	execFileSync('bash', [join(ROOT, 'scripts/db.sh'), 'start'], { env: checkoutEnv, stdio: 'pipe' });
	execFileSync('bash', [join(ROOT, 'scripts/db.sh'), 'recreate', SOURCE], {
		env: checkoutEnv,
		stdio: 'pipe'
	});
	for (const step of ['migrate', 'seed'])
		execFileSync('npx', ['tsx', `scripts/${step}.ts`, 'up'], {
			cwd: ROOT,
			env: checkoutEnv,
			stdio: 'pipe'
		});
	// Awkward text next to the seed: quotes, a backslash, a line break, characters outside the BMP.
	checkoutSql(
		`UPDATE \`${SOURCE}\`.builds SET notes = CONCAT(notes, ' — “quoted” \\\\ back\\nslash 🎮 ünï') ORDER BY id LIMIT 1`
	);
	// Uploads: binary files, a nested folder, a name with a space and non-ASCII letters.
	const uploads = join(work, 'uploads');
	mkdirSync(join(uploads, 'guides/7'), { recursive: true });
	writeFileSync(join(uploads, 'guides/7/front panel.webp'), randomBytes(48_000));
	writeFileSync(join(uploads, 'guides/7/größe.jpg'), randomBytes(7_001));
	writeFileSync(join(uploads, 'readme.txt'), 'photos of guides\n');
	target = await scratchDb('restore', [RESTORED]);
});

test.afterAll(async () => {
	await cleanUp();
	try {
		checkoutSql(`DROP DATABASE IF EXISTS \`${SOURCE}\``);
	} finally {
		rmSync(work, { recursive: true, force: true });
	}
});

test('npm run backup then npm run restore into a scratch instance: every table and file the same', async () => {
	const backup = join(work, 'backup');
	const dumped = npm(['backup', '--', backup], {
		...checkoutEnv,
		UPLOADS_DIR: join(work, 'uploads')
	});
	const restoredUploads = join(work, 'uploads-restored');
	const restored = npm(
		['restore', '--', backup, '--database', RESTORED, '--uploads-dir', restoredUploads],
		{
			...target.env,
			DB_NAME: ''
		}
	);

	const before = fingerprint(checkoutSql, SOURCE);
	const after = fingerprint(target.sql, RESTORED);
	expect(Object.keys(before).length).toBeGreaterThanOrEqual(25);
	expect(before.guides?.rows).toBeGreaterThan(0);
	expect(before.build_slots?.rows).toBeGreaterThan(0);
	expect(after).toEqual(before);
	// The awkward text came back byte for byte (CHECKSUM TABLE would differ otherwise too).
	expect(
		target.sql(
			`SELECT notes LIKE '%🎮 ünï' FROM \`${RESTORED}\`.builds ORDER BY id LIMIT 1`
		)[0]?.[0]
	).toBe('1');
	const uploadsBefore = fileHashes(join(work, 'uploads'));
	expect(Object.keys(uploadsBefore)).toHaveLength(3);
	expect(fileHashes(restoredUploads)).toEqual(uploadsBefore);

	// The app runs on the restored copy: a guide page and a sign-in.
	const app = await startApp({ DB_PORT: String(target.port), DB_NAME: RESTORED });
	try {
		const page = await fetch(`${app.origin}/guides/steady-1080p-starter`);
		expect(page.status).toBe(200);
		expect(await signIn(app.origin, 'reader@slotwise.test')).toContain('session-token');
	} finally {
		await app.stop();
	}

	const rows = Object.values(before).reduce((sum, t) => sum + t.rows, 0);
	const size = execFileSync('du', ['-sk', backup], { encoding: 'utf8' }).split('\t')[0];
	writeReliabilitySection('backup-restore', [
		runNote(),
		'',
		'| what | figure |',
		'| --- | ---: |',
		`| tables compared (row count and \`CHECKSUM TABLE\`) | ${Object.keys(before).length} |`,
		`| rows compared | ${rows} |`,
		`| uploaded files compared (SHA-256) | ${Object.keys(uploadsBefore).length} |`,
		`| \`npm run backup\` (demo data, wall time incl. npm) | ${(dumped.ms / 1000).toFixed(1)} s |`,
		`| \`npm run restore\` into a scratch instance | ${(restored.ms / 1000).toFixed(1)} s |`,
		`| backup size | ${size} KiB |`,
		'| tables or files that differed | **0** |',
		'',
		'After the restore the app started on the copy, served a guide page and signed a reader in.',
		'The demo data is small; a restore of a real database is bounded by the dump size.'
	]);
});

test('restore refuses a tampered backup and will not overwrite a database without --replace', () => {
	const backup = join(work, 'backup');
	// Over the database restored above: refused, and the data stays.
	expect(() =>
		npm(
			['restore', '--', backup, '--database', RESTORED, '--uploads-dir', join(work, 'other')],
			target.env
		)
	).toThrow(/already has \d+ tables/);
	// One changed byte in the dump: refused before anything is touched.
	const tampered = join(work, 'tampered');
	cpSync(backup, tampered, { recursive: true });
	const dump = readFileSync(join(tampered, 'database.sql.gz'));
	dump[dump.length - 20] = dump[dump.length - 20]! ^ 0xff;
	writeFileSync(join(tampered, 'database.sql.gz'), dump);
	expect(() =>
		npm(['restore', '--', tampered, '--database', 'slotwise_never'], target.env)
	).toThrow(/do not match SHA256SUMS/);
	expect(target.sql("SHOW DATABASES LIKE 'slotwise_never'")).toEqual([]);
});
