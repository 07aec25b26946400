/**
 * Upkeep alerts (issue 19): the conditions under which a published guide needs its author's
 * attention, worked out from figures the services already have (stored totals, the latest
 * quotes, the drop-in report). Plain data in, plain alerts out; the service stores them.
 *
 * Thresholds:
 * - a total that moved more than 10 % since publication (the issue's default);
 * - a pick whose newest active quote in a listed region is older than 30 days (common
 *   practice, no published source: a month is how long shops' prices are usually taken to
 *   hold in budget guides).
 */
import { formatMoney } from './money';
import { severityRank, type Severity } from './build-parts';
import type { Money } from './types';

export const UPKEEP_KINDS = [
	'no_quote',
	'over_budget',
	'new_finding',
	'total_moved',
	'stale_quote',
	'cheaper_dropin'
] as const;
export type UpkeepKind = (typeof UPKEEP_KINDS)[number];

/** Moved more than this many basis points of the published total (1000 = 10 %), unless the author chose another. */
export const MOVE_THRESHOLD_BP = 1000;
/** A quote older than this many days is stale (common practice, no published source). */
export const STALE_DAYS = 30;

const DAY_MS = 86_400_000;

export interface UpkeepOption {
	partId: number;
	name: string;
	/** Unit price in the region; null when unpriced there. */
	unit: Money | null;
}

export interface UpkeepSlot {
	slotKey: string;
	label: string;
	pick: UpkeepOption;
	alternates: UpkeepOption[];
}

export interface UpkeepRegion {
	regionId: number;
	code: string;
	/** A region the guide lists: its base region, or one where one of its picks has a quote. */
	listed: boolean;
	total: Money | null;
	/** The total when the revision was published, if known. */
	totalAtPublication: Money | null;
	/**
	 * The guide's target budget in this region's prices; null when unknown. The budget is
	 * stated in the base region; elsewhere the caller scales it by the region's total over the
	 * base total at publication, so it keeps the headroom the guide had when it went live.
	 */
	budget: Money | null;
	/** Alternates already cheaper than their pick here at publication (`${slotKey}|${partId}`). */
	cheaperAtPublication: ReadonlySet<string>;
	/** Per slot (same order as `slots`): prices of the pick and alternates in this region. */
	slots: UpkeepSlot[];
	/** Newest active quote of each pick part here (part id → date); absent: no active quote. */
	latestActiveQuote: ReadonlyMap<number, Date>;
	/** Parts that ever had a quote here, active or not (a pick with none was never sold here). */
	everQuoted?: ReadonlySet<number>;
}

export interface UpkeepFinding {
	/** Identity across reports: rule and slot keys. */
	key: string;
	rule: string;
	severity: Severity;
	message: string;
	slotKeys: string[];
}

export interface UpkeepInput {
	regions: UpkeepRegion[];
	/** Alternates that fit as drop-ins, as `${slotKey}|${partId}`. */
	dropInFits: ReadonlySet<string>;
	findings: UpkeepFinding[];
	/** Finding keys of the picks at publication; null when not recorded. */
	findingsAtPublication: ReadonlySet<string> | null;
	now: Date;
	/** The author's own move threshold in basis points; MOVE_THRESHOLD_BP when not given. */
	moveThresholdBp?: number;
}

export interface UpkeepAlertDraft {
	kind: UpkeepKind;
	regionId: number | null;
	slotKey: string | null;
	/** What the alert is about beyond kind, region and slot (an alternate, a rule). */
	subject: string;
	severity: Severity;
	details: Record<string, string | number | null>;
}

/** Every alert condition that holds now. */
export function upkeepAlerts(input: UpkeepInput): UpkeepAlertDraft[] {
	const alerts: UpkeepAlertDraft[] = [];
	for (const region of input.regions) {
		if (!region.listed) continue;
		alerts.push(...totalAlerts(region, input.moveThresholdBp ?? MOVE_THRESHOLD_BP));
		for (const slot of region.slots) alerts.push(...slotAlerts(region, slot, input));
	}
	const known = input.findingsAtPublication;
	if (known)
		for (const f of input.findings) {
			if (f.severity === 'ok' || known.has(f.key)) continue;
			alerts.push({
				kind: 'new_finding',
				regionId: null,
				slotKey: f.slotKeys[0] ?? null,
				subject: f.key,
				severity: f.severity,
				details: { rule: f.rule, message: f.message }
			});
		}
	return sortWorstFirst(alerts);
}

function totalAlerts(region: UpkeepRegion, thresholdBp: number): UpkeepAlertDraft[] {
	const out: UpkeepAlertDraft[] = [];
	const { total, totalAtPublication: then, budget } = region;
	if (total && then && then.currency === total.currency && then.amountMinor > 0) {
		const delta = total.amountMinor - then.amountMinor;
		// Strictly more than the threshold, in integers: |Δ| × 10000 > threshold × then.
		if (Math.abs(delta) * 10_000 > thresholdBp * then.amountMinor)
			out.push({
				kind: 'total_moved',
				regionId: region.regionId,
				slotKey: null,
				subject: '',
				severity: 'caution',
				details: {
					region: region.code,
					atPublication: formatMoney(then),
					now: formatMoney(total),
					changePercent: Math.round((delta * 1000) / then.amountMinor) / 10
				}
			});
	}
	if (
		total &&
		budget &&
		budget.currency === total.currency &&
		total.amountMinor > budget.amountMinor
	)
		out.push({
			kind: 'over_budget',
			regionId: region.regionId,
			slotKey: null,
			subject: '',
			severity: 'conflict',
			details: { region: region.code, budget: formatMoney(budget), now: formatMoney(total) }
		});
	return out;
}

