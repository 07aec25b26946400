/*
 * Who may see a build (services/build-access.ts) on the real MariaDB: the owner always; anyone
 * a public build; an unlisted one only with its exact link token; nobody else a hidden one
 * except editors; editors a private build only while it has an open content report. The rules
 * are the product's own (docs/architecture.md Roles, DEVELOPERS.md Builds), not a published
 * source.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { Build, Region, User } from '../../src/lib/server/db';
import * as contentReports from '../../src/lib/server/services/content-reports';
import {
	buildAccess,
	readerAccess,
	shareTokenMatches
} from '../../src/lib/server/services/build-access';
import { newShareToken } from '../../src/lib/server/services/build-fork';
import * as buildView from '../../src/lib/server/services/build-view';
import { resetDatabase } from '../support/db';

let owner: User;
let reader: User;
let editor: User;
let admin: User;
let region: Region;

async function build(
	visibility: 'private' | 'unlisted' | 'public',
	hidden = false
): Promise<Build> {
	return Build.create({
		ownerId: owner.id,
		sourceGuideId: null,
		baseRevisionId: null,
		title: `A ${visibility} build`,
		regionId: region.id,
		visibility,
		shareToken: newShareToken(),
		notes: 'Owner only.',
		...(hidden ? { hiddenAt: new Date(), hiddenReason: 'Spam links.', hiddenById: editor.id } : {})
	});
}

describe('build access', () => {
	beforeAll(async () => {
		await resetDatabase();
		const user = (email: string, role: 'reader' | 'editor' | 'admin') =>
			User.create({ email, name: email.split('@')[0] ?? null, role });
		owner = await user('owner@example.test', 'reader');
		reader = await user('reader@example.test', 'reader');
		editor = await user('editor@example.test', 'editor');
		admin = await user('admin@example.test', 'admin');
		region = await Region.create({
			code: 'us',
			name: 'United States',
			currency: 'USD',
			taxMode: 'exclusive',
			taxRateBp: 0
		});
	});

	it('compares share tokens exactly, whatever their length', () => {
		const token = newShareToken();
		expect(token).toHaveLength(43);
		expect(shareTokenMatches(token, token)).toBe(true);
		// Same length, last character changed.
		const last = token.endsWith('A') ? 'B' : 'A';
		expect(shareTokenMatches(token, `${token.slice(0, -1)}${last}`)).toBe(false);
		// A prefix, an extension, nothing.
		expect(shareTokenMatches(token, token.slice(0, 20))).toBe(false);
		expect(shareTokenMatches(token, `${token}x`)).toBe(false);
		expect(shareTokenMatches(token, '')).toBe(false);
		expect(shareTokenMatches(token, undefined)).toBe(false);
	});

	it('the owner always; a visitor or another reader only a public build', async () => {
		const [priv, pub] = [await build('private'), await build('public')];
		expect(await buildAccess(priv, { id: owner.id }, undefined)).toBe('owner');
		expect(await buildAccess(pub, { id: owner.id }, undefined)).toBe('owner');
		expect(await buildAccess(pub, null, undefined)).toBe('other');
		expect(await buildAccess(pub, { id: reader.id, role: 'reader' }, undefined)).toBe('other');
		expect(await buildAccess(priv, null, undefined)).toBeNull();
		expect(await buildAccess(priv, { id: reader.id, role: 'reader' }, undefined)).toBeNull();
		// A private build's own token opens nothing.
		expect(await buildAccess(priv, null, priv.shareToken)).toBeNull();
	});

	it('an unlisted build with its token only: not a wrong one, nor one of another length', async () => {
		const unlisted = await build('unlisted');
		const other = await build('unlisted');
		const token = unlisted.shareToken;
		expect(await buildAccess(unlisted, null, token)).toBe('other');
		expect(await buildAccess(unlisted, null, undefined)).toBeNull();
		expect(await buildAccess(unlisted, null, other.shareToken)).toBeNull();
		expect(await buildAccess(unlisted, null, `${token.slice(0, -1)}`)).toBeNull();
		expect(await buildAccess(unlisted, null, `${token}${token}`)).toBeNull();
		// The page answers the same: a view for the right link, nothing for a wrong one.
		const view = await buildView.getBuild(null, unlisted.id, { shareToken: token });
		expect(view).toMatchObject({ isOwner: false, shareToken: null, notes: '' });
		expect(await buildView.getBuild(null, unlisted.id, { shareToken: 'x' })).toBeNull();
	});

	it('a hidden build: its owner and editors, nobody else, not even with the link', async () => {
		const hidden = await build('unlisted', true);
		expect(await buildAccess(hidden, { id: owner.id }, undefined)).toBe('owner');
		expect(await buildAccess(hidden, null, hidden.shareToken)).toBeNull();
		expect(await buildAccess(hidden, { id: reader.id, role: 'reader' }, hidden.shareToken)).toBe(
			null
		);
		expect(await buildAccess(hidden, { id: editor.id, role: 'editor' }, undefined)).toBe('other');
		expect(await buildAccess(hidden, { id: admin.id, role: 'admin' }, undefined)).toBe('other');
		// As a reader (no editor's role), the owner of nothing sees nothing.
		expect(readerAccess(hidden, { id: editor.id }, hidden.shareToken)).toBeNull();
	});

	it('editors open a private build while it has an open report, and no longer once it is decided', async () => {
		const pub = await build('public');
		const filed = await contentReports.report(reader.id, 'build', String(pub.id), {
			category: 'spam',
			detail: 'Every note links to one shop.'
		});
		expect(filed).toMatchObject({ kind: 'ok', created: true });
		// The owner makes it private after the report.
		await pub.update({ visibility: 'private' });
		const asEditor = { id: editor.id, role: 'editor' };
		expect(await buildAccess(pub, { id: reader.id, role: 'reader' }, undefined)).toBeNull();
		expect(await buildAccess(pub, asEditor, undefined)).toBe('other');
		expect(await buildAccess(pub, { id: admin.id, role: 'admin' }, undefined)).toBe('other');
		const seen = await buildView.getBuild(asEditor, pub.id);
		expect(seen).toMatchObject({ isOwner: false, notes: '', shareToken: null });

		expect(
			await contentReports.dismiss(editor.id, { type: 'build', id: String(pub.id) })
		).toMatchObject({ kind: 'ok', dismissed: 1 });
		expect(await buildAccess(pub, asEditor, undefined)).toBeNull();
		// A private build without any report is the owner's alone, editors included.
		const priv = await build('private');
		expect(await buildAccess(priv, asEditor, undefined)).toBeNull();
	});

	it('content reports read builds by the same rule: an unlisted one only with its token', async () => {
		const unlisted = await build('unlisted');
		const report = (shareToken?: string) =>
			contentReports.report(
				reader.id,
				'build',
				String(unlisted.id),
				{ category: 'misleading', detail: 'The totals are made up.' },
				{ shareToken }
			);
		expect(await report(undefined)).toEqual({ kind: 'not_found' });
		expect(await report(`${unlisted.shareToken}=`)).toEqual({ kind: 'not_found' });
		expect(await report(unlisted.shareToken)).toMatchObject({ kind: 'ok', created: true });
	});
});
