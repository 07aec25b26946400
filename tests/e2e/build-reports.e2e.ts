import { expect, test } from '@playwright/test';
import type { Browser, Page } from '@playwright/test';
import { signInWithPassword } from './support';

/*
 * Content reports on a build, end to end: the demo reader forks a demo guide and makes the
 * build public; the owner is offered no report form, a visitor a sign-in link; another
 * signed-in person reports it; the editor opens it from the queue and hides it; others get
 * 404 and the guide no longer lists it, while the owner sees the notice with the reason; the
 * editor restores it. The guide is the demo's quiet 4K build, which no other end-to-end test
 * forks; the build is this test's own data.
 */
const GUIDE = 'quiet-4k-play-and-work';
const REASON = `The build title links to unsafe mains wiring advice (e2e ${Date.now()}).`;
const DETAIL = 'The notes on this build tell people to bridge the PSU switch with a paperclip.';

async function signedIn(browser: Browser, email: string): Promise<Page> {
	const page = await (await browser.newContext()).newPage();
	await signInWithPassword(page, email);
	return page;
}

/** The editor's queue entry for the build (found by its link) in the open or decided list. */
async function queueEntry(editor: Page, state: 'open' | 'closed', buildPath: string) {
	await editor.goto(state === 'open' ? '/editor/reports' : '/editor/reports?state=closed');
	return editor
		.getByTestId('report-group')
		.filter({ has: editor.locator(`h2 a[href="${buildPath}"]`) });
}

test('a build is reported, hidden by an editor (owner sees why, others get 404) and restored', async ({
	browser
}) => {
	// Four people sign in (argon2id each) and build pages are priced: more than the default 30 s.
	test.setTimeout(150_000);

	// The reader forks the guide and makes the build public.
	const reader = await signedIn(browser, 'reader@slotwise.test');
	await reader.goto(`/guides/${GUIDE}`);
	await reader.getByRole('button', { name: 'Fork into my build' }).click();
	await expect(reader).toHaveURL(/\/builds\/\d+$/);
	const buildPath = new URL(reader.url()).pathname;
	await reader.getByLabel('Public, listed on the guide').check();
	await reader.getByRole('button', { name: 'Save settings' }).click();
	await expect(reader.getByText('Saved.', { exact: true })).toBeVisible();
	// Nothing to report on your own build.
	await expect(reader.getByText('Report this build', { exact: true })).toHaveCount(0);

	// A visitor reads it and is offered a sign-in link that comes back to the build.
	const visitor = await (await browser.newContext()).newPage();
	expect((await visitor.goto(buildPath))?.status()).toBe(200);
	await visitor.getByText('Report this build', { exact: true }).click();
	await expect(visitor.getByRole('link', { name: 'Sign in' }).last()).toHaveAttribute(
		'href',
		`/signin?redirectTo=${encodeURIComponent(buildPath)}`
	);
	await visitor.goto(`/guides/${GUIDE}`);
	await expect(visitor.getByTestId('fork').locator(`a[href="${buildPath}"]`)).toHaveCount(1);

	// Another signed-in person reports it.
	const other = await signedIn(browser, 'author@slotwise.test');
	await other.goto(buildPath);
	await other.getByText('Report this build', { exact: true }).click();
	await other.getByLabel('Unsafe advice (electrical, thermal or handling risk)').check();
	await other.getByLabel('Details for the editors').fill(DETAIL);
	await other.getByRole('button', { name: 'Send report' }).click();
	await expect(other.getByText('Thank you: your report is with the editors.')).toBeVisible();

	// The editor finds it in the queue next to guide reports, opens it, and hides it.
	const editor = await signedIn(browser, 'editor@slotwise.test');
	const entry = await queueEntry(editor, 'open', buildPath);
	await expect(entry).toContainText('1 report');
	await expect(entry).toContainText(/build\s+by/i);
	await expect(entry).toContainText(DETAIL);
	expect((await editor.request.get(buildPath)).status()).toBe(200);
	await entry.getByText('Hide this build…').click();
	await entry.getByLabel('Reason (its owner sees this)').fill(REASON);
	await entry.getByRole('button', { name: 'Hide from the public' }).click();
	await expect(editor.getByText(/Hidden from the public/)).toBeVisible();

	// Others: 404, and the guide no longer lists it.
	expect((await other.goto(buildPath))?.status()).toBe(404);
	expect((await visitor.goto(buildPath))?.status()).toBe(404);
	await visitor.goto(`/guides/${GUIDE}`);
	await expect(visitor.getByTestId('fork').locator(`a[href="${buildPath}"]`)).toHaveCount(0);

	// The owner still has the page, with the notice and the editor's reason.
	expect((await reader.goto(buildPath))?.status()).toBe(200);
	await expect(reader.getByTestId('hidden-notice')).toContainText('Hidden by the editors');
	await expect(reader.getByTestId('hidden-notice')).toContainText(
		'this build is not shown to the public'
	);
	await expect(reader.getByTestId('hidden-notice')).toContainText(REASON);

	// The editor still opens it (with the notice), then restores it from the decided reports.
	expect((await editor.goto(buildPath))?.status()).toBe(200);
	await expect(editor.getByTestId('hidden-notice')).toContainText(REASON);
	const decided = await queueEntry(editor, 'closed', buildPath);
	await expect(decided).toContainText(REASON);
	await decided.getByRole('button', { name: 'Restore build' }).click();
	await expect(editor.getByText('Restored: it is public again.')).toBeVisible();

	expect((await other.goto(buildPath))?.status()).toBe(200);
	await expect(other.getByTestId('hidden-notice')).toHaveCount(0);
	await reader.goto(buildPath);
	await expect(reader.getByTestId('hidden-notice')).toHaveCount(0);
});
