/*
 * Rate limits for the sign-in flows, shared by every app instance through one MariaDB table
 * (`rate_limits`, created by migration 2026.12.02T09.07.00) and rate-limiter-flexible's
 * RateLimiterMySQL, whose upsert runs in one InnoDB transaction, so two instances can't both
 * spend the last point (docs/security.md §4).
 *
 * It has its own mysql2 *callback* pool: the library calls `pool.getConnection(cb)` and
 * `conn.query(sql, values, cb)`, and handed the Sequelize `mariadb` instance it hangs
 * (docs/architecture.md, platform note 11). Relative imports and plain process.env only, no `$app`, so scripts
 * can use it; the SvelteKit-facing 429 helpers are in rate-limit-response.ts.
 *
 * Failing closed: when the store errors or doesn't answer within `operationTimeoutMs`,
 * `consume` and `peek` report "limited, retry in 60 s" instead of letting the attempt
 * through. An in-memory fallback (the library's `insuranceLimiter`) would give every
 * instance, and every restart, a fresh budget, so an attacker who can make the database slow
 * gets more guesses exactly when nobody is watching. Failing closed costs legitimate users
 * little: the users and tokens live in the same MariaDB, so sign-in can't work during that
 * outage anyway.
 */
import { createHash } from 'node:crypto';
import { isIP } from 'node:net';
import mysql from 'mysql2';
import { RateLimiterMySQL, RateLimiterRes } from 'rate-limiter-flexible';
import { dbConfigFromEnv, type DbConfig } from './db/connection.js';

export interface LimitPolicy {
	/** Namespace inside the shared table; ≤ 32 characters (see MAX_KEY_CHARS). */
	keyPrefix: string;
	/** Attempts allowed per window. */
	points: number;
	/** Window length, counted from the first attempt in it. */
	durationSeconds: number;
	/** Once over the limit, refuse for this long (0: until the window ends). */
	blockSeconds: number;
}

/*
 * Numbers: common practice, no published source. OWASP ASVS v5.0.0 6.3.1 asks for
 * brute-force protection without fixing numbers, and the OWASP Authentication Cheat Sheet
 * leaves thresholds to the application. The *ByEmail limits stay low because each one sends
 * mail to somebody else's inbox; the *ByAddress limits are higher because many people can
 * share one address (offices, carrier NAT).
 */
const POLICIES = {
	/** Failed password sign-ins for one account from one address: 10 per 15 min, then 15 min off. */
	signInByAccountAndAddress: {
		keyPrefix: 'signin_acct_addr',
		points: 10,
		durationSeconds: 15 * 60,
		blockSeconds: 15 * 60
	},
	/**
	 * Failed password sign-ins from one address over all accounts: 100 per hour. Slows password
	 * spraying without a per-account lockout, which would let anyone lock out the real owner
	 * (ASVS 6.3.1 "no malicious lockout"); the owner can still use a sign-in link.
	 */
	signInByAddress: {
		keyPrefix: 'signin_addr',
		points: 100,
		durationSeconds: 60 * 60,
		blockSeconds: 0
	},
	/** Sign-up attempts from one address: 10 per hour. */
	signUp: {
		keyPrefix: 'signup_addr',
		points: 10,
		durationSeconds: 60 * 60,
		blockSeconds: 0
	},
	/** Sign-in links mailed to one address: 5 per 15 min. */
	emailLinkByEmail: {
		keyPrefix: 'link_email',
		points: 5,
		durationSeconds: 15 * 60,
		blockSeconds: 0
	},
	/** Sign-in links requested from one client address: 20 per hour. */
	emailLinkByAddress: {
		keyPrefix: 'link_addr',
		points: 20,
		durationSeconds: 60 * 60,
		blockSeconds: 0
	},
	/** Password-reset mails to one address: 5 per hour. */
	passwordResetByEmail: {
		keyPrefix: 'reset_email',
		points: 5,
		durationSeconds: 60 * 60,
		blockSeconds: 0
	},
	/** Password-reset requests from one client address: 20 per hour. */
	passwordResetByAddress: {
		keyPrefix: 'reset_addr',
		points: 20,
		durationSeconds: 60 * 60,
		blockSeconds: 0
	},
	/** Price sightings reported by one account: 30 per hour (a shop visit's worth, not a script's). */
	priceSightingByUser: {
		keyPrefix: 'sighting_user',
		points: 30,
		durationSeconds: 60 * 60,
		blockSeconds: 0
	},
	/**
	 * Changes of address asked for by one account: 5 per hour. Each one mails a confirmation
	 * link to an address the account typed, so without a limit the form mails anyone.
	 */
	emailChangeByUser: {
		keyPrefix: 'email_change_user',
		points: 5,
		durationSeconds: 60 * 60,
		blockSeconds: 0
	},
	/** Confirmation links mailed to one new address, from any number of accounts: 5 per hour. */
	emailChangeByEmail: {
		keyPrefix: 'email_change_to',
		points: 5,
		durationSeconds: 60 * 60,
		blockSeconds: 0
	},
	/** Builds forked by one account: 20 per hour (an afternoon of trying guides, not a script). */
	forkByUser: {
		keyPrefix: 'fork_user',
		points: 20,
		durationSeconds: 60 * 60,
		blockSeconds: 0
	},
	/** Guides created by one author: 10 per hour (each is a draft an editor may have to read). */
	guideCreateByUser: {
		keyPrefix: 'guide_create_user',
		points: 10,
		durationSeconds: 60 * 60,
		blockSeconds: 0
	},
	/** Photo uploads by one account: 60 per hour (a whole gallery in one sitting, not a flood). */
	photoUploadByUser: {
		keyPrefix: 'photo_user',
		points: 60,
		durationSeconds: 60 * 60,
		blockSeconds: 0
	},
	/** Tips started by one account: 10 per hour (each opens a checkout at the payment provider). */
	tipByUser: {
		keyPrefix: 'tip_user',
		points: 10,
		durationSeconds: 60 * 60,
		blockSeconds: 0
	}
} as const satisfies Record<string, LimitPolicy>;

