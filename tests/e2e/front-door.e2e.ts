import { connect as connectSocket } from 'node:net';
import { expect, test } from '@playwright/test';
import { type AppProcess, cleanUp, signIn, startApp } from './processes';
import { connectToE2eDb } from './support';

/*
 * The front door (src/lib/server/http/front-door.ts) against the real build: a visitor's
 * request for an answer the process keeps is answered before SvelteKit sees it, with the
 * same bytes and headers as through the hooks, only while the answer's validator still holds,
 * and never for a request with a cookie. The app logs each answer the door sends with
 * `"via":"front-door"`, which is how these checks tell the two paths apart.
 */
test.describe.configure({ mode: 'serial', timeout: 120_000 });

const LIST = '/api/v1/guides';
const PAGE = '/guides/pocket-itx-1440p';

let app: AppProcess;

test.beforeAll(async () => {
	test.setTimeout(120_000);
	app = await startApp({ DB_NAME: process.env.DB_NAME ?? 'slotwise_e2e', LOG_LEVEL: 'info' });
});

test.afterAll(async () => {
	await app?.stop();
	await cleanUp();
});

interface LoggedAnswer {
	path: string;
	status: number;
	method: string;
	via?: string;
}

/** The request lines the app has logged since `from` characters of its output. */
function answersSince(from: number): LoggedAnswer[] {
	return app
		.output()
		.slice(from)
		.split('\n')
		.filter((line) => line.startsWith('{') && line.includes('"kind":"request"'))
		.map((line) => JSON.parse(line) as LoggedAnswer);
}

/** Sends one GET and returns the answer with how the app logged it. */
async function get(path: string, headers: Record<string, string> = {}, method = 'GET') {
	const from = app.output().length;
	const response = await fetch(`${app.origin}${path}`, {
		method,
		headers,
		redirect: 'manual',
		signal: AbortSignal.timeout(20_000)
	});
	const body = await response.text();
	// The log line is written once the answer has gone: give the pipe a moment.
	let logged: LoggedAnswer[] = [];
	for (let i = 0; i < 50 && logged.length === 0; i++) {
		logged = answersSince(from).filter((a) => a.path === path.split('?')[0]);
		if (logged.length === 0) await new Promise((r) => setTimeout(r, 20));
	}
	expect(logged, `one logged answer for ${path}`).toHaveLength(1);
	return { response, body, via: logged[0]!.via ?? 'hooks' };
}

async function bumpGuideListCounter(): Promise<void> {
	const db = await connectToE2eDb();
	try {
		// What any write to a guide row does after commit (db/generation-hooks.ts).
		await db.query(
			"INSERT INTO cache_generations (name, value, updated_at) VALUES ('guide-list', 1, NOW()) ON DUPLICATE KEY UPDATE value = value + 1, updated_at = NOW()"
		);
	} finally {
		await db.end();
	}
}

const SHARED_HEADERS = ['content-type', 'etag', 'cache-control', 'vary', 'content-security-policy'];

test('a kept list is sent again at the door with the same bytes and headers, security headers included', async () => {
	const first = await get(LIST);
	expect(first.response.status).toBe(200);
	const second = await get(LIST);
	const third = await get(LIST);
	expect(first.via).toBe('hooks');
	expect([second.via, third.via]).toEqual(['front-door', 'front-door']);
	expect(third.body).toBe(first.body);
	for (const name of SHARED_HEADERS)
		expect(third.response.headers.get(name), name).toBe(first.response.headers.get(name));
	expect(third.response.headers.get('x-content-type-options')).toBe('nosniff');
	expect(third.response.headers.get('x-frame-options')).toBe('DENY');
	expect(third.response.headers.get('content-length')).toBe(String(Buffer.byteLength(first.body)));
	expect(third.response.headers.get('set-cookie')).toBeNull();
});

test("a guide page at the door keeps the page's own script hashes, not the baseline policy", async () => {
	await get(PAGE);
	const kept = await get(PAGE);
	expect(kept.via).toBe('front-door');
	expect(kept.response.status).toBe(200);
	expect(kept.response.headers.get('content-security-policy')).toContain("'sha256-");
	expect(kept.body).toContain('<html');
});

