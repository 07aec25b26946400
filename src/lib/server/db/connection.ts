/*
 * The one Sequelize instance per process. Relative imports and plain process.env only,
 * so scripts/ (outside Vite) can use it too.
 */
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

/**
 * Creates a bare connection (no models bound) with short timeouts: when MariaDB is down a request should fail
 * within seconds (health answers 503) rather than queue for the 60 s default, and the
 * pool reconnects by itself on the next acquire once the server is back.
 */
export function createSequelize(config: DbConfig = dbConfigFromEnv()): Sequelize {
	const sequelize = new Sequelize(config.database, config.user, config.password, {
		host: config.host,
		port: config.port,
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
	return sequelize;
}

let shared: Sequelize | undefined;

/** The process-wide instance, created on first use (not at import, so builds need no DB). */
export function db(): Sequelize {
	if (!shared) {
		shared = createSequelize();
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
