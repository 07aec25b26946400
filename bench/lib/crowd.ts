/*
 * The load benchmark's crowd (bench/load.ts): readers who fork and edit. Forks are limited to
 * 20 per account an hour (src/lib/server/rate-limit.ts), so a load that forks from one account
 * measures the limit, not the fork; a crowd forks as a real one would, each reader a few times.
 */
import { execFileSync } from 'node:child_process';
import { resolve } from 'node:path';
import { DEMO_READER, ROOT, signInAs } from './harness';

/** Adds `size` readers, load-reader-1… with the demo reader's password, to the scratch database `dbName`. */
export function addCrowd(dbName: string, size: number): void {
	// The same argon2 hash, in this scratch database only; MariaDB's sequence engine numbers them.
	const dataDir = process.env.SLOTWISE_DATA_DIR ?? resolve(ROOT, '.data');
	execFileSync(
		'mariadb',
		[
			'--no-defaults',
			`--socket=${resolve(dataDir, 'mariadb.sock')}`,
			'-uroot',
			dbName,
			'-e',
			`INSERT INTO users (id, email, name, password_hash, role, email_verified_at, created_at,
		                    updated_at, handle)
		 SELECT UUID(), CONCAT('load-reader-', s.seq, '@slotwise.test'), CONCAT('Load Reader ', s.seq),
		        u.password_hash, 'reader', NOW(), NOW(), NOW(), CONCAT('load-reader-', s.seq)
		   FROM users u JOIN seq_1_to_${size} s
		  WHERE u.email = '${DEMO_READER}'`
		],
		{ stdio: 'pipe' }
	);
}

/** The crowd's sessions, signed in through the real form eight at a time. */
export async function signInCrowd(origin: string, size: number): Promise<string[]> {
	const sessions: string[] = [];
	for (let first = 1; first <= size; first += 8) {
		const batch = Array.from({ length: Math.min(8, size - first + 1) }, (_, i) =>
			signInAs(origin, `load-reader-${first + i}@slotwise.test`)
		);
		sessions.push(...(await Promise.all(batch)));
	}
	return sessions;
}
