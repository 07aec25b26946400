/**
 * Upkeep alerts of published guides, worked out where the stored totals are (guide-prices.ts
 * hands over each refreshed revision priced in every region), so they follow exactly the
 * same triggers: approval, an accepted quote or sighting, a catalog import, a rates or
 * region change. Never on a page view.
 *
 * Per revision it also keeps a baseline (guide_upkeep_baselines): the totals and the picks'
 * findings the first time the revision is priced after it went live, which "moved since
 * publication" and "a rule added since publication" compare against. The conditions
 * themselves are the domain's (domain/upkeep.ts); this file loads, stores and keeps the
 * author's snooze and "handled" marks across recomputations (rows keyed by fingerprint).
 */
import { createHash } from 'node:crypto';
import { QueryTypes } from 'sequelize';
import type { Transaction } from 'sequelize';
import { dropIns } from '$lib/domain/dropins';
import { fitReport } from '$lib/domain/fit';
import { money } from '$lib/domain/money';
import { pairingCautions, type CautionRule } from '$lib/domain/pairing-cautions';
import type { Money, PartCategory } from '$lib/domain/types';
import {
	cheaperAlternates,
	upkeepAlerts,
	type UpkeepSlot,
	type UpkeepAlertDraft,
	type UpkeepFinding,
	type UpkeepRegion
} from '$lib/domain/upkeep';
import { budgetIn } from '$lib/domain/budget';
import { CautionRule as CautionRuleRow, sequelize } from '$lib/server/db';
import type { Part, Region } from '$lib/server/db';
import * as fx from './fx';
import { dropInSlot, partName, picksOf } from './mappers';
import type { PricedSet } from './pricing';

type UpkeepPart = Pick<Part, 'id' | 'brand' | 'model' | 'specs'>;

/** What the alerts read of a revision's slot (a LoadedRevisionSlot or the full pass's raw row). */
export interface UpkeepSourceSlot {
	slotKey: string;
	label: string;
	category: PartCategory;
	quantity: number;
	pickPartId: number;
	pick: UpkeepPart;
	alternates: readonly { part: UpkeepPart }[];
}

/** A refreshed revision, its slots and its pricing in every region (region id → priced set). */
export interface RevisionPriced {
	revisionId: number;
	guideId: number;
	baseRegionId: number;
	slots: readonly UpkeepSourceSlot[];
	byRegion: ReadonlyMap<number, Pick<PricedSet, 'adjustment'>>;
}

interface Baseline {
	/** Per region id: the total and the alternates already cheaper than their pick. */
	totals: Record<string, { currency: string; totalMinor: number | null; cheaper?: string[] }>;
	findingKeys: string[];
}

/** Recomputes the alerts of these revisions' guides from their fresh pricing. */
export async function refreshAlerts(
	revisions: readonly RevisionPriced[],
	regions: readonly Region[],
	options: { now?: Date; sweep?: boolean } = {}
): Promise<void> {
	const now = options.now ?? new Date();
	if (revisions.length === 0) return;
	const revisionIds = revisions.map((r) => r.revisionId);
	const [guides, baselines, quoteDates, rules, rates] = await Promise.all([
		sequelize.query<{ id: number; targetBudgetMinor: number; thresholdBp: number }>(
			`SELECT g.id, g.target_budget_minor AS targetBudgetMinor,
			        u.upkeep_move_threshold_bp AS thresholdBp
			   FROM guides g JOIN users u ON u.id = g.author_id WHERE g.id IN (:ids)`,
			{ type: QueryTypes.SELECT, replacements: { ids: revisions.map((r) => r.guideId) } }
		),
		loadBaselines(revisionIds),
		loadQuoteDates(revisions),
		loadRules(),
		fx.ratesForPricing()
	]);
	const budgetOf = new Map(guides.map((g) => [Number(g.id), Number(g.targetBudgetMinor)]));
	const thresholdOf = new Map(guides.map((g) => [Number(g.id), Number(g.thresholdBp)]));
	const newBaselines: [number, Baseline][] = [];
	const drafts: { r: RevisionPriced; alert: UpkeepAlertDraft }[] = [];

	for (const r of revisions) {
		const baseRegion = regions.find((x) => x.id === r.baseRegionId);
		if (r.byRegion.size === 0 || !baseRegion) continue;
		const slots = r.slots;
		const dropSlots = slots.map((s) =>
			dropInSlot(
				s.slotKey,
				s,
				s.pick,
				s.alternates.map((a) => ({ id: a.part.id, part: a.part }))
			)
		);
		const build = picksOf(dropSlots);
		const findings: UpkeepFinding[] = [...fitReport(build), ...pairingCautions(build, rules)].map(
			(f) => ({
				key: `${f.rule}|${f.slots.join(',')}`,
				rule: f.rule,
				severity: f.severity,
				message: f.message,
				slotKeys: f.slots
			})
		);
		const fits = new Set(
			dropIns(dropSlots, rules)
				.alternates.filter((a) => a.fits)
				.map((a) => `${a.slotKey}|${a.alternateId}`)
		);
		// Each region's prices as the domain takes them, then the baseline (first pass after publication).
		const priced = regions.flatMap((region) => {
			const p = r.byRegion.get(region.id);
			return p ? [{ region, p, slots: upkeepSlots(slots, p) }] : [];
		});
		let baseline = baselines.get(r.revisionId);
		if (!baseline) {
			baseline = baselineOf(priced, findings);
			newBaselines.push([r.revisionId, baseline]);
		}
		const at = (regionId: number): Money | null => {
			const then = baseline?.totals[String(regionId)];
			return then && then.totalMinor !== null ? money(then.totalMinor, then.currency) : null;
		};
		// The budget as the guide page shows it in each region (reference rates).
		const budgetMinor = budgetOf.get(r.guideId) ?? 0;
		const budget = budgetMinor > 0 ? money(budgetMinor, baseRegion.currency) : null;
		const upkeepRegions: UpkeepRegion[] = priced.map(({ region, p, slots: regionSlots }) => {
			const dates = quoteDates.get(region.id);
			return {
				regionId: region.id,
				code: region.code,
				listed: region.id === r.baseRegionId || slots.some((s) => dates?.quoted.has(s.pickPartId)),
				total: completeTotal(p),
				totalAtPublication: at(region.id),
				budget: budget && budgetIn(budget, region.currency, rates).money,
				cheaperAtPublication: new Set(baseline?.totals[String(region.id)]?.cheaper ?? []),
				latestActiveQuote: dates?.latestActive ?? new Map(),
				everQuoted: dates?.quoted ?? new Set(),
				slots: regionSlots
			};
		});
		const alerts = upkeepAlerts({
			regions: upkeepRegions,
			dropInFits: fits,
			findings,
			findingsAtPublication: new Set(baseline.findingKeys),
			now,
			moveThresholdBp: thresholdOf.get(r.guideId)
		});
		for (const alert of alerts) drafts.push({ r, alert });
	}
	await store(revisions, drafts, newBaselines, now, options.sweep ?? true);
}

