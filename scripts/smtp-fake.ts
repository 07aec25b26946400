/*
 * Local SMTP fake for development and tests: tsx scripts/smtp-fake.ts
 * (normally started in the background by scripts/smtp-fake.sh).
 *
 * - SMTP on 127.0.0.1:${SMTP_PORT:-2525}: real SMTP protocol (smtp-server), no auth, no TLS.
 *   Every message is parsed with mailparser and kept in memory, newest first, at most
 *   MAX_MESSAGES; nothing is ever relayed.
 * - HTTP JSON on 127.0.0.1:${MAILBOX_PORT:-2580}, read by tests (tests/support/mailbox.ts)
 *   and the dev-only page /dev/mailbox:
 *     GET    /health          { ok, messages }
 *     GET    /messages        newest first; ?to=address keeps one recipient's mail
 *     GET    /messages/:id    one message, or 404
 *     DELETE /messages        forget every message and count (204)
 *     GET    /counts          { total, recipients: { address: n } } over every message accepted
 *                             since the last DELETE, however many (the list above keeps 500)
 *     GET    /deliveries/:messageId   { count }: messages accepted with that Message-ID
 *                             (the mail queue's delivery check after a crash)
 *     PUT    /rules           [{ localPart, code, times?, message? }]: refuse RCPT TO for
 *                             addresses whose local part starts with localPart, with `code`
 *                             (5xx permanent, 4xx temporary), the first `times` times per
 *                             address (every time when absent). DELETE /rules clears them.
 *     PUT    /settings        { dataDelayMs }: wait this long after keeping a message
 *                             before answering 250 (widens the window a crash test aims at)
 *
 * SMTP_FAKE_KEEP=0 keeps no message bodies (nothing is parsed; GET /messages stays empty) and
 * only counts, reading the Message-ID from the raw header: what the crash test and
 * bench:mailing need at thousands of messages on a busy machine.
 *
 * Robustness: the message is buffered whole (bounded by MAX_MESSAGE_BYTES) before parsing,
 * so a parser failure can never leave the SMTP stream half-read; a message that cannot be
 * parsed is answered 554 and the server keeps running.
 */
import { randomUUID } from 'node:crypto';
import { createServer, type IncomingMessage, type ServerResponse } from 'node:http';
import { simpleParser, type AddressObject, type ParsedMail } from 'mailparser';
import { SMTPServer, type SMTPServerDataStream, type SMTPServerSession } from 'smtp-server';

const HOST = '127.0.0.1';
const SMTP_PORT = Number(process.env.SMTP_PORT ?? 2525);
const HTTP_PORT = Number(process.env.MAILBOX_PORT ?? 2580);
const MAX_MESSAGES = 500;
const MAX_MESSAGE_BYTES = 2 * 1024 * 1024;

export interface StoredMessage {
	id: string;
	/** When the fake accepted the message (ISO 8601). */
	receivedAt: string;
	/** The Date header (ISO 8601), or receivedAt when absent or unparseable. */
	date: string;
	/** SMTP envelope: MAIL FROM. */
	envelopeFrom: string | null;
	/** SMTP envelope: every RCPT TO, i.e. who the message was actually delivered to. */
	to: string[];
	/** The From header as text. */
	from: string;
	/** Addresses in the To, Cc and Bcc headers (Bcc is normally absent). */
	headerTo: string[];
	cc: string[];
	bcc: string[];
	subject: string;
	text: string;
	html: string;
	/** Every header, lower-case name → unfolded value (repeats joined by a newline). */
	headers: Record<string, string>;
	attachments: { filename: string | null; contentType: string; sizeBytes: number }[];
	sizeBytes: number;
}

const messages: StoredMessage[] = [];

/** Every accepted message counted, unbounded (unlike `messages`), since the last DELETE. */
let totalAccepted = 0;
const byRecipient = new Map<string, number>();
const byMessageId = new Map<string, number>();

interface RefusalRule {
	localPart: string;
	code: number;
	times: number | null;
	message: string;
}
let rules: RefusalRule[] = [];
/** Per rule and address: how many times it was refused so far. */
const refusals = new Map<string, number>();
let dataDelayMs = 0;

