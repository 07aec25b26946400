import { z } from 'zod';

/*
 * The one e-mail address schema: every e-mail field in the app (sign-up, sign-in, reset,
 * newsletter, admin) parses through `emailAddress`, and the mailer refuses anything it
 * rejects. docs/security.md §8 lists the attacks it stops: quoted local parts that
 * nodemailer once misrouted, address lists and CR/LF that smuggle extra recipients or
 * headers, and fullwidth @ signs that only become an @ after Unicode normalisation.
 *
 * Order matters. Line breaks and @ look-alikes are judged on the raw input, because NFKC
 * turns U+FF20 into "@" and trimming would hide a trailing CR/LF. Everything else is judged
 * after NFKC, so a fullwidth comma counts as a comma. Every step is a linear regex scan,
 * inputs over 1024 characters stop after the first two, and the shape regexes only ever see
 * at most 254 characters, so a hostile 10k-address list is refused in about a millisecond.
 *
 * Deliberately narrower than RFC 5321/5322: one plain `local@domain.tld`, ASCII after
 * NFKC (no quoted strings, comments, IP literals or UTF-8 mailboxes), so what we store is
 * exactly what every SMTP server and nodemailer will deliver to one mailbox.
 */

/** RFC 5321 §4.5.3.1.3 path limit minus the angle brackets. */
export const EMAIL_MAX_LENGTH = 254;
/** RFC 5321 §4.5.3.1.1. */
const LOCAL_PART_MAX_LENGTH = 64;
/** Room for surrounding whitespace a paste may bring; beyond this no valid address fits. */
const RAW_MAX_LENGTH = 1024;

// CR, LF and the Unicode line breaks NFKC leaves alone (NEL, LINE/PARAGRAPH SEPARATOR).
const LINE_BREAK = /[\r\n\u0085\u2028\u2029]/;
// Separators people use between addresses; any whitespace inside an address means two words.
const LIST_SEPARATOR = /[,;\s]/;
// RFC 5322 atext: a dot-atom local part without quotes or comments.
const LOCAL_PART = /^[A-Za-z0-9!#$%&'*+/=?^_`{|}~-]+(?:\.[A-Za-z0-9!#$%&'*+/=?^_`{|}~-]+)*$/;
// LDH labels of 1–63 characters, at least two labels, a letter-only (or punycode) TLD.
const DOMAIN = /^(?:[a-z0-9](?:[a-z0-9-]{0,61}[a-z0-9])?\.)+(?:[a-z]{2,63}|xn--[a-z0-9-]{1,59})$/;

export const EMAIL_MESSAGES = {
	required: 'Enter your e-mail address.',
	lineBreak: 'An e-mail address cannot contain line breaks.',
	lookalikeAt: 'Use the ordinary @ sign: this address contains a look-alike character instead.',
	list: 'Enter one e-mail address only, without commas, semicolons or spaces.',
	quoted: 'Enter the address without quotation marks.',
	angle: 'Enter only the address itself, without a name or angle brackets.',
	missingAt: 'An e-mail address needs an @, like name@example.com.',
	manyAt: 'An e-mail address has exactly one @.',
	tooLong: `An e-mail address can be at most ${EMAIL_MAX_LENGTH} characters long.`,
	localTooLong: `The part before the @ can be at most ${LOCAL_PART_MAX_LENGTH} characters long.`,
	nonAscii:
		'This address contains characters we cannot send mail to. Use its plain form, like name@example.com.',
	shape: 'Enter a valid e-mail address, like name@example.com.'
} as const;

export type EmailAddressCheck = { ok: true; address: string } | { ok: false; message: string };

const NON_ASCII = /\P{ASCII}/u;
const NON_ASCII_ALL = /\P{ASCII}/gu;

/**
 * Non-ASCII characters that NFKC turns into "@", e.g. U+FF20 "＠" and U+FE6B "﹫".
 * Regex scans, not a per-character loop: an ASCII-only input costs one test, whatever
 * its length.
 */
function hasLookalikeAt(raw: string): boolean {
	if (!NON_ASCII.test(raw)) return false;
	for (const [ch] of raw.matchAll(NON_ASCII_ALL)) {
		if (ch.normalize('NFKC').includes('@')) return true;
	}
	return false;
}

/**
 * Checks and normalises one address: trims, applies NFKC, lower-cases the domain (the
 * local part is case-sensitive in principle, so it is kept as typed). Pure and
 * framework-free, so the mailer and the zod schema share it.
 */
export function checkEmailAddress(raw: string): EmailAddressCheck {
	const fail = (message: string): EmailAddressCheck => ({ ok: false, message });

	if (LINE_BREAK.test(raw)) return fail(EMAIL_MESSAGES.lineBreak);
	// NFKC never turns a long input into a short ASCII address (it only composes or maps
	// one-to-many), so anything this long is refused before the costlier Unicode steps.
	if (raw.length > RAW_MAX_LENGTH) {
		return fail(LIST_SEPARATOR.test(raw.trim()) ? EMAIL_MESSAGES.list : EMAIL_MESSAGES.tooLong);
	}
	if (hasLookalikeAt(raw)) return fail(EMAIL_MESSAGES.lookalikeAt);

	const value = raw.normalize('NFKC').trim();
	if (value === '') return fail(EMAIL_MESSAGES.required);
	// NFKC can produce a line break only from a line break, but stay explicit after it too.
	if (LINE_BREAK.test(value)) return fail(EMAIL_MESSAGES.lineBreak);
	if (value.includes('"')) return fail(EMAIL_MESSAGES.quoted);
	if (LIST_SEPARATOR.test(value)) return fail(EMAIL_MESSAGES.list);
	if (value.includes('<') || value.includes('>')) return fail(EMAIL_MESSAGES.angle);

	const at = value.indexOf('@');
	if (at === -1) return fail(EMAIL_MESSAGES.missingAt);
	if (value.indexOf('@', at + 1) !== -1) return fail(EMAIL_MESSAGES.manyAt);
	if (value.length > EMAIL_MAX_LENGTH) return fail(EMAIL_MESSAGES.tooLong);
	if (/[^\x21-\x7e]/.test(value)) return fail(EMAIL_MESSAGES.nonAscii);

	const local = value.slice(0, at);
	const domain = value.slice(at + 1).toLowerCase();
	if (local.length > LOCAL_PART_MAX_LENGTH) return fail(EMAIL_MESSAGES.localTooLong);
	if (!LOCAL_PART.test(local) || !DOMAIN.test(domain)) return fail(EMAIL_MESSAGES.shape);

	return { ok: true, address: `${local}@${domain}` };
}

/**
 * Every e-mail field in the app. Output is the normalised address; refusals carry a
 * plain-language message for the field.
 */
export const emailAddress = z.string({ error: EMAIL_MESSAGES.required }).transform((raw, ctx) => {
	const result = checkEmailAddress(raw);
	if (result.ok) return result.address;
	ctx.addIssue({ code: 'custom', message: result.message });
	return z.NEVER;
});

export type EmailAddress = z.output<typeof emailAddress>;
