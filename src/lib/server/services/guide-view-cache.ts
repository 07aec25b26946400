/**
 * The computed view of a published guide revision in a region (fit report, drop-ins,
 * pricing, value and reproducibility: guides.ts getGuidePage), kept in process memory, and
 * the validator (ETag) a shared cache in front of several app processes uses for the
 * anonymous guide page and GET /api/v1/guides/[slug]/pricing.
 *
 * What a view depends on is summed up by a stamp read with one indexed query per request:
 * the guide's published revision, its row's last change and hidden state, its author's name,
 * the UTC day (reproducibility and rate staleness count days) and the `guide-view` counter
 * in cache_generations (cache-generations.ts). That counter is bumped, after the write
 * commits, by every event that changes a view without touching the guide's row:
 *
 * - a revision approved and published, a quote or sighting accepted, rates refreshed, a
 *   region changed (all through guide-prices.ts, which recomputes the stored totals);
 * - a caution rule written (caution-rules.ts: drop-in findings);
 * - a part's brand, model or specs edited (catalog-parts.ts: names and fit findings).
 *
 * A process that sees the counter move drops its views and its reference cache (regions,
 * rates, caution rules), so another process's write is seen on the next request, not after
 * the reference cache's time-to-live.
 */
import { createHash } from 'node:crypto';
import { QueryTypes } from 'sequelize';
import { sequelize } from '$lib/server/db';
import { sharedRead } from '$lib/server/db/shared-reads';
import { GUIDE_EXTRAS, GUIDE_VIEW } from './cache-generations';
import { getGuidePage, mayView } from './guides';
import type { GuidePageOutcome, GuideViewer, PricedOutcome } from './guides';
import { invalidateReferenceCaches, onReferenceChange } from './reference-cache';

/** Views kept per process (a view is tens of kilobytes): bounds memory at any number of guides. */
const MAX_VIEWS = 300;

/** What a published guide's views depend on, from one read; null when it is not published. */
export interface GuideStamp {
	guideId: number;
	revisionId: number;
	authorId: string | null;
	hidden: boolean;
	/** Every input above in one string: part of each view's key and of the ETag. */
	version: string;
	/** The `guide-extras` counter: with `version`, names the page's extras (guide-page-extras.ts). */
	extras: string;
}

interface StampRow {
	guideId: number;
	revisionId: number;
	authorId: string | null;
	hiddenAt: Date | string | null;
	updatedAt: Date | string;
	authorName: string | null;
	generation: number | string | null;
	extras: number | string | null;
}

const views = new Map<string, Promise<GuidePageOutcome>>();
let lastGeneration: string | null = null;

// Tests that empty the tables, and writes to regions, rates or rules in this process.
onReferenceChange(() => views.clear());

/** The stamp's row of the published guide `slug` (one query: guides by its unique slug, the counter by key). */
async function readStampRow(slug: string): Promise<StampRow | undefined> {
	const [row] = await sequelize.query<StampRow>(
		`SELECT g.id AS guideId, g.published_revision_id AS revisionId, g.author_id AS authorId,
		        g.hidden_at AS hiddenAt, g.updated_at AS updatedAt, u.name AS authorName,
		        (SELECT c.value FROM cache_generations c WHERE c.name = :generation) AS generation,
		        (SELECT c.value FROM cache_generations c WHERE c.name = :extras) AS extras
		   FROM guides g LEFT JOIN users u ON u.id = g.author_id
		  WHERE g.slug = :slug AND g.state = 'published' AND g.published_revision_id IS NOT NULL`,
		{
			type: QueryTypes.SELECT,
			replacements: { slug, generation: GUIDE_VIEW, extras: GUIDE_EXTRAS }
		}
	);
	return row;
}

/** A visitor's stamp read joins the same read already under way (db/shared-reads.ts). */
const readStampRowShared = sharedRead(readStampRow);

