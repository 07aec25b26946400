/**
 * Supporters' public notes (issue 20, "Moderation and abuse"): a paid tip's note shows on its
 * guide's page, so it is reportable and hideable like any content. Keyed by the tip's id;
 * only a note the public can see is reportable (paid, not hidden, on a published guide that
 * is not hidden). Hiding sets note_hidden_at: the guide page and mails leave the note out,
 * while the payment itself stays in the ledger untouched.
 */
import { Op } from 'sequelize';
import { Guide, Tip, User } from '$lib/server/db';
import type { SubjectHandler } from './content-report-subjects';
import { wholeSecondNow } from './users';

const ID = /^[1-9][0-9]{0,9}$/;
const EXCERPT_CHARS = 80;

export const tipNoteSubject: SubjectHandler = {
	async lock(id, transaction) {
		if (!ID.test(id)) return false;
		const tip = await Tip.findByPk(Number(id), {
			attributes: ['id'],
			transaction,
			lock: transaction.LOCK.UPDATE
		});
		return tip !== null;
	},

	async findReportable(key, transaction) {
		if (!ID.test(key)) return null;
		const tip = (await Tip.findOne({
			where: { id: Number(key), status: 'paid', noteHiddenAt: null, note: { [Op.ne]: null } },
			attributes: ['id', 'supporterId'],
			include: [
				{
					model: Guide,
					as: 'guide',
					attributes: ['id'],
					required: true,
					where: { state: 'published', hiddenAt: null }
				}
			],
			transaction
		})) as (Tip & { guide?: Guide | null }) | null;
		return tip ? { id: String(tip.id), ownerId: tip.supporterId ?? null } : null;
	},

	async summaries(ids) {
		const rows = (await Tip.findAll({
			where: { id: ids.map(Number) },
			attributes: ['id', 'note', 'anonymous', 'noteHiddenAt', 'noteHiddenReason'],
			include: [
				{ model: User, as: 'supporter', attributes: ['name'] },
				{ model: Guide, as: 'guide', attributes: ['slug', 'title'] }
			]
		})) as (Tip & { supporter?: User | null; guide?: Guide | null })[];
		return new Map(
			rows.map((t) => {
				const note = t.note ?? '';
				const excerpt = note.length > EXCERPT_CHARS ? `${note.slice(0, EXCERPT_CHARS - 1)}…` : note;
				return [
					String(t.id),
					{
						type: 'tip_note' as const,
						id: String(t.id),
						title: `Note on “${t.guide?.title ?? 'a guide'}”: ${excerpt}`,
						url: t.guide ? `/guides/${t.guide.slug}#tip-note-${t.id}` : '/',
						// Editors see who wrote it even when the public sees "Anonymous".
						ownerName: t.supporter?.name ?? null,
						hidden: t.noteHiddenAt
							? { reason: t.noteHiddenReason ?? '', at: t.noteHiddenAt.toISOString() }
							: null
					}
				];
			})
		);
	},

	async hide(id, reason, _actorId, transaction) {
		const [changed] = await Tip.update(
			{ noteHiddenAt: wholeSecondNow(), noteHiddenReason: reason },
			{ where: { id: Number(id), noteHiddenAt: null }, transaction, silent: true }
		);
		if (changed === 1) return 'ok';
		return (await Tip.count({ where: { id: Number(id) }, transaction })) > 0
			? 'already'
			: 'not_found';
	},

	async restore(id, transaction) {
		const tip = await Tip.findByPk(Number(id), {
			attributes: ['id', 'noteHiddenAt', 'noteHiddenReason'],
			transaction,
			lock: transaction.LOCK.UPDATE
		});
		if (!tip) return { kind: 'not_found' };
		const [changed] = await Tip.update(
			{ noteHiddenAt: null, noteHiddenReason: null },
			{ where: { id: tip.id, noteHiddenAt: { [Op.ne]: null } }, transaction, silent: true }
		);
		return changed === 1
			? { kind: 'ok', reason: tip.noteHiddenReason ?? null }
			: { kind: 'not_hidden' };
	}
};
