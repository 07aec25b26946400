/**
 * What the tip ledger adds up to (issue 20): an author's earnings per guide, month and
 * currency with totals per currency, the same as CSV, and the admins' list of payments.
 * Only `paid` rows count as earnings: a refunded tip leaves the totals, a pending or failed
 * one never enters them. Sums are done in domain/tips.ts on integer minor units.
 */
import { stringify } from 'csv-stringify/sync';
import { formatMoney, money } from '$lib/domain/money';
import {
	majorText,
	summarizeEarnings,
	type EarningsRow,
	type EarningsTotal
} from '$lib/domain/tips';
import type { TipStatus } from '$lib/domain/tips';
import { Guide, Tip, User } from '$lib/server/db';
import { neutraliseCell } from '$lib/server/csv-cells';
import { pageWindow } from './list-query';

type TipRow = Tip & { guide?: Guide | null; supporter?: User | null; author?: User | null };

export interface Earnings {
	rows: EarningsRow[];
	totals: EarningsTotal[];
	/** Paid amount per month and currency, oldest month first, for the chart. */
	months: { month: string; currency: string; amountMinor: number; label: string }[];
	refundedCount: number;
}

async function paidTips(authorId: string): Promise<TipRow[]> {
	return (await Tip.findAll({
		where: { authorId, status: 'paid' },
		include: [{ model: Guide, as: 'guide', attributes: ['title'] }],
		order: [['paidAt', 'ASC']]
	})) as TipRow[];
}

export async function earnings(authorId: string): Promise<Earnings> {
	const tips = await paidTips(authorId);
	const { rows, totals } = summarizeEarnings(
		tips.map((t) => ({
			guideTitle: t.guide?.title ?? '(guide removed)',
			paidAt: t.paidAt ?? t.updatedAt,
			amount: money(t.amountMinor, t.currency),
			fee: t.feeMinor === null ? null : money(t.feeMinor, t.currency)
		}))
	);
	const byMonth = new Map<string, { month: string; currency: string; amountMinor: number }>();
	for (const row of rows) {
		const key = `${row.month} ${row.currency}`;
		const entry = byMonth.get(key) ?? { month: row.month, currency: row.currency, amountMinor: 0 };
		entry.amountMinor += row.gross.amountMinor;
		byMonth.set(key, entry);
	}
	const months = [...byMonth.values()]
		.sort((a, b) => a.month.localeCompare(b.month) || a.currency.localeCompare(b.currency))
		.map((m) => ({ ...m, label: formatMoney(money(m.amountMinor, m.currency)) }));
	const refundedCount = await Tip.count({ where: { authorId, status: 'refunded' } });
	return { rows, totals, months, refundedCount };
}

/** Every paid tip of the author, one line each, amounts as decimal text in major units. */
export async function earningsCsv(authorId: string): Promise<string> {
	const tips = (await Tip.findAll({
		where: { authorId, status: ['paid', 'refunded'] },
		include: [
			{ model: Guide, as: 'guide', attributes: ['title'] },
			{ model: User, as: 'supporter', attributes: ['name'] }
		],
		order: [
			['paidAt', 'ASC'],
			['id', 'ASC']
		]
	})) as TipRow[];
	const major = (minor: number | null, currency: string) =>
		minor === null ? '' : majorText(money(minor, currency));
	const lines = tips.map((t) => [
		t.id,
		(t.paidAt ?? t.updatedAt).toISOString().slice(0, 10),
		neutraliseCell(t.guide?.title ?? '(guide removed)'),
		neutraliseCell(t.anonymous ? 'Anonymous' : (t.supporter?.name ?? 'A reader')),
		t.currency,
		major(t.amountMinor, t.currency),
		major(t.feeMinor, t.currency),
		t.status
	]);
	return stringify([
		['tip', 'paid_on', 'guide', 'from', 'currency', 'amount', 'fee', 'status'],
		...lines
	]);
}

export interface AdminTip {
	id: number;
	createdAt: string;
	status: TipStatus;
	amount: string;
	fee: string | null;
	guideTitle: string;
	supporter: string;
	author: string;
	reference: string;
}

export const ADMIN_TIPS_PER_PAGE = 50;

/** All tips, newest first, for admins (refunds). */
export async function listForAdmin(page: number) {
	const total = await Tip.count();
	const window = pageWindow(total, page, ADMIN_TIPS_PER_PAGE);
	const tips = (await Tip.findAll({
		include: [
			{ model: Guide, as: 'guide', attributes: ['title'] },
			{ model: User, as: 'supporter', attributes: ['email'] },
			{ model: User, as: 'author', attributes: ['email'] }
		],
		order: [['id', 'DESC']],
		limit: ADMIN_TIPS_PER_PAGE,
		offset: window.offset
	})) as TipRow[];
	const items: AdminTip[] = tips.map((t) => ({
		id: t.id,
		createdAt: t.createdAt.toISOString(),
		status: t.status,
		amount: formatMoney(money(t.amountMinor, t.currency)),
		fee: t.feeMinor === null ? null : formatMoney(money(t.feeMinor, t.currency)),
		guideTitle: t.guide?.title ?? '(guide removed)',
		supporter: t.supporter?.email ?? '(account removed)',
		author: t.author?.email ?? '(account removed)',
		reference: t.paymentIntentId ?? t.checkoutSessionId
	}));
	return { items, total, page: window.page, pageCount: window.pageCount };
}
