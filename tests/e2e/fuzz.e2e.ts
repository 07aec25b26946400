import { expect, request as playwrightRequest, test } from '@playwright/test';
import type { APIRequestContext } from '@playwright/test';
import fc from 'fast-check';
import mysql from 'mysql2/promise';
import { BASE_URL } from '../playwright.config';
import { discoverActions, discoverRoutes, urlOf } from './routes';
import { DEMO_PASSWORD, connectToE2eDb } from './support';

/*
 * Property-based fuzzing of every form action and every JSON route that takes a body
 * (issue 12: "the access-matrix and fuzz suites run in npm test"; docs/security.md §1,
 * ASVS 2.2.1). fast-check generates hostile bodies: fields of the wrong type, huge strings,
 * Unicode edge cases (lone surrogates, NUL, bidi overrides, full-width look-alikes), and
 * always at least one field no form or schema has (role, authorId, state, ownerId, …),
 * which every input schema must refuse. Each body goes out as a visitor and as an admin
 * (who gets furthest past authorization), next to a set of wrong content types. Every answer
 * must be a 4xx with a message (a visitor may instead be sent to sign in), never a 5xx, and
 * no table may gain or lose a row.
 */

// Actions that read no input at all, so no body can be wrong for them: fuzzing would only
// run them (sign out the admin, refresh exchange rates, empty the local mailbox, take the
// account off the newsletter, mark every notice read). The authorization matrix covers who
// may call them.
const NO_INPUT = new Set([
	'POST /(auth)/signout?/default',
	'POST /(account)/account?/leaveNewsletter',
	'POST /(account)/notices?/allRead',
	'POST /(editor)/editor/rates?/refresh',
	'POST /dev/mailbox?/clear'
]);

// rate_limits counts attempts, not data; everything else must stay exactly as it was.
const NOT_DATA = new Set(['rate_limits']);

const POISON_KEYS = [
	'role',
	'authorId',
	'ownerId',
	'state',
	'userId',
	'isAdmin',
	'sessionVersion',
	'emailVerified',
	'publishedRevisionId',
	'hiddenAt',
	'__proto__',
	'constructor'
];

// Field names the app's forms and APIs do use, so generated bodies reach real validation.
const FIELD_NAMES = [
	'email',
	'password',
	'name',
	'title',
	'summary',
	'guide',
	'slug',
	'token',
	'newEmail',
	'currentPassword',
	'newPassword',
	'confirmEmail',
	'pitch',
	'quantity',
	'amount',
	'region',
	'regionCode',
	'version',
	'visibility',
	'notes',
	'reason',
	'decision',
	'category',
	'label',
	'partId',
	'storeId',
	'redirectTo'
];

const HOSTILE_TEXT = [
	'\u0000',
	'\u202e\u2066evil',
	'\ud800',
	'\udfff\ud800',
	'\ufeff',
	'ｒｏｌｅ＠ｅｘａｍｐｌｅ',
	'<script>alert(1)</script>',
	"' OR 1=1 --",
	'../../etc/passwd',
	'%00%0d%0aBcc: x@example.test',
	'{{7*7}}${7*7}',
	'=HYPERLINK("http://evil.example")',
	'NaN',
	'-1',
	'1e309',
	'0x7fffffff',
	'true',
	'null',
	'[]',
	'{}'
];

const hostileString = fc.oneof(
	fc.constantFrom(...HOSTILE_TEXT),
	fc.string({ unit: 'binary', maxLength: 40 }),
	fc.string({ unit: 'grapheme', maxLength: 40 }),
	// Huge, but under the 512 KB body cap so validation (not the cap) must refuse it.
	fc.integer({ min: 10_000, max: 60_000 }).map((n) => 'x'.repeat(n) + '\u{1F600}')
);

const poison = fc.tuple(fc.constantFrom(...POISON_KEYS), hostileString);

/** A form body: known fields with hostile values, plus at least one field nothing accepts. */
const formBody = fc
	.tuple(fc.dictionary(fc.constantFrom(...FIELD_NAMES), hostileString, { maxKeys: 6 }), poison)
	.map(([fields, [key, value]]) => {
		const body = new URLSearchParams();
		for (const [name, v] of Object.entries(fields)) body.append(name, v);
		body.append(key, value);
		return body.toString();
	});

