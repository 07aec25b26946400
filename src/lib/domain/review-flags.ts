/**
 * Automatic flags on a revision waiting for review: things an editor should look at
 * before approving. Flags never decide; they point. Pure: plain input, plain output.
 *
 * - disclosure: none stated, a paid relationship declared without saying what it covers,
 *   or "none" declared while the text or links look sponsored or affiliate.
 * - unknown_link: a link (build notes, walkthrough, quotes) to a host outside the known
 *   stores and the site itself.
 * - stale_quote: an author's quote older than 30 days at review time (the review rule in
 *   issue 6; common practice for shelf prices, no published source).
 * - fit_conflict: a conflict in the revision's fit report.
 */

export const STALE_QUOTE_DAYS = 30;

export type FlagKind = 'disclosure' | 'unknown_link' | 'stale_quote' | 'fit_conflict';

export interface ReviewFlag {
	kind: FlagKind;
	message: string;
}

export interface ReviewFlagInput {
	disclosure: { kind: 'none' | 'sponsored' | 'affiliate' | null; note: string | null };
	buildNotesMd: string;
	walkthroughUrl: string | null;
	/** Hosts links may point at without a flag: the stores' hosts and the site's own. */
	knownHosts: readonly string[];
	quotes: readonly { slotLabel: string; observedAt: string; url: string | null }[];
	conflicts: readonly { message: string }[];
	now: Date;
}

const DAY_MS = 86_400_000;

// Query keys and words that usually mean a paid link or placement. A heuristic: the editor decides.
const AFFILIATE_QUERY_KEYS =
	/^(ref|referral|aff|affid|affiliate|affiliate_id|partner|tag|clickid|subid)$/i;
const PAID_WORDS =
	/\b(sponsored|sponsor(ed)? by|affiliate|commission|provided (to me )?by the (brand|maker|manufacturer)|paid partnership)\b/i;

/** Every http(s) URL in Markdown text: inline links, autolinks and bare addresses. */
export function linksIn(markdown: string): string[] {
	const found = markdown.match(/https?:\/\/[^\s<>()"'\]]+/gi) ?? [];
	// Trailing sentence punctuation is not part of an address.
	return found.map((u) => u.replace(/[.,;:!?]+$/, ''));
}

function hostOf(url: string): string | null {
	try {
		return new URL(url).hostname.toLowerCase();
	} catch {
		return null;
	}
}

/** True when `host` is a known host or a subdomain of one (shop.example.test under example.test). */
export function isKnownHost(host: string, knownHosts: readonly string[]): boolean {
	return knownHosts.some((k) => {
		const known = k.toLowerCase();
		return host === known || host.endsWith(`.${known}`);
	});
}

function looksAffiliate(url: string): boolean {
	try {
		return [...new URL(url).searchParams.keys()].some((k) => AFFILIATE_QUERY_KEYS.test(k));
	} catch {
		return false;
	}
}

function disclosureFlags(input: ReviewFlagInput, links: string[]): ReviewFlag[] {
	const { kind, note } = input.disclosure;
	if (kind === null)
		return [
			{
				kind: 'disclosure',
				message:
					'No disclosure is stated: every guide must say whether it has sponsored parts or affiliate links.'
			}
		];
	if (kind !== 'none') {
		if ((note ?? '').trim() === '') {
			const what =
				kind === 'sponsored' ? 'which parts were provided' : 'which links earn a commission';
			return [
				{
					kind: 'disclosure',
					message: `The guide declares ${kind} content but does not say ${what}.`
				}
			];
		}
		return [];
	}
	const paidLinks = links.filter(looksAffiliate);
	const flags: ReviewFlag[] = [];
	if (paidLinks.length > 0) {
		flags.push({
			kind: 'disclosure',
			message: `Disclosure says none, but ${paidLinks.length === 1 ? 'a link carries' : `${paidLinks.length} links carry`} a referral parameter: ${paidLinks.slice(0, 3).join(', ')}.`
		});
	}
	const words = input.buildNotesMd.match(PAID_WORDS);
	if (words)
		flags.push({
			kind: 'disclosure',
			message: `Disclosure says none, but the build notes mention "${words[0]}".`
		});
	return flags;
}

export function reviewFlags(input: ReviewFlagInput): ReviewFlag[] {
	const links = [
		...linksIn(input.buildNotesMd),
		...(input.walkthroughUrl ? [input.walkthroughUrl] : []),
		...input.quotes.flatMap((q) => (q.url ? [q.url] : []))
	];
	const flags = disclosureFlags(input, links);

	const unknown = new Set<string>();
	for (const link of links) {
		const host = hostOf(link);
		if (host === null) unknown.add(link);
		else if (!isKnownHost(host, input.knownHosts)) unknown.add(host);
	}
	for (const host of unknown)
		flags.push({
			kind: 'unknown_link',
			message: `Links to ${host}, which is not a known store or this site.`
		});

	for (const quote of input.quotes) {
		const ageDays = Math.floor(
			(input.now.getTime() - new Date(quote.observedAt).getTime()) / DAY_MS
		);
		if (ageDays > STALE_QUOTE_DAYS) {
			flags.push({
				kind: 'stale_quote',
				message: `${quote.slotLabel}: the quoted price is ${ageDays} days old (more than ${STALE_QUOTE_DAYS}).`
			});
		}
	}
	for (const conflict of input.conflicts)
		flags.push({ kind: 'fit_conflict', message: `Fit conflict: ${conflict.message}` });
	return flags;
}
