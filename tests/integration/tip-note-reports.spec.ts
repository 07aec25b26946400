import { beforeAll, describe, expect, it } from 'vitest';
import { AuditEvent, Guide, Tip, User, sequelize } from '../../src/lib/server/db';
import { seeder } from '../../src/lib/server/db/seeders';
import * as contentReports from '../../src/lib/server/services/content-reports';
import * as reportQueue from '../../src/lib/server/services/content-report-queue';
import * as tips from '../../src/lib/server/services/tips';
import { resetDatabase } from '../support/db';

/*
 * A supporter's public note on a guide goes through the same report / hide / restore path as
 * any content (issue 20, "Moderation and abuse"). Product rules, no published source needed.
 * Failed before tip notes had a subject handler: report() answered not_found for 'tip_note'.
 */
const SLUG = 'steady-1080p-starter'; // the demo author's guide
const input = { category: 'offensive' as const, detail: 'The note insults another reader.' };
const REASON = 'Abusive wording about another reader.';

let reader: User;
let editor: User;
let supporter: User;
let guide: Guide;

async function user(email: string): Promise<User> {
	const found = await User.findOne({ where: { email } });
	if (!found) throw new Error(`demo user ${email} missing`);
	return found;
}

async function paidTip(note: string | null, status: Tip['status'] = 'paid'): Promise<Tip> {
	return Tip.create({
		supporterId: supporter.id,
		authorId: guide.authorId,
		guideId: guide.id,
		amountMinor: 500,
		currency: 'EUR',
		status,
		checkoutSessionId: `cs_test_${Date.now()}_${Math.random().toString(36).slice(2)}`,
		note,
		anonymous: false,
		paidAt: status === 'paid' ? new Date('2026-12-01T10:00:00Z') : null
	});
}

async function notesOnPage(): Promise<string[]> {
	return (await tips.publicNotes(guide.id)).map((n) => n.note);
}

describe('reports on supporters’ notes', () => {
	beforeAll(async () => {
		await resetDatabase();
		await seeder(sequelize).up();
		reader = await user('reader@slotwise.test');
		editor = await user('editor@slotwise.test');
		supporter = await user('admin@slotwise.test');
		guide = (await Guide.findOne({ where: { slug: SLUG } })) as Guide;
	});

	it('files, queues, hides and restores a note; the payment itself stays', async () => {
		const tip = await paidTip('Thanks, you clown.');
		expect(await notesOnPage()).toContain('Thanks, you clown.');

		const filed = await contentReports.report(reader.id, 'tip_note', String(tip.id), input);
		expect(filed).toMatchObject({ kind: 'ok', created: true });

		const queue = await reportQueue.listQueue({ state: 'open', page: 1 });
		const group = queue.items.find((g) => g.subject.type === 'tip_note');
		expect(group?.subject).toMatchObject({
			id: String(tip.id),
			title: `Note on “${guide.title}”: Thanks, you clown.`,
			url: `/guides/${SLUG}#tip-note-${tip.id}`,
			hidden: null
		});
		expect(group?.reportCount).toBe(1);

		const hidden = await contentReports.hide(
			editor.id,
			{ type: 'tip_note', id: String(tip.id) },
			REASON
		);
		expect(hidden).toMatchObject({ kind: 'ok', closedReports: 1 });
		expect(await notesOnPage()).not.toContain('Thanks, you clown.');
		const after = (await Tip.findByPk(tip.id)) as Tip;
		expect(after).toMatchObject({ status: 'paid', noteHiddenReason: REASON });
		expect(Number(after.amountMinor)).toBe(500);
		// A hidden note is no longer reportable, by anyone.
		expect(await contentReports.report(editor.id, 'tip_note', String(tip.id), input)).toEqual({
			kind: 'not_found'
		});

		expect(
			await contentReports.restore(editor.id, { type: 'tip_note', id: String(tip.id) })
		).toMatchObject({
			kind: 'ok'
		});
		expect(await notesOnPage()).toContain('Thanks, you clown.');
		const actions = (
			await AuditEvent.findAll({ where: { subjectType: 'tip_note' }, order: [['id', 'ASC']] })
		).map((e) => e.action);
		expect(actions).toEqual(['tip_note.hidden', 'tip_note.restored']);
	});

	it('refuses the writer’s own note, unpaid tips, tips without a note and bad keys', async () => {
		const own = await paidTip('My own words.');
		expect(
			await contentReports.report(supporter.id, 'tip_note', String(own.id), input)
		).toMatchObject({ kind: 'conflict' });
		const pending = await paidTip('Not paid yet.', 'pending');
		const silent = await paidTip(null);
		for (const key of [String(pending.id), String(silent.id), '0', 'abc', '99999999'])
			expect(await contentReports.report(reader.id, 'tip_note', key, input)).toEqual({
				kind: 'not_found'
			});
	});
});
