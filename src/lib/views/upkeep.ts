/* What the author's dashboard and the insights page and API show (issue 19). */
import type { Severity } from '$lib/domain/build-parts';
import type { UpkeepKind } from '$lib/domain/upkeep';
import type { BuildCount } from '$lib/domain/insights';

export type { BuildCount };

export interface UpkeepAlertView {
	id: number;
	guideSlug: string;
	guideTitle: string;
	kind: UpkeepKind;
	severity: Severity;
	regionCode: string | null;
	slotKey: string | null;
	sentence: string;
	firstSeenAt: string;
	/** The editor with the slot focused (#slot-<key>), or the editor itself. */
	editorHref: string;
}

/** One choice of a slot: the pick kept, an alternate chosen, another part, or the slot removed. */
/** An alert the author set aside: snoozed (until when) or marked handled. */
export interface SetAsideAlertView extends UpkeepAlertView {
	handled: boolean;
	/** ISO time the snooze ends; null when handled. */
	snoozedUntil: string | null;
}

export interface InsightChoice {
	kind: 'pick' | 'alternate' | 'other' | 'removed';
	/** The part ("Brand Model"); null for a removed slot. */
	partName: string | null;
	partSlug: string | null;
	/** Alternate rank, for kind alternate. */
	rank: number | null;
	builds: BuildCount;
	/** Share of the slot's builds in whole percent; null when the count is suppressed. */
	percent: number | null;
}

export interface InsightSlot {
	slotKey: string;
	label: string;
	/** Builds that carry this slot's source key or lost it (the base for shares). */
	builds: BuildCount;
	/** Empty when the slot has fewer than 5 builds: not even the choices are named. */
	choices: InsightChoice[];
	/** Share (whole percent) of the hidden choices together, when some are hidden. */
	hiddenShare: number | null;
	/** The same, per build region; a region of fewer than 5 builds names no choices. */
	byRegion: { regionCode: string; builds: BuildCount; choices: InsightChoice[] }[];
	/**
	 * Parts that at least 20 % of the builds (and at least 5) swapped to and the live revision
	 * does not offer: worth adding as alternates. Counts are null where the table hides them.
	 */
	suggestions: {
		partName: string;
		partSlug: string;
		builds: number | null;
		percent: number | null;
		editorHref: string;
	}[];
}

export interface GuideInsights {
	guide: { slug: string; title: string };
	totalBuilds: BuildCount;
	perRevision: { revisionNumber: number; builds: BuildCount }[];
	tookUpdate: BuildCount;
	/** Owners who answered "Not now" to an update and have not taken it since (build_update_declines). */
	declinedUpdate: BuildCount;
	markedBought: BuildCount;
	slots: InsightSlot[];
}
