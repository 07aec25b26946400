/**
 * Sync of a build with its source guide (docs/architecture.md "Computations" §9): the per-slot
 * three-way table between the build's base revision, the guide's current published
 * revision and the build's slots (domain/sync.ts planSync), applying the reader's choices
 * as one transaction, and undoing the last sync.
 *
 * Owner only: another person's build is `not_found` (the route answers 404, no data).
 * Optimistic locking: the caller sends the build version it saw; the build row is locked
 * (SELECT … FOR UPDATE), the version compared, and the write stamped with
 * UPDATE builds … WHERE id AND version, so of two tabs only one sync lands.
 *
 * What a sync writes, all in one transaction: a BuildSync row with every slot as it was
 * (JSON rows, for undo), the rewritten build_slots, the build's new base revision and
 * version. A slot whose part changes to upstream's loses its price override and purchase
 * record (they were about the old part); a quantity-only change keeps both. Undo puts the
 * stored rows back as they were (including any slot edits made after the sync; the UI
 * says so before the reader confirms).
 */
import type { InferCreationAttributes, Transaction } from 'sequelize';
import { SyncInputError, applySync as applyDomainSync, planSync } from '$lib/domain/sync';
import type {
	BuildSlot as SyncBuildSlot,
	ConflictKind,
	SourceSlot,
	SyncChoice,
	SyncPlan,
	SyncStatus
} from '$lib/domain/sync';
import type { PartCategory } from '$lib/domain/types';
import { Build, BuildSlot, BuildSync, Guide, GuideRevision, Part, sequelize } from '$lib/server/db';
import type { SlotRowSnapshot } from '$lib/server/db/models/BuildSync';
import type { PartRef } from '$lib/views';
import { keyedRevisionSlots, sourceSlotsOf } from './build-source';
import { partRef } from './mappers';
import { loadRevisionSlots } from './revision-snapshots';

/** One side of a sync row: the part, how many, and the slot's label on that side. */
export interface SyncSideView {
	part: PartRef;
	quantity: number;
	label: string;
}

export interface SyncRowView {
	/** Row id for choices (`source:<key>` or `local:<build slot id>`). */
	id: string;
	status: SyncStatus;
	conflict: ConflictKind | null;
	/** The label to show: the build's, else upstream's, else the base's. */
	label: string;
	category: PartCategory;
	/** The build slot this row is about, if the build has one. */
	slotId: number | null;
	base: SyncSideView | null;
	upstream: SyncSideView | null;
	local: SyncSideView | null;
	options: SyncChoice[];
	defaultTakeAll: SyncChoice | null;
	defaultKeep: SyncChoice | null;
}

export interface LastSyncView {
	id: number;
	fromRevisionNumber: number | null;
	toRevisionNumber: number | null;
	createdAt: string;
}

export interface SyncPlanView {
	buildId: number;
	version: number;
	guide: { slug: string; title: string };
	base: { revisionId: number; number: number };
	upstream: { revisionId: number; number: number; publishedAt: string | null };
	rows: SyncRowView[];
	/** Row ids that need a choice. */
	conflicts: string[];
	/** Rows where taking upstream would change the build. */
	offered: number;
	/** The sync that undo would revert, if any. */
	lastSync: LastSyncView | null;
}

export type SyncPlanOutcome =
	| { kind: 'plan'; plan: SyncPlanView }
	/** No newer published revision (or no source left to sync with). */
	| { kind: 'up_to_date'; version: number; lastSync: LastSyncView | null }
	| { kind: 'invalid'; issues: Record<string, string[]> }
	| { kind: 'not_found' };

export interface ApplySyncInput {
	/** Row id → choice; conflicts need one. */
	choices: Record<string, SyncChoice>;
	/** Rows without a choice take their upstream change (conflicts still need a choice). */
	takeAllNonConflicting: boolean;
	/** The upstream revision the reader's table showed; a different one now means the table is stale. */
	upstreamRevisionId?: number;
}

/** The current state of the sync, sent back with a stale-version answer. */
export type SyncState = Exclude<SyncPlanOutcome, { kind: 'not_found' } | { kind: 'invalid' }>;

export type ApplySyncOutcome =
	| {
			kind: 'ok';
			version: number;
			syncId: number;
			baseRevisionId: number;
			changedSlots: number;
			removedSlots: number;
			addedSlots: number;
	  }
	| { kind: 'conflict'; current: SyncState }
	| { kind: 'invalid'; issues: Record<string, string[]> }
	| { kind: 'not_found' };

