/*
 * The SMTP transport, created lazily once per process. Relative imports and plain
 * process.env only, so scripts/ (outside Vite) can send mail too.
 *
 * Development and tests point at the local fake (scripts/smtp-fake.sh, 127.0.0.1:2525);
 * a real deployment sets SMTP_HOST and friends to its provider.
 */
import { createTransport, type Transporter } from 'nodemailer';
import type SMTPTransport from 'nodemailer/lib/smtp-transport';

export interface MailConfig {
	host: string;
	port: number;
	/** Implicit TLS from the first byte (port 465). Otherwise STARTTLS when the server offers it. */
	secure: boolean;
	user?: string;
	password?: string;
	/** The From header, e.g. `Slotwise <no-reply@slotwise.test>`. Operator config, never user input. */
	from: string;
}

const TRUE_WORDS = new Set(['1', 'true', 'yes', 'on']);

export function mailConfigFromEnv(env: NodeJS.ProcessEnv = process.env): MailConfig {
	const port = Number(env.SMTP_PORT ?? 2525);
	if (!Number.isInteger(port) || port < 1 || port > 65535) {
		throw new Error(`SMTP_PORT must be a port number, got ${JSON.stringify(env.SMTP_PORT)}`);
	}
	const from = env.MAIL_FROM?.trim() || 'Slotwise <no-reply@slotwise.test>';
	// A line break in From would let configuration inject headers into every message.
	if (/[\r\n]/.test(from)) throw new Error('MAIL_FROM must be one line');
	return {
		host: env.SMTP_HOST?.trim() || '127.0.0.1',
		port,
		secure: TRUE_WORDS.has((env.SMTP_SECURE ?? '').trim().toLowerCase()),
		user: env.SMTP_USER || undefined,
		password: env.SMTP_PASS || undefined,
		from
	};
}

/** Transport options for a config. Exported so the hardening flags are testable. */
export function transportOptions(config: MailConfig): SMTPTransport.Options {
	return {
		host: config.host,
		port: config.port,
		secure: config.secure,
		auth: config.user ? { user: config.user, pass: config.password ?? '' } : undefined,
		// Messages never read local files or fetch URLs for content or attachments
		// (docs/security.md §8): a path or URL that slips into a message stays text.
		disableFileAccess: true,
		disableUrlAccess: true,
		// nodemailer's defaults (2 min connect, 10 min socket) would hold a sign-in request
		// for minutes when the provider hangs; fail in seconds instead.
		connectionTimeout: 10_000,
		greetingTimeout: 10_000,
		socketTimeout: 30_000
	};
}

interface MailTransport {
	config: MailConfig;
	transporter: Transporter<SMTPTransport.SentMessageInfo>;
}

// Process-wide like the database connection: a client for an external service, not request state.
let current: MailTransport | null = null;

/** The process-wide transport, created on first use from process.env. */
export function getTransport(): MailTransport {
	if (!current) {
		const config = mailConfigFromEnv();
		current = { config, transporter: createTransport(transportOptions(config)) };
	}
	return current;
}

/** Closes the transport; the next send creates a fresh one (and re-reads process.env). */
export function closeTransport(): void {
	current?.transporter.close();
	current = null;
}
