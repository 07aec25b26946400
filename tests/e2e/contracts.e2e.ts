import { expect, test } from '@playwright/test';
import type { APIRequestContext, Browser, Page } from '@playwright/test';
import { parse } from 'devalue';
import { BASE_URL } from '../playwright.config';
import { forgetCounts, signInWithPassword } from './support';

/*
 * One contract per operation (issue 11): a page's form action and the JSON API for the same
 * operation validate with one schema, so the same bad input gets the same field messages
 * whichever way it comes. Posted to the running production build, as a browser's form post
 * (urlencoded, same origin) and as a JSON client. The expected messages are the product's
 * own wording, written here by hand.
 *
 * The fork is of the demo's quiet 4K guide into the reader's own new private build; nothing
 * any other test reads changes.
 */

const READER = 'reader@slotwise.test';
const AUTHOR = 'author@slotwise.test';

async function signedIn(browser: Browser, email: string): Promise<Page> {
	const page = await (await browser.newContext()).newPage();
	await signInWithPassword(page, email);
	return page;
}

/**
 * Posts a form to a page action the way `use:enhance` does (urlencoded, same origin, asking
 * for the action's JSON) and returns its status and data, decoded as SvelteKit encodes it.
 */
async function postAction(
	request: APIRequestContext,
	path: string,
	form: Record<string, string>
): Promise<{ type: string; status: number; data: Record<string, unknown> }> {
	const response = await request.post(path, {
		form,
		headers: { origin: BASE_URL, accept: 'application/json', 'x-sveltejs-action': 'true' },
		failOnStatusCode: false
	});
	const body = (await response.json()) as { type: string; status: number; data?: string };
	return {
		type: body.type,
		status: body.status,
		data: body.data ? (parse(body.data) as Record<string, unknown>) : {}
	};
}

test('a build: the same bad input through the page form and the JSON API gets the same field messages', async ({
	browser
}) => {
	const reader = await signedIn(browser, READER);
	const forked = await reader.request.post('/api/v1/guides/quiet-4k-play-and-work/fork', {
		data: {}
	});
	expect(forked.status()).toBe(201);
	const { id } = (await forked.json()) as { id: number };
	const build = (await (await reader.request.get(`/api/v1/builds/${id}`)).json()) as {
		version: number;
		slots: { id: number }[];
	};
	const version = build.version;
	const slotId = build.slots[0]?.id;
	expect(slotId).toBeTruthy();

	// Settings: a blank title, notes one character over the limit (the form used to take
	// 20,000 characters, the API 10,000), an unknown visibility and an amount with two marks.
	const settings = {
		title: '',
		notes: 'n'.repeat(10_001),
		visibility: 'everyone',
		budget: '12.3.4'
	};
	const expectedSettings = {
		title: ['Give the build a title.'],
		notes: ['At most 10,000 characters.'],
		visibility: ['Choose private, unlisted or public.'],
		budget: ['Enter an amount like 699.99.']
	};
	const settingsJson = await reader.request.patch(`/api/v1/builds/${id}`, {
		data: { ...settings, version },
		failOnStatusCode: false
	});
	expect(settingsJson.status()).toBe(400);
	const settingsForm = await postAction(reader.request, `/builds/${id}?/settings`, {
		...settings,
		regionCode: 'us',
		version: String(version)
	});
	expect(settingsForm.status).toBe(400);
	expect(((await settingsJson.json()) as { issues: unknown }).issues).toEqual(expectedSettings);
	expect(settingsForm.data.issues).toEqual(expectedSettings);

	// A new slot: an unknown category, no label, part 0 and a quantity over 16.
	const slot = { category: 'toaster', label: ' ', partId: '0', quantity: '17' };
	const expectedSlot = {
		category: ['Choose a category.'],
		label: ['Give the slot a label.'],
		partId: ['Choose a part.'],
		quantity: ['Enter a whole number from 1 to 16.']
	};
	const slotJson = await reader.request.post(`/api/v1/builds/${id}/slots`, {
		data: { ...slot, partId: 0, quantity: 17, version },
		failOnStatusCode: false
	});
	expect(slotJson.status()).toBe(400);
	const slotForm = await postAction(reader.request, `/builds/${id}?/addSlot`, {
		...slot,
		version: String(version)
	});
	expect(slotForm.status).toBe(400);
	expect(((await slotJson.json()) as { issues: unknown }).issues).toEqual(expectedSlot);
	expect(slotForm.data.issues).toEqual(expectedSlot);

	// A slot's quantity written as hexadecimal: the form reads digits only, so "0x10" is not 16.
	const hexJson = await reader.request.patch(`/api/v1/builds/${id}/slots/${slotId}`, {
		data: { quantity: '0x10', version },
		failOnStatusCode: false
	});
	expect(hexJson.status()).toBe(400);
	const hexForm = await postAction(reader.request, `/builds/${id}?/quantity`, {
		slotId: String(slotId),
		quantity: '0x10',
		version: String(version)
	});
	expect(hexForm.status).toBe(400);
	const expectedHex = { quantity: ['Enter a whole number from 1 to 16.'] };
	expect(((await hexJson.json()) as { issues: unknown }).issues).toEqual(expectedHex);
	expect(hexForm.data.issues).toEqual(expectedHex);

	// A price override on a day that does not exist (2023 is not a leap year).
	const overrideJson = await reader.request.patch(`/api/v1/builds/${id}/slots/${slotId}`, {
		data: { priceOverride: { amount: '99.90', store: 'Corner shop', date: '2023-02-29' }, version },
		failOnStatusCode: false
	});
	expect(overrideJson.status()).toBe(400);
	const overrideForm = await postAction(reader.request, `/builds/${id}?/override`, {
		slotId: String(slotId),
		amount: '99.90',
		store: 'Corner shop',
		date: '2023-02-29',
		version: String(version)
	});
	expect(overrideForm.status).toBe(400);
	const overrideIssues = ((await overrideJson.json()) as { issues: Record<string, string[]> })
		.issues;
	expect(Object.keys(overrideIssues)).toEqual(['priceOverride.date']);
	expect(overrideForm.data.issues).toEqual(overrideIssues);

	// Nothing was written by any of the refused changes.
	const after = (await (await reader.request.get(`/api/v1/builds/${id}`)).json()) as {
		version: number;
	};
	expect(after.version).toBe(version);
	await reader.context().close();
});

