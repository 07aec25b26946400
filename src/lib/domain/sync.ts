/**
 * Drift and sync (docs/architecture.md "Computations" §9): a build against the guide revision it was
 * forked from (the base) and a newer published revision of that guide (upstream).
 *
 * Slot key: every guide slot carries a `key` that is unique within a revision and stays the
 * same from one revision to the next (the slot's own identity, made when the author first
 * adds it; revision-diff matches on it too). A build slot records the key of the source slot
 * it came from in `sourceKey`; slots the reader added have `sourceKey: null`. Matching is by
 * key only, never by label, position or row id: a renamed slot is still the same slot, labels
 * may repeat, reordering on either side changes nothing, and new slot rows in each revision
 * (new ids) do not break the link.
 *
 * Compared content: part id AND quantity. A change of quantity (two fan packs instead of
 * three) changes what the reader buys and pays, so it counts as a change like a swap.
 * Label, category, reason and position are not compared; they follow whichever side's slot
 * is kept.
 *
 * Pure: plain inputs, plain outputs, no framework or database imports.
 */

/** What is compared per slot. */
export interface SlotContent {
	partId: number;
	quantity: number;
}

/** A slot of a guide revision (base or upstream). `key` is unique within the revision. */
export interface SourceSlot extends SlotContent {
	key: string;
	label: string;
	category: string;
}

/** A slot of the reader's build. `id` is the caller's row id, unique within the build. */
export interface BuildSlot extends SlotContent {
	id: string | number;
	/** Key of the base revision's slot it came from; null for a slot the reader added. */
	sourceKey: string | null;
	label: string;
	category: string;
}

export const SYNC_STATUSES = [
	'unchanged',
	'upstream_only',
	'local_only',
	'both_same',
	'conflict',
	'added_upstream',
	'removed_upstream',
	'added_locally',
	'removed_locally'
] as const;
export type SyncStatus = (typeof SYNC_STATUSES)[number];

/** Why a row is a conflict. */
export type ConflictKind =
	/** Both sides changed the slot, to different content. */
	| 'changed_both'
	/** Upstream removed the slot; the reader changed it. */
	| 'removed_upstream_changed_here'
	/** Upstream changed the slot; the reader removed it. */
	| 'changed_upstream_removed_here';

export type SyncChoice = 'take_upstream' | 'keep_local';

export interface SyncRow {
	/** Row id for choices: `source:<key>` for slots of the source, `local:<build slot id>` for slots the reader added. */
	id: string;
	sourceKey: string | null;
	status: SyncStatus;
	conflict: ConflictKind | null;
	base: SourceSlot | null;
	upstream: SourceSlot | null;
	local: BuildSlot | null;
	/** Choices that mean something for this row (empty when there is nothing to choose). */
	options: SyncChoice[];
	/** What happens without an explicit choice when the reader takes all non-conflicting changes; null for conflicts (a choice is required). */
	defaultTakeAll: SyncChoice | null;
	/** What happens without an explicit choice otherwise; null for conflicts. */
	defaultKeep: SyncChoice | null;
}

export interface SyncPlan {
	rows: SyncRow[];
	/** Ids of the conflict rows, in row order. */
	conflicts: string[];
	/** Rows where taking upstream would change the build (upstream-only, added, removed upstream, conflicts). */
	offered: number;
	/** The upstream revision's slot keys in its order (used to place slots taken from it). */
	upstreamKeys: string[];
}

/** Thrown for inputs that break the matching rules (duplicate keys or ids). */
export class SyncInputError extends Error {
	constructor(message: string) {
		super(message);
		this.name = 'SyncInputError';
	}
}

export function sameContent(a: SlotContent, b: SlotContent): boolean {
	return a.partId === b.partId && a.quantity === b.quantity;
}

function indexSource(slots: readonly SourceSlot[], side: string): Map<string, SourceSlot> {
	const map = new Map<string, SourceSlot>();
	for (const s of slots) {
		if (map.has(s.key))
			throw new SyncInputError(`${side} revision has two slots with key "${s.key}"`);
		map.set(s.key, s);
	}
	return map;
}

