/*
 * Telling "the database cannot be reached" apart from every other failure, so the app can
 * answer a calm 503 and keep sessions instead of answering 500 or signing people out
 * (issue 12, item 6; docs/security.md §7). Plain TypeScript, no framework.
 */
import { ConnectionError } from 'sequelize';

// Driver codes for a connection that failed or died under a query (mariadb and mysql2).
const CONNECTION_CODES = new Set([
	'ECONNREFUSED',
	'ECONNRESET',
	'EPIPE',
	'ETIMEDOUT',
	'EHOSTUNREACH',
	'ENETUNREACH',
	'ENOTFOUND',
	'EAI_AGAIN',
	'PROTOCOL_CONNECTION_LOST',
	'ER_SOCKET_UNEXPECTED_CLOSE',
	'ER_CONNECTION_KILLED',
	'ER_CONNECTION_TIMEOUT',
	'ER_GET_CONNECTION_TIMEOUT',
	'ER_CMD_CONNECTION_CLOSED',
	'ER_CLIENT_CLOSED_CONNECTION',
	'ER_SERVER_SHUTDOWN'
]);

interface MaybeDriverError {
	code?: unknown;
	fatal?: unknown;
	parent?: unknown;
	original?: unknown;
	cause?: unknown;
}

/**
 * True when `error` (or what it wraps) says the database could not be reached or the
 * connection broke: Sequelize's connection errors, including a pool that could not get a
 * connection in time, and driver errors with a connection-level code or marked fatal.
 */
export function isDatabaseUnavailable(error: unknown, depth = 0): boolean {
	if (!error || typeof error !== 'object' || depth > 5) return false;
	if (error instanceof ConnectionError) return true;
	const e = error as MaybeDriverError;
	if (typeof e.code === 'string' && CONNECTION_CODES.has(e.code)) return true;
	if (e.fatal === true) return true;
	return [e.parent, e.original, e.cause].some(
		(inner) => inner !== error && isDatabaseUnavailable(inner, depth + 1)
	);
}
