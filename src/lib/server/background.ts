/*
 * Work that runs after the answer has gone out: e-mail, and the part of an account request
 * whose cost would tell an observer whether the address has an account (issue 12, item 8).
 * Fire-and-forget with errors logged, one JSON line each. Relative imports and plain
 * process.env only, so scripts and tests can use it.
 *
 * Not crash-safe: a job still pending when the process dies is lost (the person asks again).
 * A persistent mail queue is meant to replace `sendLater` in server/mail/index.ts; this
 * module stays for jobs that need no durability.
 */

const pending = new Set<Promise<void>>();

function logFailed(label: string, error: unknown) {
	console.error(
		JSON.stringify({
			t: new Date().toISOString(),
			kind: 'background-job-failed',
			job: label,
			error:
				error instanceof Error
					? { name: error.name, message: error.message, stack: error.stack }
					: String(error)
		})
	);
}

/**
 * Runs `job` on a later turn of the event loop, after the caller has returned. A failure is
 * logged under `label` and goes no further.
 */
export function runLater(label: string, job: () => Promise<unknown>): void {
	const done: Promise<void> = new Promise<void>((resolve) => setImmediate(resolve))
		.then(job)
		.then(
			() => undefined,
			(error: unknown) => logFailed(label, error)
		)
		.finally(() => pending.delete(done));
	pending.add(done);
}

/** Resolves once every job started so far, and any they started, has finished (tests, shutdown). */
export async function settled(): Promise<void> {
	while (pending.size > 0) await Promise.all([...pending]);
}
