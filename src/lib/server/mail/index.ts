/*
 * The one way the app sends e-mail. Relative imports and plain process.env only (see
 * transport.ts), so scripts can send too.
 *
 * Rules from docs/security.md §8: exactly one recipient per message, passed as an
 * address object so nodemailer never parses a user-typed string into a list; the address
 * must pass the app-wide `emailAddress` schema; the subject loses any CR/LF; the only
 * headers are the ones we set, and extra headers (List-Unsubscribe and the like) are
 * refused unless they are plain single-line ASCII under a name we do not manage ourselves.
 */
import { emailAddress } from '../../schemas/email.js';
import { runLater } from '../background.js';
import type { MailTemplate } from './templates.js';
import { getTransport } from './transport.js';

export type { MailTemplate } from './templates.js';
export * as templates from './templates.js';
export * as tipTemplates from './tip-templates.js';
export { closeTransport, mailConfigFromEnv } from './transport.js';

/** The recipient failed the `emailAddress` schema; nothing was sent. */
export class MailAddressError extends Error {
	override readonly name = 'MailAddressError';
	/** The schema's plain-language reason. The address itself is left out: it may hold CR/LF. */
	readonly reason: string;
	constructor(reason: string) {
		super(`Refused to send e-mail: ${reason}`);
		this.reason = reason;
	}
}

/** An extra header had a name we manage ourselves or a value that is not one plain line. */
export class MailHeaderError extends Error {
	override readonly name = 'MailHeaderError';
}

// Set by nodemailer from our own data; a caller-supplied copy could add or redirect recipients.
const RESERVED_HEADERS = new Set([
	'from',
	'sender',
	'reply-to',
	'to',
	'cc',
	'bcc',
	'subject',
	'date',
	'message-id',
	'return-path',
	'mime-version',
	'content-type',
	'content-transfer-encoding'
]);
const HEADER_NAME = /^[A-Za-z0-9][A-Za-z0-9-]{0,75}$/;
// Printable ASCII, space and tab; RFC 5322 caps a line at 998 characters including the name.
const HEADER_VALUE = /^[\x20-\x7e\t]{1,900}$/;

function checkedHeaders(headers: Record<string, string>): Record<string, string> {
	const out: Record<string, string> = {};
	for (const [name, value] of Object.entries(headers)) {
		if (!HEADER_NAME.test(name) || RESERVED_HEADERS.has(name.toLowerCase())) {
			throw new MailHeaderError(`Refused header name ${JSON.stringify(name)}`);
		}
		if (typeof value !== 'string' || !HEADER_VALUE.test(value)) {
			throw new MailHeaderError(
				`Refused value for header ${name}: it must be one line of plain ASCII`
			);
		}
		out[name] = value;
	}
	return out;
}

/** One line: CR/LF (and other control characters) become spaces. */
export function oneLineSubject(subject: string): string {
	return (
		subject
			// eslint-disable-next-line no-control-regex
			.replace(/[\u0000-\u001f\u007f\u0085\u2028\u2029]+/g, ' ')
			.replace(/ {2,}/g, ' ')
			.trim()
	);
}

/** The recipient as nodemailer gets it, or `MailAddressError` when it fails the schema. */
function recipient(to: string): { address: string } {
	const parsed = emailAddress.safeParse(to);
	if (!parsed.success) {
		throw new MailAddressError(parsed.error.issues[0]?.message ?? 'invalid e-mail address');
	}
	return { address: parsed.data };
}

// <local@domain>, ASCII without spaces or brackets inside: the queue derives it from ids.
const MESSAGE_ID = /^<[A-Za-z0-9.!#$%&'*+/=?^_`{|}~-]{1,120}@[A-Za-z0-9.-]{1,120}>$/;

/**
 * The nodemailer options for one message to one recipient, after every check `send()`
 * makes: the schema on the address, one-line subject, extra headers checked. The mail queue
 * (./queue) sends these through its pooled transport with a Message-ID of its own choosing,
 * which must have the plain `<local@domain>` form.
 */
export function prepareMessage(
	from: string,
	to: string,
	message: MailTemplate,
	options: { headers?: Record<string, string>; messageId?: string } = {}
) {
	const address = recipient(to);
	const extraHeaders = options.headers ? checkedHeaders(options.headers) : undefined;
	if (options.messageId !== undefined && !MESSAGE_ID.test(options.messageId)) {
		throw new MailHeaderError('Refused Message-ID: it must be one plain <local@domain>');
	}
	return {
		from,
		to: address,
		subject: oneLineSubject(message.subject),
		text: message.text,
		html: message.html,
		headers: extraHeaders,
		...(options.messageId ? { messageId: options.messageId } : {})
	};
}

/**
 * Sends one message to exactly one recipient over SMTP. Throws `MailAddressError` (before
 * any connection) when `to` fails the `emailAddress` schema, `MailHeaderError` for a bad
 * extra header, and nodemailer's error when the server refuses or cannot be reached.
 */
export async function send(
	to: string,
	message: MailTemplate,
	headers?: Record<string, string>
): Promise<void> {
	const { config, transporter } = getTransport();
	await transporter.sendMail(prepareMessage(config.from, to, message, { headers }));
}

/**
 * Sends like `send`, but after the current request has been answered: a slow or hanging mail
 * server never holds a request, and the time an answer takes does not depend on whether a
 * message went out (issue 12, item 8). Failures are logged. The one function a persistent
 * mail queue replaces.
 */
export function sendLater(
	to: string,
	message: MailTemplate,
	headers?: Record<string, string>
): void {
	runLater('mail', () => send(to, message, headers));
}
