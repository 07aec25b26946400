/*
 * The one Sequelize instance per process. Relative imports and plain process.env only,
 * so scripts/ (outside Vite) can use it too.
 */
import { AsyncLocalStorage } from 'node:async_hooks';
import { Sequelize } from 'sequelize';
import { initModels } from './models/index.js';

export interface DbConfig {
	host: string;
	port: number;
	user: string;
	password: string;
	database: string;
}

export function dbConfigFromEnv(env: NodeJS.ProcessEnv = process.env): DbConfig {
	return {
		host: env.DB_HOST ?? '127.0.0.1',
		port: Number(env.DB_PORT ?? 3307),
		user: env.DB_USER ?? 'slotwise',
		password: env.DB_PASSWORD ?? 'slotwise-dev',
		database: env.DB_NAME ?? 'slotwise'
	};
}

/** A read replica of the primary (scripts/db-replica.sh; docs/deployment.md). */
export interface ReplicaConfig {
	host: string;
	port: number;
}

/** The replica named by DB_REPLICA_PORT / DB_REPLICA_HOST, or null when none is configured. */
export function replicaConfigFromEnv(env: NodeJS.ProcessEnv = process.env): ReplicaConfig | null {
	if (!env.DB_REPLICA_PORT && !env.DB_REPLICA_HOST) return null;
	return {
		host: env.DB_REPLICA_HOST ?? '127.0.0.1',
		port: Number(env.DB_REPLICA_PORT ?? 3306)
	};
}

/*
 * Read-your-own-writes: code running inside readFromPrimary() sends even its plain SELECTs
 * to the primary. The request hook (read-your-writes.ts) wraps a request in it when the
 * request writes or its client wrote a moment ago, so a user never reads a replica that has
 * not caught up with their own change. Transactions always run on the primary anyway.
 */
const primaryReads = new AsyncLocalStorage<true>();

export function readFromPrimary<T>(work: () => T): T {
	return primaryReads.run(true, work);
}

/**
 * Creates a bare connection (no models bound) with short timeouts: when MariaDB is down a request should fail
 * within seconds (health answers 503) rather than queue for the 60 s default, and the
 * pool reconnects by itself on the next acquire once the server is back.
 */
export function createSequelize(
	config: DbConfig = dbConfigFromEnv(),
	replica: ReplicaConfig | null = null
): Sequelize {
	const sequelize = new Sequelize(config.database, config.user, config.password, {
		host: config.host,
		port: config.port,
		// With a replica, SELECTs outside a transaction read from it and everything else goes
		// to the primary; each side gets its own pool of the size below.
		...(replica
			? {
					replication: {
						read: [{ host: replica.host, port: replica.port }],
						write: { host: config.host, port: config.port }
					}
				}
			: {}),
		dialect: 'mariadb',
		logging: false,
		timezone: '+00:00',
		pool: { max: 5, min: 0, acquire: 5_000, idle: 10_000 },
		dialectOptions: {
			connectTimeout: 1_500,
			socketTimeout: 30_000,
			// Return DECIMAL and BIGINT as strings/numbers we control, not floats.
			decimalAsNumber: false,
			bigIntAsNumber: true
		},
		define: { underscored: true }
	});
	if (replica) {
		sequelize.addHook('beforePoolAcquire', (options) => {
			if (primaryReads.getStore()) options.useMaster = true;
		});
	}
	return sequelize;
}

let shared: Sequelize | undefined;

/**
 * The process-wide instance, created on first use (not at import, so builds need no DB).
 * Only the app reads from a replica: scripts (migrations, seeds) call createSequelize()
 * and always work on the primary.
 */
export function db(): Sequelize {
	if (!shared) {
		shared = createSequelize(dbConfigFromEnv(), replicaConfigFromEnv());
		// Model classes are global: bind them to the process-wide instance only.
		initModels(shared);
	}
	return shared;
}

export async function closeDb(): Promise<void> {
	if (shared) {
		const s = shared;
		shared = undefined;
		await s.close();
	}
}