export type LimiterName = keyof typeof POLICIES;
export const limiterNames = Object.keys(POLICIES) as LimiterName[];

/** Points and windows, for messages and tests. */
export function policyOf(limiter: LimiterName): Readonly<LimitPolicy> {
	return POLICIES[limiter];
}

export type ConsumeResult =
	| { ok: true }
	| {
			ok: false;
			retryAfterSeconds: number;
			/** Refused because the store is down or slow (fail closed), not because of the limit. */
			storeDown?: true;
	  };
export interface PeekResult {
	blocked: boolean;
	retryAfterSeconds: number;
}

/** What a caller is told when the store is down or slow (see the header comment). */
export const FAIL_CLOSED_RETRY_AFTER_SECONDS = 60;

/*
 * The library stores `${keyPrefix}:${key}` in a VARCHAR(255). Keys up to this length stay
 * readable (an IPv6 address, '|' and a typical e-mail); longer ones are replaced by their
 * SHA-256, so no input can overflow the column (255 ≥ 32 + 1 + MAX_KEY_CHARS).
 */
const MAX_KEY_CHARS = 160;
const HASHED_KEY_MARK = 'sha256:';

/**
 * The stored form of a key: NFKC, trimmed and lower-cased (e-mail case and full-width forms
 * must not buy extra attempts; hex in IPv6 is case-insensitive anyway), then hashed when long.
 * A short key that already looks hashed is hashed as well, so nobody can type their way into
 * another key's counter.
 */
export function normaliseKey(key: string): string {
	const plain = key.normalize('NFKC').trim().toLowerCase();
	if (plain.length <= MAX_KEY_CHARS && !plain.startsWith(HASHED_KEY_MARK)) return plain;
	return HASHED_KEY_MARK + createHash('sha256').update(plain, 'utf8').digest('hex');
}

/**
 * The part of a client address to count by: IPv4 as is (IPv4-mapped IPv6 unwrapped), IPv6
 * by its /64, since one subscriber usually gets a whole /64 and could otherwise rotate
 * through 2^64 addresses (common practice, no published source). Anything that isn't an
 * address is returned trimmed, so a bad value still gets a (shared) counter.
 */
export function addressKey(address: string): string {
	const raw = address.trim().toLowerCase().replace(/%.*$/, '');
	if (isIP(raw) !== 6) return raw;
	const groups = expandIpv6(raw);
	if (groups.slice(0, 5).every((g) => g === '0') && groups[5] === 'ffff') {
		const [hi, lo] = [parseInt(groups[6] ?? '0', 16), parseInt(groups[7] ?? '0', 16)];
		return [hi >> 8, hi & 255, lo >> 8, lo & 255].join('.');
	}
	return `${groups.slice(0, 4).join(':')}::/64`;
}

/** Eight hextets without leading zeros, from any valid IPv6 text form. */
function expandIpv6(address: string): string[] {
	let text = address;
	const v4 = /(\d{1,3})\.(\d{1,3})\.(\d{1,3})\.(\d{1,3})$/.exec(text);
	if (v4) {
		const [a, b, c, d] = v4.slice(1).map(Number) as [number, number, number, number];
		text =
			text.slice(0, v4.index) + `${((a << 8) | b).toString(16)}:${((c << 8) | d).toString(16)}`;
	}
	const [head = '', tail] = text.split('::');
	const left = head ? head.split(':') : [];
	const right = tail ? tail.split(':') : [];
	const zeros = tail === undefined ? [] : Array(8 - left.length - right.length).fill('0');
	return [...left, ...zeros, ...right].map((g) => parseInt(g, 16).toString(16));
}

