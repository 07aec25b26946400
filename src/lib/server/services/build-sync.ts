/**
 * Sync of a build with its source guide, changing (docs/architecture.md "Computations" §9):
 * applying the reader's choices from the three-way table (build-sync-plan.ts) as one
 * transaction, and undoing the last sync.
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
import { applySync as applyDomainSync } from '$lib/domain/sync';
import type { SyncChoice } from '$lib/domain/sync';
import type { PartCategory } from '$lib/domain/types';
import { Build, BuildSlot, BuildSync, sequelize } from '$lib/server/db';
import type { SlotRowSnapshot } from '$lib/server/db/models/BuildSync';
import { inputError, loadState, ownBuild, stateOf } from './build-sync-plan';
import type { SyncState } from './build-sync-plan';
import type { Invalid, Issues, NotFound, Stale, VersionedOutcome } from '$lib/schemas/issues';

export interface ApplySyncInput {
	/** Row id → choice; conflicts need one. */
	choices: Record<string, SyncChoice>;
	/** Rows without a choice take their upstream change (conflicts still need a choice). */
	takeAllNonConflicting: boolean;
	/** The upstream revision the reader's table showed; a different one now means the table is stale. */
	upstreamRevisionId?: number;
}

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
	| Stale<SyncState>
	| Invalid
	| NotFound;

export type UndoSyncOutcome = VersionedOutcome<
	{ version: number; baseRevisionId: number | null; restoredSlots: number },
	SyncState
>;

const NOTHING_TO_UNDO = 'There is no sync to undo on this build.';
const STALE_TABLE =
	'A newer revision of the guide was published since this table was made. Review the new table and choose again.';

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
				const issues: Issues = {};
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
