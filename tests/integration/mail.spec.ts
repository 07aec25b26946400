/*
 * The mailer end to end over the real SMTP protocol: send() → nodemailer → the local SMTP
 * fake (scripts/smtp-fake.ts) → read back through the fake's HTTP API.
 *
 * This file starts nothing itself. `npm test` starts the fake (scripts/lib.sh
 * start_mail_fake) and the integration project sets SMTP_HOST/SMTP_PORT/MAILBOX_URL
 * (vite.config.ts), so a missing fake is a failure, not a skip. By hand:
 *   bash scripts/smtp-fake.sh start
 *   npx vitest run --project integration tests/integration/mail.spec.ts
 *
 * Refusal cases are docs/security.md §8's list and ASVS v5.0.0 1.3.11 (mail injection).
 */
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
	MailAddressError,
	MailHeaderError,
	closeTransport,
	send,
	type MailTemplate
} from '../../src/lib/server/mail';
import * as templates from '../../src/lib/server/mail/templates';
import {
	clearMailbox,
	firstLink,
	linksIn,
	listMessages,
	mailboxUrl,
	waitForMessage,
	type MailboxMessage
} from '../support/mailbox';

const APP = 'http://127.0.0.1:4173';
const SENDER = 'no-reply@slotwise.test'; // MAIL_FROM's default

// Every recipient carries this run's tag, so the assertions hold even when another process
// uses the same fake at the same time; nothing here depends on the mailbox being empty.
const RUN = randomUUID().slice(0, 8);
const addr = (local: string) => `${local}.${RUN}@example.test`;
const delivered = async (to: string) => (await listMessages()).filter((m) => m.to.includes(to));
// Every domain the refused recipients below could have reached.
const ATTACK_DOMAINS = /@(evil\.test|victim\.test|x\.test|y\.test)$/i;

beforeAll(async () => {
	const url = mailboxUrl(); // throws a clear message when MAILBOX_URL is unset
	const health = await fetch(`${url}/health`, { signal: AbortSignal.timeout(3_000) }).catch(
		() => null
	);
	if (!health?.ok) {
		throw new Error(
			`The local SMTP fake does not answer at ${url}. npm test starts it; by hand run: bash scripts/smtp-fake.sh start`
		);
	}
	await clearMailbox(); // a tidy start for whoever reads the mailbox; the tests do not need it
});

afterAll(() => {
	closeTransport();
});

/** Everything a delivered account e-mail must satisfy, whatever the template. */
function expectDeliveredOnce(message: MailboxMessage, to: string, sent: MailTemplate) {
	expect(message.to).toEqual([to]); // SMTP envelope: exactly one RCPT TO
	expect(message.headerTo).toEqual([to]);
	expect(message.cc).toEqual([]);
	expect(message.bcc).toEqual([]);
	expect(message.envelopeFrom).toBe(SENDER);
	expect(message.subject).toBe(sent.subject);
	expect(message.subject).not.toMatch(/[\r\n]/);
	expect(message.text.trim()).toBe(sent.text.trim());
	expect(message.html.trim()).toBe(sent.html.trim());
	expect(message.text).toContain('You got this e-mail because');
	expect(message.html).toContain('You got this e-mail because');
}

const link = (path: string, token: string) => `${APP}${path}?token=${token}&from=mail`;

