import { beforeEach, describe, expect, it } from 'vitest';
import { createGuideInput, draftInput } from '../../src/lib/schemas/guide-editor';
import type { DraftInput } from '../../src/lib/schemas/guide-editor';
import { decisionInput, moderationInput, reviewQueueQuery } from '../../src/lib/schemas/review';
import { AuditEvent, Guide, GuideRevision, Review, User, sequelize } from '../../src/lib/server/db';
import { seedDemoCommunity } from '../../src/lib/server/db/seeders/demo-community';
import * as draftEdits from '../../src/lib/server/services/guide-draft-edits';
import * as drafts from '../../src/lib/server/services/guide-drafts';
import * as reviews from '../../src/lib/server/services/guide-reviews';
import * as reviewPage from '../../src/lib/server/services/review-page';
import * as reviewQueue from '../../src/lib/server/services/review-queue';
import * as guides from '../../src/lib/server/services/guides';
import { resetDatabase } from '../support/db';
import { clearMailbox, waitForMessage } from '../support/mailbox';

/*
 * Moderation on the real MariaDB with the real SMTP fake: submit → request changes →
 * resubmit → approve, state rules, conflicts (including two editors at once), the own-guide
 * rule with its admin override, unpublish and archive, and the audit rows each writes.
 */

let author: User;
let editor: User;
let admin: User;
let slotsOfDemo: DraftInput['slots'];
const LINKS = { guidesUrl: 'http://127.0.0.1/my/guides' };
const queue = (q: Partial<Record<string, unknown>> = {}) =>
	reviewQueue.listQueue(reviewQueueQuery.parse(q));
const decision = (d: Record<string, unknown>) => decisionInput.parse(d);

async function freshDemo() {
	await resetDatabase();
	await seedDemoCommunity(sequelize);
	await clearMailbox();
	author = (await User.findOne({ where: { email: 'author@slotwise.test' } })) as User;
	editor = (await User.findOne({ where: { email: 'editor@slotwise.test' } })) as User;
	admin = (await User.findOne({ where: { email: 'admin@slotwise.test' } })) as User;
	const demo = await drafts.getDraft(author.id, 'steady-1080p-starter');
	if (!demo) throw new Error('demo guide missing');
	slotsOfDemo = draftInput.shape.slots.parse(
		demo.slots.map((s) => ({
			// Saved again with its key, a slot stays the same slot in the next revision.
			slotKey: s.slotKey,
			category: s.category,
			label: s.label,
			quantity: s.quantity,
			pickPartId: s.pickPartId,
			reason: s.reason,
			priceQuote: s.priceQuote,
			alternates: s.alternates.map((a) => ({
				partId: a.partId,
				reasonTag: a.reasonTag,
				note: a.note
			}))
		}))
	);
}

function input(overrides: Partial<DraftInput> = {}): DraftInput {
	return draftInput.parse({
		title: 'Review me',
		summary: 'A guide for the review tests.',
		targetBudget: '800.00',
		baseRegion: 'us',
		tags: ['1080p'],
		disclosure: 'none',
		buildNotes: {
			firmware: 'Update firmware.',
			assembly: 'Seat the CPU.',
			cabling: '',
			display: ''
		},
		slots: slotsOfDemo,
		...overrides
	});
}

/** A new guide by `owner`, saved and submitted; returns its slug and pending revision id. */
async function submitted(
	owner: User,
	title = 'Review me'
): Promise<{ slug: string; revisionId: number }> {
	const made = await draftEdits.createGuide(
		owner.id,
		createGuideInput.parse({
			title,
			summary: 'x',
			targetBudget: '800',
			baseRegion: 'us',
			tags: [],
			disclosure: 'none'
		})
	);
	if (made.kind !== 'created') throw new Error(JSON.stringify(made));
	const saved = await draftEdits.saveDraft(owner.id, made.slug, input({ title }), made.version);
	if (saved.kind !== 'saved') throw new Error(JSON.stringify(saved));
	const sent = await draftEdits.submit(owner.id, made.slug, saved.draft.version, LINKS);
	if (sent.kind !== 'submitted') throw new Error(JSON.stringify(sent));
	return { slug: made.slug, revisionId: await pendingId(made.slug) };
}