function slotAlerts(
	region: UpkeepRegion,
	slot: UpkeepSlot,
	input: UpkeepInput
): UpkeepAlertDraft[] {
	const out: UpkeepAlertDraft[] = [];
	const at = { regionId: region.regionId, slotKey: slot.slotKey };
	const latest = region.latestActiveQuote.get(slot.pick.partId);
	if (!latest)
		out.push({
			kind: 'no_quote',
			...at,
			subject: String(slot.pick.partId),
			severity: 'conflict',
			details: {
				region: region.code,
				slot: slot.label,
				part: slot.pick.name,
				// 0: never quoted here (stored as a number with the other details)
				everQuoted: region.everQuoted && !region.everQuoted.has(slot.pick.partId) ? 0 : 1
			}
		});
	else {
		// Older than 30 days by the clock, not by whole days: 30 days and an hour is stale.
		const age = input.now.getTime() - latest.getTime();
		const days = Math.floor(age / DAY_MS);
		if (age > STALE_DAYS * DAY_MS)
			out.push({
				kind: 'stale_quote',
				...at,
				subject: String(slot.pick.partId),
				severity: 'caution',
				details: {
					region: region.code,
					slot: slot.label,
					part: slot.pick.name,
					observedAt: latest.toISOString().slice(0, 10),
					days
				}
			});
	}
	const pick = slot.pick.unit;
	if (pick)
		for (const alt of slot.alternates) {
			if (!alt.unit || alt.unit.currency !== pick.currency) continue;
			if (alt.unit.amountMinor >= pick.amountMinor) continue;
			const key = `${slot.slotKey}|${alt.partId}`;
			// Only what changed: an alternate listed as the cheaper choice from the start is no news.
			if (region.cheaperAtPublication.has(key) || !input.dropInFits.has(key)) continue;
			out.push({
				kind: 'cheaper_dropin',
				...at,
				subject: String(alt.partId),
				severity: 'caution',
				details: {
					region: region.code,
					slot: slot.label,
					part: slot.pick.name,
					alternate: alt.name,
					pickPrice: formatMoney(pick),
					alternatePrice: formatMoney(alt.unit)
				}
			});
		}
	return out;
}

const KIND_ORDER = new Map(UPKEEP_KINDS.map((k, i) => [k, i]));

/** Worst first: conflicts before cautions, then by kind in UPKEEP_KINDS order. */
export function sortWorstFirst<T extends { severity: Severity; kind: UpkeepKind }>(
	alerts: T[]
): T[] {
	return [...alerts].sort(
		(a, b) =>
			severityRank(b.severity) - severityRank(a.severity) ||
			(KIND_ORDER.get(a.kind) ?? 0) - (KIND_ORDER.get(b.kind) ?? 0)
	);
}

/** The alert as a sentence for the dashboard and the digest. */
export function upkeepSentence(kind: UpkeepKind, d: Record<string, unknown>): string {
	const s = (k: string) => String(d[k] ?? '');
	switch (kind) {
		case 'no_quote':
			return d.everQuoted === 0
				? `${s('part')} (${s('slot')}) has never been quoted in ${s('region')}: readers there cannot price it.`
				: `${s('part')} (${s('slot')}) has no active quote in ${s('region')}: it may be gone from the stores there.`;
		case 'over_budget':
			return `The total in ${s('region')} is ${s('now')}, above the guide's target budget of ${s('budget')}.`;
		case 'new_finding':
			return `A fit check or pairing caution added since publication now flags the picks: ${s('message')}`;
		case 'total_moved':
			return `The total in ${s('region')} moved ${Number(d.changePercent) > 0 ? '+' : ''}${s('changePercent')} % since publication: ${s('atPublication')} then, ${s('now')} now.`;
		case 'stale_quote':
			return `${s('part')} (${s('slot')}) has no quote newer than 30 days in ${s('region')}; the newest is from ${s('observedAt')}.`;
		case 'cheaper_dropin':
			return `${s('alternate')} is now cheaper than the pick ${s('part')} in ${s('region')} (${s('alternatePrice')} against ${s('pickPrice')}) and fits as a drop-in.`;
	}
}

/** The alternates cheaper than their pick in one region's prices (`${slotKey}|${partId}`). */
export function cheaperAlternates(slots: readonly UpkeepSlot[]): string[] {
	const out: string[] = [];
	for (const slot of slots)
		for (const alt of slot.alternates)
			if (
				slot.pick.unit &&
				alt.unit &&
				alt.unit.currency === slot.pick.unit.currency &&
				alt.unit.amountMinor < slot.pick.unit.amountMinor
			)
				out.push(`${slot.slotKey}|${alt.partId}`);
	return out;
}
