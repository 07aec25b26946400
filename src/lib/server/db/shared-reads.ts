/**
 * Identical reads that are in flight at the same moment share one query.
 *
 * The visitors' caching hooks read a small stamp for every request (http/list-caching.ts,
 * http/guide-caching.ts). Under a crowd, fifty requests at once each waited for a pool
 * connection to ask MariaDB the same question, and the pool, not the app, set the pace.
 * Shared, a request that arrives while the same read is under way takes its answer, which
 * can be at most one round trip older than the request: a visitor cannot tell a write that
 * committed during that round trip from one that committed just after it.
 *
 * Only for visitors' reads: someone who just wrote must read their own write (db/
 * read-your-writes.ts), which a read begun by another request before that write may miss.
 */
export function sharedRead<T>(read: (key: string) => Promise<T>): (key: string) => Promise<T> {
	const inFlight = new Map<string, Promise<T>>();
	return (key) => {
		const pending = inFlight.get(key);
		if (pending) return pending;
		const started = read(key).finally(() => inFlight.delete(key));
		inFlight.set(key, started);
		return started;
	};
}
