import { z } from 'zod';
import { HANDLE_PATTERN } from '$lib/domain/handles';
import { NOTICE_KINDS, type NoticeKind } from '$lib/domain/notice-kinds';

/*
 * Author pages, following and notices: the handle in /authors/[handle], the notice page's
 * forms and the per-kind notice settings on the account page. Every object is strict.
 */

export const authorHandle = z.string().regex(HANDLE_PATTERN, 'No such author.');

/** Follow and unfollow post nothing but the button. */
export const followInput = z.strictObject({});

export const noticeIdInput = z.strictObject({
	id: z.coerce.number().int().positive().max(4_294_967_295)
});

export const noticePageQuery = z.coerce.number().int().min(1).max(100_000).catch(1);

const tickBox = z.literal('on', { error: 'A ticked box posts "on".' }).optional();

/**
 * Checkboxes named `<kind>.inApp` / `<kind>.email`; an unticked box posts nothing. Strict, so
 * any other field (a hostile `__proto__` included) is refused rather than read as "all off".
 */
export const noticeSettingsInput = z
	.strictObject(
		Object.fromEntries(
			NOTICE_KINDS.flatMap((kind) => [
				[`${kind}.inApp`, tickBox],
				[`${kind}.email`, tickBox]
			])
		) as Record<string, typeof tickBox>,
		{ error: 'Unknown notice setting.' }
	)
	.transform(
		(fields) =>
			Object.fromEntries(
				NOTICE_KINDS.map((kind) => [
					kind,
					{ inApp: fields[`${kind}.inApp`] === 'on', email: fields[`${kind}.email`] === 'on' }
				])
			) as Record<NoticeKind, { inApp: boolean; email: boolean }>
	);