const wrongTypeValue = fc.oneof(
	hostileString,
	fc.integer(),
	fc.double(),
	fc.boolean(),
	fc.constant(null),
	fc.array(fc.anything({ maxDepth: 2 }), { maxLength: 4 }),
	fc.object({ maxDepth: 2 })
);

/** A JSON body: valid JSON that no route may accept, or text that is not JSON at all. */
const jsonBody = fc.oneof(
	fc
		.tuple(fc.dictionary(fc.constantFrom(...FIELD_NAMES), wrongTypeValue, { maxKeys: 6 }), poison)
		.map(([fields, [key, value]]) => JSON.stringify({ ...fields, [key]: value })),
	fc
		.anything({ maxDepth: 3 })
		.filter((v) => typeof v !== 'object' || v === null || Array.isArray(v))
		.map((v) => JSON.stringify(v) ?? 'undefined'),
	fc.constantFrom('{', '', ' ', '{"a":', '\u0000', '[1,2', '{"__proto__":{"role":"admin"}}', 'null')
);

const WRONG_FORM_TYPES = [
	'text/plain',
	'application/json',
	'application/xml',
	'multipart/form-data',
	''
];
const WRONG_JSON_TYPES = [
	'text/plain',
	'application/x-www-form-urlencoded',
	'multipart/form-data; boundary=x',
	'application/xml',
	''
];

type Outcome = { ok: true } | { ok: false; why: string };

/** 4xx with a message; for a visitor, a redirect to sign in is the designed answer too. */
async function judge(
	response: Awaited<ReturnType<APIRequestContext['fetch']>>,
	visitor: boolean
): Promise<Outcome> {
	const status = response.status();
	const text = await response.text();
	if (status >= 500) return { ok: false, why: `${status} ${text.slice(0, 120)}` };
	let body: unknown = null;
	try {
		body = JSON.parse(text);
	} catch {
		// A plain-text refusal (the form body hook answers text to non-JSON clients).
	}
	const result = body as {
		type?: string;
		status?: number;
		location?: string;
		message?: string;
		error?: { message?: string };
		data?: string;
	} | null;
	// SvelteKit's action protocol: HTTP 200 carrying { type, status } (use:enhance reads it).
	if (result?.type === 'failure') {
		const hasMessage = /message|issues/i.test(result.data ?? '');
		return result.status && result.status >= 400 && result.status < 500 && hasMessage
			? { ok: true }
			: { ok: false, why: `failure ${result.status} without a message: ${text.slice(0, 120)}` };
	}
	if (result?.type === 'redirect') {
		return visitor && /^\/signin\?/.test(result.location ?? '')
			? { ok: true }
			: { ok: false, why: `redirect to ${result.location}` };
	}
	if (result?.type === 'success') return { ok: false, why: `accepted: ${text.slice(0, 120)}` };
	if (status >= 400 && status < 500) {
		const message = result?.message ?? result?.error?.message ?? (result ? '' : text);
		return message.trim() ? { ok: true } : { ok: false, why: `${status} without a message` };
	}
	return { ok: false, why: `${status} ${text.slice(0, 120)}` };
}

/**
 * Runs the property over `runs` generated bodies. A failing body is shrunk by fast-check
 * and reported with the seed that reproduces it; the other routes still run.
 */
async function check(
	bodies: fc.Arbitrary<string>,
	runs: number,
	send: (body: string) => Promise<boolean>,
	label: string,
	wrong: string[]
): Promise<void> {
	try {
		await fc.assert(fc.asyncProperty(bodies, send), { numRuns: runs });
	} catch (e) {
		wrong.push(`${label}: ${e instanceof Error ? e.message.split('\n').slice(0, 4).join(' ') : e}`);
	}
}

async function rowCounts(): Promise<Record<string, number>> {
	const connection = await connectToE2eDb();
	try {
		const [tables] = await connection.query<mysql.RowDataPacket[]>(
			'SELECT table_name AS name FROM information_schema.tables WHERE table_schema = DATABASE() ORDER BY name'
		);
		const counts: Record<string, number> = {};
		for (const { name } of tables as { name: string }[]) {
			if (NOT_DATA.has(name)) continue;
			const [rows] = await connection.query<mysql.RowDataPacket[]>(
				`SELECT COUNT(*) AS n FROM \`${name}\``
			);
			counts[name] = Number(rows[0]?.n ?? 0);
		}
		return counts;
	} finally {
		await connection.end();
	}
}

