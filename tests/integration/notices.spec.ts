import { beforeEach, describe, expect, it } from 'vitest';
import { draftInput } from '../../src/lib/schemas/guide-editor';
import { decisionInput } from '../../src/lib/schemas/review';
import { Follow, Guide, GuideRevision, Notice, User } from '../../src/lib/server/db';
import * as notices from '../../src/lib/server/services/notices';
import * as draftEdits from '../../src/lib/server/services/guide-draft-edits';
import * as drafts from '../../src/lib/server/services/guide-drafts';
import * as reviews from '../../src/lib/server/services/guide-reviews';
import { forkBuild, newReader } from '../support/buildsync-fixtures';
import { resetDatabase } from '../support/db';
import { drainMailQueue } from '../support/mail-queue';
import { listMessages, waitForMessage } from '../support/mailbox';
import { LINKS, newsletterWorld, type NewsletterWorld } from '../support/newsletter-fixtures';

/* Notices filed by submissions and decisions, their settings, read state and e-mail. */

let world: NewsletterWorld;

beforeEach(async () => {
	await resetDatabase();
});

async function noticesOf(user: User) {
	return (await Notice.findAll({ where: { userId: user.id }, order: [['id', 'ASC']] })).map(
		(n) => ({
			kind: n.kind,
			message: n.message,
			linkPath: n.linkPath
		})
	);
}

async function publishRevision2(major: boolean): Promise<number> {
	const view = (await drafts.getDraft(world.author.id, world.slug))!;
	const saved = await draftEdits.saveDraft(
		world.author.id,
		world.slug,
		draftInput.parse({
			title: view.title,
			summary: `${view.summary} Again.`,
			targetBudget: view.targetBudget,
			baseRegion: view.baseRegion,
			tags: view.tags,
			disclosure: view.disclosure,
			buildNotes: view.buildNotes,
			slots: view.slots.map((s) => ({
				category: s.category,
				label: s.label,
				quantity: s.quantity,
				pickPartId: s.pickPartId,
				reason: s.reason,
				priceQuote: s.priceQuote
			}))
		}),
		view.version
	);
	if (saved.kind !== 'saved') throw new Error(saved.kind);
	await draftEdits.submit(world.author.id, world.slug, saved.draft.version, LINKS, { major });
	const guide = (await Guide.findOne({ where: { slug: world.slug } }))!;
	const revision = (await GuideRevision.findOne({
		where: { guideId: guide.id, reviewedAt: null }
	}))!;
	await reviews.decide(
		{ id: world.editor.id, role: 'editor' },
		revision.id,
		decisionInput.parse({ decision: 'approve' }),
		LINKS
	);
	return revision.id;
}

