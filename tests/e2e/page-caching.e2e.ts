import { expect, test } from '@playwright/test';
import { BASE_URL } from '../playwright.config';
import { type AppProcess, cleanUp, postForm, signIn, startApp } from './processes';
import { connectToE2eDb, forgetAddressCounts } from './support';

/*
 * HTTP caching of the guide page and the pricing API (src/lib/server/http/guide-caching.ts)
 * against the real build, with two app processes on one database as behind a load balancer
 * with a shared cache in front: the app under test (A) and a second `node build` (B).
 *
 * - A visitor's answer carries a weak ETag and `public` caching; the same If-None-Match is
 *   answered 304 with no body, by either process (the validator lives in the database).
 * - An editor's new quote on A changes the ETag that B hands out: a shared cache asking B
 *   again gets the new page, not a 304 for the old one.
 * - Signed-in answers are `private, no-store`, never carry or honour the visitor's
 *   validator, and each person sees only their own signed-in parts.
 */
test.describe.configure({ mode: 'serial', timeout: 120_000 });

// Base region Japan (demo-data/guides.ts); the cooler slot's alternate is the Flatline 58.
const SLUG = 'pocket-itx-1440p';
const PAGE = `/guides/${SLUG}`;
const PRICING = `/api/v1/guides/${SLUG}/pricing`;
// What the client router fetches on navigation: every load, or only the page's (layout skipped).
const DATA = `${PAGE}/__data.json?x-sveltekit-invalidated=11`;
const PAGE_DATA_ONLY = `${PAGE}/__data.json?x-sveltekit-invalidated=01`;
const ALTERNATE = 'kelda-flatline-58';
const PUBLIC = 'public, max-age=0, s-maxage=60, stale-while-revalidate=60';

let second: AppProcess;

test.beforeAll(async () => {
	test.setTimeout(120_000);
	second = await startApp({ DB_NAME: process.env.DB_NAME ?? 'slotwise_e2e' });
});

test.afterAll(async () => {
	await second?.stop();
	await cleanUp();
});

/**
 * The page's ETag also counts minutes (forks, gallery and tip notes are outside the stamp):
 * start a request pair at least 10 s before the next minute, so both fall in one minute.
 */
async function inOneMinute(): Promise<void> {
	const left = 60_000 - (Date.now() % 60_000);
	if (left < 10_000) await new Promise((r) => setTimeout(r, left + 50));
}

async function get(origin: string, path: string, headers: Record<string, string> = {}) {
	const response = await fetch(`${origin}${path}`, {
		headers,
		redirect: 'manual',
		signal: AbortSignal.timeout(20_000)
	});
	return { response, body: await response.text() };
}

/** The alternate's unit price in the pricing API's answer. */
function alternatePrice(body: string) {
	const guide = JSON.parse(body) as {
		slots: {
			alternates: { part: { slug: string }; price: { unit: unknown; storeName: string } | null }[];
		}[];
	};
	const alternate = guide.slots.flatMap((s) => s.alternates).find((a) => a.part.slug === ALTERNATE);
	return alternate?.price ?? null;
}

/** Gives the person with `email` `count` unread notices. */
async function addNotices(email: string, count: number): Promise<void> {
	const connection = await connectToE2eDb();
	try {
		for (let i = 0; i < count; i++) {
			await connection.query(
				`INSERT INTO notices (user_id, kind, message, link_path, created_at)
				 SELECT id, 'source_revised', 'A test notice (page caching).', '/notices', NOW() FROM users WHERE email = ?`,
				[email]
			);
		}
	} finally {
		await connection.end();
	}
}

/** Removes the notices addNotices made. */
async function removeTestNotices(): Promise<void> {
	const connection = await connectToE2eDb();
	try {
		await connection.query("DELETE FROM notices WHERE message = 'A test notice (page caching).'");
	} finally {
		await connection.end();
	}
}