/** A key out of several parts, e.g. `joinKey(addressKey(ip), email)` for the account limiter. */
export function joinKey(...parts: string[]): string {
	return parts.join('|');
}

export interface RateLimitConfig extends DbConfig {
	/** Give up on one store operation after this long and fail closed. */
	operationTimeoutMs?: number;
	/** Connections this instance may hold (on top of Sequelize's pool). */
	connectionLimit?: number;
	/** Where the single "store down" line goes; console.error as JSON by default. */
	logStoreError?: (entry: StoreErrorLog) => void;
}

export interface StoreErrorLog {
	kind: 'rate-limit-store-down' | 'rate-limit-store-up';
	limiter: LimiterName;
	operation: 'consume' | 'peek' | 'reset' | 'refund';
	error?: string;
}

export interface RateLimits {
	consume(limiter: LimiterName, key: string): Promise<ConsumeResult>;
	consumeAll(checks: ReadonlyArray<readonly [LimiterName, string]>): Promise<ConsumeResult>;
	peek(limiter: LimiterName, key: string): Promise<PeekResult>;
	reset(limiter: LimiterName, key: string): Promise<void>;
	refund(limiter: LimiterName, key: string): Promise<void>;
	close(): Promise<void>;
}

function defaultLog(entry: StoreErrorLog) {
	// No key in the log: it holds an e-mail address and a client address.
	console.error(JSON.stringify({ t: new Date().toISOString(), ...entry }));
}

/** Whole seconds to wait, at least 1 (Retry-After is an integer, and 0 invites a retry storm). */
function seconds(ms: number): number {
	return Math.max(1, Math.ceil(ms / 1000));
}

class StoreTimeout extends Error {
	constructor(ms: number) {
		super(`rate-limit store did not answer within ${ms} ms`);
	}
}

function withTimeout<T>(work: Promise<T>, ms: number): Promise<T> {
	let timer: ReturnType<typeof setTimeout> | undefined;
	const timeout = new Promise<never>((_, reject) => {
		timer = setTimeout(() => reject(new StoreTimeout(ms)), ms);
	});
	// A late answer after the timeout is dropped; a late rejection must not go unhandled.
	work.catch(() => undefined);
	return Promise.race([work, timeout]).finally(() => clearTimeout(timer));
}

/*
 * Rows outlive their window: the library only overwrites them on the next hit. Sweep rows
 * that expired over an hour ago (as the library's own clearExpiredByTimeout does), from one
 * timer per instance rather than one per limiter.
 */
const SWEEP_EVERY_MS = 5 * 60 * 1000;
const SWEEP_AGE_MS = 60 * 60 * 1000;

/**
 * One set of limiters with its own pool. The app uses the process-wide one through the
 * functions below; tests make several to stand in for several app instances.
 */