async function adminContext(): Promise<APIRequestContext> {
	const context = await playwrightRequest.newContext({ baseURL: BASE_URL });
	const response = await context.post('/signin?/password', {
		form: { email: 'admin@slotwise.test', password: DEMO_PASSWORD },
		headers: { origin: BASE_URL, accept: 'text/html' },
		maxRedirects: 0
	});
	expect(response.status(), 'the admin signs in').toBe(303);
	return context;
}

const ACTIONS = discoverActions().filter((entry) => !NO_INPUT.has(entry));
const JSON_ROUTES = discoverRoutes().filter((entry) =>
	/^(POST|PUT|PATCH|DELETE) \/api\//.test(entry)
);

test.describe.configure({ mode: 'serial', timeout: 240_000 });

let before: Record<string, number>;
let visitor: APIRequestContext;
let admin: APIRequestContext;

test.beforeAll(async () => {
	before = await rowCounts();
	visitor = await playwrightRequest.newContext({ baseURL: BASE_URL });
	admin = await adminContext();
});

test.afterAll(async () => {
	await visitor?.dispose();
	await admin?.dispose();
});

test('the suite covers every form action and JSON route that takes a body', () => {
	expect(ACTIONS.length).toBeGreaterThan(50);
	expect(JSON_ROUTES.length).toBeGreaterThan(10);
});

test('hostile bodies sent to every form action are refused with a 4xx and a message', async () => {
	const wrong: string[] = [];
	for (const entry of ACTIONS) {
		const { url } = urlOf(entry);
		for (const [who, context] of [
			['visitor', visitor],
			['admin', admin]
		] as const) {
			const send = async (body: string, type: string) => {
				const headers: Record<string, string> = { origin: BASE_URL, accept: 'application/json' };
				if (type) headers['content-type'] = type;
				const response = await context.fetch(url, {
					method: 'POST',
					data: body,
					headers,
					maxRedirects: 0
				});
				const outcome = await judge(response, who === 'visitor');
				if (!outcome.ok) wrong.push(`${who} ${entry} [${type || 'no type'}]: ${outcome.why}`);
				return outcome.ok;
			};
			await check(
				formBody,
				6,
				(body) => send(body, 'application/x-www-form-urlencoded'),
				`${who} ${entry}`,
				wrong
			);
			for (const type of WRONG_FORM_TYPES) await send('email=a%40b.test&role=admin', type);
		}
	}
	expect(wrong).toEqual([]);
});

test('a form body whose only field is __proto__ is refused by every form action', async () => {
	// The form reader drops a field named __proto__ (it would set the object's prototype), so
	// this body reads as an empty form. An action whose schema takes an empty form as
	// "everything off" or "no message" would save that: found by the generated bodies above
	// on the tip settings, which it turned off and whose thank-you message it cleared.
	const wrong: string[] = [];
	for (const entry of ACTIONS) {
		const response = await admin.fetch(urlOf(entry).url, {
			method: 'POST',
			data: '__proto__=x',
			headers: {
				origin: BASE_URL,
				accept: 'application/json',
				'content-type': 'application/x-www-form-urlencoded'
			},
			maxRedirects: 0
		});
		const outcome = await judge(response, false);
		if (!outcome.ok) wrong.push(`${entry}: ${outcome.why}`);
	}
	expect(wrong).toEqual([]);
});

test('hostile bodies sent to every JSON route are refused with a 4xx and a message', async () => {
	const wrong: string[] = [];
	for (const entry of JSON_ROUTES) {
		const { method, url } = urlOf(entry);
		for (const [who, context] of [
			['visitor', visitor],
			['admin', admin]
		] as const) {
			const send = async (body: string, type: string) => {
				const headers: Record<string, string> = { origin: BASE_URL, accept: 'application/json' };
				if (type) headers['content-type'] = type;
				const response = await context.fetch(url, { method, data: body, headers, maxRedirects: 0 });
				const outcome = await judge(response, who === 'visitor');
				if (!outcome.ok) wrong.push(`${who} ${entry} [${type || 'no type'}]: ${outcome.why}`);
				return outcome.ok;
			};
			await check(jsonBody, 10, (body) => send(body, 'application/json'), `${who} ${entry}`, wrong);
			for (const type of WRONG_JSON_TYPES) await send('{"role":"admin"}', type);
		}
	}
	expect(wrong).toEqual([]);
});

test('no row was added or removed anywhere by all of the above', async () => {
	expect(await rowCounts()).toEqual(before);
});