export type UndoSyncOutcome =
	| { kind: 'ok'; version: number; baseRevisionId: number | null; restoredSlots: number }
	| { kind: 'conflict'; current: SyncState }
	| { kind: 'invalid'; issues: Record<string, string[]> }
	| { kind: 'not_found' };

const NOTHING_TO_UNDO = 'There is no sync to undo on this build.';
const STALE_TABLE =
	'A newer revision of the guide was published since this table was made. Review the new table and choose again.';

interface SyncState0 {
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
async function ownBuild(
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
async function loadState(
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
		lastSync: await lastSyncView(build.id, transaction)
	};
}

function inputError(e: unknown): Record<string, string[]> | null {
	if (e instanceof SyncInputError)
		return { _form: [`This build cannot be synced automatically: ${e.message}.`] };
	return null;
}

async function stateOf(build: Build, transaction?: Transaction): Promise<SyncState> {
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

/** A build slot as stored, for BuildSync.slotsBefore (dates as ISO strings). */
function snapshotOf(slot: BuildSlot): SlotRowSnapshot {
	const plain = slot.get({ plain: true }) as unknown as Record<string, unknown>;
	const out: SlotRowSnapshot = {};
	for (const [k, v] of Object.entries(plain)) out[k] = v instanceof Date ? v.toISOString() : v;
	return out;
}

/** Bumps the version of a build the caller has locked; false when it moved meanwhile. */
async function stamp(
	build: Build,
	expectedVersion: number,
	changes: Partial<Pick<Build, 'baseRevisionId'>>,
	transaction: Transaction
): Promise<boolean> {
	const [affected] = await Build.update(
		{ ...changes, version: expectedVersion + 1 },
		{ where: { id: build.id, version: expectedVersion }, transaction }
	);
	return affected === 1;
}

class StaleVersion extends Error {}

/** The JSON column as rows (the driver may hand MariaDB's JSON back as text). */
function storedRows(value: unknown): SlotRowSnapshot[] {
	const parsed: unknown = typeof value === 'string' ? JSON.parse(value) : value;
	return Array.isArray(parsed) ? (parsed as SlotRowSnapshot[]) : [];
}

/**
 * Applies the reader's choices: one transaction that stores the slots before, rewrites the
 * slots per domain applySync, and moves the build's base to the guide's published revision.
 */
export async function applySync(
	ownerId: string,
	buildId: number,
	input: ApplySyncInput,
	expectedVersion: number
): Promise<ApplySyncOutcome> {
	try {
		return await sequelize.transaction(async (transaction): Promise<ApplySyncOutcome> => {
			const build = await ownBuild(ownerId, buildId, transaction);
			if (!build) return { kind: 'not_found' };
			if (build.version !== expectedVersion)
				return { kind: 'conflict', current: await stateOf(build, transaction) };
			const state = await loadState(build, transaction);
			if (state === 'up_to_date')
				return {
					kind: 'invalid',
					issues: { _form: ['This build is already on the guide’s latest published revision.'] }
				};
			if (
				input.upstreamRevisionId !== undefined &&
				input.upstreamRevisionId !== state.upstreamRevision.id
			) {
				return { kind: 'invalid', issues: { upstreamRevisionId: [STALE_TABLE] } };
			}
			const outcome = applyDomainSync(state.plan, input.choices, {
				takeAllNonConflicting: input.takeAllNonConflicting
			});
			if (!outcome.ok) {
				const issues: Record<string, string[]> = {};
				const labelOf = (rowId: string) => state.plan.rows.find((r) => r.id === rowId);
				for (const rowId of outcome.unresolved) {
					const row = labelOf(rowId);
					const label = row?.local?.label ?? row?.upstream?.label ?? row?.base?.label ?? rowId;
					(issues[`choices.${rowId}`] ??= []).push(
						`${label}: changed on both sides. Choose to take the guide’s version or keep yours.`
					);
				}
				for (const { rowId, reason } of outcome.invalid)
					(issues[`choices.${rowId}`] ??= []).push(reason);
				return { kind: 'invalid', issues };
			}

			const before = state.localSlots;
			const byId = new Map(before.map((s) => [s.id, s]));
			if (
				!(await stamp(
					build,
					expectedVersion,
					{ baseRevisionId: state.upstreamRevision.id },
					transaction
				))
			)
				throw new StaleVersion();
			const sync = await BuildSync.create(
				{
					buildId: build.id,
					fromRevisionId: state.baseRevision.id,
					toRevisionId: state.upstreamRevision.id,
					slotsBefore: before.map(snapshotOf)
				},
				{ transaction }
			);
			if (outcome.removedIds.length > 0) {
				await BuildSlot.destroy({
					where: { buildId: build.id, id: outcome.removedIds.map(Number) },
					transaction
				});
			}
			let changedSlots = 0;
			let addedSlots = 0;
			for (const [index, s] of outcome.slots.entries()) {
				const position = index + 1;
				const existing = s.id === null ? undefined : byId.get(Number(s.id));
				if (!existing) {
					addedSlots++;
					await BuildSlot.create(
						{
							buildId: build.id,
							sourceSlotKey: s.sourceKey,
							category: s.category as PartCategory,
							label: s.label,
							position,
							partId: s.partId,
							quantity: s.quantity,
							origin: 'source'
						},
						{ transaction }
					);
					continue;
				}
				if (s.changed) changedSlots++;
				const partChanged = existing.partId !== s.partId;
				existing.set({
					sourceSlotKey: s.sourceKey,
					label: s.label,
					category: s.category as PartCategory,
					position,
					partId: s.partId,
					quantity: s.quantity
				});
				if (s.from === 'upstream' && s.changed) existing.origin = 'source';
				if (partChanged) {
					// The override and the purchase were about the old part.
					existing.set({
						priceOverrideMinor: null,
						priceOverrideCurrency: null,
						priceOverrideStore: null,
						priceOverrideDate: null,
						purchased: false,
						paidMinor: null,
						paidCurrency: null,
						purchasedAt: null,
						purchaseStore: null
					});
				}
				if (existing.changed()) await existing.save({ transaction });
			}
			return {
				kind: 'ok',
				version: expectedVersion + 1,
				syncId: sync.id,
				baseRevisionId: state.upstreamRevision.id,
				changedSlots,
				removedSlots: outcome.removedIds.length,
				addedSlots
			};
		});
	} catch (e) {
		if (e instanceof StaleVersion) return conflictNow(ownerId, buildId);
		const issues = inputError(e);
		if (issues) return { kind: 'invalid', issues };
		throw e;
	}
}

async function conflictNow(
	ownerId: string,
	buildId: number
): Promise<{ kind: 'conflict'; current: SyncState } | { kind: 'not_found' }> {
	const build = await ownBuild(ownerId, buildId);
	return build ? { kind: 'conflict', current: await stateOf(build) } : { kind: 'not_found' };
}

/** Restores the slots and base revision of the build's last sync that was not undone. */
export async function undoLastSync(
	ownerId: string,
	buildId: number,
	expectedVersion: number
): Promise<UndoSyncOutcome> {
	try {
		return await sequelize.transaction(async (transaction): Promise<UndoSyncOutcome> => {
			const build = await ownBuild(ownerId, buildId, transaction);
			if (!build) return { kind: 'not_found' };
			if (build.version !== expectedVersion)
				return { kind: 'conflict', current: await stateOf(build, transaction) };
			const last = await BuildSync.findOne({
				where: { buildId: build.id, undoneAt: null },
				order: [['id', 'DESC']],
				transaction,
				lock: transaction.LOCK.UPDATE
			});
			if (!last) return { kind: 'invalid', issues: { _form: [NOTHING_TO_UNDO] } };
			if (
				!(await stamp(build, expectedVersion, { baseRevisionId: last.fromRevisionId }, transaction))
			)
				throw new StaleVersion();
			await BuildSlot.destroy({ where: { buildId: build.id }, transaction });
			const rows = storedRows(last.slotsBefore).map((row) => ({
				...row,
				buildId: build.id
			})) as unknown as InferCreationAttributes<BuildSlot>[];
			if (rows.length > 0) await BuildSlot.bulkCreate(rows, { transaction });
			last.undoneAt = new Date();
			await last.save({ transaction });
			return {
				kind: 'ok',
				version: expectedVersion + 1,
				baseRevisionId: last.fromRevisionId,
				restoredSlots: rows.length
			};
		});
	} catch (e) {
		if (e instanceof StaleVersion) return conflictNow(ownerId, buildId);
		throw e;
	}
}