const cases: {
	name: string;
	to: string;
	mail: MailTemplate;
	links: [prefix: string, url: string][];
}[] = [
	{
		name: 'verifyEmail',
		to: addr('verify'),
		mail: templates.verifyEmail({ name: 'Ana Lind', url: link('/verify-email', 'tok-verify') }),
		links: [['/verify-email', link('/verify-email', 'tok-verify')]]
	},
	{
		name: 'signInLink',
		to: addr('signin'),
		mail: templates.signInLink({ url: link('/signin/link', 'tok-signin'), minutes: 10 }),
		links: [['/signin/link', link('/signin/link', 'tok-signin')]]
	},
	{
		name: 'resetPassword',
		to: addr('reset'),
		mail: templates.resetPassword({ url: link('/reset-password', 'tok-reset'), minutes: 30 }),
		links: [['/reset-password', link('/reset-password', 'tok-reset')]]
	},
	{
		name: 'signUpWithExistingEmail',
		to: addr('existing'),
		mail: templates.signUpWithExistingEmail({
			signInUrl: `${APP}/signin`,
			resetUrl: `${APP}/reset-password`
		}),
		links: [
			['/signin', `${APP}/signin`],
			['/reset-password', `${APP}/reset-password`]
		]
	},
	{
		name: 'passwordChanged',
		to: addr('changed'),
		mail: templates.passwordChanged({ resetUrl: `${APP}/reset-password` }),
		links: [['/reset-password', `${APP}/reset-password`]]
	},
	{
		name: 'authorRequestDecision (approved)',
		to: addr('approved'),
		mail: templates.authorRequestDecision({
			name: 'Ana',
			approved: true,
			note: 'Welcome aboard.',
			url: `${APP}/`
		}),
		links: [['/', `${APP}/`]]
	},
	{
		name: 'authorRequestDecision (declined)',
		to: addr('declined'),
		mail: templates.authorRequestDecision({ name: 'Ana', approved: false, note: null }),
		links: []
	},
	{
		name: 'accountDisabled',
		to: addr('disabled'),
		mail: templates.accountDisabled({ note: 'Repeated spam in guide comments.' }),
		links: []
	}
];

describe('each account e-mail travels over SMTP to exactly one recipient', () => {
	it.each(cases)('$name', async ({ to, mail, links }) => {
		await send(to, mail);
		const message = await waitForMessage({ to });
		expectDeliveredOnce(message, to, mail);
		for (const [prefix, url] of links) {
			expect(firstLink(message, prefix)).toBe(url);
			// The HTML carries the same link, attribute-escaped (& → &amp;).
			expect(message.html).toContain(
				`href="${url.replaceAll('&', '&amp;')}" style="color:#0E6F6A;`
			);
		}
		if (links.length === 0) expect(linksIn(message)).toEqual([]);
		expect(await delivered(to)).toHaveLength(1);
	});

	it('states how long a one-time link lasts', async () => {
		await send(
			addr('minutes'),
			templates.signInLink({ url: `${APP}/signin/link?token=t`, minutes: 10 })
		);
		const message = await waitForMessage({ to: addr('minutes'), subject: /sign-in link/ });
		expect(message.text).toContain('It works once and expires in 10 minutes.');
	});

	it('delivers to the normalised address (domain lower-cased)', async () => {
		await send(`  Ana.Lind.${RUN}@Example.TEST `, templates.passwordChanged());
		const message = await waitForMessage({ to: `Ana.Lind.${RUN}@example.test` });
		expect(message.to).toEqual([`Ana.Lind.${RUN}@example.test`]);
	});

	it('escapes a hostile name in the HTML and drops a link-like name from the greeting', async () => {
		await send(
			addr('escaped'),
			templates.verifyEmail({ name: '<script>alert(1)</script> & co', url: `${APP}/v` })
		);
		const escaped = await waitForMessage({ to: addr('escaped') });
		expect(escaped.html).toContain('Hello &lt;script&gt;alert(1)&lt;/script&gt; &amp; co,');
		expect(escaped.html).not.toContain('<script');

		await send(
			addr('linkname'),
			templates.verifyEmail({ name: 'Win a GPU at www.prize.example', url: `${APP}/v` })
		);
		const plain = await waitForMessage({ to: addr('linkname') });
		expect(plain.text.startsWith('Hello,\n')).toBe(true);
		expect(plain.text).not.toContain('prize');
	});
});

/**
 * Sends a good message after the refusals and waits for it (send() awaits each delivery, so
 * nothing sent earlier can still be in flight), then checks no refused recipient got mail.
 */
