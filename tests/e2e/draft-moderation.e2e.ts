import { expect, test } from '@playwright/test';
import type { APIRequestContext, Browser, Page } from '@playwright/test';
import { forgetCounts, signInWithPassword } from './support';

/*
 * Issue 12, items 1 and 2, end to end against the production build: once a guide is live,
 * its author saving a draft with new details and a price of 0.01 changes nothing public.
 * The guide page's HTML, GET /api/v1/guides/<slug> and the guide's Atom entry stay
 * byte-for-byte the same (each read is a fresh render: see publicAnswers), and
 * another reader's build is not re-priced, until an editor approves; then the new details
 * and price show. Failed on main: the save rewrote the guide row and created a live quote.
 */

const AUTHOR = 'author@slotwise.test';
const EDITOR = 'editor@slotwise.test';
const READER = 'reader@slotwise.test';

async function signedIn(browser: Browser, email: string): Promise<Page> {
	const page = await (await browser.newContext()).newPage();
	await signInWithPassword(page, email);
	return page;
}

interface DraftSlot {
	category: string;
	label: string;
	quantity: number;
	pickPartId: number;
	reason: string;
	priceQuote: { storeId: number; amount: string; observedAt: string } | null;
	alternates: { partId: number; reasonTag: string; note: string }[];
}

const DETAILS = {
	summary: 'A small 1080p box, live before its author drafts again.',
	targetBudget: '800',
	baseRegion: 'us',
	tags: ['1080p'],
	disclosure: 'none'
};
const NOTES = {
	firmware: 'Update the firmware first.',
	assembly: 'Seat the CPU.',
	cabling: '',
	display: ''
};

/** The demo author's own slots (prices included) from their working copy of a demo guide. */
async function demoSlots(request: APIRequestContext): Promise<DraftSlot[]> {
	const demo = await request.get('/api/v1/guides/steady-1080p-starter/draft');
	expect(demo.status()).toBe(200);
	return ((await demo.json()) as { slots: (DraftSlot & Record<string, unknown>)[] }).slots.map(
		(s) => ({
			category: s.category,
			label: s.label,
			quantity: s.quantity,
			pickPartId: s.pickPartId,
			reason: s.reason,
			priceQuote: s.priceQuote,
			alternates: s.alternates.map((a) => ({
				partId: a.partId,
				reasonTag: a.reasonTag,
				note: a.note
			}))
		})
	);
}

async function approve(editor: Page, title: string) {
	await editor.goto('/review');
	await editor.getByTestId('review-queue').getByRole('link', { name: title }).click();
	await editor.getByRole('button', { name: 'Publish', exact: true }).click();
	await editor.getByRole('button', { name: 'Yes, publish now' }).click();
	await expect(editor.getByText('Published: this revision is now live.')).toBeVisible();
}

let reads = 0;

/**
 * What a signed-out reader gets: page HTML, the API body, the feed entry. The page is asked
 * with a query of its own each time: the same URL with an unchanged stamp may be served
 * again from the app's memory (http/visitor-answers.ts), and comparing a kept copy with
 * itself would prove nothing. The query does not appear in the page.
 */
async function publicAnswers(request: APIRequestContext, slug: string) {
	const page = await request.get(`/guides/${slug}?read=${++reads}`);
	expect(page.status()).toBe(200);
	const api = await request.get(`/api/v1/guides/${slug}`);
	expect(api.status()).toBe(200);
	const feed = await (await request.get('/guides/feed.xml')).text();
	const entry = feed
		.split('<entry>')
		.find((e) => e.includes(`/guides/${slug}<`) || e.includes(`/guides/${slug}"`));
	return {
		html: await page.text(),
		api: await api.text(),
		entry: entry ?? null
	};
}