function log(event: string, detail: Record<string, unknown> = {}) {
	console.log(JSON.stringify({ t: new Date().toISOString(), kind: 'smtp-fake', event, ...detail }));
}

function addresses(field: AddressObject | AddressObject[] | undefined): string[] {
	const list = field === undefined ? [] : Array.isArray(field) ? field : [field];
	const out: string[] = [];
	const walk = (items: AddressObject['value']) => {
		for (const item of items) {
			if (item.address) out.push(item.address);
			if (item.group) walk(item.group);
		}
	};
	for (const object of list) walk(object.value);
	return out;
}

function headerMap(parsed: ParsedMail): Record<string, string> {
	const out: Record<string, string> = {};
	for (const { key, line } of parsed.headerLines) {
		const colon = line.indexOf(':');
		const value = (colon === -1 ? '' : line.slice(colon + 1)).replace(/\r?\n[ \t]+/g, ' ').trim();
		out[key] = key in out ? `${out[key]}\n${value}` : value;
	}
	return out;
}

function toStored(
	parsed: ParsedMail,
	session: SMTPServerSession,
	sizeBytes: number
): StoredMessage {
	const receivedAt = new Date().toISOString();
	const date =
		parsed.date && !Number.isNaN(parsed.date.getTime()) ? parsed.date.toISOString() : receivedAt;
	const { mailFrom, rcptTo } = session.envelope;
	return {
		id: randomUUID(),
		receivedAt,
		date,
		envelopeFrom: mailFrom ? mailFrom.address : null,
		to: rcptTo.map((r) => r.address),
		from: parsed.from?.text ?? '',
		headerTo: addresses(parsed.to),
		cc: addresses(parsed.cc),
		bcc: addresses(parsed.bcc),
		subject: parsed.subject ?? '',
		text: parsed.text ?? '',
		html: typeof parsed.html === 'string' ? parsed.html : '',
		headers: headerMap(parsed),
		attachments: parsed.attachments.map((a) => ({
			filename: a.filename ?? null,
			contentType: a.contentType,
			sizeBytes: a.size
		})),
		sizeBytes
	};
}

function smtpError(message: string, responseCode: number): Error {
	return Object.assign(new Error(message), { responseCode });
}

/** Reads the whole DATA stream, keeping at most MAX_MESSAGE_BYTES but always draining it. */
function readAll(stream: SMTPServerDataStream): Promise<Buffer> {
	return new Promise((resolve, reject) => {
		const chunks: Buffer[] = [];
		let kept = 0;
		stream.on('data', (chunk: Buffer) => {
			if (kept + chunk.length <= MAX_MESSAGE_BYTES) {
				chunks.push(chunk);
				kept += chunk.length;
			}
		});
		stream.on('end', () => resolve(Buffer.concat(chunks)));
		stream.on('error', reject);
	});
}

const KEEP_BODIES = process.env.SMTP_FAKE_KEEP !== '0';

/** The Message-ID from the raw header block (unfolded), without parsing the whole message. */
function rawMessageId(raw: Buffer): string | null {
	const end = raw.indexOf('\r\n\r\n');
	const head = raw.subarray(0, end === -1 ? raw.length : end).toString('latin1');
	const match = /^message-id:[ \t]*((?:.|\r\n[ \t])*)/im.exec(head);
	return match?.[1]?.replace(/\r\n[ \t]+/g, ' ').trim() || null;
}

function count(recipients: string[], messageId: string | null) {
	totalAccepted++;
	for (const address of recipients) {
		const key = address.toLowerCase();
		byRecipient.set(key, (byRecipient.get(key) ?? 0) + 1);
	}
	if (messageId) byMessageId.set(messageId, (byMessageId.get(messageId) ?? 0) + 1);
}

