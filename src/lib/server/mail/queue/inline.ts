/*
 * The worker that runs inside the app process (src/hooks.server.ts starts it), so
 * `npm start` and the end-to-end tests send queued mail with no extra process. Set
 * MAIL_WORKER=off where dedicated workers (`npm run worker`) do the sending instead
 * (settings.ts `inlineWorkerWanted`; docs/deployment.md §5).
 */
import { db } from '../../db/connection.js';
import { deliveryCheckFromEnv } from './delivery-check.js';
import { inlineWorkerWanted, queueSettingsFromEnv } from './settings.js';
import { MailWorker } from './worker.js';

let inline: MailWorker | null = null;

export function startInlineWorker(env: NodeJS.ProcessEnv = process.env): MailWorker | null {
	if (inline || !inlineWorkerWanted(env)) return inline;
	inline = new MailWorker({
		sequelize: db(),
		settings: queueSettingsFromEnv(env),
		check: deliveryCheckFromEnv(env)
	});
	inline.start();
	return inline;
}

/** Lets the in-process worker know mail was queued, so it need not wait for its next poll. */
export function pokeInlineWorker(): void {
	inline?.poke();
}

export async function stopInlineWorker(): Promise<void> {
	const worker = inline;
	inline = null;
	await worker?.stop();
}