/** A revision's slots with their prices in one region, as the domain takes them. */
function upkeepSlots(
	slots: readonly UpkeepSourceSlot[],
	p: Pick<PricedSet, 'adjustment'>
): UpkeepSlot[] {
	return slots.map((s, i) => ({
		slotKey: s.slotKey,
		label: s.label,
		pick: {
			partId: s.pickPartId,
			name: partName(s.pick),
			unit: p.adjustment.slots[i]?.pick.unit ?? null
		},
		alternates: s.alternates.map((a, j) => ({
			partId: a.part.id,
			name: partName(a.part),
			unit: p.adjustment.slots[i]?.alternates[j]?.unit ?? null
		}))
	}));
}

/**
 * The picks total when every pick has a price; a total missing a part compares with nothing
 * (a pick with no price has its own alert), so it neither "moves" nor crosses the budget.
 */
function completeTotal(p: Pick<PricedSet, 'adjustment'>): Money | null {
	return p.adjustment.unpricedSlots === 0 ? p.adjustment.picksTotal : null;
}

function baselineOf(
	priced: { region: Region; p: Pick<PricedSet, 'adjustment'>; slots: UpkeepSlot[] }[],
	findings: UpkeepFinding[]
): Baseline {
	const totals: Baseline['totals'] = {};
	for (const { region, p, slots } of priced)
		totals[String(region.id)] = {
			currency: region.currency,
			totalMinor: completeTotal(p)?.amountMinor ?? null,
			cheaper: cheaperAlternates(slots)
		};
	return { totals, findingKeys: findings.map((f) => f.key) };
}

async function loadBaselines(revisionIds: number[]): Promise<Map<number, Baseline>> {
	const rows = await sequelize.query<{ revisionId: number; totals: unknown; findingKeys: unknown }>(
		`SELECT revision_id AS revisionId, totals, finding_keys AS findingKeys
		   FROM guide_upkeep_baselines WHERE revision_id IN (:ids)`,
		{ type: QueryTypes.SELECT, replacements: { ids: revisionIds } }
	);
	const json = (v: unknown) => (typeof v === 'string' ? JSON.parse(v) : v);
	return new Map(
		rows.map((row) => [
			Number(row.revisionId),
			{
				totals: json(row.totals) as Baseline['totals'],
				findingKeys: json(row.findingKeys) as string[]
			}
		])
	);
}

interface QuoteDates {
	/** Pick parts with any quote in the region (active or not): makes the region "listed". */
	quoted: Set<number>;
	latestActive: Map<number, Date>;
}

