import { beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { AuditEvent, Build, ContentReport, User, sequelize } from '../../src/lib/server/db';
import { seeder } from '../../src/lib/server/db/seeders';
import * as buildEdits from '../../src/lib/server/services/build-edits';
import * as buildExport from '../../src/lib/server/services/build-export';
import * as buildFork from '../../src/lib/server/services/build-fork';
import * as buildLists from '../../src/lib/server/services/build-lists';
import * as buildView from '../../src/lib/server/services/build-view';
import type { BuildView } from '../../src/lib/views';
import * as contentReports from '../../src/lib/server/services/content-reports';
import * as reportQueue from '../../src/lib/server/services/content-report-queue';
import { countRows, resetDatabase } from '../support/db';

/*
 * Content reports on builds on the real MariaDB with the demo community: who may report a
 * build (what they can see, not their own), the editors' queue entry and link, hiding with
 * its audit event (gone for others and from the guide's lineage, shown to the owner with
 * the reason and to editors), and restoring. Product rules from the task (docs/architecture.md
 * "Build" visibility, content reports); no computation here needs a published source.
 */
const GUIDE = 'steady-1080p-starter'; // a published demo guide by author@slotwise.test
const REASON = 'The build notes tell readers to run the PSU with its fan unplugged.';
const input = { category: 'unsafe' as const, detail: 'Its title links to an unsafe wiring trick.' };

let reader: User; // owns the builds
let author: User; // reports them
let editor: User;
let admin: User;

async function user(email: string): Promise<User> {
	const found = await User.findOne({ where: { email } });
	if (!found) throw new Error(`demo user ${email} missing`);
	return found;
}

/** A fresh fork of the demo guide owned by the reader, with the given visibility. */
async function buildWith(visibility: 'private' | 'unlisted' | 'public'): Promise<BuildView> {
	const created = await buildFork.fork(reader.id, GUIDE);
	if (created.kind !== 'created') throw new Error('fork failed');
	const view = await buildView.getBuild({ id: reader.id }, created.id);
	if (!view) throw new Error('own build not visible');
	if (visibility === 'private') return view;
	const saved = await buildEdits.updateBuild(reader.id, view.id, { visibility }, view.version);
	if (saved.kind !== 'ok') throw new Error(`visibility not saved: ${saved.kind}`);
	return saved.build;
}

const subject = (b: { id: number }) => ({ type: 'build' as const, id: String(b.id) });
const as = (u: User) => ({ id: u.id, role: u.role });

async function auditActions(b: { id: number }): Promise<string[]> {
	const rows = await AuditEvent.findAll({
		where: { subjectType: 'build', subjectId: String(b.id) },
		order: [['id', 'ASC']]
	});
	return rows.map((r) => r.action);
}

async function lineageIds(): Promise<number[]> {
	return (await buildLists.lineage(GUIDE)).publicBuilds.map((b) => b.id);
}

describe('content reports on builds, real MariaDB', () => {
	beforeAll(async () => {
		await resetDatabase();
		await seeder(sequelize).up();
		reader = await user('reader@slotwise.test');
		author = await user('author@slotwise.test');
		editor = await user('editor@slotwise.test');
		admin = await user('admin@slotwise.test');
	});

	beforeEach(async () => {
		await ContentReport.destroy({ where: {} });
		await AuditEvent.destroy({ where: {} });
	});

	it('files a report on a public build once; the editors see it grouped with a link to the build', async () => {
		const build = await buildWith('public');
		const first = await contentReports.report(author.id, 'build', String(build.id), input);
		expect(first).toMatchObject({ kind: 'ok', created: true });
		const again = await contentReports.report(author.id, 'build', String(build.id), {
			category: 'spam',
			detail: 'Second try at it.'
		});
		expect(again).toMatchObject({ kind: 'ok', created: false });
		await contentReports.report(editor.id, 'build', String(build.id), {
			category: 'misleading',
			detail: 'Wrong parts in the title.'
		});

		const queue = await reportQueue.listQueue({ state: 'open', page: 1 });
		const group = queue.items.find(
			(g) => g.subject.type === 'build' && g.subject.id === String(build.id)
		);
		expect(group?.reportCount).toBe(2);
		expect(group?.subject).toMatchObject({
			title: build.title,
			url: `/builds/${build.id}`,
			ownerName: reader.name,
			hidden: null
		});
	});

	it('refuses the owner, and does not reveal a build the reporter cannot see', async () => {
		const mine = await buildWith('public');
		expect(await contentReports.report(reader.id, 'build', String(mine.id), input)).toMatchObject({
			kind: 'conflict',
			message: expect.stringContaining('your own content')
		});
		const secret = await buildWith('private');
		// Someone else's private build answers exactly like a build that does not exist.
		expect(await contentReports.report(author.id, 'build', String(secret.id), input)).toEqual({
			kind: 'not_found'
		});
		expect(await contentReports.report(author.id, 'build', '999999', input)).toEqual({
			kind: 'not_found'
		});
		expect(await contentReports.report(author.id, 'build', 'x1', input)).toEqual({
			kind: 'not_found'
		});
		// The owner of a private build is still told it is their own.
		expect(await contentReports.report(reader.id, 'build', String(secret.id), input)).toMatchObject(
			{ kind: 'conflict' }
		);
		expect(await countRows('content_reports')).toBe(0);
	});

	it('reports an unlisted build only with its link token; the queue links it with the token', async () => {
		const build = await buildWith('unlisted');
		const token = build.shareToken as string;
		expect(token).toHaveLength(43);
		expect(await contentReports.report(author.id, 'build', String(build.id), input)).toEqual({
			kind: 'not_found'
		});
		expect(
			await contentReports.report(author.id, 'build', String(build.id), input, {
				shareToken: 'a'.repeat(43)
			})
		).toEqual({ kind: 'not_found' });
		expect(
			await contentReports.report(author.id, 'build', String(build.id), input, {
				shareToken: token
			})
		).toMatchObject({ kind: 'ok', created: true });
		const queue = await reportQueue.listQueue({ state: 'open', page: 1 });
		const group = queue.items.find(
			(g) => g.subject.type === 'build' && g.subject.id === String(build.id)
		);
		expect(group?.subject.url).toBe(`/builds/${build.id}?key=${encodeURIComponent(token)}`);
	});

	it('hides a build: a 404 for others and gone from the lineage; its owner sees the reason, editors see it; audited', async () => {
		const build = await buildWith('public');
		const before = await Build.findByPk(build.id);
		await contentReports.report(author.id, 'build', String(build.id), input);
		expect(await lineageIds()).toContain(build.id);

		expect(await contentReports.hide(editor.id, subject(build), REASON)).toEqual({
			kind: 'ok',
			closedReports: 1
		});

		expect(await buildView.getBuild(null, build.id)).toBeNull();
		expect(await buildView.getBuild(as(author), build.id)).toBeNull();
		expect(await buildExport.exportCsv(null, build.id)).toBeNull();
		expect(await lineageIds()).not.toContain(build.id);
		const own = await buildView.getBuild({ id: reader.id }, build.id);
		expect(own?.isOwner).toBe(true);
		expect(own?.hidden?.reason).toBe(REASON);
		for (const moderator of [editor, admin]) {
			const view = await buildView.getBuild(as(moderator), build.id);
			expect(view?.isOwner).toBe(false);
			expect(view?.hidden?.reason).toBe(REASON);
			expect(view?.shareToken).toBeNull();
		}
		// Hiding is not the owner's change: version and updatedAt stay.
		const after = await Build.findByPk(build.id);
		expect(after?.version).toBe(before?.version);
		expect(after?.updatedAt.toISOString()).toBe(before?.updatedAt.toISOString());
		expect(after?.hiddenById).toBe(editor.id);

		// Not reportable while hidden, and not hidden twice.
		expect(await contentReports.report(admin.id, 'build', String(build.id), input)).toEqual({
			kind: 'not_found'
		});
		expect(await contentReports.hide(admin.id, subject(build), REASON)).toMatchObject({
			kind: 'conflict',
			message: expect.stringContaining('already hidden')
		});
		const report = await ContentReport.findOne({
			where: { subjectType: 'build', subjectId: String(build.id) }
		});
		expect(report).toMatchObject({ state: 'actioned', openMarker: null, decidedById: editor.id });

		const event = await AuditEvent.findOne({ where: { action: 'build.hidden' } });
		expect(event).toMatchObject({
			actorId: editor.id,
			subjectType: 'build',
			subjectId: String(build.id)
		});
		expect(event?.after).toMatchObject({ hidden: true, hiddenReason: REASON, reportsClosed: 1 });
		expect(await auditActions(build)).toEqual(['build.hidden']);
	});

	it('hides an unlisted build for its link too', async () => {
		const build = await buildWith('unlisted');
		const token = build.shareToken as string;
		expect(await buildView.getBuild(null, build.id, { shareToken: token })).not.toBeNull();
		await contentReports.hide(editor.id, subject(build), REASON);
		expect(await buildView.getBuild(null, build.id, { shareToken: token })).toBeNull();
		expect(await buildView.getBuild(as(author), build.id, { shareToken: token })).toBeNull();
	});

	it('restores a hidden build, records it, and refuses a second restore', async () => {
		const build = await buildWith('public');
		await contentReports.report(author.id, 'build', String(build.id), input);
		await contentReports.hide(editor.id, subject(build), REASON);
		expect(await contentReports.restore(admin.id, subject(build))).toEqual({ kind: 'ok' });

		expect((await buildView.getBuild(null, build.id))?.hidden).toBeNull();
		expect(await lineageIds()).toContain(build.id);
		expect((await buildView.getBuild({ id: reader.id }, build.id))?.hidden).toBeNull();
		expect(await contentReports.restore(editor.id, subject(build))).toMatchObject({
			kind: 'conflict'
		});

		const restored = await AuditEvent.findOne({ where: { action: 'build.restored' } });
		expect(restored).toMatchObject({
			actorId: admin.id,
			before: { hidden: true, hiddenReason: REASON },
			after: { hidden: false }
		});
		expect(await auditActions(build)).toEqual(['build.hidden', 'build.restored']);
		expect(await contentReports.hide(editor.id, { type: 'build', id: '999999' }, REASON)).toEqual({
			kind: 'not_found'
		});
	});

	it('lets editors open a reported build made private meanwhile, until the reports are decided', async () => {
		const build = await buildWith('public');
		await contentReports.report(author.id, 'build', String(build.id), input);
		const fresh = await buildView.getBuild({ id: reader.id }, build.id);
		const saved = await buildEdits.updateBuild(
			reader.id,
			build.id,
			{ visibility: 'private' },
			fresh?.version ?? 0
		);
		expect(saved.kind).toBe('ok');

		expect(await buildView.getBuild(as(author), build.id)).toBeNull();
		// A reader role claimed without being an editor opens nothing.
		expect(await buildView.getBuild({ id: author.id, role: 'reader' }, build.id)).toBeNull();
		const seen = await buildView.getBuild(as(editor), build.id);
		expect(seen?.isOwner).toBe(false);
		expect(seen?.notes).toBe('');

		expect(await contentReports.dismiss(editor.id, subject(build))).toMatchObject({
			kind: 'ok',
			dismissed: 1
		});
		expect(await buildView.getBuild(as(editor), build.id)).toBeNull();
		expect(await auditActions(build)).toEqual(['content_report.dismissed']);
	});
});
