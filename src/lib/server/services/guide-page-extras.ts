/**
 * What the guide page shows beside its computed view (guide-view-cache.ts): forks and public
 * builds of the guide, its gallery, the picks' part photos and the tip panel. Eight queries
 * that were made for every signed-in reader's page, although they are the same for everyone
 * and change far less often than they are read.
 *
 * They are kept here once per change. The key is the guide's stamp (its revision, row and
 * the day) and the `guide-extras` counter, read in the same query as the stamp and moved
 * after commit by every write these figures come from (db/generation-hooks.ts in the Build,
 * GalleryPhoto, Photo, Part, Tip, TipSettings and User models). A reader who has just forked
 * or tipped reads the stamp afresh, so their own write shows on their next page.
 *
 * Nothing here is personal: the signed-in parts of the page (the header, the report and
 * fork forms) are made per request from the session.
 */
import { LRUCache } from 'lru-cache';
import type { LineageView, PhotoView, PublishedGallery } from '$lib/views';
import { lineageOf } from './build-lists';
import { galleryOfRevision } from './gallery';
import type { GuideStamp } from './guide-view-cache';
import { partThumbs } from './photos';
import { onReferenceChange } from './reference-cache';
import { guideTipPanel } from './tips';
import type { PublicNote } from './tips';

export interface GuidePageExtras {
	lineage: LineageView;
	gallery: PublishedGallery;
	partThumbs: Record<string, PhotoView>;
	tipsOpen: boolean;
	tipNotes: PublicNote[];
}

/** A few kilobytes each: bounds memory at any number of guides. */
const MAX_KEPT = 300;

const kept = new LRUCache<string, Promise<GuidePageExtras>>({ max: MAX_KEPT });

/** The extras of the published guide `slug` whose stamp is `stamp`; `pickSlugs` from its view. */
export function pageExtras(
	slug: string,
	stamp: GuideStamp,
	pickSlugs: readonly string[]
): Promise<GuidePageExtras> {
	const key = JSON.stringify([stamp.version, stamp.extras]);
	const hit = kept.get(key);
	if (hit) return hit;
	const made = makeExtras(slug, stamp, pickSlugs);
	kept.set(key, made);
	// A failure (an outage) is asked again next time, not kept.
	made.catch(() => {
		if (kept.get(key) === made) kept.delete(key);
	});
	return made;
}

async function makeExtras(
	slug: string,
	stamp: GuideStamp,
	pickSlugs: readonly string[]
): Promise<GuidePageExtras> {
	const [lineage, gallery, thumbs, tips] = await Promise.all([
		lineageOf(stamp.guideId),
		galleryOfRevision(stamp.revisionId),
		partThumbs([...pickSlugs]),
		guideTipPanel(slug)
	]);
	return { lineage, gallery, partThumbs: thumbs, ...tips };
}

// Tests that empty the tables (the counters start again), and a process that sees the views'
// counter move: the key names the stamp, so nothing kept under an older one is read again.
onReferenceChange(() => kept.clear());
