/*
 * The mail queue: enqueue.ts puts mail on it (any service, inside its transaction),
 * worker.ts sends it. See worker.ts for the exactly-once design.
 */
export {
	enqueueMailingJobs,
	enqueueMessage,
	mailingMessageId,
	messageIdDomain
} from './enqueue.js';
export type { EnqueueMessage, MailingRecipientJob } from './enqueue.js';
export { mailingPayload, renderMailing } from './compose.js';
export type { MailingPayload } from './compose.js';
export { deliveryCheckFromEnv, httpDeliveryCheck } from './delivery-check.js';
export type { DeliveryCheck } from './delivery-check.js';
export { inlineWorkerWanted, queueSettingsFromEnv } from './settings.js';
export type { QueueSettings } from './settings.js';
export { createPooledTransport, MailWorker } from './worker.js';