/**
 * Build slots by source key. A build slot whose sourceKey is not in the base (a stale
 * link) is treated as a slot the reader added; it is returned in `orphans`.
 */
function indexLocal(local: readonly BuildSlot[], base: Map<string, SourceSlot>) {
	const byKey = new Map<string, BuildSlot>();
	const ids = new Set<string | number>();
	const added: BuildSlot[] = [];
	for (const s of local) {
		if (ids.has(s.id)) throw new SyncInputError(`build has two slots with id ${String(s.id)}`);
		ids.add(s.id);
		if (s.sourceKey === null || !base.has(s.sourceKey)) {
			added.push(s);
			continue;
		}
		if (byKey.has(s.sourceKey))
			throw new SyncInputError(`build has two slots from source slot "${s.sourceKey}"`);
		byKey.set(s.sourceKey, s);
	}
	return { byKey, added };
}

const BOTH: SyncChoice[] = ['take_upstream', 'keep_local'];

function row(
	partial: Pick<SyncRow, 'id' | 'sourceKey' | 'status' | 'base' | 'upstream' | 'local'> &
		Partial<SyncRow>
): SyncRow {
	return {
		conflict: null,
		options: [],
		defaultTakeAll: 'keep_local',
		defaultKeep: 'keep_local',
		...partial
	};
}

/** Classifies one source slot present in the base. */
function classify(key: string, b: SourceSlot, u: SourceSlot | null, l: BuildSlot | null): SyncRow {
	const common = { id: `source:${key}`, sourceKey: key, base: b, upstream: u, local: l };
	if (u && l) {
		const upChanged = !sameContent(b, u);
		const hereChanged = !sameContent(b, l);
		if (!upChanged && !hereChanged) return row({ ...common, status: 'unchanged' });
		if (upChanged && !hereChanged)
			return row({
				...common,
				status: 'upstream_only',
				options: BOTH,
				defaultTakeAll: 'take_upstream'
			});
		// Taking upstream on a local-only change reverts it to the source.
		if (!upChanged && hereChanged) return row({ ...common, status: 'local_only', options: BOTH });
		if (sameContent(u, l)) return row({ ...common, status: 'both_same' });
		return row({
			...common,
			status: 'conflict',
			conflict: 'changed_both',
			options: BOTH,
			defaultTakeAll: null,
			defaultKeep: null
		});
	}
	if (!u && l) {
		if (sameContent(b, l))
			return row({
				...common,
				status: 'removed_upstream',
				options: BOTH,
				defaultTakeAll: 'take_upstream'
			});
		return row({
			...common,
			status: 'conflict',
			conflict: 'removed_upstream_changed_here',
			options: BOTH,
			defaultTakeAll: null,
			defaultKeep: null
		});
	}
	if (u && !l) {
		// Taking upstream on a local removal puts the source's slot back.
		if (sameContent(b, u)) return row({ ...common, status: 'removed_locally', options: BOTH });
		return row({
			...common,
			status: 'conflict',
			conflict: 'changed_upstream_removed_here',
			options: BOTH,
			defaultTakeAll: null,
			defaultKeep: null
		});
	}
	// Removed on both sides: the same change, nothing to choose.
	return row({ ...common, status: 'both_same' });
}

/**
 * The per-slot three-way table. Rows come in the build's order (slots the reader added in
 * place), then slots the build no longer has (in the base's order), then slots upstream
 * added (in upstream's order).
 */
