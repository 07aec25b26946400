/**
 * Sync of a build with its source guide, reading (docs/architecture.md "Computations" §9): the
 * per-slot three-way table between the build's base revision, the guide's current published
 * revision and the build's slots (domain/sync.ts planSync). Owner only: another person's
 * build is `not_found`. Applying the reader's choices and undoing are build-sync.ts's.
 */
import { QueryTypes, type Transaction } from 'sequelize';
import { SyncInputError, planSync } from '$lib/domain/sync';
import type { BuildSlot as SyncBuildSlot, SourceSlot, SyncPlan } from '$lib/domain/sync';
import type { PartCategory } from '$lib/domain/types';
import { Build, BuildSlot, BuildSync, Guide, GuideRevision, Part, sequelize } from '$lib/server/db';
import type { LastSyncView, SyncPlanView, SyncRowView, SyncSideView } from '$lib/views';
import { keyedRevisionSlots, sourceSlotsOf } from './build-source';
import { partRef } from './mappers';
import { loadRevisionSlots } from './revision-snapshots';
import type { Invalid, Issues, NotFound } from '$lib/schemas/issues';

export type SyncPlanOutcome =
	| { kind: 'plan'; plan: SyncPlanView }
	/** No newer published revision (or no source left to sync with). */
	| { kind: 'up_to_date'; version: number; lastSync: LastSyncView | null }
	| Invalid
	| NotFound;

/** The current state of the sync, sent back with a stale-version answer. */
export type SyncState = Exclude<SyncPlanOutcome, { kind: 'not_found' } | { kind: 'invalid' }>;

/** What a plan is made of: the build, its guide, both revisions' slots and the build's. */
export interface SyncState0 {
	build: Build;
	guide: Guide;
	baseRevision: GuideRevision;
	upstreamRevision: GuideRevision;
	baseSlots: SourceSlot[];
	upstreamSlots: SourceSlot[];
	localSlots: BuildSlot[];
	plan: SyncPlan;
}

/** The build when it is the owner's, else null (locked when a transaction is given). */
export async function ownBuild(
	ownerId: string,
	buildId: number,
	transaction?: Transaction
): Promise<Build | null> {
	return Build.findOne({
		where: { id: buildId, ownerId },
		...(transaction ? { transaction, lock: transaction.LOCK.UPDATE } : {})
	});
}

function localOf(slots: BuildSlot[]): SyncBuildSlot[] {
	return slots.map((s) => ({
		id: s.id,
		sourceKey: s.sourceSlotKey,
		label: s.label,
		category: s.category,
		partId: s.partId,
		quantity: s.quantity
	}));
}

/**
 * Loads what a plan needs. Returns 'up_to_date' when the guide has no public revision other
 * than the build's base (or the build lost its source or base revision).
 */
export async function loadState(
	build: Build,
	transaction?: Transaction
): Promise<SyncState0 | 'up_to_date'> {
	if (!build.sourceGuideId || !build.baseRevisionId) return 'up_to_date';
	const guide = await Guide.findByPk(build.sourceGuideId, { transaction });
	if (!guide || guide.state !== 'published' || !guide.publishedRevisionId || guide.hiddenAt)
		return 'up_to_date';
	if (guide.publishedRevisionId === build.baseRevisionId) return 'up_to_date';
	const revisions = await GuideRevision.findAll({
		where: { id: [build.baseRevisionId, guide.publishedRevisionId] },
		transaction
	});
	const baseRevision = revisions.find((r) => r.id === build.baseRevisionId);
	const upstreamRevision = revisions.find((r) => r.id === guide.publishedRevisionId);
	if (!baseRevision || !upstreamRevision) return 'up_to_date';
	// Published revisions never change, so reading them outside the transaction is safe.
	const slots = await loadRevisionSlots([baseRevision.id, upstreamRevision.id]);
	const localSlots = await BuildSlot.findAll({
		where: { buildId: build.id },
		order: [
			['position', 'ASC'],
			['id', 'ASC']
		],
		transaction
	});
	// Keys as fork gives them (build-source.ts keyedRevisionSlots: the label, " (2)" for a repeat).
	const baseSlots = sourceSlotsOf(
		keyedRevisionSlots(slots.filter((s) => s.revisionId === baseRevision.id))
	);
	const upstreamSlots = sourceSlotsOf(
		keyedRevisionSlots(slots.filter((s) => s.revisionId === upstreamRevision.id))
	);
	const plan = planSync(baseSlots, upstreamSlots, localOf(localSlots));
	return {
		build,
		guide,
		baseRevision,
		upstreamRevision,
		baseSlots,
		upstreamSlots,
		localSlots,
		plan
	};
}