/** Unread notices of the person with `email`, counted in the database. */
async function unreadOf(email: string): Promise<number> {
	const connection = await connectToE2eDb();
	try {
		const [rows] = await connection.query(
			'SELECT COUNT(*) AS n FROM notices n JOIN users u ON u.id = n.user_id WHERE u.email = ? AND n.read_at IS NULL',
			[email]
		);
		return Number((rows as { n: number }[])[0]?.n);
	} finally {
		await connection.end();
	}
}

async function jpStoreId(): Promise<number> {
	const connection = await connectToE2eDb();
	try {
		const [rows] = await connection.query(
			"SELECT id FROM stores WHERE name = 'Kairo Denki' LIMIT 1"
		);
		return Number((rows as { id: number }[])[0]?.id);
	} finally {
		await connection.end();
	}
}

test('a visitor gets public caching with an ETag, a 304 from either process, and a new ETag after a new quote', async () => {
	for (const path of [PAGE, PRICING]) {
		await inOneMinute();
		const first = await get(BASE_URL, path);
		expect(first.response.status).toBe(200);
		const etag = first.response.headers.get('etag') ?? '';
		expect(etag).toMatch(/^W\/"[^"]+"$/);
		expect(first.response.headers.get('cache-control')).toBe(PUBLIC);
		expect(first.response.headers.get('vary')).toContain('Cookie');
		expect(first.body.length).toBeGreaterThan(0);

		for (const origin of [BASE_URL, second.origin]) {
			const again = await get(origin, path, { 'if-none-match': etag });
			expect(again.response.status, `${origin}${path}`).toBe(304);
			expect(again.body).toBe('');
			expect(again.response.headers.get('etag')).toBe(etag);
			expect(again.response.headers.get('cache-control')).toBe(PUBLIC);
		}
		// Any other validator gets the whole answer.
		const other = await get(BASE_URL, path, { 'if-none-match': 'W/"something-else"' });
		expect(other.response.status).toBe(200);
	}

	// The page's data (client navigation) is another answer with validators of its own: the
	// document's, the full data's and the page-only data's all differ.
	await inOneMinute();
	const tags = await Promise.all(
		[PAGE, DATA, PAGE_DATA_ONLY].map(async (path) => {
			const { response } = await get(BASE_URL, path);
			expect(response.status, path).toBe(200);
			expect(response.headers.get('cache-control'), path).toBe(PUBLIC);
			return response.headers.get('etag');
		})
	);
	expect(new Set(tags).size).toBe(3);

	// Before: the demo's latest Japanese quote for the alternate (demo-data/quotes.ts).
	const before = await get(BASE_URL, PRICING);
	expect(alternatePrice(before.body)).toMatchObject({
		unit: { amountMinor: 8480, currency: 'JPY' },
		storeName: 'Kairo Denki'
	});
	await inOneMinute();
	const oldPage = (await get(second.origin, PAGE)).response.headers.get('etag') ?? '';
	const oldPricing = before.response.headers.get('etag') ?? '';

	// An editor adds a newer Japanese quote for the alternate on process A.
	await forgetAddressCounts();
	const editor = await signIn(BASE_URL, 'editor@slotwise.test');
	const added = await postForm(
		BASE_URL,
		'/editor/quotes?/create',
		{
			partSlug: ALTERNATE,
			storeId: String(await jpStoreId()),
			amount: '7980',
			taxIncluded: 'on',
			observedOn: new Date().toISOString().slice(0, 10)
		},
		editor
	);
	expect(added.status).toBe(303);

	// Process B, asked again with the old validators, answers in full with new ones.
	for (const [path, old] of [
		[PAGE, oldPage],
		[PRICING, oldPricing]
	] as const) {
		const fresh = await get(second.origin, path, { 'if-none-match': old });
		expect(fresh.response.status, path).toBe(200);
		const etag = fresh.response.headers.get('etag');
		expect(etag).toMatch(/^W\/"[^"]+"$/);
		expect(etag).not.toBe(old);
	}
	// The new price is the quote as entered: yen have no minor unit (ISO 4217, from memory),
	// and a Japanese price includes consumption tax like the demo's other Japanese quotes.
	const after = await get(second.origin, PRICING);
	expect(alternatePrice(after.body)).toMatchObject({
		unit: { amountMinor: 7980, currency: 'JPY' },
		storeName: 'Kairo Denki'
	});
	// Process A kept its visitors' answer from before the quote in memory
	// (http/visitor-answers.ts): a full request now gets the new price, never the kept copy.
	const fromA = await get(BASE_URL, PRICING);
	expect(alternatePrice(fromA.body)).toMatchObject({
		unit: { amountMinor: 7980, currency: 'JPY' },
		storeName: 'Kairo Denki'
	});
});

