import { beforeAll, describe, expect, it } from 'vitest';
import { draftInput } from '../../src/lib/schemas/guide-editor';
import { decisionInput } from '../../src/lib/schemas/review';
import {
	Guide,
	GuidePriceProposal,
	GuideSlot,
	Quote,
	User,
	sequelize
} from '../../src/lib/server/db';
import { seedDemoCommunity } from '../../src/lib/server/db/seeders/demo-community';
import * as buildFork from '../../src/lib/server/services/build-fork';
import * as buildView from '../../src/lib/server/services/build-view';
import * as draftEdits from '../../src/lib/server/services/guide-draft-edits';
import * as drafts from '../../src/lib/server/services/guide-drafts';
import * as browse from '../../src/lib/server/services/guide-browse';
import * as feed from '../../src/lib/server/services/guide-feed';
import * as reviews from '../../src/lib/server/services/guide-reviews';
import * as reviewPage from '../../src/lib/server/services/review-page';
import * as guides from '../../src/lib/server/services/guides';
import * as parts from '../../src/lib/server/services/parts';
import { resetDatabase } from '../support/db';

/*
 * Issue 12, items 1 and 2: an author's saved draft of a published guide (new details and a
 * price of 0.01) changes nothing a reader sees (guide, list, feed, part, a reader's build)
 * and creates no quote, until an editor approves; approval makes both live at once.
 * Failed on main before the fix: the save wrote the guide row and created an active quote.
 */
const SLUG = 'steady-1080p-starter';
const LINKS = { guidesUrl: 'http://127.0.0.1/my/guides' };
// A fixed clock, so the public answers before and after differ only if data changed.
const NOW = new Date('2026-12-02T00:00:00Z');

let author: User;
let editor: User;
let reader: User;

/** Every public answer about the guide, its part and the reader's fork, as strings. */
async function publicState(pricedSlug: string, buildId: number) {
	const viewer = { id: reader.id, role: reader.role };
	return {
		detail: JSON.stringify(await guides.getPublishedBySlug(SLUG)),
		page: JSON.stringify(await guides.getGuidePage(SLUG, null, NOW)),
		list: JSON.stringify(await browse.listPublished()),
		feed: await feed.atomFeed('http://127.0.0.1'),
		part: JSON.stringify(await parts.getBySlug(pricedSlug)),
		build: JSON.stringify(await buildView.getBuild(viewer, buildId))
	};
}

/** Each answer compared on its own, so a failure names the one that moved. */
function expectSame(after: Record<string, string>, before: Record<string, string>) {
	for (const key of Object.keys(before))
		expect({ key, value: after[key] }).toEqual({ key, value: before[key] });
}

