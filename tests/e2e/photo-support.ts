import { expect } from '@playwright/test';
import type { APIRequestContext, Browser, Page } from '@playwright/test';
import { forgetCounts, signInWithPassword } from './support';

/* What the photo suites share: the demo author, a signed-in page, and a fresh draft guide. */

export const AUTHOR = 'author@slotwise.test';

export async function signedIn(browser: Browser, email: string): Promise<Page> {
	const page = await (await browser.newContext()).newPage();
	await signInWithPassword(page, email);
	return page;
}

/** A new guide with one slot of a demo guide, saved as a draft through the author JSON API. */
export async function draftGuide(request: APIRequestContext, title: string): Promise<string> {
	// The author's guide-creation allowance (10 an hour) is spent by earlier suites.
	await forgetCounts('guide_create_user');
	const created = await request.post('/api/v1/guides', {
		data: {
			title,
			summary: 'A gallery test build.',
			targetBudget: '800',
			baseRegion: 'us',
			tags: [],
			disclosure: 'none'
		}
	});
	expect(created.status()).toBe(201);
	const { slug, version } = (await created.json()) as { slug: string; version: number };
	const demo = (await (await request.get('/api/v1/guides/steady-1080p-starter')).json()) as {
		slots: { category: string; label: string; reason: string; pick: { id: number } }[];
	};
	const slot = demo.slots[0];
	const saved = await request.put(`/api/v1/guides/${slug}/draft`, {
		data: {
			version,
			title,
			summary: 'A gallery test build.',
			targetBudget: '800',
			baseRegion: 'us',
			tags: [],
			disclosure: 'none',
			buildNotes: { firmware: '', assembly: '', cabling: '', display: '' },
			slots: [
				{
					category: slot?.category,
					label: slot?.label,
					quantity: 1,
					pickPartId: slot?.pick.id,
					reason: slot?.reason,
					alternates: []
				}
			]
		}
	});
	expect(saved.status()).toBe(200);
	return slug;
}

/** The widths of the three photos below, in the order they are picked: each row's tell. */
