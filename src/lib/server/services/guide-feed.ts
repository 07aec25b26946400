/**
 * The Atom feed (RFC 4287) of published guides. Entry ids are the guides' permanent URLs
 * (RFC 4287 §4.2.6 allows any IRI that never changes; a guide's slug never changes).
 */
import type { GuideCard } from '$lib/views';
import { listPublished } from './guide-browse';

const FEED_TITLE = 'Slotwise: new and revised PC build guides';

/** Escapes text for XML element content and attribute values. */
export function xmlEscape(text: string): string {
	return (
		text
			.replace(/&/g, '&amp;')
			.replace(/</g, '&lt;')
			.replace(/>/g, '&gt;')
			.replace(/"/g, '&quot;')
			.replace(/'/g, '&apos;')
			// Characters XML 1.0 forbids outright (control characters other than tab/CR/LF).
			// eslint-disable-next-line no-control-regex
			.replace(/[\u0000-\u0008\u000B\u000C\u000E-\u001F\uFFFE\uFFFF]/g, '')
	);
}

/** The feed document for the site at `origin` (e.g. https://slotwise.example). */
export async function atomFeed(origin: string): Promise<string> {
	const list = (await listPublished()).sort((a, b) => b.publishedAt.localeCompare(a.publishedAt));
	// A feed with no entries still needs an <updated>; the epoch says "nothing yet".
	const updated = list[0]?.publishedAt ?? new Date(0).toISOString();
	const self = `${origin}/guides/feed.xml`;
	return [
		'<?xml version="1.0" encoding="utf-8"?>',
		'<feed xmlns="http://www.w3.org/2005/Atom">',
		`  <id>${xmlEscape(`${origin}/guides`)}</id>`,
		`  <title>${xmlEscape(FEED_TITLE)}</title>`,
		`  <updated>${updated}</updated>`,
		'  <author><name>Slotwise</name></author>',
		`  <link rel="self" type="application/atom+xml" href="${xmlEscape(self)}"/>`,
		`  <link rel="alternate" type="text/html" href="${xmlEscape(`${origin}/guides`)}"/>`,
		...list.map((g) => entry(g, origin)),
		'</feed>',
		''
	].join('\n');
}

function entry(g: GuideCard, origin: string): string {
	const url = `${origin}/guides/${g.slug}`;
	return [
		'  <entry>',
		`    <id>${xmlEscape(url)}</id>`,
		`    <title>${xmlEscape(g.title)}</title>`,
		// The latest published revision's date: a revised guide shows up again in readers.
		`    <updated>${g.publishedAt}</updated>`,
		`    <published>${g.publishedAt}</published>`,
		`    <author><name>${xmlEscape(g.authorName)}</name></author>`,
		`    <link rel="alternate" type="text/html" href="${xmlEscape(url)}"/>`,
		`    <summary type="text">${xmlEscape(g.summary)}</summary>`,
		...g.tags.map((t) => `    <category term="${xmlEscape(t)}"/>`),
		'  </entry>'
	].join('\n');
}