export function planSync(
	base: readonly SourceSlot[],
	upstream: readonly SourceSlot[],
	local: readonly BuildSlot[]
): SyncPlan {
	const b = indexSource(base, 'base');
	const u = indexSource(upstream, 'upstream');
	const { byKey } = indexLocal(local, b);
	const rows: SyncRow[] = [];

	for (const l of local) {
		const key = l.sourceKey;
		const baseSlot = key !== null && byKey.get(key) === l ? b.get(key) : undefined;
		if (key !== null && baseSlot) {
			rows.push(classify(key, baseSlot, u.get(key) ?? null, l));
		} else {
			rows.push(
				row({
					id: `local:${String(l.id)}`,
					sourceKey: null,
					status: 'added_locally',
					base: null,
					upstream: null,
					local: l
				})
			);
		}
	}
	for (const s of base)
		if (!byKey.has(s.key)) rows.push(classify(s.key, s, u.get(s.key) ?? null, null));
	for (const s of upstream) {
		if (!b.has(s.key)) {
			rows.push(
				row({
					id: `source:${s.key}`,
					sourceKey: s.key,
					status: 'added_upstream',
					base: null,
					upstream: s,
					local: null,
					options: BOTH,
					defaultTakeAll: 'take_upstream'
				})
			);
		}
	}
	const conflicts = rows.filter((r) => r.status === 'conflict').map((r) => r.id);
	const offered = rows.filter((r) =>
		['upstream_only', 'added_upstream', 'removed_upstream', 'conflict'].includes(r.status)
	).length;
	return { rows, conflicts, offered, upstreamKeys: upstream.map((s) => s.key) };
}

/** One slot of the build after a sync. */
export interface SyncedSlot extends SlotContent {
	/** The existing build slot to update, or null for a slot to create. */
	id: string | number | null;
	/** Key in the upstream revision (the build's new base); null when upstream has no such slot. */
	sourceKey: string | null;
	label: string;
	category: string;
	/** Which side the content came from. */
	from: 'local' | 'upstream';
	/** Part or quantity differ from what the build had (always true for created slots). */
	changed: boolean;
}

export interface SyncDecision {
	rowId: string;
	status: SyncStatus;
	choice: SyncChoice | null;
}

export type SyncOutcome =
	| {
			ok: true;
			/** The build's slots after the sync, in order. */
			slots: SyncedSlot[];
			/** Build slot ids to delete. */
			removedIds: (string | number)[];
			/** The choice applied to every row (null where there was nothing to choose). */
			decisions: SyncDecision[];
	  }
	| {
			ok: false;
			/** Conflict rows without a choice. */
			unresolved: string[];
			/** Choices for unknown rows or rows that do not offer them. */
			invalid: { rowId: string; reason: string }[];
	  };

export interface ApplyOptions {
	/** "Take all non-conflicting": rows without a choice take their upstream change. */
	takeAllNonConflicting?: boolean;
}

function fromUpstream(u: SourceSlot, l: BuildSlot | null): SyncedSlot {
	return {
		id: l ? l.id : null,
		sourceKey: u.key,
		label: u.label,
		category: u.category,
		partId: u.partId,
		quantity: u.quantity,
		from: 'upstream',
		changed: !l || !sameContent(u, l)
	};
}

function fromLocal(l: BuildSlot, sourceKey: string | null): SyncedSlot {
	return {
		id: l.id,
		sourceKey,
		label: l.label,
		category: l.category,
		partId: l.partId,
		quantity: l.quantity,
		from: 'local',
		changed: false
	};
}

/**
 * Applies the reader's choices to a plan. Conflicts need an explicit choice; other rows
 * take `defaultTakeAll` or `defaultKeep` when they have none. A slot kept although
 * upstream removed it loses its source key (it becomes the reader's own slot against the
 * new base). Slots put in from upstream go after the nearest slot that precedes them in
 * the upstream revision, or first when none does.
 */