async function expectOnlySentinelArrives(refusedTo?: string) {
	const sentinel = addr(`sentinel-${randomUUID().slice(0, 6)}`);
	await send(sentinel, templates.passwordChanged());
	await waitForMessage({ to: sentinel });
	const all = await listMessages();
	expect(all.flatMap((m) => m.to).filter((a) => ATTACK_DOMAINS.test(a))).toEqual([]);
	if (refusedTo) expect(all.filter((m) => m.to.includes(refusedTo))).toEqual([]);
}

describe('send() refuses bad recipients before any SMTP traffic', () => {
	const tenThousandCommas = Array.from({ length: 10_000 }, (_, i) => `u${i}@x.test`).join(',');
	const bad: [string, string][] = [
		['quoted local part', '"a@evil.test"@victim.test'],
		['comma list', 'a@x.test,b@y.test'],
		['CRLF Bcc injection', 'a@x.test\r\nBcc: c@y.test'],
		['fullwidth ＠', 'a＠x.test'],
		['10k-comma list', tenThousandCommas],
		['angle-bracket display name', 'Eve <a@x.test>']
	];

	it('refuses each with MailAddressError in under 50 ms, and nothing arrives', async () => {
		for (const [label, address] of bad) {
			const started = performance.now();
			const outcome = await send(address, templates.passwordChanged()).then(
				() => null,
				(e: unknown) => e
			);
			const ms = performance.now() - started;
			expect(outcome, label).toBeInstanceOf(MailAddressError);
			expect((outcome as MailAddressError).reason, label).toMatch(/\S/);
			expect(ms, label).toBeLessThan(50);
		}
		await expectOnlySentinelArrives();
	});
});

describe('headers stay ours', () => {
	it('strips CR/LF from the subject, so no header can be added through it', async () => {
		const sneaky = {
			...templates.passwordChanged(),
			subject: 'Hello\r\nBcc: evil@y.test\r\n\r\nbody'
		};
		await send(addr('subject'), sneaky);
		const message = await waitForMessage({ to: addr('subject') });
		expect(message.subject).toBe('Hello Bcc: evil@y.test body');
		expect(message.to).toEqual([addr('subject')]);
		expect(message.headers).not.toHaveProperty('bcc');
		await expectOnlySentinelArrives();
	});

	it('passes one-click unsubscribe headers through unchanged', async () => {
		// Exact header per RFC 8058 (docs/sources.md row 12, V2); List-Unsubscribe per RFC 2369.
		await send(addr('list'), templates.passwordChanged(), {
			'List-Unsubscribe': '<https://slotwise.test/unsubscribe/abc123>',
			'List-Unsubscribe-Post': 'List-Unsubscribe=One-Click'
		});
		const message = await waitForMessage({ to: addr('list') });
		expect(message.headers['list-unsubscribe']).toBe('<https://slotwise.test/unsubscribe/abc123>');
		expect(message.headers['list-unsubscribe-post']).toBe('List-Unsubscribe=One-Click');
	});

	it.each([
		['a CRLF in a value', { 'X-Slotwise-Note': 'ok\r\nBcc: evil@y.test' }],
		['a recipient header', { Bcc: 'evil@y.test' }],
		['a From override', { from: 'Admin <admin@evil.test>' }],
		['a colon in the name', { 'X-A:B': 'x' }],
		['a non-ASCII value', { 'X-Name': 'Zoë' }]
	])('refuses %s with MailHeaderError, and nothing arrives', async (_label, headers) => {
		const to = addr(`headers-${randomUUID().slice(0, 6)}`);
		await expect(send(to, templates.passwordChanged(), headers)).rejects.toBeInstanceOf(
			MailHeaderError
		);
		await expectOnlySentinelArrives(to);
	});
});

describe('templates refuse links that are not http(s)', () => {
	it.each(['javascript:alert(1)', 'data:text/html,hi', '/relative/path'])('%s', (url) => {
		expect(() => templates.signInLink({ url, minutes: 10 })).toThrow(TypeError);
	});
});
