/**
 * Content reports: signed-in people report a guide, build or photo with a reason; editors
 * dismiss the reports, hide the content (its owner still sees it, with the reason) or
 * restore it. The only module that writes content reports; the hidden columns of guides and
 * builds are written through the subject handlers (content-report-subjects.ts), the queue is
 * read in content-report-queue.ts. Every decision writes its audit event in the same
 * transaction.
 *
 * Concurrency: one open report per reporter and subject is guaranteed by a unique index
 * (see the migration); decisions lock the item's row first and then make conditional updates (`WHERE state = 'open'`,
 * `WHERE hidden_at IS NULL`), so of two editors deciding at once one wins and the other is
 * told the reports were already decided.
 */
import { UniqueConstraintError } from 'sequelize';
import type { Transaction } from 'sequelize';
import { REPORT_SUBJECT_NOUNS } from '$lib/domain/content-reports';
import type { ReportCategory, ReportSubjectType } from '$lib/domain/content-reports';
import { ContentReport, sequelize } from '$lib/server/db';
import * as audit from './audit';
import { bumpGuideViews } from './cache-generations';
import { handlerFor } from './content-report-subjects';
import { wholeSecondNow } from './users';
import type { Outcome } from './users';

/**
 * Files a report by `reporterId` on the item of `subjectType` with public key `key` (a
 * guide's slug, a build's id; `access.shareToken` is an unlisted build's link token). A
 * second report while the reporter's first is still open is answered with `created: false`
 * and changes nothing.
 */
export async function report(
	reporterId: string,
	subjectType: ReportSubjectType,
	key: string,
	input: { category: ReportCategory; detail: string },
	access: { shareToken?: string } = {}
): Promise<Outcome<{ created: boolean; reportId: number }>> {
	const handler = handlerFor(subjectType);
	if ('kind' in handler) return handler;
	let subjectId: string | null = null;
	try {
		return await sequelize.transaction(async (transaction) => {
			const subject = await handler.findReportable(key, transaction, {
				id: reporterId,
				shareToken: access.shareToken
			});
			if (!subject) return { kind: 'not_found' } as const;
			subjectId = subject.id;
			if (subject.ownerId === reporterId) {
				return {
					kind: 'conflict',
					message: 'This is your own content: edit it instead of reporting it.'
				} as const;
			}
			const open = await ContentReport.findOne({
				where: { reporterId, subjectType, subjectId: subject.id, state: 'open' },
				attributes: ['id'],
				transaction
			});
			if (open) return { kind: 'ok', created: false, reportId: open.id } as const;
			const row = await ContentReport.create(
				{
					reporterId,
					subjectType,
					subjectId: subject.id,
					category: input.category,
					detail: input.detail
				},
				{ transaction }
			);
			return { kind: 'ok', created: true, reportId: row.id } as const;
		});
	} catch (error) {
		// Two submits at the same moment: the unique index lets one in; the other is the repeat.
		if (error instanceof UniqueConstraintError && subjectId !== null) {
			const open = await ContentReport.findOne({
				where: { reporterId, subjectType, subjectId, state: 'open' }
			});
			if (open) return { kind: 'ok', created: false, reportId: open.id };
		}
		throw error;
	}
}

/** Closes every open report on `subject` with `state`; returns their ids. */
async function closeOpenReports(
	subject: { type: ReportSubjectType; id: string },
	state: 'dismissed' | 'actioned',
	actorId: string,
	transaction: Transaction
): Promise<number[]> {
	const open = await ContentReport.findAll({
		where: { subjectType: subject.type, subjectId: subject.id, state: 'open' },
		attributes: ['id'],
		transaction,
		lock: transaction.LOCK.UPDATE
	});
	if (open.length === 0) return [];
	const ids = open.map((r) => r.id);
	// Conditional on state = 'open': a report decided meanwhile is left as it was.
	const [changed] = await ContentReport.update(
		{ state, openMarker: null, decidedById: actorId, decidedAt: wholeSecondNow() },
		{ where: { id: ids, state: 'open' }, transaction }
	);
	return changed === ids.length ? ids : ids.slice(0, changed);
}