async function receive(stream: SMTPServerDataStream, session: SMTPServerSession): Promise<string> {
	const raw = await readAll(stream);
	if (stream.sizeExceeded) throw smtpError('Message too big for the local fake', 552);
	if (!KEEP_BODIES) {
		count(
			session.envelope.rcptTo.map((r) => r.address),
			rawMessageId(raw)
		);
		if (dataDelayMs > 0) await new Promise((resolve) => setTimeout(resolve, dataDelayMs));
		return randomUUID();
	}
	let parsed: ParsedMail;
	try {
		parsed = await simpleParser(raw, { skipImageLinks: true });
	} catch (e) {
		log('unparseable', { error: String(e), sizeBytes: raw.length });
		throw smtpError('Message could not be parsed', 554);
	}
	const message = toStored(parsed, session, raw.length);
	messages.unshift(message);
	messages.length = Math.min(messages.length, MAX_MESSAGES);
	totalAccepted++;
	for (const address of message.to) {
		const key = address.toLowerCase();
		byRecipient.set(key, (byRecipient.get(key) ?? 0) + 1);
	}
	if (parsed.messageId)
		byMessageId.set(parsed.messageId, (byMessageId.get(parsed.messageId) ?? 0) + 1);
	if (process.env.SMTP_FAKE_QUIET !== '1')
		log('received', { id: message.id, to: message.to, subject: message.subject });
	// Kept and counted first: a client that dies during this wait has delivered the message.
	if (dataDelayMs > 0) await new Promise((resolve) => setTimeout(resolve, dataDelayMs));
	return message.id;
}

/** The refusal a rule gives this recipient now, if any. */
function refusalFor(address: string): RefusalRule | null {
	const local = address.slice(0, address.lastIndexOf('@')).toLowerCase();
	for (const rule of rules) {
		if (!local.startsWith(rule.localPart)) continue;
		const key = `${rule.localPart}|${address.toLowerCase()}`;
		const done = refusals.get(key) ?? 0;
		if (rule.times !== null && done >= rule.times) continue;
		refusals.set(key, done + 1);
		return rule;
	}
	return null;
}

function parseRules(body: unknown): RefusalRule[] | null {
	if (!Array.isArray(body)) return null;
	const out: RefusalRule[] = [];
	for (const item of body) {
		const r = item as Record<string, unknown>;
		const code = Number(r.code);
		if (typeof r.localPart !== 'string' || r.localPart === '' || !(code >= 400 && code <= 599))
			return null;
		const times = r.times === undefined || r.times === null ? null : Number(r.times);
		if (times !== null && !(Number.isInteger(times) && times >= 0)) return null;
		out.push({
			localPart: r.localPart.toLowerCase(),
			code,
			times,
			message:
				typeof r.message === 'string'
					? r.message
					: code >= 500
						? 'Mailbox does not exist (local fake rule)'
						: 'Mailbox busy, try again later (local fake rule)'
		});
	}
	return out;
}

const smtp = new SMTPServer({
	secure: false,
	authOptional: true,
	disabledCommands: ['STARTTLS'],
	banner: 'Slotwise local SMTP fake (nothing is relayed)',
	size: MAX_MESSAGE_BYTES,
	logger: false,
	onRcptTo(address, _session, callback) {
		const rule = refusalFor(address.address);
		if (rule) return callback(smtpError(rule.message, rule.code));
		callback();
	},
	onData(stream, session, callback) {
		receive(stream, session).then(
			(id) => callback(null, `Kept as ${id}`),
			(error: Error) => callback(error)
		);
	}
});
smtp.on('error', (error) => log('smtp-error', { error: String(error) }));

function sendJson(res: ServerResponse, status: number, body: unknown) {
	res.writeHead(status, {
		'content-type': 'application/json; charset=utf-8',
		'cache-control': 'no-store'
	});
	res.end(body === undefined ? undefined : JSON.stringify(body));
}

async function readJson(req: IncomingMessage): Promise<unknown> {
	const chunks: Buffer[] = [];
	let size = 0;
	for await (const chunk of req as AsyncIterable<Buffer>) {
		size += chunk.length;
		if (size > 64 * 1024) throw new Error('body too large');
		chunks.push(chunk);
	}
	return JSON.parse(Buffer.concat(chunks).toString('utf8') || 'null');
}