/**
 * The stamp of the published guide `slug`. `shared` (visitors only) lets it join an
 * identical read already in flight.
 */
export async function readStamp(
	slug: string,
	now = new Date(),
	options: { shared?: boolean } = {}
): Promise<GuideStamp | null> {
	const row = await (options.shared ? readStampRowShared : readStampRow)(slug);
	if (!row) return null;
	const generation = String(row.generation ?? 0);
	if (generation !== lastGeneration) {
		// Another process (or this one) changed something views are built from.
		lastGeneration = generation;
		invalidateReferenceCaches();
	}
	const time = (d: Date | string | null) => (d === null ? null : new Date(d).getTime());
	return {
		guideId: Number(row.guideId),
		revisionId: Number(row.revisionId),
		authorId: row.authorId,
		hidden: row.hiddenAt !== null,
		version: JSON.stringify([
			Number(row.guideId),
			Number(row.revisionId),
			time(row.updatedAt),
			time(row.hiddenAt),
			row.authorName,
			generation,
			now.toISOString().slice(0, 10)
		]),
		extras: String(row.extras ?? 0)
	};
}

/**
 * The guide page of `slug` priced in `regionCode` (its base region when null), computed once
 * per stamp and region. `stamp` is the request's own read (the conditional-request hook
 * makes it); without one it is read here.
 */
export async function guidePage(
	slug: string,
	regionCode: string | null,
	viewer: GuideViewer | null,
	stamp?: GuideStamp | null
): Promise<GuidePageOutcome> {
	const current = stamp === undefined ? await readStamp(slug) : stamp;
	const hiddenAt = current?.hidden ? new Date(0) : null;
	if (!current || !mayView({ hiddenAt, authorId: current.authorId }, viewer)) {
		return { kind: 'not_found' };
	}
	const key = `${current.version}|${regionCode ?? ''}`;
	const hit = views.get(key);
	if (hit) {
		// Least recently used goes first: re-insert moves the key to the end.
		views.delete(key);
		views.set(key, hit);
		return hit;
	}
	const view = getGuidePage(slug, regionCode, new Date(), viewer);
	views.set(key, view);
	if (views.size > MAX_VIEWS) views.delete(views.keys().next().value as string);
	// Only finished pages are kept; a failure or a 404 is asked again next time.
	view.then(
		(outcome) => {
			if (outcome.kind !== 'ok' && views.get(key) === view) views.delete(key);
		},
		() => {
			if (views.get(key) === view) views.delete(key);
		}
	);
	return view;
}

/** The pricing API's answer from the same cached view. */
export async function priced(
	slug: string,
	regionCode: string | null,
	stamp?: GuideStamp | null
): Promise<PricedOutcome> {
	const outcome = await guidePage(slug, regionCode, null, stamp);
	if (outcome.kind !== 'ok') return outcome;
	return { kind: 'ok', guide: outcome.page.guide };
}

/**
 * A weak ETag from the stamp and what else tells two answers apart (route, query, page or
 * data request). Weak because two renders of the same view may differ in bytes that say
 * nothing different (the order of serialised data, for instance).
 */
export function validatorOf(stamp: GuideStamp, parts: readonly string[]): string {
	return weakValidator([stamp.version, ...parts]);
}

/** A weak ETag naming everything in `parts` (guide pages here, guide lists in list-caching.ts). */
export function weakValidator(parts: readonly string[]): string {
	const digest = createHash('sha256').update(JSON.stringify(parts)).digest('base64url');
	return `W/"${digest.slice(0, 27)}"`;
}

/** Whether an If-None-Match header names `etag` (weak comparison, RFC 9110 13.1.2). */
export function matchesIfNoneMatch(header: string | null, etag: string): boolean {
	if (!header) return false;
	const opaque = (tag: string) => tag.trim().replace(/^W\//, '');
	const wanted = opaque(etag);
	return header.split(',').some((tag) => tag.trim() === '*' || opaque(tag) === wanted);
}
