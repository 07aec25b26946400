/**
 * The review e-mails to a guide's author. Sent after the change commits: a decision
 * stands whether or not the message goes out, and the caller tells the editor when it did not.
 */
import * as mail from '$lib/server/mail';
import { templates } from '$lib/server/mail';
import type { MailTemplate } from '$lib/server/mail';

export interface Recipient {
	email: string;
	name: string | null;
}

export async function sendToAuthor(
	recipient: Recipient | null,
	message: MailTemplate,
	kind: string
): Promise<boolean> {
	if (!recipient) return false;
	try {
		await mail.send(recipient.email, message);
		return true;
	} catch (error) {
		// The address stays out of the log (personal data); the reason is enough to act on.
		console.error(
			JSON.stringify({
				t: new Date().toISOString(),
				kind: 'mail_failed',
				mail: kind,
				error: error instanceof Error ? { name: error.name, message: error.message } : String(error)
			})
		);
		return false;
	}
}

export function submittedMail(
	recipient: Recipient,
	title: string,
	revision: number,
	url: string
): MailTemplate {
	return templates.revisionSubmitted({ name: recipient.name ?? '', title, revision, url });
}

export { templates };