export function createRateLimits(config: RateLimitConfig = dbConfigFromEnv()): RateLimits {
	const operationTimeoutMs = config.operationTimeoutMs ?? 2_000;
	const log = config.logStoreError ?? defaultLog;
	const pool = mysql.createPool({
		host: config.host,
		port: config.port,
		user: config.user,
		password: config.password,
		database: config.database,
		connectionLimit: config.connectionLimit ?? 5,
		maxIdle: 1,
		idleTimeout: 10_000,
		// Fail fast on a dead server; operationTimeoutMs bounds the rest.
		connectTimeout: 1_500,
		// Bounded queue: under a flood, refuse (fail closed) rather than pile up requests.
		queueLimit: 100,
		enableKeepAlive: true
	});

	const limiters = new Map<LimiterName, RateLimiterMySQL>();
	function limiter(name: LimiterName): RateLimiterMySQL {
		let found = limiters.get(name);
		if (!found) {
			const policy = POLICIES[name];
			found = new RateLimiterMySQL({
				storeClient: pool,
				storeType: 'pool',
				dbName: config.database,
				tableName: 'rate_limits',
				// The migration owns the table; the library must never issue DDL itself.
				tableCreated: true,
				clearExpiredByTimeout: false,
				keyPrefix: policy.keyPrefix,
				points: policy.points,
				duration: policy.durationSeconds,
				blockDuration: policy.blockSeconds
			});
			limiters.set(name, found);
		}
		return found;
	}

	let sweeper: ReturnType<typeof setInterval> | undefined;
	function startSweeper() {
		if (sweeper) return;
		sweeper = setInterval(() => {
			pool.query('DELETE FROM rate_limits WHERE expire < ?', [Date.now() - SWEEP_AGE_MS], () => {
				// Errors are ignored: the next sweep tries again, and stale rows are harmless.
			});
		}, SWEEP_EVERY_MS);
		sweeper.unref();
	}

	// Log the first failure of an outage and the recovery, not every refused request.
	let storeDown = false;
	function failed(name: LimiterName, operation: StoreErrorLog['operation'], error: unknown) {
		if (storeDown) return;
		storeDown = true;
		const message =
			error instanceof Error
				? `${(error as { code?: string }).code ?? error.name}: ${error.message}`
				: String(error);
		log({ kind: 'rate-limit-store-down', limiter: name, operation, error: message });
	}
	function succeeded(name: LimiterName, operation: StoreErrorLog['operation']) {
		if (!storeDown) return;
		storeDown = false;
		log({ kind: 'rate-limit-store-up', limiter: name, operation });
	}

	async function consume(name: LimiterName, key: string): Promise<ConsumeResult> {
		startSweeper();
		try {
			await withTimeout(limiter(name).consume(normaliseKey(key)), operationTimeoutMs);
			succeeded(name, 'consume');
			return { ok: true };
		} catch (e) {
			// The library rejects with a RateLimiterRes when the limit is reached, with an Error otherwise.
			if (e instanceof RateLimiterRes) {
				succeeded(name, 'consume');
				return { ok: false, retryAfterSeconds: seconds(e.msBeforeNext) };
			}
			failed(name, 'consume', e);
			return { ok: false, retryAfterSeconds: FAIL_CLOSED_RETRY_AFTER_SECONDS, storeDown: true };
		}
	}

	return {
		consume,

		async consumeAll(checks) {
			for (const [name, key] of checks) {
				const result = await consume(name, key);
				if (!result.ok) return result;
			}
			return { ok: true };
		},

		async peek(name, key) {
			try {
				const res = await withTimeout(limiter(name).get(normaliseKey(key)), operationTimeoutMs);
				succeeded(name, 'peek');
				// Blocked when the next consume would be refused: no points left in this window.
				if (!res || res.consumedPoints < POLICIES[name].points) {
					return { blocked: false, retryAfterSeconds: 0 };
				}
				return { blocked: true, retryAfterSeconds: seconds(res.msBeforeNext) };
			} catch (e) {
				failed(name, 'peek', e);
				return { blocked: true, retryAfterSeconds: FAIL_CLOSED_RETRY_AFTER_SECONDS };
			}
		},

		async reset(name, key) {
			try {
				await withTimeout(limiter(name).delete(normaliseKey(key)), operationTimeoutMs);
				succeeded(name, 'reset');
			} catch (e) {
				// A sign-in that already succeeded must not fail because its counter stayed.
				failed(name, 'reset', e);
			}
		},

		async refund(name, key) {
			try {
				await withTimeout(limiter(name).reward(normaliseKey(key), 1), operationTimeoutMs);
				succeeded(name, 'refund');
			} catch (e) {
				failed(name, 'refund', e);
			}
		},

		async close() {
			if (sweeper) clearInterval(sweeper);
			await new Promise<void>((resolve) => pool.end(() => resolve()));
		}
	};
}

let shared: RateLimits | undefined;

/** The process-wide limiters, created on first use (not at import, so builds need no DB). */
function rateLimits(): RateLimits {
	shared ??= createRateLimits();
	return shared;
}

/**
 * Counts one attempt. `{ ok: false }` when the limit is reached, or when the store is down or
 * slow (fail closed, retry after 60 s). Never throws.
 */
export async function consume(limiter: LimiterName, key: string): Promise<ConsumeResult> {
	return rateLimits().consume(limiter, key);
}

/**
 * Counts one attempt against each limiter in order and stops at the first refusal, so list the
 * address limiter first: a blocked address then doesn't spend the e-mail's budget.
 */
export async function consumeAll(
	checks: ReadonlyArray<readonly [LimiterName, string]>
): Promise<ConsumeResult> {
	return rateLimits().consumeAll(checks);
}

/** Whether the next `consume` would be refused, without counting; fails closed like consume. */
export async function peek(limiter: LimiterName, key: string): Promise<PeekResult> {
	return rateLimits().peek(limiter, key);
}

/** Forgets a key's count (e.g. after a successful sign-in). Never throws; errors are logged. */
export async function reset(limiter: LimiterName, key: string): Promise<void> {
	return rateLimits().reset(limiter, key);
}

/**
 * Gives back one point counted by `consume` (e.g. the attempt turned out to be a successful
 * sign-in, which a limit on failures must not count). Never throws; errors are logged.
 */
export async function refund(limiter: LimiterName, key: string): Promise<void> {
	return rateLimits().refund(limiter, key);
}

/** Closes the process-wide pool (shutdown, tests); the next call opens a new one. */
export async function closeRateLimits(): Promise<void> {
	if (shared) {
		const s = shared;
		shared = undefined;
		await s.close();
	}
}
