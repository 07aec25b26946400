/*
 * Signed newsletter links: confirm (double opt-in), manage (preferences) and unsubscribe.
 * Relative imports and plain process.env only, so scripts and the bench can sign too.
 *
 * A token is `<purpose>.<subscriber id>.<link version>.<expiry>[.<nonce>].<signature>`, the
 * numbers in base 36 and the signature an HMAC-SHA256 over everything before it, keyed with
 * NEWSLETTER_SECRET or, when that is unset, a key derived from AUTH_SECRET with HKDF (so the
 * session secret itself never signs anything else). Checking a token needs no database:
 * a forged or expired one is refused before any query. The database then decides the rest:
 * a confirm token must match the stored SHA-256 of the last one issued (single use, and a
 * newer link replaces an older one); manage and unsubscribe tokens must carry the
 * subscriber's current link version, which is bumped to revoke every link sent so far.
 */
import { createHash, createHmac, hkdfSync, randomBytes, timingSafeEqual } from 'node:crypto';

export type LinkPurpose = 'confirm' | 'manage' | 'unsubscribe';

const CODES: Record<LinkPurpose, string> = { confirm: 'c', manage: 'm', unsubscribe: 'u' };

/** Confirmation links expire after 48 hours (common practice, no published source). */
export const CONFIRM_LINK_HOURS = 48;
/**
 * Manage and unsubscribe links work for 90 days: long enough for a mailing read weeks later
 * (RFC 8058 asks only that one-click works; the providers' bulk-sender rules want it
 * honoured within 2 days, docs/sources.md 12); an older link leads to a page that mails a fresh one.
 */
export const MANAGE_LINK_DAYS = 90;

const HOUR_S = 3600;
const DAY_S = 86_400;

let cachedKey: { from: string; key: Buffer } | null = null;

function signingKey(env: NodeJS.ProcessEnv = process.env): Buffer {
	const own = env.NEWSLETTER_SECRET ?? '';
	const auth = env.AUTH_SECRET ?? '';
	const from = own.length >= 32 ? `own:${own}` : auth.length >= 32 ? `auth:${auth}` : '';
	if (!from)
		throw new Error(
			'Newsletter links need NEWSLETTER_SECRET or AUTH_SECRET (at least 32 characters).'
		);
	if (cachedKey?.from !== from) {
		const key =
			own.length >= 32
				? Buffer.from(own, 'utf8')
				: Buffer.from(hkdfSync('sha256', auth, '', 'slotwise newsletter links v1', 32));
		cachedKey = { from, key };
	}
	return cachedKey.key;
}

function sign(body: string): string {
	return createHmac('sha256', signingKey()).update(body).digest('base64url');
}

export interface IssuedLink {
	token: string;
	/** SHA-256 of the token (hex): what the database keeps for confirm links. */
	hash: string;
	expiresAt: Date;
}

export function tokenHash(token: string): string {
	return createHash('sha256').update(token).digest('hex');
}

/** A signed token for one subscriber. Confirm tokens get a random nonce so each is unique. */
export function issueLink(
	purpose: LinkPurpose,
	subscriberId: number,
	linkVersion: number,
	now: Date = new Date()
): IssuedLink {
	const lifetime = purpose === 'confirm' ? CONFIRM_LINK_HOURS * HOUR_S : MANAGE_LINK_DAYS * DAY_S;
	const expiresS = Math.floor(now.getTime() / 1000) + lifetime;
	const parts = [
		CODES[purpose],
		subscriberId.toString(36),
		linkVersion.toString(36),
		expiresS.toString(36)
	];
	if (purpose === 'confirm') parts.push(randomBytes(16).toString('base64url'));
	const body = parts.join('.');
	const token = `${body}.${sign(body)}`;
	return { token, hash: tokenHash(token), expiresAt: new Date(expiresS * 1000) };
}

export type LinkCheck =
	| { ok: true; subscriberId: number; linkVersion: number }
	| { ok: false; reason: 'malformed' | 'forged' | 'expired' };

const SHAPE =
	/^([cmu])\.([0-9a-z]{1,10})\.([0-9a-z]{1,7})\.([0-9a-z]{1,10})(\.[A-Za-z0-9_-]{22})?\.([A-Za-z0-9_-]{43})$/;

/** Checks shape, purpose, signature and expiry, in that order; no database involved. */
export function checkLink(
	purpose: LinkPurpose,
	token: string | null | undefined,
	now: Date = new Date()
): LinkCheck {
	if (typeof token !== 'string' || token.length > 200) return { ok: false, reason: 'malformed' };
	const m = SHAPE.exec(token);
	if (!m || m[1] !== CODES[purpose]) return { ok: false, reason: 'malformed' };
	if ((purpose === 'confirm') !== (m[5] !== undefined)) return { ok: false, reason: 'malformed' };
	const body = token.slice(0, token.length - 44);
	const expected = Buffer.from(sign(body), 'base64url');
	const given = Buffer.from(m[6] ?? '', 'base64url');
	if (given.length !== expected.length || !timingSafeEqual(given, expected))
		return { ok: false, reason: 'forged' };
	const subscriberId = parseInt(m[2] ?? '', 36);
	const linkVersion = parseInt(m[3] ?? '', 36);
	const expiresS = parseInt(m[4] ?? '', 36);
	if (!Number.isSafeInteger(subscriberId) || !Number.isSafeInteger(linkVersion))
		return { ok: false, reason: 'malformed' };
	if (expiresS * 1000 <= now.getTime()) return { ok: false, reason: 'expired' };
	return { ok: true, subscriberId, linkVersion };
}

/** The absolute URL of a newsletter page carrying a token. */
export function linkUrl(
	origin: string,
	path: '/newsletter/confirm' | '/newsletter/manage' | '/newsletter/unsubscribe',
	token: string
): string {
	const url = new URL(path, origin);
	url.searchParams.set('token', token);
	return url.href;
}