/** Dismisses the open reports on an item (no action on the content). */
export async function dismiss(
	actorId: string,
	subject: { type: ReportSubjectType; id: string }
): Promise<Outcome<{ dismissed: number }>> {
	const handler = handlerFor(subject.type);
	if ('kind' in handler) return handler;
	return sequelize.transaction(async (transaction) => {
		if (!(await handler.lock(subject.id, transaction))) return { kind: 'not_found' } as const;
		const ids = await closeOpenReports(subject, 'dismissed', actorId, transaction);
		if (ids.length === 0) {
			return {
				kind: 'conflict',
				message: 'These reports were already decided (perhaps by another editor).'
			} as const;
		}
		await audit.record(
			{
				actorId,
				action: 'content_report.dismissed',
				subjectType: subject.type,
				subjectId: subject.id,
				before: { openReports: ids.length, reportIds: ids },
				after: { state: 'dismissed' }
			},
			transaction
		);
		return { kind: 'ok', dismissed: ids.length } as const;
	});
}

/**
 * Hides an item: the public no longer sees it; its owner (and editors) still do, with
 * `reason`. Open reports on it are closed as actioned.
 */
export async function hide(
	actorId: string,
	subject: { type: ReportSubjectType; id: string },
	reason: string
): Promise<Outcome<{ closedReports: number }>> {
	const handler = handlerFor(subject.type);
	if ('kind' in handler) return handler;
	const outcome = await sequelize.transaction(async (transaction) => {
		if (!(await handler.lock(subject.id, transaction))) return { kind: 'not_found' } as const;
		const hidden = await handler.hide(subject.id, reason, actorId, transaction);
		if (hidden === 'not_found') return { kind: 'not_found' } as const;
		if (hidden === 'already') {
			return {
				kind: 'conflict',
				message: `This ${REPORT_SUBJECT_NOUNS[subject.type]} is already hidden (perhaps by another editor).`
			} as const;
		}
		const ids = await closeOpenReports(subject, 'actioned', actorId, transaction);
		await audit.record(
			{
				actorId,
				action: `${subject.type}.hidden`,
				subjectType: subject.type,
				subjectId: subject.id,
				before: { hidden: false },
				after: { hidden: true, hiddenReason: reason, reportsClosed: ids.length }
			},
			transaction
		);
		return { kind: 'ok', closedReports: ids.length } as const;
	});
	await visibilityChanged(outcome);
	return outcome;
}

/** Shows a hidden item again. Reports closed by hiding it stay closed. */
export async function restore(
	actorId: string,
	subject: { type: ReportSubjectType; id: string }
): Promise<Outcome> {
	const handler = handlerFor(subject.type);
	if ('kind' in handler) return handler;
	const outcome = await sequelize.transaction(async (transaction) => {
		if (!(await handler.lock(subject.id, transaction))) return { kind: 'not_found' } as const;
		const restored = await handler.restore(subject.id, transaction);
		if (restored.kind === 'not_found') return { kind: 'not_found' } as const;
		if (restored.kind === 'not_hidden') {
			return {
				kind: 'conflict',
				message: `This ${REPORT_SUBJECT_NOUNS[subject.type]} is not hidden (perhaps another editor restored it).`
			} as const;
		}
		await audit.record(
			{
				actorId,
				action: `${subject.type}.restored`,
				subjectType: subject.type,
				subjectId: subject.id,
				before: { hidden: true, hiddenReason: restored.reason },
				after: { hidden: false }
			},
			transaction
		);
		return { kind: 'ok' } as const;
	});
	await visibilityChanged(outcome);
	return outcome;
}

/**
 * A hidden or restored guide, build, photo or note changes what guide pages show (a guide's
 * forks, gallery and notes): after commit, cached guide views and their ETags move on in
 * every process (cache-generations.ts).
 */
async function visibilityChanged(outcome: { kind: string }): Promise<void> {
	if (outcome.kind === 'ok') await bumpGuideViews();
}