async function handle(req: IncomingMessage, res: ServerResponse) {
	const url = new URL(req.url ?? '/', `http://${HOST}`);
	const path = url.pathname.replace(/\/+$/, '') || '/';
	if (path === '/health' && req.method === 'GET') {
		return sendJson(res, 200, { ok: true, messages: messages.length, accepted: totalAccepted });
	}
	if (path === '/counts' && req.method === 'GET') {
		return sendJson(res, 200, {
			total: totalAccepted,
			recipients: Object.fromEntries(byRecipient)
		});
	}
	const delivery = /^\/deliveries\/(.{1,300})$/.exec(path);
	if (delivery && req.method === 'GET') {
		return sendJson(res, 200, {
			count: byMessageId.get(decodeURIComponent(delivery[1] ?? '')) ?? 0
		});
	}
	if (path === '/rules') {
		if (req.method === 'DELETE') {
			rules = [];
			refusals.clear();
			return sendJson(res, 204, undefined);
		}
		if (req.method === 'PUT') {
			const parsed = parseRules(await readJson(req).catch(() => undefined));
			if (!parsed) return sendJson(res, 400, { message: 'Send [{ localPart, code, times? }]' });
			rules = parsed;
			refusals.clear();
			return sendJson(res, 200, rules);
		}
		if (req.method === 'GET') return sendJson(res, 200, rules);
	}
	if (path === '/settings' && req.method === 'PUT') {
		const body = (await readJson(req).catch(() => undefined)) as
			{ dataDelayMs?: unknown } | undefined;
		const delay = Number(body?.dataDelayMs ?? 0);
		if (!(Number.isInteger(delay) && delay >= 0 && delay <= 10_000))
			return sendJson(res, 400, { message: 'dataDelayMs: a whole number of ms, 0–10000' });
		dataDelayMs = delay;
		return sendJson(res, 200, { dataDelayMs });
	}
	if (path === '/messages') {
		if (req.method === 'GET') {
			const to = url.searchParams.get('to')?.toLowerCase();
			const list = to
				? messages.filter((m) => [...m.to, ...m.headerTo].some((a) => a.toLowerCase() === to))
				: messages;
			return sendJson(res, 200, list);
		}
		if (req.method === 'DELETE') {
			messages.length = 0;
			totalAccepted = 0;
			byRecipient.clear();
			byMessageId.clear();
			return sendJson(res, 204, undefined);
		}
		return sendJson(res, 405, { message: 'Use GET or DELETE' });
	}
	const one = /^\/messages\/([A-Za-z0-9-]{1,64})$/.exec(path);
	if (one && req.method === 'GET') {
		const message = messages.find((m) => m.id === one[1]);
		return message
			? sendJson(res, 200, message)
			: sendJson(res, 404, { message: 'No such message' });
	}
	return sendJson(res, 404, { message: 'Not found' });
}

const http = createServer((req, res) => {
	handle(req, res).catch((e: unknown) => {
		log('http-error', { error: String(e) });
		if (!res.headersSent) sendJson(res, 500, { message: 'Internal error' });
	});
});

interface Listener {
	listen(port: number, host: string, callback: () => void): unknown;
	once(event: 'error', listener: (error: Error) => void): unknown;
}

function listen(server: Listener, port: number, name: string) {
	return new Promise<void>((resolve, reject) => {
		server.once('error', (e) =>
			reject(new Error(`${name} could not listen on ${HOST}:${port}: ${e.message}`))
		);
		server.listen(port, HOST, resolve);
	});
}

try {
	await listen(smtp, SMTP_PORT, 'SMTP');
	await listen(http, HTTP_PORT, 'HTTP');
} catch (e) {
	console.error(String(e instanceof Error ? e.message : e));
	process.exit(1);
}
http.on('error', (error) => log('http-error', { error: String(error) }));
log('ready', { smtp: `${HOST}:${SMTP_PORT}`, http: `http://${HOST}:${HTTP_PORT}` });

// A stray failure deep in a parser must not take the mailbox (and every waiting test) down.
process.on('uncaughtException', (error) => log('uncaught', { error: String(error) }));
process.on('unhandledRejection', (error) => log('unhandled-rejection', { error: String(error) }));

function shutdown(signal: string) {
	log('stopping', { signal });
	setTimeout(() => process.exit(0), 2_000).unref();
	http.close();
	http.closeAllConnections();
	smtp.close(() => process.exit(0));
}
process.once('SIGTERM', () => shutdown('SIGTERM'));
process.once('SIGINT', () => shutdown('SIGINT'));