async function pendingId(slug: string): Promise<number> {
	const guide = (await Guide.findOne({ where: { slug } })) as Guide;
	const revision = await GuideRevision.findOne({
		where: { guideId: guide.id, reviewedAt: null },
		order: [['number', 'DESC']]
	});
	return revision?.id ?? 0;
}

const guideState = async (slug: string) => (await Guide.findOne({ where: { slug } }))?.state;

describe('review workflow', () => {
	beforeEach(freshDemo);

	it('submit → request changes → resubmit → approve, with an e-mail to the author at each step', async () => {
		const { slug, revisionId } = await submitted(author);
		expect(await guideState(slug)).toBe('in_review');
		await waitForMessage({ to: author.email, subject: /^Your guide is in the review queue$/ });
		const waiting = await queue();
		expect(waiting.items.map((i) => [i.slug, i.kind, i.resubmitted])).toEqual([
			[slug, 'new', false]
		]);

		const sentBack = await reviews.decide(
			editor,
			revisionId,
			decision({
				decision: 'request_changes',
				note: 'Add a cooler note.',
				slotNotes: [{ label: 'CPU', note: 'Say why six cores.' }]
			}),
			LINKS
		);
		expect(sentBack).toMatchObject({ kind: 'ok', guideState: 'changes_requested', mailed: true });
		const mail = await waitForMessage({
			to: author.email,
			subject: /^An editor asked for changes to your guide$/
		});
		expect(mail.text).toContain('Add a cooler note.');
		expect(mail.text).toContain('Say why six cores.');
		expect((await queue()).total).toBe(0);

		// The author's dashboard shows the note; after an edit it shows what changed.
		const editable = await drafts.getDraft(author.id, slug);
		const changedSlots = slotsOfDemo.map((s, i) =>
			i === 0 ? { ...s, reason: 'Six cores run every game in the list.' } : s
		);
		const saved = await draftEdits.saveDraft(
			author.id,
			slug,
			input({ slots: changedSlots }),
			editable?.version ?? 0
		);
		if (saved.kind !== 'saved') throw new Error(saved.kind);
		const [card] = await reviewQueue
			.authorDashboard(author.id)
			.then((all) => all.filter((g) => g.slug === slug));
		expect(card?.lastDecision).toMatchObject({
			decision: 'request_changes',
			note: 'Add a cooler note.',
			slotNotes: [{ label: 'CPU', note: 'Say why six cores.' }]
		});
		expect(card?.changedSinceDecision?.slots).toEqual([
			{
				kind: 'changed',
				key: slotsOfDemo[0]?.slotKey,
				label: 'CPU',
				renamedFrom: null,
				fields: [
					{
						field: 'reason',
						from: slotsOfDemo[0]?.reason,
						to: 'Six cores run every game in the list.'
					}
				],
				alternates: []
			}
		]);

		const again = await draftEdits.submit(author.id, slug, saved.draft.version, LINKS);
		expect(again.kind).toBe('submitted');
		expect(await guideState(slug)).toBe('in_review');
		const second = await pendingId(slug);
		expect((await queue()).items[0]).toMatchObject({
			revisionId: second,
			revisionNumber: 2,
			resubmitted: true
		});
		const page = await reviewPage.getReview(editor, second, '127.0.0.1:4173');
		expect(page?.sinceLastReview?.slots.map((s) => s.label)).toEqual(['CPU']);
		expect(page?.diff.from).toBe(0); // a new guide: compared against nothing

		const approved = await reviews.decide(editor, second, decision({ decision: 'approve' }), LINKS);
		expect(approved).toMatchObject({ kind: 'ok', guideState: 'published', mailed: true });
		await waitForMessage({ to: author.email, subject: /^Your guide revision was approved$/ });
		const publicPage = await guides.getGuidePage(slug, null);
		expect(publicPage.kind).toBe('ok');
		if (publicPage.kind === 'ok') expect(publicPage.page.guide.revisionNumber).toBe(2);

		const trail = await AuditEvent.findAll({
			where: { subjectType: 'guide_revision' },
			order: [['id', 'ASC']]
		});
		expect(trail.map((e) => [e.action, e.actorId])).toEqual([
			['guide_revision.changes_requested', editor.id],
			['guide_revision.approved', editor.id]
		]);
		expect(trail[1]?.after).toMatchObject({
			state: 'published',
			decision: 'approve',
			selfReviewOverride: false
		});
	});

	it('answers a decision on a revision that is no longer pending with a conflict naming what happened', async () => {
		const { revisionId } = await submitted(author);
		await reviews.decide(editor, revisionId, decision({ decision: 'approve' }), LINKS);
		const late = await reviews.decide(
			admin,
			revisionId,
			decision({ decision: 'decline', note: 'Too late.' }),
			LINKS
		);
		expect(late.kind).toBe('conflict');
		if (late.kind === 'conflict')
			expect(late.message).toMatch(/^Revision 1 was already approved by Dario Vesely at /);
		expect(await Review.count()).toBe(1);
	});

	it('lets exactly one of two editors deciding at once win', async () => {
		const { slug, revisionId } = await submitted(author);
		const results = await Promise.all([
			reviews.decide(editor, revisionId, decision({ decision: 'approve' }), LINKS),
			reviews.decide(
				admin,
				revisionId,
				decision({ decision: 'decline', note: 'Not this one.' }),
				LINKS
			)
		]);
		expect(results.map((r) => r.kind).sort()).toEqual(['conflict', 'ok']);
		expect(await Review.count({ where: { revisionId } })).toBe(1);
		const winner = results.findIndex((r) => r.kind === 'ok');
		expect(await guideState(slug)).toBe(winner === 0 ? 'published' : 'declined');
	});

	it("refuses an editor's decision on their own guide; an admin's override works and is audited", async () => {
		const mine = await submitted(editor, 'Editor wrote this');
		const refused = await reviews.decide(
			editor,
			mine.revisionId,
			decision({ decision: 'approve' }),
			LINKS
		);
		expect(refused).toEqual({
			kind: 'forbidden',
			message: 'You wrote this guide, so another editor must review it.'
		});
		expect(await guideState(mine.slug)).toBe('in_review');

		const adminsOwn = await submitted(admin, 'Admin wrote this');
		const page = await reviewPage.getReview(admin, adminsOwn.revisionId, 'localhost');
		expect(page).toMatchObject({ ownGuide: true, canDecide: true });
		const override = await reviews.decide(
			admin,
			adminsOwn.revisionId,
			decision({ decision: 'approve' }),
			LINKS
		);
		expect(override.kind).toBe('ok');
		expect(await Review.findOne({ where: { revisionId: adminsOwn.revisionId } })).toMatchObject({
			selfReviewOverride: true
		});
		const events = await AuditEvent.findAll({
			where: { actorId: admin.id },
			order: [['id', 'ASC']]
		});
		expect(events.map((e) => e.action)).toEqual([
			'guide_revision.approved',
			'review.self_review_override'
		]);
	});

	it('keeps a live revision up while a newer one is reviewed, declined or approved', async () => {
		const live = (await Guide.findOne({ where: { slug: 'steady-1080p-starter' } })) as Guide;
		const view = await drafts.getDraft(author.id, live.slug);
		const saved = await draftEdits.saveDraft(
			author.id,
			live.slug,
			input({ title: live.title, slots: slotsOfDemo.slice(0, -1) }),
			view?.version ?? 0
		);
		if (saved.kind !== 'saved') throw new Error(saved.kind);
		await draftEdits.submit(author.id, live.slug, saved.draft.version, LINKS);
		// Submitting never publishes: the live revision is unchanged and the guide stays published.
		expect(await Guide.findByPk(live.id)).toMatchObject({
			state: 'published',
			publishedRevisionId: live.publishedRevisionId
		});
		const pending = await pendingId(live.slug);
		expect((await queue({ kind: 'revision' })).items.map((i) => i.revisionId)).toEqual([pending]);
		expect((await queue({ kind: 'new' })).total).toBe(0);

		const page = await reviewPage.getReview(editor, pending, 'localhost');
		expect(page?.diff.slots.filter((s) => s.kind === 'removed')).toHaveLength(1);

		await reviews.decide(
			editor,
			pending,
			decision({ decision: 'decline', note: 'Keep the case slot.' }),
			LINKS
		);
		expect(await Guide.findByPk(live.id)).toMatchObject({
			state: 'published',
			publishedRevisionId: live.publishedRevisionId
		});
		await waitForMessage({ to: author.email, subject: /^About your guide revision$/ });
	});

	it('unpublishes a live guide back to the author and archives for good', async () => {
		const slug = 'steady-1080p-starter';
		const unpublished = await reviews.moderate(
			editor,
			slug,
			moderationInput.parse({ action: 'unpublish', reason: 'Prices are a year old.' }),
			LINKS
		);
		expect(unpublished).toMatchObject({ kind: 'ok', guideState: 'changes_requested' });
		expect((await guides.getGuidePage(slug, null)).kind).toBe('not_found');
		expect(
			(
				await reviews.moderate(
					editor,
					slug,
					moderationInput.parse({ action: 'unpublish', reason: 'Again.' }),
					LINKS
				)
			).kind
		).toBe('conflict');
		await waitForMessage({ to: author.email, subject: /^Your guide was unpublished$/ });

		await reviews.moderate(
			editor,
			slug,
			moderationInput.parse({ action: 'archive', reason: 'Abandoned.' }),
			LINKS
		);
		expect(await guideState(slug)).toBe('archived');
		const view = await drafts.getDraft(author.id, slug);
		const refused = await draftEdits.saveDraft(author.id, slug, input(), view?.version ?? 0);
		expect(refused).toEqual({
			kind: 'invalid',
			issues: { _form: ['This guide was archived by an editor and can no longer be edited.'] }
		});
		expect((await AuditEvent.findAll({ order: [['id', 'ASC']] })).map((e) => e.action)).toEqual([
			'guide.unpublished',
			'guide.archived'
		]);
	});

	it('flags old quotes and unknown links on the review page and shows the fit report and power budget', async () => {
		const { revisionId } = await submitted(author);
		const slots = slotsOfDemo.map((s, i) =>
			i === 0 && s.priceQuote
				? { ...s, priceQuote: { ...s.priceQuote, observedAt: '2026-09-01' } }
				: s
		);
		const page = await reviewPage.getReview(
			editor,
			revisionId,
			'127.0.0.1:4173',
			new Date('2026-12-02T00:00:00Z')
		);
		expect(page?.fit.summary.conflict).toBe(0);
		expect(page?.power.loadW).toBeGreaterThan(0);
		// The demo quotes are recent; a resubmission with an old quote and a stray link is flagged.
		const view = await drafts.getDraft(author.id, 'review-me');
		await reviews.decide(
			editor,
			revisionId,
			decision({ decision: 'request_changes', note: 'Fix it.' }),
			LINKS
		);
		const saved = await draftEdits.saveDraft(
			author.id,
			'review-me',
			input({
				slots,
				buildNotes: {
					firmware: 'See https://stray-host.example/bios for the file.',
					assembly: 'Seat the CPU.',
					cabling: '',
					display: ''
				}
			}),
			(await drafts.getDraft(author.id, 'review-me'))?.version ?? view?.version ?? 0
		);
		if (saved.kind !== 'saved') throw new Error(JSON.stringify(saved));
		await draftEdits.submit(author.id, 'review-me', saved.draft.version, LINKS);
		const flagged = await reviewPage.getReview(
			editor,
			await pendingId('review-me'),
			'127.0.0.1:4173',
			new Date('2026-12-02T00:00:00Z')
		);
		expect(flagged?.flags.map((f) => f.kind).sort()).toEqual(['stale_quote', 'unknown_link']);
		expect(flagged?.diff.from).toBe(0);
		expect(flagged?.sinceLastReview?.slots[0]).toMatchObject({
			kind: 'changed',
			fields: [expect.objectContaining({ field: 'price' })]
		});
	});
});

describe('decision input', () => {
	it('refuses decisions without the reasons authors need', () => {
		expect(decisionInput.safeParse({ decision: 'decline', note: '  ' }).success).toBe(false);
		expect(decisionInput.safeParse({ decision: 'request_changes' }).success).toBe(false);
		expect(
			decisionInput.safeParse({
				decision: 'request_changes',
				slotNotes: [{ label: 'CPU', note: 'Why?' }]
			}).success
		).toBe(true);
		expect(decisionInput.safeParse({ decision: 'publish' }).success).toBe(false);
		expect(moderationInput.safeParse({ action: 'archive', reason: '' }).success).toBe(false);
	});
});