test('a visitor asking twice gets the same bytes, whose scripts are allowed by hash, not by a reused nonce', async () => {
	await inOneMinute();
	const first = await get(BASE_URL, PAGE);
	const second = await get(BASE_URL, PAGE);
	expect(first.response.status).toBe(200);
	expect(second.body).toBe(first.body);
	expect(second.response.headers.get('etag')).toBe(first.response.headers.get('etag'));
	const csp = second.response.headers.get('content-security-policy') ?? '';
	expect(csp).toBe(first.response.headers.get('content-security-policy'));
	expect(csp).toMatch(/script-src[^;]*'sha256-[A-Za-z0-9+/=]+'/);
	expect(csp).not.toContain('nonce-');
	expect(second.body).not.toContain('nonce=');
});

test('signed-in people get private answers with their own parts only, never a shared copy', async () => {
	await inOneMinute();
	const visitor = await get(BASE_URL, PAGE);
	const visitorTag = visitor.response.headers.get('etag') ?? '';
	expect(visitorTag).not.toBe('');
	// The visitor's page has no report form and no signed-in links.
	expect(visitor.body).not.toContain('action="?/report"');
	expect(visitor.body).not.toContain('href="/builds"');

	await forgetAddressCounts();
	// A reader and an author (demo-data/users.ts): their headers differ by role ("My guides"
	// is for authors) and by their own count of unread notices.
	const people = [
		{
			name: 'Sam Okonkwo-Reyes',
			email: 'reader@slotwise.test',
			author: false,
			cookie: await signIn(BASE_URL, 'reader@slotwise.test')
		},
		{
			name: 'Tobias Wren',
			email: 'tobias.wren@slotwise.test',
			author: true,
			cookie: await signIn(second.origin, 'tobias.wren@slotwise.test')
		}
	];
	// The reader gets two more unread notices than they had, so the two headers' counts differ.
	await addNotices('reader@slotwise.test', 2);
	expect(await unreadOf('reader@slotwise.test')).not.toBe(
		await unreadOf('tobias.wren@slotwise.test')
	);
	try {
		// Each asks both processes twice (the second answer may be one the process kept), with
		// the visitor's validator: never a 304, always their own page.
		for (const origin of [BASE_URL, second.origin]) {
			for (const me of [...people, ...people]) {
				const unread = await unreadOf(me.email);
				for (const path of [PAGE, DATA, PRICING]) {
					const mine = await get(origin, path, { cookie: me.cookie, 'if-none-match': visitorTag });
					expect(mine.response.status, `${me.name} ${origin}${path}`).toBe(200);
					expect(mine.response.headers.get('cache-control')).toBe('private, no-store');
					// Never the visitor's validator (SvelteKit may add its own hash of this very body).
					expect(mine.response.headers.get('etag')).not.toBe(visitorTag);
					// The session is renewed on every answer, kept or not (Auth.js's sliding expiry).
					expect(mine.response.headers.getSetCookie().join(';')).toContain('session-token');
					// Nothing about the person beyond their header: no name, no address.
					for (const someone of people) {
						expect(mine.body).not.toContain(someone.name);
						expect(mine.body).not.toContain(someone.email);
					}
					if (path === PAGE) {
						// The signed-in parts: the report form and the reader's own header.
						expect(mine.body).toContain('action="?/report"');
						expect(mine.body.includes('href="/my/guides"'), me.name).toBe(me.author);
						const badge = /data-testid="unread-count"[^>]*>\s*(\d+)/.exec(mine.body)?.[1];
						expect(Number(badge ?? 0), me.name).toBe(unread);
					}
				}
			}
		}
	} finally {
		await removeTestNotices();
	}
	// And the visitor still gets the visitor's page, public, after both.
	const later = await get(BASE_URL, PAGE);
	expect(later.response.headers.get('cache-control')).toBe(PUBLIC);
	expect(later.body).not.toContain('action="?/report"');
	expect(later.body).not.toContain('href="/builds"');
});