test('a guide draft: the editor form and PUT share messages, and a GET answer is accepted back by PUT as it came', async ({
	browser
}) => {
	const author = await signedIn(browser, AUTHOR);
	// The author's guide-creation allowance (10 an hour) is spent by earlier suites.
	await forgetCounts('guide_create_user');
	const created = await author.request.post('/api/v1/guides', {
		data: {
			title: `Contract run ${Date.now()}`,
			summary: 'Read back and sent again.',
			targetBudget: '900',
			baseRegion: 'us',
			tags: ['office'],
			disclosure: 'none'
		}
	});
	expect(created.status()).toBe(201);
	const { slug, version } = (await created.json()) as { slug: string; version: number };

	// A slot with alternates, copied from the author's own seeded guide (reading changes nothing).
	const seeded = (await (
		await author.request.get('/api/v1/guides/steady-1080p-starter/draft')
	).json()) as {
		slots: {
			category: string;
			pickPartId: number;
			alternates: { partId: number; reasonTag: string; note: string }[];
		}[];
	};
	const withAlternate = seeded.slots.find((s) => s.alternates.length > 0);
	expect(withAlternate).toBeTruthy();

	// The same bad draft both ways: a blank title and a slot without a part.
	const jsonBad = await author.request.put(`/api/v1/guides/${slug}/draft`, {
		data: {
			version,
			title: '',
			summary: 'S',
			targetBudget: '900',
			baseRegion: 'us',
			tags: [],
			disclosure: 'none',
			buildNotes: { firmware: '', assembly: '', cabling: '', display: '' },
			slots: [{ category: 'cpu', label: 'CPU', quantity: 1, pickPartId: 0, reason: 'Efficient.' }]
		},
		failOnStatusCode: false
	});
	expect(jsonBad.status()).toBe(400);
	const formBad = await postAction(author.request, `/my/guides/${slug}/edit?/save`, {
		version: String(version),
		title: '',
		summary: 'S',
		targetBudget: '900',
		baseRegion: 'us',
		disclosure: 'none',
		'slots.0.key': 'a',
		'slots.0.category': 'cpu',
		'slots.0.label': 'CPU',
		'slots.0.quantity': '1',
		'slots.0.pickPartId': '0',
		'slots.0.reason': 'Efficient.'
	});
	expect(formBad.status).toBe(400);
	const jsonIssues = ((await jsonBad.json()) as { issues: Record<string, string[]> }).issues;
	expect(jsonIssues.title).toBeTruthy();
	expect(jsonIssues['slots.0.pickPartId']).toEqual(['Choose a part.']);
	expect(formBad.data.issues).toEqual(jsonIssues);

	// A draft with a slot and an alternate, so the GET answer carries the read-only `pick`
	// and `part` summaries and the region's `currency`.
	const saved = await author.request.put(`/api/v1/guides/${slug}/draft`, {
		data: {
			version,
			title: 'Read back and sent again',
			summary: 'S',
			targetBudget: '900',
			baseRegion: 'us',
			tags: ['office'],
			disclosure: 'none',
			buildNotes: { firmware: '', assembly: 'Seat the CPU.', cabling: '', display: '' },
			slots: [
				{
					category: withAlternate?.category,
					label: 'Copied slot',
					quantity: 1,
					pickPartId: withAlternate?.pickPartId,
					reason: 'Efficient.',
					alternates: withAlternate?.alternates.map(({ partId, reasonTag, note }) => ({
						partId,
						reasonTag,
						note
					}))
				}
			]
		}
	});
	expect(saved.status()).toBe(200);
	const read = (await (await author.request.get(`/api/v1/guides/${slug}/draft`)).json()) as Record<
		string,
		unknown
	> & { version: number; slots: Record<string, unknown>[] };
	expect(read).toHaveProperty('currency', 'USD');
	expect(read.slots[0]).toHaveProperty('pick');
	expect((read.slots[0]?.alternates as unknown[])[0]).toHaveProperty('part');

	const putBack = await author.request.put(`/api/v1/guides/${slug}/draft`, {
		data: read,
		failOnStatusCode: false
	});
	expect(putBack.status(), await putBack.text()).toBe(200);
	const stored = (await putBack.json()) as Record<string, unknown>;
	expect(stored.version).toBe(read.version + 1);
	expect({ ...stored, version: read.version }).toEqual(read);

	// Read-only fields are ignored, not taken: fields GET never shows are still refused.
	const massAssigned = await author.request.put(`/api/v1/guides/${slug}/draft`, {
		data: { ...stored, authorId: 'someone-else' },
		failOnStatusCode: false
	});
	expect(massAssigned.status()).toBe(400);
	await author.context().close();
});
