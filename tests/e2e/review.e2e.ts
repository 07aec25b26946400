import { expect, test } from '@playwright/test';
import type { APIRequestContext, Browser, Page } from '@playwright/test';
import { BASE_URL } from '../playwright.config';
import { waitForMessage } from '../support/mailbox';
import { forgetCounts, severeViolations, signInWithPassword } from './support';

/*
 * Moderation in Chromium against the production build, with e-mails read from the SMTP fake:
 * an author's new guide goes submit → changes requested → edited and resubmitted → approved →
 * public and in the feed; an editor cannot approve their own guide, an admin can, and the
 * override shows in the audit trail.
 */

const AUTHOR = 'author@slotwise.test';
const EDITOR = 'editor@slotwise.test';
const ADMIN = 'admin@slotwise.test';

async function signedIn(browser: Browser, email: string): Promise<Page> {
	const page = await (await browser.newContext()).newPage();
	await signInWithPassword(page, email);
	return page;
}

interface DemoSlot {
	category: string;
	label: string;
	quantity: number;
	reason: string;
	pick: { id: number };
	alternates: { part: { id: number }; reasonTag: string; note: string }[];
}

/** A new guide with the demo author's 1080p slots, created and submitted through the author JSON API. */
async function submitGuide(request: APIRequestContext, title: string): Promise<string> {
	// The author's guide-creation allowance (10 an hour) is spent by earlier suites.
	await forgetCounts('guide_create_user');
	const created = await request.post('/api/v1/guides', {
		data: {
			title,
			summary: 'A small 1080p box for the review test.',
			targetBudget: '800',
			baseRegion: 'us',
			tags: ['1080p'],
			disclosure: 'none'
		}
	});
	expect(created.status()).toBe(201);
	const { slug, version } = (await created.json()) as { slug: string; version: number };
	// The slots of a published demo guide, as the public guide API shows them.
	const demo = (await (await request.get('/api/v1/guides/steady-1080p-starter')).json()) as {
		slots: DemoSlot[];
	};
	const slots = demo.slots.map((s) => ({
		category: s.category,
		label: s.label,
		quantity: s.quantity,
		pickPartId: s.pick.id,
		reason: s.reason,
		alternates: s.alternates.map((a) => ({
			partId: a.part.id,
			reasonTag: a.reasonTag,
			note: a.note
		}))
	}));
	const saved = await request.put(`/api/v1/guides/${slug}/draft`, {
		data: {
			version,
			title,
			summary: 'A small 1080p box for the review test.',
			targetBudget: '800',
			baseRegion: 'us',
			tags: ['1080p'],
			disclosure: 'none',
			buildNotes: {
				firmware: 'Update the firmware first.',
				assembly: 'Seat the CPU by the triangle.',
				cabling: '',
				display: ''
			},
			slots
		}
	});
	expect(saved.status()).toBe(200);
	const submitted = await request.post(`/api/v1/guides/${slug}/submit`, {
		data: { version: (await saved.json()).version }
	});
	expect(submitted.status()).toBe(200);
	return slug;
}

async function openInQueue(page: Page, title: string) {
	await page.goto('/review');
	await page.getByTestId('review-queue').getByRole('link', { name: title }).click();
	await expect(page.getByRole('heading', { level: 1, name: title })).toBeVisible();
}