/**
 * Each path's public validator from process A, after checking that both processes answer it
 * with a 304: the validator lives in the database, not in one process.
 */
async function publicValidators(paths: readonly string[]): Promise<Record<string, string>> {
	const old: Record<string, string> = {};
	for (const path of paths) {
		const first = await get(BASE_URL, path);
		expect(first.response.status, path).toBe(200);
		expect(first.response.headers.get('cache-control'), path).toBe(PUBLIC);
		const etag = first.response.headers.get('etag') ?? '';
		expect(etag, path).toMatch(/^W\/"[^"]+"$/);
		old[path] = etag;
		for (const origin of [BASE_URL, second.origin]) {
			const again = await get(origin, path, { 'if-none-match': etag });
			expect(again.response.status, `${origin}${path}`).toBe(304);
		}
	}
	return old;
}

test('the guide lists give visitors a validator both processes honour, moved by an author’s new name', async () => {
	const LISTS = ['/', '/guides', '/api/v1/guides'];
	const old = await publicValidators(LISTS);

	// The lists show authors' names: a rename on process A changes what B validates.
	await forgetAddressCounts();
	const editor = await signIn(BASE_URL, 'editor@slotwise.test');
	const rename = (name: string) => postForm(BASE_URL, '/account?/profile', { name }, editor);
	expect((await rename('Dario Vesely Renamed')).status).toBe(200);
	try {
		for (const path of LISTS) {
			const fresh = await get(second.origin, path, { 'if-none-match': old[path] ?? '' });
			expect(fresh.response.status, path).toBe(200);
			expect(fresh.response.headers.get('etag'), path).not.toBe(old[path]);
		}
	} finally {
		expect((await rename('Dario Vesely')).status).toBe(200);
	}
});

test('the parts catalog gives visitors a validator both processes honour, moved by a new quote', async () => {
	const CATALOG = ['/parts?q=flatline&region=jp', `/api/v1/parts?q=flatline&region=jp`];
	const old = await publicValidators(CATALOG);
	const catalogPrice = async (origin: string) => {
		const { body } = await get(origin, CATALOG[1]!);
		const result = JSON.parse(body) as {
			items: { slug: string; price: { unit: { amountMinor: number } } | null }[];
		};
		return result.items.find((p) => p.slug === ALTERNATE)?.price?.unit.amountMinor;
	};
	const price = await catalogPrice(second.origin);
	expect(price).toBeGreaterThan(0);

	// A newer, lower Japanese quote for the part, entered on process A.
	await forgetAddressCounts();
	const editor = await signIn(BASE_URL, 'editor@slotwise.test');
	const added = await postForm(
		BASE_URL,
		'/editor/quotes?/create',
		{
			partSlug: ALTERNATE,
			storeId: String(await jpStoreId()),
			amount: String(price! - 500),
			taxIncluded: 'on',
			observedOn: new Date().toISOString().slice(0, 10)
		},
		editor
	);
	expect(added.status).toBe(303);

	for (const path of CATALOG) {
		const fresh = await get(second.origin, path, { 'if-none-match': old[path] ?? '' });
		expect(fresh.response.status, path).toBe(200);
		expect(fresh.response.headers.get('etag'), path).not.toBe(old[path]);
	}
	// Yen have no minor unit (ISO 4217, from memory): the amount is the quote as entered.
	expect(await catalogPrice(second.origin)).toBe(price! - 500);
	// Process A's kept answer from before the quote is not served again.
	expect(await catalogPrice(BASE_URL)).toBe(price! - 500);
});