describe('notices', () => {
	it('a submission tells the editors, a decision the author, a new guide or major revision the followers', async () => {
		const follower = await newReader('follower');
		const admin = await User.create({ email: 'boss@example.test', name: 'Boss', role: 'admin' });
		world = await newsletterWorld(undefined, async (author) => {
			await Follow.create({ followerId: follower.id, authorId: author.id });
		});
		const revision2 = await publishRevision2(true);
		const editorNotices = await noticesOf(world.editor);
		expect(editorNotices.filter((n) => n.kind === 'queue_gained')).toHaveLength(2);
		expect(await noticesOf(admin)).toEqual([
			{
				kind: 'queue_gained',
				message: '“Two-part test build” by Noor Castellan (revision 1) is waiting for review.',
				linkPath: `/review/${world.revisionId}`
			},
			{
				kind: 'queue_gained',
				message: '“Two-part test build” by Noor Castellan (revision 2) is waiting for review.',
				linkPath: `/review/${revision2}`
			}
		]);
		expect((await noticesOf(world.author)).filter((n) => n.kind === 'revision_decided')).toEqual([
			{
				kind: 'revision_decided',
				message: 'Revision 1 of “Two-part test build” was approved and is live.',
				linkPath: '/my/guides'
			},
			{
				kind: 'revision_decided',
				message: 'Revision 2 of “Two-part test build” was approved and is live.',
				linkPath: '/my/guides'
			}
		]);
		expect(await noticesOf(follower)).toEqual([
			{
				kind: 'author_published',
				message: 'Noor Castellan published a new guide: “Two-part test build”.',
				linkPath: `/guides/${world.slug}`
			},
			{
				kind: 'author_published',
				message: 'Noor Castellan published a major revision of “Two-part test build”.',
				linkPath: `/guides/${world.slug}`
			}
		]);
	});

	it('a newer revision tells build owners in-app, and the e-mail follows the owner’s switch', async () => {
		world = await newsletterWorld();
		const guide = (await Guide.findOne({ where: { slug: world.slug } }))!;
		const keen = await newReader('keen-owner');
		const quiet = await newReader('quiet-owner');
		const keenBuild = await forkBuild(keen, guide, { title: 'Desk box' });
		await forkBuild(quiet, guide, { title: 'Spare box' });
		const defaults = await notices.settingsOf(quiet.id);
		await notices.saveSettings(quiet.id, {
			...defaults,
			source_revised: { inApp: true, email: false }
		});
		await publishRevision2(false);
		expect(await noticesOf(keen)).toEqual([
			{
				kind: 'source_revised',
				message:
					'“Two-part test build”, the guide your build “Desk box” came from, has a new revision (2).',
				linkPath: `/builds/${keenBuild.id}`
			}
		]);
		expect((await noticesOf(quiet)).map((n) => n.kind)).toEqual(['source_revised']);
		await waitForMessage({ to: keen.email, subject: /new revision/ });
		expect((await listMessages()).some((m) => m.to.includes(quiet.email))).toBe(false);
	});

	it('in-app off files nothing; e-mail on queues a notice mail for followers', async () => {
		const fan = await newReader('mail-fan');
		const muted = await newReader('muted-fan');
		const author = await User.create({
			email: 'prolific@example.test',
			name: 'Prolific',
			role: 'author'
		});
		for (const u of [fan, muted]) await Follow.create({ followerId: u.id, authorId: author.id });
		await notices.saveSettings(fan.id, {
			...(await notices.settingsOf(fan.id)),
			author_published: { inApp: true, email: true }
		});
		await notices.saveSettings(muted.id, {
			...(await notices.settingsOf(muted.id)),
			author_published: { inApp: false, email: false }
		});
		const filed = await notices.notify(
			'author_published',
			[fan, muted].map((u) => ({
				userId: u.id,
				message: 'Prolific published a new guide: “X”.',
				linkPath: '/guides/x'
			})),
			'http://127.0.0.1:4173'
		);
		expect(filed).toBe(1);
		expect(await noticesOf(muted)).toEqual([]);
		await drainMailQueue();
		const mail = await waitForMessage({ to: fan.email, subject: /^News from Slotwise$/ });
		expect(mail.text).toContain('Prolific published a new guide: “X”.');
		expect(mail.text).toContain('http://127.0.0.1:4173/guides/x');
	});

	it('read and unread: one at a time, all at once, and never another user’s', async () => {
		const a = await newReader('reads');
		const b = await newReader('other');
		await notices.notify(
			'queue_gained',
			[1, 2, 3].map((n) => ({ userId: a.id, message: `Item ${n}`, linkPath: `/review/${n}` })),
			'http://127.0.0.1:4173'
		);
		expect(await notices.unreadCount(a.id)).toBe(3);
		const first = (await notices.list(a.id, 1)).items.at(-1)!;
		expect(await notices.markRead(b.id, first.id)).toBeNull();
		expect(await notices.unreadCount(a.id)).toBe(3);
		expect(await notices.markRead(a.id, first.id)).toBe('/review/1');
		expect(await notices.unreadCount(a.id)).toBe(2);
		expect(await notices.markAllRead(a.id)).toBe(2);
		const listed = await notices.list(a.id, 1);
		expect(listed.unread).toBe(0);
		expect(listed.items.map((n) => [n.message, n.read])).toEqual([
			['Item 3', true],
			['Item 2', true],
			['Item 1', true]
		]);
	});
});
