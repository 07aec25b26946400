import { beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { reportInput, hideInput } from '../../src/lib/schemas/content-reports';
import {
	AuditEvent,
	Build,
	ContentReport,
	Guide,
	GuideSlot,
	Part,
	User,
	sequelize
} from '../../src/lib/server/db';
import { seeder } from '../../src/lib/server/db/seeders';
import type { GuideBrowseQuery } from '../../src/lib/schemas/guide-browse';
import * as buildFork from '../../src/lib/server/services/build-fork';
import * as buildLists from '../../src/lib/server/services/build-lists';
import * as buildView from '../../src/lib/server/services/build-view';
import * as contentReports from '../../src/lib/server/services/content-reports';
import * as reportQueue from '../../src/lib/server/services/content-report-queue';
import * as guideBrowse from '../../src/lib/server/services/guide-browse';
import { atomFeed } from '../../src/lib/server/services/guide-feed';
import * as guides from '../../src/lib/server/services/guides';
import * as parts from '../../src/lib/server/services/parts';
import { countRows, resetDatabase } from '../support/db';

/*
 * Content reports and hiding on the real MariaDB with the demo community: reports, the
 * one-open-report rule, the editors' decisions with their audit events, and what a hidden
 * guide looks like to the public, its author and editors. No computation here needs a
 * published source: these are product rules from the issue (docs/architecture.md, issue 6).
 */
const SLUG = 'steady-1080p-starter'; // written by author@slotwise.test in the demo data
const REASON = 'The PSU section recommends bridging the PS_ON pin with a paperclip.';
const browseQuery: GuideBrowseQuery = { tag: [], sort: 'newest', page: 1 };

let reader: User;
let editor: User;
let author: User;
let admin: User;
let guideId: string;

async function user(email: string): Promise<User> {
	const found = await User.findOne({ where: { email } });
	if (!found) throw new Error(`demo user ${email} missing`);
	return found;
}

const input = { category: 'unsafe' as const, detail: 'It tells readers to open the PSU case.' };
const subject = () => ({ type: 'guide' as const, id: guideId });

async function publicSlugs(): Promise<{
	list: string[];
	browse: string[];
	feed: string;
	home: string[];
}> {
	const browse = await guideBrowse.browse(browseQuery);
	if (browse.kind !== 'ok') throw new Error(browse.kind);
	const home = await guideBrowse.homeLists(10);
	return {
		list: (await guideBrowse.listPublished()).map((g) => g.slug),
		browse: browse.result.items.map((g) => g.slug),
		feed: await atomFeed('https://slotwise.example'),
		home: [...home.latest, ...home.featured].map((g) => g.slug)
	};
}

async function auditActions(): Promise<string[]> {
	const rows = await AuditEvent.findAll({
		where: { subjectType: 'guide', subjectId: guideId },
		order: [['id', 'ASC']]
	});
	return rows.map((r) => r.action);
}

describe('content reports on the real MariaDB', () => {
	beforeAll(async () => {
		await resetDatabase();
		await seeder(sequelize).up();
		reader = await user('reader@slotwise.test');
		editor = await user('editor@slotwise.test');
		author = await user('author@slotwise.test');
		admin = await user('admin@slotwise.test');
		const guide = await Guide.findOne({ where: { slug: SLUG } });
		if (!guide || guide.authorId !== author.id)
			throw new Error('demo guide missing or not by the demo author');
		guideId = String(guide.id);
	});

	beforeEach(async () => {
		await ContentReport.destroy({ where: {} });
		await AuditEvent.destroy({ where: {} });
		await Guide.update({ hiddenAt: null, hiddenReason: null, hiddenById: null }, { where: {} });
	});

	it('files a report once; a repeat while it is open files nothing and says so', async () => {
		const first = await contentReports.report(reader.id, 'guide', SLUG, input);
		expect(first).toMatchObject({ kind: 'ok', created: true });
		const again = await contentReports.report(reader.id, 'guide', SLUG, {
			category: 'spam',
			detail: 'Second try at it.'
		});
		expect(again).toMatchObject({ kind: 'ok', created: false });
		expect(again.kind === 'ok' && first.kind === 'ok' && again.reportId === first.reportId).toBe(
			true
		);
		expect(await countRows('content_reports')).toBe(1);

		// Two submits at the same moment: the unique index lets exactly one in.
		const [a, b] = await Promise.all([
			contentReports.report(admin.id, 'guide', SLUG, input),
			contentReports.report(admin.id, 'guide', SLUG, input)
		]);
		expect([a, b].filter((o) => o.kind === 'ok' && o.created)).toHaveLength(1);
		expect([a, b].every((o) => o.kind === 'ok')).toBe(true);
		expect(await ContentReport.count({ where: { reporterId: admin.id } })).toBe(1);
	});

	it('refuses own content, unknown guides and unknown photos', async () => {
		expect(await contentReports.report(author.id, 'guide', SLUG, input)).toMatchObject({
			kind: 'conflict'
		});
		expect(await contentReports.report(reader.id, 'guide', 'no-such-guide', input)).toEqual({
			kind: 'not_found'
		});
		// Photos of finished builds are reportable now (tests/integration/build-photos.spec.ts); this id
		// names none (the demo seed has photos of its own, with low ids).
		expect(await contentReports.report(reader.id, 'photo', '999999', input)).toEqual({
			kind: 'not_found'
		});
		expect(
			await contentReports.hide(editor.id, { type: 'photo', id: '999999' }, REASON)
		).toMatchObject({
			kind: 'not_found'
		});
		expect(await countRows('content_reports')).toBe(0);
	});

	it('validates the report and hide forms field by field', () => {
		const bad = reportInput.safeParse({ category: 'boring', detail: 'short' });
		expect(bad.success).toBe(false);
		const paths = bad.success ? [] : bad.error.issues.map((i) => i.path.join('.'));
		expect(paths.sort()).toEqual(['category', 'detail']);
		expect(
			reportInput.safeParse({ category: 'unsafe', detail: 'Long enough detail.', extra: '1' })
				.success
		).toBe(false);
		expect(
			hideInput.safeParse({ subjectType: 'guide', subjectId: '1', reason: 'too short' }).success
		).toBe(false);
		expect(
			hideInput.safeParse({ subjectType: 'guide', subjectId: '0x1', reason: REASON }).success
		).toBe(false);
		expect(
			hideInput.safeParse({ subjectType: 'guide', subjectId: '12', reason: REASON }).success
		).toBe(true);
	});

	it('groups open reports by subject with a count for the editors', async () => {
		await contentReports.report(reader.id, 'guide', SLUG, input);
		await contentReports.report(editor.id, 'guide', SLUG, {
			category: 'misleading',
			detail: 'Wrong RAM speed listed.'
		});
		await contentReports.report(reader.id, 'guide', 'pocket-itx-1440p', input);
		const queue = await reportQueue.listQueue({ state: 'open', page: 1 });
		expect(queue.total).toBe(2);
		const group = queue.items.find((g) => g.subject.id === guideId);
		expect(group?.reportCount).toBe(2);
		expect(group?.subject).toMatchObject({ type: 'guide', url: `/guides/${SLUG}`, hidden: null });
		expect(group?.reports.map((r) => r.category).sort()).toEqual(['misleading', 'unsafe']);
		expect((await reportQueue.listQueue({ state: 'closed', page: 1 })).total).toBe(0);
		// One group per page: two pages.
		expect(
			(await reportQueue.listQueue({ state: 'open', page: 2, perPage: 1 })).items
		).toHaveLength(1);
	});

	it('hides a guide: gone from every public list and page, shown to its author and editors with the reason', async () => {
		await contentReports.report(reader.id, 'guide', SLUG, input);
		const before = await publicSlugs();
		expect(before.list).toContain(SLUG);
		expect(before.feed).toContain(`/guides/${SLUG}`);

		expect(await contentReports.hide(editor.id, subject(), REASON)).toEqual({
			kind: 'ok',
			closedReports: 1
		});

		const after = await publicSlugs();
		expect(after.list).not.toContain(SLUG);
		expect(after.browse).not.toContain(SLUG);
		expect(after.home).not.toContain(SLUG);
		expect(after.feed).not.toContain(`/guides/${SLUG}`);
		expect(after.list).toHaveLength(before.list.length - 1);
		expect(await guides.getGuidePage(SLUG, null)).toEqual({ kind: 'not_found' });
		expect(await guides.getPriced(SLUG, null)).toEqual({ kind: 'not_found' });
		expect(await guides.getPublishedBySlug(SLUG)).toBeNull();
		expect(
			await guides.getGuidePage(SLUG, null, undefined, { id: reader.id, role: 'reader' })
		).toEqual({ kind: 'not_found' });
		expect((await guides.getRevisionDiff(SLUG, 1, 1)).kind).toBe('not_found');

		for (const viewer of [author, editor, admin]) {
			const page = await guides.getGuidePage(SLUG, null, undefined, {
				id: viewer.id,
				role: viewer.role
			});
			expect(page.kind).toBe('ok');
			if (page.kind === 'ok') expect(page.page.hidden?.reason).toBe(REASON);
		}
		const mine = await guides.listByAuthor(author.id);
		expect(mine.find((g) => g.slug === SLUG)?.hiddenReason).toBe(REASON);

		// A hidden guide cannot be reported (the public cannot see it) and cannot be hidden twice.
		expect(await contentReports.report(admin.id, 'guide', SLUG, input)).toEqual({
			kind: 'not_found'
		});
		expect(await contentReports.hide(admin.id, subject(), REASON)).toMatchObject({
			kind: 'conflict',
			message: expect.stringContaining('already hidden')
		});
		// Its report was closed as actioned, so dismissing now is a conflict.
		const report = await ContentReport.findOne({ where: { subjectId: guideId } });
		expect(report).toMatchObject({ state: 'actioned', openMarker: null, decidedById: editor.id });
		expect(await contentReports.dismiss(editor.id, subject())).toMatchObject({ kind: 'conflict' });

		const event = await AuditEvent.findOne({ where: { action: 'guide.hidden' } });
		expect(event).toMatchObject({ actorId: editor.id, subjectType: 'guide', subjectId: guideId });
		expect(event?.after).toMatchObject({ hidden: true, hiddenReason: REASON, reportsClosed: 1 });
		expect(await auditActions()).toEqual(['guide.hidden']);
	});

	it('a hidden guide leaves no title or link on part pages, the parts API or builds forked from it (issue 12, item 9)', async () => {
		const guide = await Guide.findByPk(Number(guideId));
		const pick = await GuideSlot.findOne({
			where: { revisionId: guide?.publishedRevisionId ?? 0 },
			order: [['position', 'ASC']]
		});
		const part = await Part.findByPk(pick?.pickPartId ?? 0);
		if (!guide || !part) throw new Error('demo guide or its first pick missing');
		// A reader's public build forked from the guide, as anyone may see it.
		const forked = await buildFork.fork(reader.id, SLUG);
		if (forked.kind !== 'created') throw new Error('fork failed');
		await Build.update({ visibility: 'public' }, { where: { id: forked.id } });

		const usingBefore = (await parts.getBySlug(part.slug))?.guides.map((g) => g.slug);
		expect(usingBefore).toContain(SLUG);
		expect((await buildView.getBuild(null, forked.id))?.source).toMatchObject({
			slug: SLUG,
			title: guide.title
		});

		await contentReports.report(admin.id, 'guide', SLUG, input);
		await contentReports.hide(editor.id, subject(), REASON);

		// The part page and /api/v1/parts/[slug] both read getBySlug.
		const usingAfter = (await parts.getBySlug(part.slug))?.guides ?? [];
		expect(usingAfter.map((g) => g.slug)).not.toContain(SLUG);
		expect(JSON.stringify(usingAfter)).not.toContain(guide.title);
		for (const viewer of [null, { id: admin.id, role: 'admin' }]) {
			const view = await buildView.getBuild(viewer, forked.id);
			expect(view, 'the build itself stays visible').not.toBeNull();
			expect(view?.source ?? null).toBeNull();
			expect(JSON.stringify(view)).not.toContain(`/guides/${SLUG}`);
		}
		const mine = await buildLists.listMine(reader.id);
		expect(mine.find((b) => b.id === forked.id)?.source ?? null).toBeNull();

		// Restored, it is credited again.
		await contentReports.restore(editor.id, subject());
		expect((await parts.getBySlug(part.slug))?.guides.map((g) => g.slug)).toContain(SLUG);
		expect((await buildView.getBuild(null, forked.id))?.source?.slug).toBe(SLUG);
		await Build.destroy({ where: { id: forked.id } });
	});

	it('restores a hidden guide, records it, and refuses a second restore', async () => {
		await contentReports.report(reader.id, 'guide', SLUG, input);
		await contentReports.hide(editor.id, subject(), REASON);
		expect(await contentReports.restore(admin.id, subject())).toEqual({ kind: 'ok' });

		expect((await guideBrowse.listPublished()).map((g) => g.slug)).toContain(SLUG);
		const page = await guides.getGuidePage(SLUG, null);
		expect(page.kind === 'ok' && page.page.hidden).toBeNull();
		expect(
			(await guides.listByAuthor(author.id)).find((g) => g.slug === SLUG)?.hiddenReason
		).toBeNull();

		expect(await contentReports.restore(editor.id, subject())).toMatchObject({ kind: 'conflict' });
		const restored = await AuditEvent.findOne({ where: { action: 'guide.restored' } });
		expect(restored).toMatchObject({
			actorId: admin.id,
			before: { hidden: true, hiddenReason: REASON },
			after: { hidden: false }
		});
		expect(await auditActions()).toEqual(['guide.hidden', 'guide.restored']);

		// The earlier report is closed, so the same reader may report the visible guide again.
		expect(await contentReports.report(reader.id, 'guide', SLUG, input)).toMatchObject({
			kind: 'ok',
			created: true
		});
		expect(await ContentReport.count({ where: { reporterId: reader.id } })).toBe(2);
	});

	it('dismisses the open reports once: of two editors deciding at once, one wins', async () => {
		await contentReports.report(reader.id, 'guide', SLUG, input);
		await contentReports.report(admin.id, 'guide', SLUG, input);
		const [a, b] = await Promise.all([
			contentReports.dismiss(editor.id, subject()),
			contentReports.dismiss(admin.id, subject())
		]);
		const outcomes = [a, b].map((o) => o.kind).sort();
		expect(outcomes).toEqual(['conflict', 'ok']);
		expect([a, b].find((o) => o.kind === 'ok')).toMatchObject({ dismissed: 2 });
		expect(await ContentReport.count({ where: { state: 'dismissed' } })).toBe(2);
		expect(await auditActions()).toEqual(['content_report.dismissed']);
		// Dismissing hides nothing.
		expect((await guideBrowse.listPublished()).map((g) => g.slug)).toContain(SLUG);
		const closed = await reportQueue.listQueue({ state: 'closed', page: 1 });
		expect(closed.items[0]).toMatchObject({ reportCount: 2 });
		expect(
			closed.items[0]?.reports.every((r) => r.state === 'dismissed' && r.decidedBy !== null)
		).toBe(true);
	});

	it('two editors hiding at once: one hides, the other is told, one audit event', async () => {
		const [a, b] = await Promise.all([
			contentReports.hide(editor.id, subject(), REASON),
			contentReports.hide(admin.id, subject(), REASON)
		]);
		expect([a.kind, b.kind].sort()).toEqual(['conflict', 'ok']);
		expect(await auditActions()).toEqual(['guide.hidden']);
		expect(await contentReports.hide(editor.id, { type: 'guide', id: '999999' }, REASON)).toEqual({
			kind: 'not_found'
		});
	});
});
