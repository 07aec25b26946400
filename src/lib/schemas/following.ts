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

/** The notice form's hidden field: proof that the form, not some other body, was posted. */
export const NOTICE_FORM_MARKER = { name: 'form', value: 'notice-settings' } as const;

/**
 * Checkboxes named `<kind>.inApp` / `<kind>.email`; an unticked box posts nothing, so a body
 * with no box at all means "everything off". The required marker keeps a stray body (empty,
 * or only unknown fields) from being read that way; strict, so unknown fields are refused.
 */
export const noticeSettingsInput = z
	.strictObject(
		{
			[NOTICE_FORM_MARKER.name]: z.literal(NOTICE_FORM_MARKER.value, {
				error: 'Send the notice settings from their form.'
			}),
			...(Object.fromEntries(
				NOTICE_KINDS.flatMap((kind) => [
					[`${kind}.inApp`, tickBox],
					[`${kind}.email`, tickBox]
				])
			) as Record<string, typeof tickBox>)
		},
		{ error: 'Unknown notice setting.' }
	)
	.transform(
		(fields: Record<string, string | undefined>) =>
			Object.fromEntries(
				NOTICE_KINDS.map((kind) => [
					kind,
					{ inApp: fields[`${kind}.inApp`] === 'on', email: fields[`${kind}.email`] === 'on' }
				])
			) as Record<NoticeKind, { inApp: boolean; email: boolean }>
	);
