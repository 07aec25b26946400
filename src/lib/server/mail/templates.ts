/*
 * The account e-mails, as plain functions returning { subject, text, html }. Pure: no
 * transport, no env, so tests and the mailer share them.
 *
 * Tone: calm, short, plain language; every message says why the person got it and what
 * to do if it was not them. Subjects are fixed wording, never user input (docs/security.md
 * §8). Names and editor notes go in the body only, escaped for HTML. Links are app-built
 * URLs; anything but http(s) is refused, so a bad call cannot produce a javascript: link.
 */

export interface MailTemplate {
	subject: string;
	text: string;
	html: string;
}

export interface Action {
	label: string;
	url: string;
}

export interface Content {
	subject: string;
	greeting?: string;
	/** Plain-text paragraphs; escaped for HTML. */
	before: string[];
	actions?: Action[];
	after?: string[];
	/** Why the person got this message, and what to do if it was not them. */
	why: string;
}

// Hex copies of the tokens in tailwind.config.ts: mail clients know no CSS variables.
const COLOR = {
	paper: '#FBF8F3',
	surface: '#FFFFFF',
	ink: '#1F2933',
	muted: '#5B6672',
	rule: '#E4DED4',
	teal: '#0E6F6A'
};
const FONT = "Inter, 'Helvetica Neue', Helvetica, Arial, sans-serif";
const SIGNATURE = 'Slotwise · PC build guides you can reproduce';

const HTML_ESCAPES: Record<string, string> = {
	'&': '&amp;',
	'<': '&lt;',
	'>': '&gt;',
	'"': '&quot;',
	"'": '&#39;'
};

