import { beforeEach, describe, expect, it } from 'vitest';
import { draftInput } from '../../src/lib/schemas/guide-editor';
import { decisionInput } from '../../src/lib/schemas/review';
import { Build, Guide, GuideRevision, User, sequelize } from '../../src/lib/server/db';
import { seedDemoCommunity } from '../../src/lib/server/db/seeders/demo-community';
import { notifyForks } from '../../src/lib/server/services/build-notify';
import * as draftEdits from '../../src/lib/server/services/guide-draft-edits';
import * as drafts from '../../src/lib/server/services/guide-drafts';
import * as reviews from '../../src/lib/server/services/guide-reviews';
import { DEMO_SLUG, demoGuide, forkBuild, newReader } from '../support/buildsync-fixtures';
import { resetDatabase } from '../support/db';
import { listMessages, waitForMessage } from '../support/mailbox';

/*
 * The new-revision e-mail to build owners (services/build-notify.ts), sent through the real
 * SMTP fake after an editor approves a newer revision (services/guide-reviews.ts decide()).
 * Recipients are fresh addresses per test, so the shared mailbox is never cleared.
 */

const ORIGIN = 'http://127.0.0.1:4173';
const LINKS = { guidesUrl: `${ORIGIN}/my/guides` };
const SUBJECT = /^A guide you built from has a new revision$/;

let author: User;
let editor: User;

beforeEach(async () => {
	await resetDatabase();
	await seedDemoCommunity(sequelize);
	author = (await User.findOne({ where: { email: 'author@slotwise.test' } }))!;
	editor = (await User.findOne({ where: { email: 'editor@slotwise.test' } }))!;
});

/** The author submits revision 2 of the demo guide (one slot fewer); returns its id. */
async function submitRevision2(): Promise<number> {
	const view = (await drafts.getDraft(author.id, DEMO_SLUG))!;
	const input = draftInput.parse({
		title: view.title,
		summary: view.summary,
		targetBudget: view.targetBudget,
		baseRegion: view.baseRegion,
		tags: view.tags,
		disclosure: view.disclosure,
		buildNotes: view.buildNotes,
		slots: view.slots.slice(0, -1).map((s) => ({
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
	});
	const saved = await draftEdits.saveDraft(author.id, DEMO_SLUG, input, view.version);
	if (saved.kind !== 'saved') throw new Error(JSON.stringify(saved));
	const sent = await draftEdits.submit(author.id, DEMO_SLUG, saved.draft.version, LINKS);
	if (sent.kind !== 'submitted') throw new Error(sent.kind);
	const guide = (await Guide.findOne({ where: { slug: DEMO_SLUG } }))!;
	return (await GuideRevision.findOne({
		where: { guideId: guide.id, reviewedAt: null },
		order: [['number', 'DESC']]
	}))!.id;
}

describe('new-revision e-mail to build owners', () => {
	it('mails owners who asked for it once per revision, after the approval, with a link to each build', async () => {
		const guide = await demoGuide();
		const keen = await newReader('notify-keen');
		const quiet = await newReader('notify-quiet');
		const first = await forkBuild(keen, guide, { title: 'Living-room box' });
		const second = await forkBuild(keen, guide, { title: 'Spare-parts box' });
		const optedOut = await forkBuild(quiet, guide, { notify: false });
		const revisionId = await submitRevision2();
		const versions = (
			await Build.findAll({ where: { id: [first.id, second.id] }, order: [['id', 'ASC']] })
		).map((b) => b.version);

		const decided = await reviews.decide(
			editor,
			revisionId,
			decisionInput.parse({ decision: 'approve' }),
			LINKS
		);
		expect(decided).toMatchObject({ kind: 'ok', guideState: 'published' });

		const message = await waitForMessage({ to: keen.email, subject: SUBJECT });
		expect(message.text).toContain(
			'Revision 2 of "The steady 1080p starter for about $700" is now published.'
		);
		expect(message.text).toContain(`${ORIGIN}/builds/${first.id}`);
		expect(message.text).toContain(`${ORIGIN}/builds/${second.id}`);
		expect(message.text).toContain('To stop these e-mails for a build');
		// One message for both of the owner's builds; none for the owner who turned it off.
		const all = await listMessages();
		expect(all.filter((m) => m.to.includes(keen.email))).toHaveLength(1);
		expect(all.filter((m) => m.to.includes(quiet.email))).toHaveLength(0);

		const after = await Build.findAll({
			where: { id: [first.id, second.id, optedOut.id] },
			order: [['id', 'ASC']]
		});
		expect(after.map((b) => b.lastNotifiedRevisionId)).toEqual([revisionId, revisionId, null]);
		// Marking a build notified is not an edit: the owner's open tab stays current.
		expect(after.slice(0, 2).map((b) => b.version)).toEqual(versions);

		// Asking again for the same revision sends nothing more.
		expect(await notifyForks(guide.id, revisionId, ORIGIN)).toEqual({
			mailed: 0,
			failed: 0,
			builds: 0
		});
		expect((await listMessages()).filter((m) => m.to.includes(keen.email))).toHaveLength(1);
	});

	it('never throws: a refused address is logged and the build stays un-notified', async () => {
		const guide = await demoGuide();
		const owner = await newReader('notify-bad');
		const build = await forkBuild(owner, guide);
		// An address the app-wide e-mail schema refuses (mail.send throws before any connection).
		await User.update({ email: 'not an address' }, { where: { id: owner.id } });
		const revisionId = await submitRevision2();
		const decided = await reviews.decide(
			editor,
			revisionId,
			decisionInput.parse({ decision: 'approve' }),
			LINKS
		);
		expect(decided.kind).toBe('ok');
		expect(await notifyForks(guide.id, revisionId, ORIGIN)).toEqual({
			mailed: 0,
			failed: 1,
			builds: 0
		});
		expect((await Build.findByPk(build.id))?.lastNotifiedRevisionId).toBeNull();
	});
});