test('a matching If-None-Match gets a 304 at the door', async () => {
	const { response } = await get(LIST);
	const etag = response.headers.get('etag')!;
	const revalidated = await get(LIST, { 'if-none-match': etag });
	expect(revalidated.via).toBe('front-door');
	expect(revalidated.response.status).toBe(304);
	expect(revalidated.body).toBe('');
	expect(revalidated.response.headers.get('etag')).toBe(etag);
});

test('a changed validator sends the request on to SvelteKit, and the new answer is kept', async () => {
	const before = await get(LIST);
	await bumpGuideListCounter();
	const after = await get(LIST);
	expect(after.via).toBe('hooks');
	expect(after.response.headers.get('etag')).not.toBe(before.response.headers.get('etag'));
	// The old validator is not honoured any more, at the door or behind it.
	const old = await get(LIST, { 'if-none-match': before.response.headers.get('etag')! });
	expect(old.response.status).toBe(200);
	const again = await get(LIST);
	expect(again.via).toBe('front-door');
	expect(again.response.headers.get('etag')).toBe(after.response.headers.get('etag'));
});

test('requests with any cookie, and HEAD requests, never come through the door', async () => {
	await get(PAGE);
	await get(PAGE);
	const cookie = await signIn(app.origin, 'reader@slotwise.test');
	const signedIn = await get(PAGE, { cookie });
	expect(signedIn.via).toBe('hooks');
	expect(signedIn.response.headers.get('cache-control')).toContain('private');
	const otherCookie = await get(PAGE, { cookie: 'theme=dark' });
	expect(otherCookie.via).toBe('hooks');
	expect(otherCookie.response.status).toBe(200);
	const head = await get(PAGE, {}, 'HEAD');
	expect(head.via).toBe('hooks');
});

test('a page the browser revalidates (a 304) keeps its own policy and runs its scripts, at the door or through the hooks', async ({
	browser
}) => {
	// A 304's headers replace the stored answer's (RFC 9111 §4.3.4): a 304 carrying the
	// baseline policy for files and JSON blocked every script and stylesheet of the page.
	for (const cookie of [null, { name: 'theme', value: 'dark' }]) {
		const context = await browser.newContext();
		if (cookie) await context.addCookies([{ ...cookie, url: app.origin }]);
		const page = await context.newPage();
		const blocked: string[] = [];
		page.on('console', (m) => {
			if (m.text().includes('Content Security Policy')) blocked.push(m.text());
		});
		const from = app.output().length;
		for (let visit = 0; visit < 3; visit++) await page.goto(`${app.origin}${PAGE}`);
		const revalidated = answersSince(from).filter((a) => a.path === PAGE && a.status === 304);
		expect(revalidated.length, 'the browser revalidated the page').toBeGreaterThan(0);
		if (!cookie) expect(revalidated.every((a) => a.via === 'front-door')).toBe(true);
		else expect(revalidated.some((a) => a.via === 'front-door')).toBe(false);
		expect(blocked, 'nothing blocked by a policy').toEqual([]);
		// Hydrated: the client router takes the next link without a full load.
		await page.evaluate(() => ((window as unknown as { hydrated: boolean }).hydrated = true));
		await page.getByRole('link', { name: 'Guides', exact: true }).first().click();
		await page.waitForURL(/\/guides$/);
		expect(await page.evaluate(() => (window as unknown as { hydrated?: boolean }).hydrated)).toBe(
			true
		);
		await context.close();
	}
});

/** Sends one raw HTTP/1.1 GET for `target` and returns the status line. */
function rawGet(target: string): Promise<string> {
	return new Promise<string>((done, fail) => {
		const socket = connectSocket(Number(new URL(app.origin).port), '127.0.0.1');
		let text = '';
		socket.on('data', (chunk) => (text += chunk.toString()));
		socket.on('end', () => done(text.split('\r\n')[0] ?? ''));
		socket.on('error', fail);
		socket.write(`GET ${target} HTTP/1.1\r\nHost: x\r\nConnection: close\r\n\r\n`);
	});
}

test('request targets other than a path are left to SvelteKit, and the process lives on', async () => {
	await get(LIST);
	await get(LIST);
	for (const target of ['*', `http://x${LIST}`, `http://[bad${LIST}`]) {
		const from = app.output().length;
		const status = await rawGet(target);
		expect(status, target).toMatch(/^HTTP\/1\.1 \d{3}/);
		expect(app.output().slice(from), target).not.toContain('front-door');
	}
	const health = await fetch(`${app.origin}/api/health`);
	expect(health.status).toBe(200);
});
