/**
 * The tip e-mails (issue 20): the reader's receipt and the author's notice once a payment is
 * confirmed, and a note to both after a refund. Called by tip-ledger.ts only after the ledger
 * change committed, and only by the call that made the change. Queued in MariaDB's mail queue
 * (mail/queue) under a stable key per tip and kind, so a crash after the payment still
 * delivers them, a repeat queues nothing, and a mail failure never undoes a payment.
 */
import { formatMoney, money } from '$lib/domain/money';
import type { TipStatus } from '$lib/domain/tips';
import { Guide, Tip, User } from '$lib/server/db';
import type { MailTemplate } from '$lib/server/mail';
import { tipTemplates as templates } from '$lib/server/mail';
import { enqueueMessage } from '$lib/server/mail/queue';
import { pokeInlineWorker } from '$lib/server/mail/queue/inline';
import { runLater } from '$lib/server/background';

type TipWithPeople = Tip & { supporter?: User | null; author?: User | null; guide?: Guide | null };

export function mailTipChange(tipId: number, to: TipStatus, origin: string): void {
	if (to !== 'paid' && to !== 'refunded') return;
	runLater('tip-mail', async () => {
		const tip = (await Tip.findByPk(tipId, {
			include: [
				{ model: User, as: 'supporter', attributes: ['id', 'email', 'name', 'disabledAt'] },
				{ model: User, as: 'author', attributes: ['id', 'email', 'name', 'disabledAt'] },
				{ model: Guide, as: 'guide', attributes: ['id', 'title', 'slug'] }
			]
		})) as TipWithPeople | null;
		if (!tip) return;
		const base = {
			amount: formatMoney(money(tip.amountMinor, tip.currency)),
			guideTitle: tip.guide?.title ?? 'a guide that is no longer on Slotwise',
			reference: tip.paymentIntentId ?? tip.checkoutSessionId
		};
		const { supporter, author } = tip;
		if (to === 'paid') {
			if (supporter && !supporter.disabledAt)
				await queue(
					`tip.${tip.id}.receipt`,
					supporter.email,
					templates.tipReceipt({
						...base,
						name: supporter.name ?? '',
						authorName: author?.name ?? 'the author',
						date: (tip.paidAt ?? new Date()).toISOString().slice(0, 10),
						url: `${origin}/tips/thanks?session_id=${encodeURIComponent(tip.checkoutSessionId)}`
					})
				);
			if (author && !author.disabledAt)
				await queue(
					`tip.${tip.id}.received`,
					author.email,
					templates.tipReceived({
						...base,
						name: author.name ?? '',
						supporter: tip.anonymous
							? 'A reader who chose to stay anonymous'
							: (supporter?.name ?? 'A reader'),
						note: tip.noteHiddenAt ? null : tip.note,
						url: `${origin}/my/earnings`
					})
				);
			pokeInlineWorker();
			return;
		}
		for (const person of [supporter, author]) {
			if (!person || person.disabledAt) continue;
			await queue(
				`tip.${tip.id}.refunded.${person === author ? 'author' : 'supporter'}`,
				person.email,
				templates.tipRefunded({ ...base, name: person.name ?? '', forAuthor: person === author })
			);
		}
		pokeInlineWorker();
	});
}

async function queue(key: string, to: string, message: MailTemplate): Promise<void> {
	await enqueueMessage({ to, message, key });
}
