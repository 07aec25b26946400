import { expect, test } from '@playwright/test';
import type { Browser, Page } from '@playwright/test';
import { demoGuides } from '../../src/lib/server/db/seeders/demo-data';
import { signInWithPassword } from './support';

/*
 * Content reports end to end: a reader reports a demo guide, an editor hides it, visitors
 * get 404 while its author sees the notice with the reason, the editor restores it, and the
 * admin finds both decisions in the audit trail. The guide is public again at the end
 * (other tests read the demo guides); afterAll restores it should a step fail midway.
 */
const guide = demoGuides.find((g) => g.slug === 'pocket-itx-1440p');
if (!guide) throw new Error('demo guide pocket-itx-1440p missing');
const GUIDE_URL = `/guides/${guide.slug}`;
const REASON = `Unsafe mains wiring advice in the PSU section (e2e ${Date.now()}).`;

async function signedIn(browser: Browser, email: string): Promise<Page> {
	const page = await (await browser.newContext()).newPage();
	await signInWithPassword(page, email);
	return page;
}

/** The editor's queue entry for the guide in the open or decided list. */
async function queueEntry(editor: Page, state: 'open' | 'closed') {
	await editor.goto(state === 'open' ? '/editor/reports' : '/editor/reports?state=closed');
	return editor
		.getByTestId('report-group')
		.filter({ has: editor.getByRole('heading', { name: guide?.title }) });
}

test.afterAll(async ({ browser }) => {
	const editor = await signedIn(browser, 'editor@slotwise.test');
	for (const state of ['open', 'closed'] as const) {
		const restore = (await queueEntry(editor, state)).getByRole('button', {
			name: 'Restore guide'
		});
		if ((await restore.count()) > 0) await restore.first().click();
	}
	await editor.context().close();
});

test('a reader reports a guide, an editor hides it and restores it, and the admin sees both in the audit trail', async ({
	browser
}) => {
	// Five people sign in (argon2id each) and the guide pages are priced: more than the default 30 s.
	test.setTimeout(120_000);
	// A visitor is offered a sign-in link instead of the form.
	const visitor = await (await browser.newContext()).newPage();
	await visitor.goto(GUIDE_URL);
	await visitor.getByText('Report this guide', { exact: true }).click();
	await expect(visitor.getByRole('link', { name: 'Sign in' }).last()).toHaveAttribute(
		'href',
		/redirectTo=%2Fguides%2Fpocket-itx-1440p/
	);

	const reader = await signedIn(browser, 'reader@slotwise.test');
	await reader.goto(GUIDE_URL);
	await reader.getByText('Report this guide', { exact: true }).click();
	await reader.getByLabel('Unsafe advice (electrical, thermal or handling risk)').check();
	await reader
		.getByLabel('Details for the editors')
		.fill('The PSU section suggests opening the power supply.');
	await reader.getByRole('button', { name: 'Send report' }).click();
	await expect(
		reader.getByText(/Thank you: your report is with the editors|already reported this guide/)
	).toBeVisible();

	const editor = await signedIn(browser, 'editor@slotwise.test');
	await editor.goto('/editor');
	await editor
		.getByRole('navigation', { name: 'Editor' })
		.getByRole('link', { name: 'Reports' })
		.click();
	const entry = await queueEntry(editor, 'open');
	await expect(entry).toContainText(/\d+ reports?/);
	await expect(entry).toContainText('The PSU section suggests opening the power supply.');
	await entry.getByText('Hide this guide…').click();
	await entry.getByLabel('Reason (its author sees this)').fill(REASON);
	await entry.getByRole('button', { name: 'Hide from the public' }).click();
	await expect(
		editor.getByText(/Hidden from the public; its author sees your reason/)
	).toBeVisible();

	// Visitors and other readers: gone from the page, browse, the feed and the API.
	expect((await visitor.goto(GUIDE_URL))?.status()).toBe(404);
	expect((await reader.goto(GUIDE_URL))?.status()).toBe(404);
	await visitor.goto('/guides');
	await expect(visitor.locator(`a[href="${GUIDE_URL}"]`)).toHaveCount(0);
	const api = (await (await visitor.request.get('/api/v1/guides')).json()) as {
		items: { slug: string }[];
	};
	expect(api.items.map((g) => g.slug)).not.toContain(guide.slug);
	expect(await (await visitor.request.get('/guides/feed.xml')).text()).not.toContain(GUIDE_URL);

	// Its author still sees the page, with the notice and the reason, and the reason on /my/guides.
	const author = await signedIn(browser, guide.authorEmail);
	const own = await author.goto(GUIDE_URL);
	expect(own?.status()).toBe(200);
	await expect(author.getByTestId('hidden-notice')).toContainText('Hidden by the editors');
	await expect(author.getByTestId('hidden-notice')).toContainText(REASON);
	await author.goto('/my/guides');
	const dashboardNote = author.getByText(REASON);
	await expect(dashboardNote).toBeVisible();
	await expect(dashboardNote).toContainText(/hidden/i);

	// The editor restores it from the list of decided reports.
	const decided = await queueEntry(editor, 'closed');
	await expect(decided).toContainText(REASON);
	await decided.getByRole('button', { name: 'Restore guide' }).click();
	await expect(editor.getByText('Restored: it is public again.')).toBeVisible();
	expect((await visitor.goto(GUIDE_URL))?.status()).toBe(200);
	await expect(visitor.getByTestId('hidden-notice')).toHaveCount(0);

	// The admin filters the audit trail by action, without JavaScript-only controls.
	const admin = await signedIn(browser, 'admin@slotwise.test');
	await admin.goto('/admin/users');
	await admin
		.getByRole('navigation', { name: 'Admin' })
		.getByRole('link', { name: 'Audit trail' })
		.click();
	await admin.getByLabel('Action').selectOption('guide.hidden');
	await admin.getByRole('button', { name: 'Filter' }).click();
	await expect(admin).toHaveURL(/action=guide\.hidden/);
	const hiddenRows = admin.getByTestId('audit-row');
	await expect(hiddenRows.first()).toContainText('guide.hidden');
	await expect(hiddenRows.first()).toContainText(REASON);
	await expect(hiddenRows.filter({ hasNotText: 'guide.hidden' })).toHaveCount(0);

	await admin.getByLabel('Action').selectOption('guide.restored');
	await admin.getByLabel('Actor e-mail').fill('editor@slotwise.test');
	await admin.getByRole('button', { name: 'Filter' }).click();
	const restoredRow = admin.getByTestId('audit-row').first();
	await expect(restoredRow).toContainText('guide.restored');
	await expect(restoredRow).toContainText('editor@slotwise.test');
	await expect(restoredRow).toContainText(REASON);
	await expect(admin.getByTestId('audit-row').filter({ hasNotText: 'guide.restored' })).toHaveCount(
		0
	);
});