export function applySync(
	plan: SyncPlan,
	choices: Readonly<Record<string, SyncChoice>>,
	options: ApplyOptions = {}
): SyncOutcome {
	const rowsById = new Map(plan.rows.map((r) => [r.id, r]));
	const invalid: { rowId: string; reason: string }[] = [];
	for (const [rowId, choice] of Object.entries(choices)) {
		const r = rowsById.get(rowId);
		if (!r) invalid.push({ rowId, reason: 'no such row in this sync' });
		else if (!r.options.includes(choice))
			invalid.push({ rowId, reason: `"${choice}" is not offered for a ${r.status} row` });
	}
	const unresolved = plan.rows
		.filter((r) => r.status === 'conflict' && !Object.hasOwn(choices, r.id))
		.map((r) => r.id);
	if (invalid.length > 0 || unresolved.length > 0) return { ok: false, unresolved, invalid };

	const kept: SyncedSlot[] = [];
	const inserted: SyncedSlot[] = [];
	const removedIds: (string | number)[] = [];
	const decisions: SyncDecision[] = [];

	for (const r of plan.rows) {
		const explicit = Object.hasOwn(choices, r.id) ? (choices[r.id] ?? null) : null;
		const choice =
			r.options.length === 0
				? null
				: (explicit ?? (options.takeAllNonConflicting ? r.defaultTakeAll : r.defaultKeep));
		decisions.push({ rowId: r.id, status: r.status, choice });
		const { upstream: u, local: l } = r;
		if (choice === 'take_upstream') {
			if (u) (l ? kept : inserted).push(fromUpstream(u, l));
			else if (l) removedIds.push(l.id);
		} else if (l) {
			// Keep (or nothing to choose): the reader's slot stays, linked to upstream's key if it still exists.
			kept.push(fromLocal(l, u ? u.key : null));
		}
	}

	// Place created slots by upstream order.
	const slots = [...kept];
	const upstreamIndex = new Map(plan.upstreamKeys.map((k, i) => [k, i]));
	// Every inserted slot came from upstream, so its key is in the index.
	const at = (key: string | null) => (key === null ? -1 : (upstreamIndex.get(key) ?? -1));
	inserted.sort((a, b) => at(a.sourceKey) - at(b.sourceKey));
	for (const s of inserted) {
		let index = 0;
		for (let k = at(s.sourceKey) - 1; k >= 0; k--) {
			const prevKey = plan.upstreamKeys[k];
			const found = slots.findIndex((x) => x.sourceKey === prevKey);
			if (found >= 0) {
				index = found + 1;
				break;
			}
		}
		slots.splice(index, 0, s);
	}
	return { ok: true, slots, removedIds, decisions };
}

export type DriftKind = 'same' | 'swapped' | 'quantity' | 'added' | 'removed';

export interface DriftRow {
	kind: DriftKind;
	/** Source slot key; null for a slot the reader added. */
	sourceKey: string | null;
	base: SourceSlot | null;
	local: BuildSlot | null;
	/** For `swapped`: the quantity changed as well. */
	quantityChanged: boolean;
}

export interface Drift {
	rows: DriftRow[];
	/** Slots that are not `same`. */
	changed: number;
}

/**
 * Per-slot difference of a build from its base revision: `swapped` when the part differs
 * (whatever the quantity), `quantity` when only the quantity differs, `added` for the
 * reader's own slots (and slots whose source key is not in the base), `removed` for base
 * slots the build no longer has. Rows follow the build's order, removed slots last in the
 * base's order.
 */
export function drift(base: readonly SourceSlot[], local: readonly BuildSlot[]): Drift {
	const b = indexSource(base, 'base');
	const { byKey } = indexLocal(local, b);
	const rows: DriftRow[] = [];
	for (const l of local) {
		const key = l.sourceKey;
		const s = key !== null && byKey.get(key) === l ? (b.get(key) ?? null) : null;
		if (!s) {
			rows.push({ kind: 'added', sourceKey: null, base: null, local: l, quantityChanged: false });
			continue;
		}
		const quantityChanged = s.quantity !== l.quantity;
		const kind: DriftKind =
			s.partId !== l.partId ? 'swapped' : quantityChanged ? 'quantity' : 'same';
		rows.push({ kind, sourceKey: s.key, base: s, local: l, quantityChanged });
	}
	for (const s of base) {
		if (!byKey.has(s.key))
			rows.push({
				kind: 'removed',
				sourceKey: s.key,
				base: s,
				local: null,
				quantityChanged: false
			});
	}
	return { rows, changed: rows.filter((r) => r.kind !== 'same').length };
}