export function escapeHtml(value: string): string {
	return value.replace(/[&<>"']/g, (ch) => HTML_ESCAPES[ch] ?? ch);
}

/** The URL in canonical form, or a TypeError for anything that is not absolute http(s). */
function linkUrl(url: string): string {
	let parsed: URL;
	try {
		parsed = new URL(url);
	} catch {
		throw new TypeError('Mail links must be absolute http(s) URLs');
	}
	if (parsed.protocol !== 'https:' && parsed.protocol !== 'http:') {
		throw new TypeError('Mail links must be absolute http(s) URLs');
	}
	return parsed.href;
}

function minutesText(minutes: number): string {
	if (!Number.isInteger(minutes) || minutes < 1) {
		throw new RangeError('minutes must be a positive whole number');
	}
	return minutes === 1 ? '1 minute' : `${minutes} minutes`;
}

/**
 * "Hello Ana," or plain "Hello," when the name is empty or looks like a link or address:
 * sign-up names are typed by whoever fills in the form, which may not be the owner of the
 * mailbox, and a greeting must not carry someone's advert or phishing link.
 */
export function greetingFor(name: string | null | undefined): string {
	const clean = (name ?? '')
		// eslint-disable-next-line no-control-regex
		.replace(/[\u0000-\u001f\u007f-\u009f\u2028\u2029]/g, ' ')
		.replace(/\s+/g, ' ')
		.trim();
	const looksLikeLink = /:\/\/|www\.|@|\w\.[a-z]{2,}/i.test(clean);
	if (!clean || looksLikeLink || clean.length > 60) return 'Hello,';
	return `Hello ${clean},`;
}

function renderText(c: Content): string {
	const blocks: string[] = [];
	if (c.greeting) blocks.push(c.greeting);
	blocks.push(...c.before);
	// Each link on its own line, so every client makes it clickable and it never wraps.
	for (const action of c.actions ?? []) blocks.push(`${action.label}:\n${linkUrl(action.url)}`);
	blocks.push(...(c.after ?? []));
	blocks.push(`-- \n${c.why}\n\n${SIGNATURE}`);
	return `${blocks.join('\n\n')}\n`;
}

const P = `margin:0 0 16px;`;

function paragraphHtml(text: string): string {
	// Line breaks inside a paragraph (an editor's note) survive as <br>.
	return `<p style="${P}">${escapeHtml(text).replace(/\r?\n/g, '<br>')}</p>`;
}

function actionHtml(action: Action): string {
	const href = escapeHtml(linkUrl(action.url));
	return (
		`<p style="${P}"><a href="${href}" style="display:inline-block;padding:10px 16px;border:1px solid ${COLOR.teal};` +
		`border-radius:6px;color:${COLOR.teal};font-weight:600;text-decoration:none;">${escapeHtml(action.label)}</a></p>`
	);
}

function renderHtml(c: Content): string {
	const actions = c.actions ?? [];
	const parts: string[] = [];
	if (c.greeting) parts.push(paragraphHtml(c.greeting));
	parts.push(...c.before.map(paragraphHtml));
	parts.push(...actions.map(actionHtml));
	if (actions.length > 0) {
		const copies = actions
			.map((a) => {
				const href = escapeHtml(linkUrl(a.url));
				return `<a href="${href}" style="color:${COLOR.teal};word-break:break-all;">${href}</a>`;
			})
			.join('<br>');
		parts.push(
			`<p style="${P}font-size:14px;line-height:20px;color:${COLOR.muted};">If the button does not work, ` +
				`copy ${actions.length === 1 ? 'this address' : 'these addresses'} into your browser:<br>${copies}</p>`
		);
	}
	parts.push(...(c.after ?? []).map(paragraphHtml));
	return [
		'<!doctype html>',
		'<html lang="en"><head><meta charset="utf-8">',
		'<meta name="viewport" content="width=device-width, initial-scale=1">',
		`<title>${escapeHtml(c.subject)}</title></head>`,
		`<body style="margin:0;padding:0;background:${COLOR.paper};">`,
		`<div style="max-width:560px;margin:0 auto;padding:24px 16px;font-family:${FONT};font-size:16px;line-height:24px;color:${COLOR.ink};">`,
		`<div style="background:${COLOR.surface};border:1px solid ${COLOR.rule};border-radius:6px;padding:24px;">`,
		`<p style="margin:0 0 20px;font-size:18px;line-height:28px;font-weight:600;">Slotwise</p>`,
		...parts,
		'</div>',
		`<p style="margin:16px 0 0;font-size:14px;line-height:20px;color:${COLOR.muted};">${escapeHtml(c.why)}</p>`,
		`<p style="margin:8px 0 0;font-size:14px;line-height:20px;color:${COLOR.muted};">${escapeHtml(SIGNATURE)}</p>`,
		'</div></body></html>'
	].join('\n');
}

/** One message from its parts, as text and as HTML (shared with tip-templates.ts and newsletter-templates.ts). */
export function render(c: Content): MailTemplate {
	return { subject: c.subject, text: renderText(c), html: renderHtml(c) };
}

/** After sign-up: confirm the address belongs to the person. */
export function verifyEmail({ name, url }: { name: string; url: string }): MailTemplate {
	return render({
		subject: 'Confirm your e-mail address for Slotwise',
		greeting: greetingFor(name),
		before: [
			'Thanks for creating a Slotwise account. Please confirm that this e-mail address is yours, so we can send you sign-in links and password resets.'
		],
		actions: [{ label: 'Confirm my e-mail address', url }],
		why: 'You got this e-mail because someone created a Slotwise account with this address. If it was not you, you can ignore it: the account stays unconfirmed.'
	});
}

/** A one-time sign-in link. */
export function signInLink({ url, minutes }: { url: string; minutes: number }): MailTemplate {
	return render({
		subject: 'Your Slotwise sign-in link',
		greeting: 'Hello,',
		before: [
			`Here is your link to sign in to Slotwise. It works once and expires in ${minutesText(minutes)}.`
		],
		actions: [{ label: 'Sign in to Slotwise', url }],
		why: 'You got this e-mail because someone asked to sign in to Slotwise with this address. If it was not you, ignore it: no one can sign in without this link.'
	});
}

/** A one-time password reset link. */
export function resetPassword({ url, minutes }: { url: string; minutes: number }): MailTemplate {
	return render({
		subject: 'Reset your Slotwise password',
		greeting: 'Hello,',
		before: [
			`Use the link below to choose a new password for your Slotwise account. It works once and expires in ${minutesText(minutes)}.`
		],
		actions: [{ label: 'Choose a new password', url }],
		why: 'You got this e-mail because someone asked to reset the password of the Slotwise account with this address. If it was not you, ignore it: your password stays as it is.'
	});
}

/**
 * Sent instead of a second account when someone signs up with a registered address, so
 * the sign-up form answers the same whether or not the address is known.
 */
export function signUpWithExistingEmail({
	signInUrl,
	resetUrl
}: {
	signInUrl: string;
	resetUrl: string;
}): MailTemplate {
	return render({
		subject: 'You already have a Slotwise account',
		greeting: 'Hello,',
		before: [
			'Someone tried to create a new Slotwise account with this e-mail address, but you already have an account with us.',
			'If it was you, sign in to your existing account, or reset your password if you have forgotten it.'
		],
		actions: [
			{ label: 'Sign in', url: signInUrl },
			{ label: 'Reset my password', url: resetUrl }
		],
		after: ['If it was not you, there is nothing to do: your account has not changed.'],
		why: 'You got this e-mail because this address belongs to a Slotwise account and was entered on the sign-up form.'
	});
}

/** After any password change, so the owner notices a change they did not make. */
export function passwordChanged({ resetUrl }: { resetUrl?: string } = {}): MailTemplate {
	return render({
		subject: 'Your Slotwise password was changed',
		greeting: 'Hello,',
		before: [
			'The password of your Slotwise account was just changed. If you did this, there is nothing else to do.',
			resetUrl
				? 'If you did not, reset your password straight away with the link below.'
				: 'If you did not, reset your password from the Slotwise sign-in page straight away.'
		],
		actions: resetUrl ? [{ label: 'Reset my password', url: resetUrl }] : [],
		why: 'You got this e-mail because the password of the Slotwise account with this address changed. We always tell you when that happens.'
	});
}

/** An editor's decision on a request to become an author. */
export function authorRequestDecision({
	name,
	approved,
	note,
	url
}: {
	name: string;
	approved: boolean;
	note?: string | null;
	url?: string;
}): MailTemplate {
	const trimmedNote = note?.trim();
	return render({
		subject: approved
			? 'Your Slotwise author request was approved'
			: 'About your Slotwise author request',
		greeting: greetingFor(name),
		before: [
			approved
				? 'Good news: an editor approved your request to write guides on Slotwise. You can now start a guide from your account and submit it for review.'
				: 'An editor has looked at your request to write guides on Slotwise and did not approve it this time. You can still read guides, fork them and track your builds as before.',
			...(trimmedNote ? [`Note from the editor:\n${trimmedNote}`] : [])
		],
		actions: url ? [{ label: 'Open Slotwise', url }] : [],
		why: 'You got this e-mail because you asked to become an author on Slotwise.'
	});
}

/** After an administrator disables an account. */
export function accountDisabled({ note }: { note?: string | null } = {}): MailTemplate {
	const trimmedNote = note?.trim();
	return render({
		subject: 'Your Slotwise account has been disabled',
		greeting: 'Hello,',
		before: [
			'An administrator has disabled your Slotwise account, so you can no longer sign in with it.',
			...(trimmedNote ? [`Note from the administrator:\n${trimmedNote}`] : []),
			'If you think this is a mistake, please contact the Slotwise team.'
		],
		why: 'You got this e-mail because it concerns the Slotwise account registered with this address.'
	});
}

/** Sent to the new address: confirming moves the account there. */
export function confirmEmailChange({
	url,
	minutes
}: {
	url: string;
	minutes: number;
}): MailTemplate {
	return render({
		subject: 'Confirm your new e-mail address for Slotwise',
		greeting: 'Hello,',
		before: [
			`Someone asked to move a Slotwise account to this address. Confirm it within ${minutes} minutes and the account signs in with this address from then on.`
		],
		actions: [{ label: 'Confirm my new address', url }],
		why: 'You got this e-mail because this address was entered as the new address of a Slotwise account. If it was not you, ignore it: nothing changes.'
	});
}

/** Sent to the old address, so the owner notices a change they did not ask for. */
export function emailChangeRequested({ resetUrl }: { resetUrl: string }): MailTemplate {
	return render({
		subject: 'Your Slotwise e-mail address is about to change',
		greeting: 'Hello,',
		before: [
			'Someone asked to move your Slotwise account to another e-mail address. It moves only once the new address is confirmed.',
			'If this was not you, reset your password now: that also cancels the move.'
		],
		actions: [{ label: 'Reset my password', url: resetUrl }],
		why: 'You got this e-mail because the Slotwise account with this address asked to change it. We always tell you when that happens.'
	});
}

/** After an author submits a revision: it is in the review queue. */
export function revisionSubmitted({
	name,
	title,
	revision,
	url
}: {
	name: string;
	title: string;
	revision: number;
	url: string;
}): MailTemplate {
	return render({
		subject: 'Your guide is in the review queue',
		greeting: greetingFor(name),
		before: [
			`Revision ${revision} of "${title}" is waiting for an editor. Nothing is public or mailed to subscribers until an editor approves it; a revision that is already live stays up meanwhile.`,
			'You will get an e-mail when an editor decides.'
		],
		actions: [{ label: 'See your guides', url }],
		why: 'You got this e-mail because you submitted a guide revision on Slotwise.'
	});
}

const DECISION_SUBJECTS = {
	approve: 'Your guide revision was approved',
	request_changes: 'An editor asked for changes to your guide',
	decline: 'About your guide revision',
	unpublish: 'Your guide was unpublished',
	archive: 'Your guide was archived'
} as const;

/** An editor's decision on a revision (approve, request changes, decline) or on the guide (unpublish, archive). */
export function reviewDecision({
	name,
	title,
	revision,
	decision,
	note,
	slotNotes = [],
	url
}: {
	name: string;
	title: string;
	revision: number | null;
	decision: keyof typeof DECISION_SUBJECTS;
	note: string | null;
	slotNotes?: { label: string; note: string }[];
	url: string;
}): MailTemplate {
	const which = revision === null ? `"${title}"` : `revision ${revision} of "${title}"`;
	const lead = {
		approve: `An editor approved ${which}. It is now the live version of your guide.`,
		request_changes: `An editor reviewed ${which} and asked for changes before it can go live. Edit the guide and submit it again.`,
		decline: `An editor reviewed ${which} and declined it. The reason is below.`,
		unpublish: `An editor unpublished ${which}: it is no longer public. Edit it and submit it again for review.`,
		archive: `An editor archived ${which}: it is no longer public or editable.`
	}[decision];
	const trimmed = note?.trim();
	return render({
		subject: DECISION_SUBJECTS[decision],
		greeting: greetingFor(name),
		before: [
			lead,
			...(trimmed ? [`Note from the editor:\n${trimmed}`] : []),
			...slotNotes.filter((s) => s.note.trim() !== '').map((s) => `${s.label}:\n${s.note.trim()}`)
		],
		actions: [{ label: decision === 'approve' ? 'See your guides' : 'Open your guides', url }],
		why: 'You got this e-mail because you write guides on Slotwise and an editor decided on one of them.'
	});
}

/** To a build's owner: the guide the build was forked from has a newer published revision. */
export function guideRevisionForBuilds({
	name,
	guideTitle,
	revision,
	builds
}: {
	name: string;
	guideTitle: string;
	revision: number;
	builds: { title: string; url: string }[];
}): MailTemplate {
	const one = builds.length === 1;
	return render({
		subject: 'A guide you built from has a new revision',
		greeting: greetingFor(name),
		before: [
			`Revision ${revision} of "${guideTitle}" is now published.`,
			one
				? `Your build "${builds[0]?.title ?? ''}" is still on the revision you started from. Open it to see what changed and take the changes you want, slot by slot. Nothing changes in your build until you do.`
				: `${builds.length} of your builds started from this guide. Open each one to see what changed and take the changes you want, slot by slot. Nothing changes in your builds until you do.`
		],
		actions: builds.map((b) => ({
			label: one ? 'Open your build' : `Open "${b.title}"`,
			url: b.url
		})),
		after: [
			'To stop these e-mails for a build, open it and turn off the new-revision e-mail in its settings.'
		],
		why: 'You got this e-mail because you have a build on Slotwise that started from this guide.'
	});
}
