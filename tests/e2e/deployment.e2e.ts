import { expect, test } from '@playwright/test';
import { DEMO_PASSWORD } from './support';
import { startOwnServer, type OwnServer } from './own-server';

/*
 * A server set up as a deployment would be: listening on every interface behind an https
 * origin, with its log kept. The shared e2e server listens on 127.0.0.1 over http, so
 * these cannot be seen there (issue 12, items 10, 13 and 14).
 */
test.describe.configure({ mode: 'serial', timeout: 90_000 });

let server: OwnServer;

test.beforeAll(async () => {
	test.setTimeout(60_000);
	server = await startOwnServer({
		HOST: '0.0.0.0',
		ORIGIN: 'https://slotwise.example',
		// The log is what one test reads, so it is on here.
		LOG_LEVEL: 'info'
	});
});

test.afterAll(async () => {
	await server?.stop();
});

function sessionCookie(setCookies: string[]): { name: string; attributes: string[]; pair: string } {
	const line = setCookies.find((c) => /^(__Secure-)?authjs\.session-token=/.test(c));
	if (!line) throw new Error(`no session cookie in ${JSON.stringify(setCookies)}`);
	const [pair = '', ...attributes] = line.split(';').map((p) => p.trim());
	return {
		name: pair.slice(0, pair.indexOf('=')),
		pair,
		attributes: attributes.map((a) => a.toLowerCase())
	};
}

test('behind an https origin the session cookie is Secure and prefixed at sign-in and on refresh (item 13)', async () => {
	const signIn = await fetch(`${server.url}/signin?/password`, {
		method: 'POST',
		body: new URLSearchParams({ email: 'reader@slotwise.test', password: DEMO_PASSWORD }),
		headers: { origin: server.origin, accept: 'text/html' },
		redirect: 'manual'
	});
	expect(signIn.status).toBe(303);
	const issued = sessionCookie(signIn.headers.getSetCookie());
	expect(issued.name).toBe('__Secure-authjs.session-token');
	expect(issued.attributes).toEqual(
		expect.arrayContaining(['secure', 'httponly', 'samesite=lax', 'path=/'])
	);

	// A proxy header claiming plain http must not change the decision either.
	for (const extra of [{}, { 'x-forwarded-proto': 'http' }] as Record<string, string>[]) {
		const refresh = await fetch(`${server.url}/`, {
			headers: { cookie: issued.pair, ...extra }
		});
		expect(refresh.status).toBe(200);
		const refreshed = sessionCookie(refresh.headers.getSetCookie());
		expect(refreshed.name, JSON.stringify(extra)).toBe(issued.name);
		expect(refreshed.attributes.filter((a) => !a.startsWith('expires=')).sort()).toEqual(
			issued.attributes.filter((a) => !a.startsWith('expires=')).sort()
		);
		expect(refresh.headers.get('strict-transport-security')).toMatch(/max-age=\d+/);
	}
});

test('a refused password is one structured log line, not a stack trace (item 14)', async () => {
	const before = server.output().length;
	const refused = await fetch(`${server.url}/signin?/password`, {
		method: 'POST',
		body: new URLSearchParams({
			email: `nobody-${Date.now()}@example.test`,
			password: 'not the password at all'
		}),
		headers: { origin: server.origin, accept: 'text/html' },
		redirect: 'manual'
	});
	expect(refused.status).toBe(400);
	// The request line is written after the answer; give the log a moment.
	await expect
		.poll(() => server.output().slice(before), { timeout: 5_000 })
		.toContain('"kind":"request"');
	const lines = server
		.output()
		.slice(before)
		.split('\n')
		.filter((l) => l.trim() !== '');
	expect(
		lines.filter((l) => /^\s+at /.test(l)),
		'stack frames'
	).toEqual([]);
	expect(lines.filter((l) => l.includes('[auth][error]'))).toEqual([]);
	const refusals = lines.filter((l) => l.includes('"sign-in-refused"'));
	expect(refusals).toHaveLength(1);
	const entry = JSON.parse(refusals[0] ?? '{}') as Record<string, unknown>;
	expect(entry).toMatchObject({ kind: 'sign-in-refused', method: 'credentials' });
	// The address typed is not logged.
	expect(refusals[0]).not.toContain('example.test');
	for (const line of lines) expect(() => JSON.parse(line), line).not.toThrow();
});

test('the development mailbox does not exist on a server that is not loopback-only (item 10)', async () => {
	expect(process.env.MAILBOX_URL, 'the local SMTP fake is configured for this server').toBeTruthy();
	const page = await fetch(`${server.url}/dev/mailbox`);
	expect(page.status).toBe(404);
	const clear = await fetch(`${server.url}/dev/mailbox?/clear`, {
		method: 'POST',
		body: new URLSearchParams({}),
		headers: { origin: server.origin, accept: 'application/json' }
	});
	expect(clear.status).toBe(404);
	const one = await fetch(`${server.url}/dev/mailbox/00000000-0000-4000-8000-000000000000`);
	expect(one.status).toBe(404);
});