test('a saved draft of a live guide changes nothing public until an editor approves', async ({
	browser,
	playwright
}) => {
	test.setTimeout(180_000); // three sign-ins, two reviews and many fetches on a shared machine
	const title = `Live then drafted ${Date.now()}`;
	const author = await signedIn(browser, AUTHOR);
	const slots = await demoSlots(author.request);
	const priced = slots.findIndex((s) => s.priceQuote !== null);
	expect(priced).toBeGreaterThanOrEqual(0);

	// The author's guide-creation allowance (10 an hour) is spent by earlier suites.
	await forgetCounts('guide_create_user');
	const created = await author.request.post('/api/v1/guides', { data: { title, ...DETAILS } });
	expect(created.status()).toBe(201);
	const { slug, version } = (await created.json()) as { slug: string; version: number };
	const first = await author.request.put(`/api/v1/guides/${slug}/draft`, {
		data: { version, title, ...DETAILS, buildNotes: NOTES, slots }
	});
	expect(first.status()).toBe(200);
	const sent = await author.request.post(`/api/v1/guides/${slug}/submit`, {
		data: { version: (await first.json()).version }
	});
	expect(sent.status()).toBe(200);
	const editor = await signedIn(browser, EDITOR);
	await approve(editor, title);

	const visitor = await playwright.request.newContext({ baseURL: new URL(editor.url()).origin });
	const reader = await signedIn(browser, READER);
	const fork = await reader.request.post(`/api/v1/guides/${slug}/fork`, { data: {} });
	expect(fork.status()).toBe(201);
	const { id: buildId } = (await fork.json()) as { id: number };
	const readersBuild = async () => (await reader.request.get(`/api/v1/builds/${buildId}`)).text();

	const before = await publicAnswers(visitor, slug);
	expect(before.entry).toContain(`<title>${title}</title>`);
	expect(before.html).toContain(title);
	const buildBefore = await readersBuild();

	// The author drafts new details and a price of 0.01 (dated in the past, so once approved
	// it is this guide's chosen quote without becoming the part's latest price elsewhere).
	const draft = (await (await author.request.get(`/api/v1/guides/${slug}/draft`)).json()) as {
		version: number;
	};
	const newTitle = `${title} rewritten`;
	const cheap = slots.map((s, i) =>
		i === priced && s.priceQuote
			? { ...s, priceQuote: { ...s.priceQuote, amount: '0.01', observedAt: '2026-06-01' } }
			: s
	);
	const saved = await author.request.put(`/api/v1/guides/${slug}/draft`, {
		data: {
			version: draft.version,
			title: newTitle,
			summary: 'A summary no editor has read.',
			targetBudget: '5000',
			baseRegion: 'us',
			tags: ['4k'],
			disclosure: 'sponsored',
			disclosureNote: 'A sponsor gave the parts.',
			walkthroughUrl: 'https://walkthrough.example/build',
			buildNotes: NOTES,
			slots: cheap
		}
	});
	expect(saved.status()).toBe(200);

	const afterSave = await publicAnswers(visitor, slug);
	expect(afterSave.html).toBe(before.html);
	expect(afterSave.api).toBe(before.api);
	expect(afterSave.entry).toBe(before.entry);
	expect(await readersBuild()).toBe(buildBefore);
	expect(afterSave.api).not.toContain(newTitle);

	const submitted = await author.request.post(`/api/v1/guides/${slug}/submit`, {
		data: { version: (await saved.json()).version }
	});
	expect(submitted.status()).toBe(200);
	const afterSubmit = await publicAnswers(visitor, slug);
	expect(afterSubmit.api).toBe(before.api);
	expect(afterSubmit.html).toBe(before.html);

	await approve(editor, newTitle);
	const approved = await publicAnswers(visitor, slug);
	expect(approved.api).toContain(newTitle);
	expect(approved.api).toContain('A summary no editor has read.');
	// The approved 0.01 is now the slot's chosen quote: 1 minor unit of USD.
	expect(approved.api).toContain('"unit":{"amountMinor":1,"currency":"USD"}');
	expect(approved.html).toContain(newTitle);
	expect(approved.entry).toContain(`<title>${newTitle}</title>`);
	await visitor.dispose();
});