async function lastSyncOf(buildId: number, transaction?: Transaction): Promise<BuildSync | null> {
	return BuildSync.findOne({
		where: { buildId, undoneAt: null },
		order: [['id', 'DESC']],
		transaction
	});
}

async function lastSyncView(
	buildId: number,
	transaction?: Transaction
): Promise<LastSyncView | null> {
	const last = await lastSyncOf(buildId, transaction);
	if (!last) return null;
	const ids = [last.fromRevisionId, last.toRevisionId].filter((id): id is number => id !== null);
	const revisions = await GuideRevision.findAll({
		where: { id: ids },
		attributes: ['id', 'number'],
		transaction
	});
	const numberOf = (id: number | null) => revisions.find((r) => r.id === id)?.number ?? null;
	return {
		id: last.id,
		fromRevisionNumber: numberOf(last.fromRevisionId),
		toRevisionNumber: numberOf(last.toRevisionId),
		createdAt: last.createdAt.toISOString()
	};
}

async function planView(state: SyncState0, transaction?: Transaction): Promise<SyncPlanView> {
	const { build, guide, plan } = state;
	const partIds = new Set<number>();
	for (const r of plan.rows)
		for (const side of [r.base, r.upstream, r.local]) if (side) partIds.add(side.partId);
	const parts = new Map(
		(await Part.findAll({ where: { id: [...partIds] }, transaction })).map((p) => [
			p.id,
			partRef(p)
		])
	);
	const side = (
		s: { partId: number; quantity: number; label: string } | null
	): SyncSideView | null => {
		if (!s) return null;
		const part = parts.get(s.partId) ?? {
			id: s.partId,
			slug: '',
			brand: 'Unknown part',
			model: `#${s.partId}`,
			category: 'fan' as PartCategory
		};
		return { part, quantity: s.quantity, label: s.label };
	};
	const rows: SyncRowView[] = plan.rows.map((r) => {
		const shown = r.local ?? r.upstream ?? r.base;
		return {
			id: r.id,
			status: r.status,
			conflict: r.conflict,
			label: shown?.label ?? '',
			category: (shown?.category ?? 'fan') as PartCategory,
			slotId: r.local ? Number(r.local.id) : null,
			base: side(r.base),
			upstream: side(r.upstream),
			local: side(r.local),
			options: r.options,
			defaultTakeAll: r.defaultTakeAll,
			defaultKeep: r.defaultKeep
		};
	});
	return {
		buildId: build.id,
		version: build.version,
		guide: { slug: guide.slug, title: guide.title },
		base: { revisionId: state.baseRevision.id, number: state.baseRevision.number },
		upstream: {
			revisionId: state.upstreamRevision.id,
			number: state.upstreamRevision.number,
			publishedAt: state.upstreamRevision.publishedAt?.toISOString() ?? null
		},
		rows,
		conflicts: plan.conflicts,
		offered: plan.offered,
		lastSync: await lastSyncView(build.id, transaction),
		declinedAt: await declinedAt(build.id, state.upstreamRevision.id, transaction)
	};
}

/** When the owner declined this revision for this build (build-declines.ts), else null. */
async function declinedAt(
	buildId: number,
	revisionId: number,
	transaction?: Transaction
): Promise<string | null> {
	const [row] = await sequelize.query<{ declinedAt: Date }>(
		`SELECT declined_at AS declinedAt FROM build_update_declines
		  WHERE build_id = :buildId AND revision_id = :revisionId`,
		{ type: QueryTypes.SELECT, replacements: { buildId, revisionId }, transaction }
	);
	return row ? new Date(row.declinedAt).toISOString() : null;
}

/** The form message for a build the domain cannot sync (a SyncInputError), else null. */
export function inputError(e: unknown): Issues | null {
	if (e instanceof SyncInputError)
		return { _form: [`This build cannot be synced automatically: ${e.message}.`] };
	return null;
}

/** The table (or up to date) as it is now, for a stale answer. */
export async function stateOf(build: Build, transaction?: Transaction): Promise<SyncState> {
	const state = await loadState(build, transaction);
	if (state === 'up_to_date')
		return {
			kind: 'up_to_date',
			version: build.version,
			lastSync: await lastSyncView(build.id, transaction)
		};
	return { kind: 'plan', plan: await planView(state, transaction) };
}

/** The three-way table for the owner's build, or `up_to_date` when there is nothing newer. */
export async function syncPlan(ownerId: string, buildId: number): Promise<SyncPlanOutcome> {
	const build = await ownBuild(ownerId, buildId);
	if (!build) return { kind: 'not_found' };
	try {
		return await stateOf(build);
	} catch (e) {
		const issues = inputError(e);
		if (issues) return { kind: 'invalid', issues };
		throw e;
	}
}