test('submit → request changes → resubmit → approve: public, in the feed, and the author is mailed each step', async ({
	browser
}) => {
	test.setTimeout(120_000); // four sign-ins and round trips through review on a shared machine
	const title = `Review run ${Date.now()}`;
	const author = await signedIn(browser, AUTHOR);
	const slug = await submitGuide(author.request, title);
	await waitForMessage({ to: AUTHOR, subject: /^Your guide is in the review queue$/ });
	// Not public while it waits.
	expect((await author.request.get(`/guides/${slug}`, { failOnStatusCode: false })).status()).toBe(
		404
	);

	const editor = await signedIn(browser, EDITOR);
	await openInQueue(editor, title);
	await expect(editor.getByTestId('review-status')).toHaveText('Waiting for a decision');
	// The author cannot decide on (publish) their own revision by posting the form either.
	const byAuthor = await author.request.post(`${new URL(editor.url()).pathname}?/decide`, {
		form: { decision: 'approve' },
		headers: { origin: BASE_URL, accept: 'text/html' },
		failOnStatusCode: false
	});
	expect(byAuthor.status()).toBe(403);
	await expect(editor.getByTestId('fit-report')).toBeVisible();
	await expect(editor.getByTestId('power-budget')).toBeVisible();
	await expect(editor.getByRole('heading', { name: 'New guide: everything is new' })).toBeVisible();
	const reviewViolations = await severeViolations(editor);
	expect(reviewViolations, reviewViolations.join('\n')).toEqual([]);
	// Sending back without a note: a field message, nothing decided.
	await editor.getByRole('button', { name: 'Send back with notes' }).click();
	await expect(editor.getByText('Say what should change, in the note or on a slot.')).toBeVisible();
	await editor
		.getByLabel('Note to the author')
		.fill('Please explain the cooler choice in the CPU slot.');
	await editor.getByRole('button', { name: 'Send back with notes' }).click();
	await expect(editor.getByText('Sent back to the author with your notes.')).toBeVisible();
	const changesMail = await waitForMessage({
		to: AUTHOR,
		subject: /^An editor asked for changes to your guide$/
	});
	expect(changesMail.text).toContain('Please explain the cooler choice in the CPU slot.');

	// The author sees the note on the dashboard, edits and resubmits.
	await author.goto('/my/guides');
	const card = author.getByRole('article', { name: title });
	await expect(card.getByTestId('guide-state')).toHaveText(
		'Returned to the author with notes (revision 1)'
	);
	const dashboardViolations = await severeViolations(author);
	expect(dashboardViolations, dashboardViolations.join('\n')).toEqual([]);
	await expect(card).toContainText('Please explain the cooler choice in the CPU slot.');
	await card.getByRole('link', { name: `Edit ${title}` }).click();
	await author
		.getByLabel('Why this part')
		.first()
		.fill('Six cores with the bundled cooler: quiet enough at 65 W.');
	await author.getByRole('button', { name: 'Save and submit for review' }).click();
	await expect(author).toHaveURL(/\/my\/guides\?submitted=/);
	await expect(author.getByRole('article', { name: title }).getByTestId('guide-state')).toHaveText(
		'Waiting for an editor (revision 2)'
	);
	await waitForMessage({
		to: AUTHOR,
		subject: /^Your guide is in the review queue$/,
		timeoutMs: 5_000
	});

	await openInQueue(editor, title);
	await expect(
		editor.getByRole('heading', { name: /Changes since revision 1 was returned to the author/ })
	).toBeVisible();
	await editor.getByRole('button', { name: 'Publish', exact: true }).click();
	await editor.getByRole('button', { name: 'Yes, publish now' }).click();
	await expect(editor.getByText('Published: this revision is now live.')).toBeVisible();
	await waitForMessage({ to: AUTHOR, subject: /^Your guide revision was approved$/ });

	const visitor = await (await browser.newContext()).newPage();
	await visitor.goto(`/guides/${slug}`);
	await expect(visitor.getByRole('heading', { level: 1, name: title })).toBeVisible();
	const feed = await (await visitor.request.get('/guides/feed.xml')).text();
	expect(feed).toContain(`<title>${title}</title>`);
	expect(feed).toContain(`/guides/${slug}`);
	for (const page of [author, editor, visitor]) await page.context().close();
});

test("an editor's approval of their own guide is refused; the admin override works and is audited", async ({
	browser
}) => {
	test.setTimeout(90_000);
	const title = `Editor's own ${Date.now()}`;
	const editor = await signedIn(browser, EDITOR);
	const slug = await submitGuide(editor.request, title);
	await openInQueue(editor, title);
	await expect(
		editor.getByText('You wrote this guide, so another editor must review it.').first()
	).toBeVisible();
	await editor.getByRole('button', { name: 'Publish', exact: true }).click();
	await editor.getByRole('button', { name: 'Yes, publish now' }).click();
	// The refusal comes back from the server as the form's answer (beside the page's own warning).
	await expect(
		editor.getByRole('alert').filter({
			hasText: 'You wrote this guide, so another editor must review it.',
			hasNotText: 'would be refused'
		})
	).toBeVisible();
	await editor.reload();
	await expect(editor.getByTestId('review-status')).toHaveText('Waiting for a decision');

	const admin = await signedIn(browser, ADMIN);
	const adminsOwn = `Admin's own ${Date.now()}`;
	await submitGuide(admin.request, adminsOwn);
	await openInQueue(admin, adminsOwn);
	await expect(admin.getByText(/As an admin you may still decide/)).toBeVisible();
	await admin.getByRole('button', { name: 'Publish', exact: true }).click();
	await admin.getByRole('button', { name: 'Yes, publish now' }).click();
	await expect(admin.getByText('Published: this revision is now live.')).toBeVisible();
	await expect(admin.getByTestId('review-log-entry').first()).toContainText(
		'admin override on own guide'
	);

	await admin.goto('/admin/audit?action=review.self_review_override');
	await expect(admin.locator('main')).toContainText('review.self_review_override');
	// The editor's own guide is still waiting for someone else.
	expect((await editor.request.get(`/guides/${slug}`, { failOnStatusCode: false })).status()).toBe(
		404
	);
	await editor.context().close();
	await admin.context().close();
});
