import { expect, test } from '@playwright/test';
import { signInWithPassword, signUpConfirmed, uniqueEmail } from './support';

test('an admin promotes a reader to author: author pages open on the next request; disabling refuses the next one', async ({
	browser
}) => {
	const readerContext = await browser.newContext();
	const reader = await readerContext.newPage();
	const email = uniqueEmail('promoted');
	await signUpConfirmed(reader, 'Pia Promoted', email, 'willow rafters and brass bells');

	const before = await reader.goto('/my/guides');
	expect(before?.status()).toBe(403);

	const adminContext = await browser.newContext();
	const admin = await adminContext.newPage();
	await signInWithPassword(admin, 'admin@slotwise.test');
	await admin.goto(`/admin/users?q=${encodeURIComponent(email)}`);
	const row = admin.getByRole('row', { name: new RegExp(email) });
	await row.getByLabel(/Role for/).selectOption('author');
	await row.getByRole('button', { name: 'Change role' }).click();
	await expect(admin.getByText(/now has the author role/)).toBeVisible();

	// Same session, no new sign-in: the role is re-read from the database.
	const after = await reader.goto('/my/guides');
	expect(after?.status()).toBe(200);
	await expect(reader.getByRole('heading', { name: 'My guides' })).toBeVisible();

	await admin.goto(`/admin/users?q=${encodeURIComponent(email)}`);
	const row2 = admin.getByRole('row', { name: new RegExp(email) });
	await row2.getByText('Disable…').click();
	await row2.getByRole('button', { name: /Yes, disable/ }).click();
	await expect(admin.getByText(/is disabled/)).toBeVisible();

	await reader.goto('/account');
	await expect(reader).toHaveURL(/\/signin\?redirectTo=%2Faccount/);
	const session = await reader.request.get('/auth/session');
	expect(await session.json()).toBeNull();

	await readerContext.close();
	await adminContext.close();
});

test('an editor approves a reader’s request to become an author, and the reader is told by e-mail', async ({
	browser
}) => {
	const { waitForMessage } = await import('../support/mailbox');
	const readerContext = await browser.newContext();
	const reader = await readerContext.newPage();
	const email = uniqueEmail('hopeful');
	await signUpConfirmed(reader, 'Hana Hopeful', email, 'pine needles under snowfall');
	await reader.goto('/account');
	await reader
		.getByLabel(/would you like to write about/i)
		.fill('I build quiet small-form-factor machines and write up every step with photos.');
	await reader.getByRole('button', { name: 'Ask to become an author' }).click();
	await expect(reader.getByText(/editor will read|waiting/i).first()).toBeVisible();

	const editorContext = await browser.newContext();
	const editor = await editorContext.newPage();
	await signInWithPassword(editor, 'editor@slotwise.test');
	await editor.goto('/editor/author-requests');
	const item = editor.locator('li, article, section').filter({ hasText: 'Hana Hopeful' }).first();
	await item.getByRole('button', { name: /Approve/i }).click();
	await expect(editor.getByText(/approved/i).first()).toBeVisible();

	const message = await waitForMessage({ to: email, subject: /author/i });
	expect(message.text).toMatch(/approved|welcome/i);
	const page = await reader.goto('/my/guides');
	expect(page?.status()).toBe(200);
	await readerContext.close();
	await editorContext.close();
});