/** Per region: which picks were ever quoted there and their newest active quote's date. */
async function loadQuoteDates(
	revisions: readonly RevisionPriced[]
): Promise<Map<number, QuoteDates>> {
	const partIds = new Set<number>();
	for (const r of revisions) for (const s of r.slots) partIds.add(s.pickPartId);
	const out = new Map<number, QuoteDates>();
	if (partIds.size === 0) return out;
	const rows = await sequelize.query<{ partId: number; regionId: number; latest: Date | null }>(
		`SELECT part_id AS partId, region_id AS regionId,
		        MAX(CASE WHEN status = 'active' THEN observed_at END) AS latest
		   FROM quotes WHERE part_id IN (:parts) GROUP BY part_id, region_id`,
		{ type: QueryTypes.SELECT, replacements: { parts: [...partIds] } }
	);
	for (const row of rows) {
		const regionId = Number(row.regionId);
		const entry = out.get(regionId) ?? { quoted: new Set(), latestActive: new Map() };
		entry.quoted.add(Number(row.partId));
		if (row.latest) entry.latestActive.set(Number(row.partId), new Date(row.latest));
		out.set(regionId, entry);
	}
	return out;
}

/** Active pairing cautions, read fresh (this runs right after writes, not per page). */
async function loadRules(): Promise<CautionRule[]> {
	const rows = await CautionRuleRow.findAll({ where: { active: true }, order: [['id', 'ASC']] });
	return rows.map((r) => ({
		id: r.id,
		message: r.message,
		authorName: '',
		conditions: r.conditions
	}));
}

function fingerprint(a: UpkeepAlertDraft): string {
	const text = `${a.kind}|${a.regionId ?? ''}|${a.slotKey ?? ''}|${a.subject}`;
	return text.length <= 191 ? text : createHash('sha256').update(text).digest('hex');
}

/** Multi-row statements of at most this many rows: one round trip per chunk, not per row. */
const CHUNK = 500;

function chunks<T>(rows: readonly T[]): T[][] {
	const out: T[][] = [];
	for (let i = 0; i < rows.length; i += CHUNK) out.push(rows.slice(i, i + CHUNK));
	return out;
}

/**
 * One transaction: new baselines, then per guide the alerts that hold now upserted by
 * fingerprint (first seen, snooze and handled kept) and the ones that stopped holding removed,
 * each as a few multi-row statements for the whole batch of revisions.
 */
async function store(
	revisions: readonly RevisionPriced[],
	drafts: { r: RevisionPriced; alert: UpkeepAlertDraft }[],
	baselines: [number, Baseline][],
	now: Date,
	sweep: boolean
): Promise<void> {
	const guideIds = [...new Set(revisions.map((r) => r.guideId))];
	const rows = drafts.map(({ r, alert }) => [
		r.guideId,
		r.revisionId,
		fingerprint(alert),
		alert.kind,
		alert.regionId,
		alert.slotKey,
		alert.severity,
		JSON.stringify(alert.details),
		now,
		now
	]);
	await sequelize.transaction(async (transaction) => {
		for (const chunk of chunks(baselines))
			await sequelize.query(
				`INSERT IGNORE INTO guide_upkeep_baselines (revision_id, totals, finding_keys, created_at)
				 VALUES ${chunk.map(() => '(?)').join(', ')}`,
				{
					type: QueryTypes.INSERT,
					replacements: chunk.map(([revisionId, b]) => [
						revisionId,
						JSON.stringify(b.totals),
						JSON.stringify(b.findingKeys),
						now
					]),
					transaction
				}
			);
		for (const chunk of chunks(rows))
			await sequelize.query(
				`INSERT INTO guide_upkeep_alerts
				   (guide_id, revision_id, fingerprint, kind, region_id, slot_key, severity, details,
				    first_seen_at, last_seen_at)
				 VALUES ${chunk.map(() => '(?)').join(', ')}
				 ON DUPLICATE KEY UPDATE revision_id = VALUES(revision_id),
				   severity = VALUES(severity), details = VALUES(details), last_seen_at = VALUES(last_seen_at)`,
				{ type: QueryTypes.INSERT, replacements: chunk, transaction }
			);
		// Conditions that no longer hold leave with their rows: every alert of these guides
		// but the (guide, fingerprint) pairs just written.
		const kept = rows.map((row) => [row[0], row[2]]);
		await sequelize.query(
			`DELETE FROM guide_upkeep_alerts WHERE guide_id IN (?)${
				kept.length > 0
					? ` AND (guide_id, fingerprint) NOT IN (${kept.map(() => '(?)').join(', ')})`
					: ''
			}`,
			{ type: QueryTypes.DELETE, replacements: [guideIds, ...kept], transaction }
		);
		if (sweep) await sweepAlerts(transaction);
	});
}

/**
 * Drops the alerts of revisions that are no longer live (a newer one, or the guide taken
 * down). It reads the whole alerts table, so the full pass (guide-prices.ts refreshAll) runs
 * it once, not once per page.
 */
export async function sweepAlerts(transaction?: Transaction): Promise<void> {
	await sequelize.query(
		`DELETE a FROM guide_upkeep_alerts a
		   LEFT JOIN guides g ON g.id = a.guide_id AND g.published_revision_id = a.revision_id
		  WHERE g.id IS NULL`,
		{ type: QueryTypes.DELETE, transaction }
	);
}
