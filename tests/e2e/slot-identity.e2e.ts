import { expect, test } from '@playwright/test';
import { signInWithPassword } from './support';

/*
 * Labels are display text and may repeat (issue 11, "Slot identity"; issue 15, "a build with
 * two slots of the same label renders"). A reader forks a guide and adds two slots of their own,
 * both called "Extra drive": the build page shows both rows, and the drift panel lists both,
 * rather than a blank page. The guide is the demo's entry build, which the sync tests
 * change only in their own database.
 */

const READER = 'reader@slotwise.test';
const GUIDE = 'steady-1080p-starter';

test('a build with two slots of the same label shows both rows', async ({ page }) => {
	test.setTimeout(90_000);
	await signInWithPassword(page, READER);
	const forked = await page.request.post(`/api/v1/guides/${GUIDE}/fork`, { data: {} });
	expect(forked.status(), await forked.text()).toBe(201);
	const { id } = (await forked.json()) as { id: number };
	const build = await (await page.request.get(`/api/v1/builds/${id}`)).json();
	const storage = (build.slots as { category: string; part: { id: number } }[]).find(
		(s) => s.category === 'storage'
	);
	if (!storage) throw new Error('the demo guide has no storage slot');

	let version = build.version as number;
	for (let i = 0; i < 2; i++) {
		const added = await page.request.post(`/api/v1/builds/${id}/slots`, {
			data: { version, category: 'storage', label: 'Extra drive', partId: storage.part.id }
		});
		expect(added.status(), await added.text()).toBe(201);
		version = ((await added.json()) as { version: number }).version;
	}

	const errors: string[] = [];
	page.on('pageerror', (e) => errors.push(e.message));
	const answer = await page.goto(`/builds/${id}`);
	expect(answer?.status()).toBe(200);
	await expect(page.getByRole('listitem', { name: 'Extra drive', exact: true })).toHaveCount(2);
	await expect(page.getByTestId('drift').getByText('Extra drive')).toHaveCount(2);
	expect(errors).toEqual([]);
});