describe('a draft of a published guide changes nothing public until approved', () => {
	beforeAll(async () => {
		await resetDatabase();
		// Seeded on the same clock the review reads with: quotes are dated days before NOW.
		await seedDemoCommunity(sequelize, NOW);
		author = (await User.findOne({ where: { email: 'author@slotwise.test' } })) as User;
		editor = (await User.findOne({ where: { email: 'editor@slotwise.test' } })) as User;
		reader = (await User.findOne({ where: { email: 'reader@slotwise.test' } })) as User;
	});

	it('keeps details and prices private through save and submit, and publishes both on approval', async () => {
		const forked = await buildFork.fork(reader.id, SLUG);
		if (forked.kind !== 'created') throw new Error(JSON.stringify(forked));
		const demo = await drafts.getDraft(author.id, SLUG);
		if (!demo) throw new Error('demo guide missing');
		const priced = demo.slots.findIndex((s) => s.priceQuote !== null);
		const pricedSlot = demo.slots[priced];
		if (!pricedSlot?.priceQuote) throw new Error('demo guide has no quoted slot');
		const before = await publicState(pricedSlot.pick.slug, forked.id);
		const quotesBefore = await Quote.count();
		expect(before.detail).not.toContain('A rewritten title');
		expect(before.build).toContain(SLUG);

		const slots = demo.slots.map((s, i) => ({
			category: s.category,
			label: s.label,
			quantity: s.quantity,
			pickPartId: s.pickPartId,
			reason: s.reason,
			priceQuote:
				i === priced && s.priceQuote
					? { ...s.priceQuote, amount: '0.01', observedAt: '2026-12-01' }
					: s.priceQuote,
			alternates: s.alternates.map((a) => ({
				partId: a.partId,
				reasonTag: a.reasonTag,
				note: a.note
			}))
		}));
		const saved = await draftEdits.saveDraft(
			author.id,
			SLUG,
			draftInput.parse({
				title: 'A rewritten title',
				summary: 'A summary nobody approved.',
				targetBudget: '5000.00',
				baseRegion: 'us',
				tags: ['4k'],
				disclosure: 'sponsored',
				disclosureNote: 'Parts given by a sponsor.',
				walkthroughUrl: 'https://walkthrough.example/build',
				buildNotes: demo.buildNotes,
				slots
			}),
			demo.version
		);
		if (saved.kind !== 'saved') throw new Error(JSON.stringify(saved));
		// The author sees their working copy…
		expect(saved.draft.title).toBe('A rewritten title');
		expect(saved.draft.slots[priced]?.priceQuote?.amount).toBe('0.01');
		// …and nothing public moved: no quote was created, every answer is the same string.
		expect(await Quote.count()).toBe(quotesBefore);
		expect(await Quote.count({ where: { amountMinor: 1 } })).toBe(0);
		expectSame(await publicState(pricedSlot.pick.slug, forked.id), before);
		const proposal = await GuidePriceProposal.findOne({ where: { amountMinor: 1 } });
		expect(proposal).toMatchObject({ position: priced + 1, quoteId: null, currency: 'USD' });

		const sent = await draftEdits.submit(author.id, SLUG, saved.draft.version, LINKS);
		if (sent.kind !== 'submitted') throw new Error(JSON.stringify(sent));
		expectSame(await publicState(pricedSlot.pick.slug, forked.id), before);

		// The editor sees the proposal, flagged: 0.01 is far below any positive median
		// (rule: more than 50 % off the 90-day median; common practice, no published source).
		const revisionId = Number(proposal?.revisionId);
		const review = await reviewPage.getReview(editor, revisionId, '127.0.0.1', NOW);
		expect(review?.guide.title).toBe('A rewritten title');
		const listed = review?.priceProposals.find((p) => p.position === priced + 1);
		expect(listed).toMatchObject({ verdict: 'low', amount: expect.stringContaining('0.01') });
		expect(listed?.sampleSize).toBeGreaterThan(0);

		const decided = await reviews.decide(
			editor,
			revisionId,
			decisionInput.parse({ decision: 'approve' }),
			LINKS
		);
		expect(decided.kind).toBe('ok');
		const guide = (await Guide.findOne({ where: { slug: SLUG } })) as Guide;
		expect(guide).toMatchObject({
			title: 'A rewritten title',
			summary: 'A summary nobody approved.',
			disclosure: 'sponsored',
			walkthroughUrl: 'https://walkthrough.example/build',
			tags: ['4k']
		});
		expect(Number(guide.targetBudgetMinor)).toBe(500000);
		const quote = await Quote.findOne({ where: { amountMinor: 1 } });
		expect(quote).toMatchObject({ source: 'author', status: 'active', currency: 'USD' });
		const slot = await GuideSlot.findOne({
			where: { revisionId, position: priced + 1 }
		});
		expect(slot?.priceQuoteId).toBe(quote?.id);
		const after = await publicState(pricedSlot.pick.slug, forked.id);
		expect(after.detail).toContain('A rewritten title');
		expect(after.feed).toContain('<title>A rewritten title</title>');
		const part = await parts.getBySlug(pricedSlot.pick.slug);
		// The approved price is now in the part's public price history (1 minor unit = USD
		// 0.01, observed 2026-12-01; the store's newer quote stays its current price).
		expect(JSON.stringify(part)).toContain(
			'{"observedAt":"2026-12-01T00:00:00.000Z","amountMinor":1}'
		);
	});
});
