/*
 * After a crash, a job can be left `sending`: the worker died somewhere between claiming it
 * and recording the server's answer. If it died before the server took the whole message,
 * nothing was delivered; if after, the message was delivered and only our record is
 * missing. SMTP itself has no way to ask which. So the queue never resends such a job
 * blindly: it asks a delivery check by the job's fixed Message-ID.
 *
 * The check is an HTTP lookup, GET <base>/deliveries/<Message-ID> → { "count": n }. The local
 * SMTP fake answers it (scripts/smtp-fake.ts); a production relay with a message-log API
 * can be put behind the same small interface with MAIL_DELIVERY_CHECK_URL. Without a check,
 * such jobs become `in_doubt`: never sent twice, shown to the editor, who decides.
 */

export type DeliveryAnswer = 'delivered' | 'absent';
export type DeliveryCheck = (messageId: string) => Promise<DeliveryAnswer>;

export function httpDeliveryCheck(baseUrl: string, timeoutMs = 5_000): DeliveryCheck {
	const base = baseUrl.replace(/\/+$/, '');
	return async (messageId) => {
		const response = await fetch(`${base}/deliveries/${encodeURIComponent(messageId)}`, {
			signal: AbortSignal.timeout(timeoutMs)
		});
		if (!response.ok) throw new Error(`delivery check answered ${response.status}`);
		const body = (await response.json()) as { count?: unknown };
		if (typeof body.count !== 'number') throw new Error('delivery check gave no count');
		return body.count > 0 ? 'delivered' : 'absent';
	};
}

/** MAIL_DELIVERY_CHECK_URL, else the local fake's mailbox (MAILBOX_URL) when it is in use, else none. */
export function deliveryCheckFromEnv(env: NodeJS.ProcessEnv = process.env): DeliveryCheck | null {
	if (env.MAIL_DELIVERY_CHECK === 'off') return null;
	const url = env.MAIL_DELIVERY_CHECK_URL || env.MAILBOX_URL;
	return url ? httpDeliveryCheck(url) : null;
}
