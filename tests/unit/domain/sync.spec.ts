import { describe, expect, it } from 'vitest';
import {
	applySync,
	drift,
	planSync,
	SyncInputError,
	type BuildSlot,
	type ConflictKind,
	type SlotContent,
	type SourceSlot,
	type SyncChoice,
	type SyncStatus
} from '$lib/domain/sync';

/*
 * Drift and sync are algorithms, not measurements: there is no published source to check
 * them against. The expected rows below are worked examples by hand from the design rule
 * (docs/architecture.md "Computations" §9 and issue 7: unchanged, upstream-only → offer to take,
 * local-only → keep, changed on both sides → the reader chooses, plus slots added or
 * removed on either side). Compared content is part id and quantity (sync.ts).
 * Parts are invented ids. Slot keys are the label here unless a test gives the slot a label of
 * its own (real keys are UUIDs, guide_slots.slot_key); matching never looks at the label.
 */

const src = (key: string, partId: number, quantity = 1): SourceSlot => ({
	key,
	label: key,
	category: 'gpu',
	partId,
	quantity
});
const mine = (id: number, sourceKey: string | null, partId: number, quantity = 1): BuildSlot => ({
	id,
	sourceKey,
	label: sourceKey ?? `Own ${id}`,
	category: 'gpu',
	partId,
	quantity
});
const content = (s: SlotContent | null | undefined) =>
	s ? { partId: s.partId, quantity: s.quantity } : null;

type Side = [partId: number, quantity: number] | null;

interface Case {
	name: string;
	base: Side;
	upstream: Side;
	local: Side;
	status: SyncStatus;
	conflict: ConflictKind | null;
	options: SyncChoice[];
	/** Content of the slot after the sync (null = no slot) for: take all non-conflicting, keep (no choices), explicit take_upstream, explicit keep_local. */
	takeAll: Side | 'choice required';
	keep: Side | 'choice required';
	takeUpstream: Side | 'not offered';
	keepLocal: Side | 'not offered';
}

const B: Side = [100, 1]; // base: part 100 × 1
const BOTH: SyncChoice[] = ['take_upstream', 'keep_local'];

/* One slot "Graphics card" in each case; worked by hand from the design rule. */
const CASES: Case[] = [
	{
		name: 'unchanged on both sides',
		base: B,
		upstream: B,
		local: B,
		status: 'unchanged',
		conflict: null,
		options: [],
		takeAll: B,
		keep: B,
		takeUpstream: 'not offered',
		keepLocal: 'not offered'
	},
	{
		name: 'upstream swapped the part',
		base: B,
		upstream: [200, 1],
		local: B,
		status: 'upstream_only',
		conflict: null,
		options: BOTH,
		takeAll: [200, 1],
		keep: B,
		takeUpstream: [200, 1],
		keepLocal: B
	},
	{
		name: 'upstream changed the quantity',
		base: B,
		upstream: [100, 2],
		local: B,
		status: 'upstream_only',
		conflict: null,
		options: BOTH,
		takeAll: [100, 2],
		keep: B,
		takeUpstream: [100, 2],
		keepLocal: B
	},
	{
		name: 'reader swapped the part',
		base: B,
		upstream: B,
		local: [300, 1],
		status: 'local_only',
		conflict: null,
		options: BOTH,
		takeAll: [300, 1],
		keep: [300, 1],
		takeUpstream: B,
		keepLocal: [300, 1]
	},
	{
		name: 'reader changed the quantity',
		base: B,
		upstream: B,
		local: [100, 3],
		status: 'local_only',
		conflict: null,
		options: BOTH,
		takeAll: [100, 3],
		keep: [100, 3],
		takeUpstream: B,
		keepLocal: [100, 3]
	},
	{
		name: 'both swapped to the same part',
		base: B,
		upstream: [200, 1],
		local: [200, 1],
		status: 'both_same',
		conflict: null,
		options: [],
		takeAll: [200, 1],
		keep: [200, 1],
		takeUpstream: 'not offered',
		keepLocal: 'not offered'
	},
	{
		name: 'both changed the quantity alike',
		base: B,
		upstream: [100, 2],
		local: [100, 2],
		status: 'both_same',
		conflict: null,
		options: [],
		takeAll: [100, 2],
		keep: [100, 2],
		takeUpstream: 'not offered',
		keepLocal: 'not offered'
	},
	{
		name: 'both swapped, to different parts',
		base: B,
		upstream: [200, 1],
		local: [300, 1],
		status: 'conflict',
		conflict: 'changed_both',
		options: BOTH,
		takeAll: 'choice required',
		keep: 'choice required',
		takeUpstream: [200, 1],
		keepLocal: [300, 1]
	},
	{
		name: 'upstream swapped, reader changed the quantity',
		base: B,
		upstream: [200, 1],
		local: [100, 2],
		status: 'conflict',
		conflict: 'changed_both',
		options: BOTH,
		takeAll: 'choice required',
		keep: 'choice required',
		takeUpstream: [200, 1],
		keepLocal: [100, 2]
	},
	{
		name: 'same part, different quantities',
		base: B,
		upstream: [100, 2],
		local: [100, 4],
		status: 'conflict',
		conflict: 'changed_both',
		options: BOTH,
		takeAll: 'choice required',
		keep: 'choice required',
		takeUpstream: [100, 2],
		keepLocal: [100, 4]
	},
	{
		name: 'upstream removed the slot, reader left it alone',
		base: B,
		upstream: null,
		local: B,
		status: 'removed_upstream',
		conflict: null,
		options: BOTH,
		takeAll: null,
		keep: B,
		takeUpstream: null,
		keepLocal: B
	},
	{
		name: 'upstream removed the slot, reader changed it',
		base: B,
		upstream: null,
		local: [300, 1],
		status: 'conflict',
		conflict: 'removed_upstream_changed_here',
		options: BOTH,
		takeAll: 'choice required',
		keep: 'choice required',
		takeUpstream: null,
		keepLocal: [300, 1]
	},
	{
		name: 'reader removed the slot, upstream left it alone',
		base: B,
		upstream: B,
		local: null,
		status: 'removed_locally',
		conflict: null,
		options: BOTH,
		takeAll: null,
		keep: null,
		takeUpstream: B,
		keepLocal: null
	},
	{
		name: 'reader removed the slot, upstream changed it',
		base: B,
		upstream: [200, 1],
		local: null,
		status: 'conflict',
		conflict: 'changed_upstream_removed_here',
		options: BOTH,
		takeAll: 'choice required',
		keep: 'choice required',
		takeUpstream: [200, 1],
		keepLocal: null
	},
	{
		name: 'removed on both sides',
		base: B,
		upstream: null,
		local: null,
		status: 'both_same',
		conflict: null,
		options: [],
		takeAll: null,
		keep: null,
		takeUpstream: 'not offered',
		keepLocal: 'not offered'
	},
	{
		name: 'upstream added the slot',
		base: null,
		upstream: [200, 1],
		local: null,
		status: 'added_upstream',
		conflict: null,
		options: BOTH,
		takeAll: [200, 1],
		keep: null,
		takeUpstream: [200, 1],
		keepLocal: null
	}
];

const KEY = 'Graphics card';
/** The one-slot scenario of a case, beside an untouched "Processor" slot that must stay. */
function scenario(c: Case) {
	const cpu = src('Processor', 1);
	const base = [cpu, ...(c.base ? [src(KEY, c.base[0], c.base[1])] : [])];
	const upstream = [cpu, ...(c.upstream ? [src(KEY, c.upstream[0], c.upstream[1])] : [])];
	const local = [
		mine(1, 'Processor', 1),
		...(c.local ? [mine(2, KEY, c.local[0], c.local[1])] : [])
	];
	return { base, upstream, local };
}

/** Content of the "Graphics card" slot after applying, or a marker. */
function after(
	c: Case,
	choices: Record<string, SyncChoice>,
	takeAll: boolean
): Side | 'choice required' {
	const { base, upstream, local } = scenario(c);
	const plan = planSync(base, upstream, local);
	const out = applySync(plan, choices, { takeAllNonConflicting: takeAll });
	if (!out.ok) {
		expect(out.unresolved).toEqual([`source:${KEY}`]);
		expect(out.invalid).toEqual([]);
		return 'choice required';
	}
	// The untouched slot always stays as it was, in place.
	expect(out.slots[0]).toMatchObject({
		id: 1,
		sourceKey: 'Processor',
		partId: 1,
		quantity: 1,
		changed: false
	});
	const slot = out.slots.find((s) => s.label === KEY);
	expect(out.slots).toHaveLength(slot ? 2 : 1);
	return slot ? [slot.partId, slot.quantity] : null;
}

describe('three-way sync table (worked examples from the design rule)', () => {
	it.each(CASES)('$name → $status', (c) => {
		const { base, upstream, local } = scenario(c);
		const plan = planSync(base, upstream, local);
		const row = plan.rows.find((r) => r.id === `source:${KEY}`)!;
		expect(row.status).toBe(c.status);
		expect(row.conflict).toBe(c.conflict);
		expect(row.options).toEqual(c.options);
		expect(content(row.base)).toEqual(c.base ? { partId: c.base[0], quantity: c.base[1] } : null);
		expect(content(row.upstream)).toEqual(
			c.upstream ? { partId: c.upstream[0], quantity: c.upstream[1] } : null
		);
		expect(content(row.local)).toEqual(
			c.local ? { partId: c.local[0], quantity: c.local[1] } : null
		);
		expect(plan.rows.find((r) => r.id === 'source:Processor')!.status).toBe('unchanged');
		expect(plan.conflicts).toEqual(c.status === 'conflict' ? [`source:${KEY}`] : []);

		expect(after(c, {}, true)).toEqual(c.takeAll);
		expect(after(c, {}, false)).toEqual(c.keep);
		for (const [choice, expected] of [
			['take_upstream', c.takeUpstream],
			['keep_local', c.keepLocal]
		] as const) {
			if (expected === 'not offered') {
				const out = applySync(plan, { [row.id]: choice });
				expect(out.ok).toBe(false);
				if (!out.ok)
					expect(out.invalid).toEqual([
						{ rowId: row.id, reason: `"${choice}" is not offered for a ${c.status} row` }
					]);
			} else {
				expect(after(c, { [row.id]: choice }, false)).toEqual(expected);
				// An explicit choice wins over "take all" too.
				expect(after(c, { [row.id]: choice }, true)).toEqual(expected);
			}
		}
	});

	it('covers every status and every conflict kind', () => {
		const statuses = new Set(CASES.map((c) => c.status));
		// added_locally has no source slot; it is covered in its own tests below.
		expect([...statuses, 'added_locally'].sort()).toEqual(
			[
				'added_locally',
				'added_upstream',
				'both_same',
				'conflict',
				'local_only',
				'removed_locally',
				'removed_upstream',
				'unchanged',
				'upstream_only'
			].sort()
		);
		expect(new Set(CASES.map((c) => c.conflict).filter(Boolean))).toEqual(
			new Set(['changed_both', 'removed_upstream_changed_here', 'changed_upstream_removed_here'])
		);
	});

	it('a slot the reader added is kept whatever the choice mode, and offers nothing', () => {
		const base = [src('Processor', 1)];
		const local = [mine(1, 'Processor', 1), mine(7, null, 555, 2)];
		const plan = planSync(base, base, local);
		expect(plan.rows.map((r) => [r.id, r.status, r.options])).toEqual([
			['source:Processor', 'unchanged', []],
			['local:7', 'added_locally', []]
		]);
		for (const takeAll of [true, false]) {
			const out = applySync(plan, {}, { takeAllNonConflicting: takeAll });
			expect(out.ok && out.slots.map((s) => [s.id, s.sourceKey, s.partId, s.quantity])).toEqual([
				[1, 'Processor', 1, 1],
				[7, null, 555, 2]
			]);
		}
	});

	it('slots added on both sides are two rows: the reader keeps theirs and may take upstream’s', () => {
		const base = [src('Processor', 1)];
		const upstream = [src('Processor', 1), src('Case fans', 40, 3)];
		const local = [mine(1, 'Processor', 1), mine(9, null, 41, 2)];
		const plan = planSync(base, upstream, local);
		expect(plan.rows.map((r) => [r.id, r.status])).toEqual([
			['source:Processor', 'unchanged'],
			['local:9', 'added_locally'],
			['source:Case fans', 'added_upstream']
		]);
		const out = applySync(plan, {}, { takeAllNonConflicting: true });
		expect(
			out.ok && out.slots.map((s) => [s.id, s.sourceKey, s.partId, s.quantity, s.from, s.changed])
		).toEqual([
			[1, 'Processor', 1, 1, 'local', false],
			[null, 'Case fans', 40, 3, 'upstream', true],
			[9, null, 41, 2, 'local', false]
		]);
	});

	it('a build slot whose source key is not in the base counts as the reader’s own', () => {
		const base = [src('Processor', 1)];
		const plan = planSync(base, base, [mine(1, 'Processor', 1), mine(2, 'Gone slot', 77)]);
		expect(plan.rows.map((r) => [r.id, r.status])).toEqual([
			['source:Processor', 'unchanged'],
			['local:2', 'added_locally']
		]);
		const out = applySync(plan, {});
		expect(out.ok && out.slots[1]).toMatchObject({ id: 2, sourceKey: null, partId: 77 });
	});

	it('matches by key, so reordering on either side changes nothing', () => {
		const base = [src('Processor', 1), src('Memory', 2), src('Graphics card', 3)];
		const upstream = [src('Graphics card', 3), src('Processor', 1), src('Memory', 2)];
		const local = [mine(13, 'Memory', 2), mine(11, 'Graphics card', 3), mine(12, 'Processor', 1)];
		const plan = planSync(base, upstream, local);
		expect(plan.rows.map((r) => r.status)).toEqual(['unchanged', 'unchanged', 'unchanged']);
		expect(plan.offered).toBe(0);
		expect(drift(base, local).changed).toBe(0);
	});

	it('rejects duplicate keys and ids', () => {
		const a = src('Processor', 1);
		expect(() => planSync([a, a], [a], [])).toThrow(SyncInputError);
		expect(() => planSync([a], [a, a], [])).toThrow(
			'upstream revision has two slots with key "Processor"'
		);
		expect(() => planSync([a], [a], [mine(1, 'Processor', 1), mine(2, 'Processor', 1)])).toThrow(
			'two slots from source slot "Processor"'
		);
		expect(() => planSync([a], [a], [mine(1, 'Processor', 1), mine(1, null, 5)])).toThrow(
			'two slots with id 1'
		);
	});
});

describe('applySync on a whole build (worked example by hand)', () => {
	// Base revision 1; upstream revision 2; the reader's build.
	const base = [
		src('Processor', 10),
		src('Memory', 20),
		src('Graphics card', 30),
		src('Case fans', 40, 3),
		src('Storage', 50),
		src('Extras', 60)
	];
	const upstream = [
		src('Processor', 11), //        upstream-only swap
		src('Memory', 21), //           conflict (reader chose 22)
		src('Cooler', 70), //           added upstream, after Memory
		src('Graphics card', 30), //    reader changed quantity → local-only
		src('Case fans', 40, 2), //     conflict: reader removed it, upstream changed the count
		src('Storage', 50) //           unchanged
		// Extras removed upstream; the reader left it alone → removed_upstream
	];
	const local = [
		mine(1, 'Processor', 10),
		mine(2, 'Memory', 22),
		mine(3, 'Graphics card', 30, 2),
		mine(5, 'Storage', 50),
		mine(6, 'Extras', 60),
		mine(7, null, 90) // the reader's own slot
	];
	const plan = planSync(base, upstream, local);

	it('classifies every row and lists the conflicts', () => {
		expect(plan.rows.map((r) => [r.id, r.status, r.conflict])).toEqual([
			['source:Processor', 'upstream_only', null],
			['source:Memory', 'conflict', 'changed_both'],
			['source:Graphics card', 'local_only', null],
			['source:Storage', 'unchanged', null],
			['source:Extras', 'removed_upstream', null],
			['local:7', 'added_locally', null],
			['source:Case fans', 'conflict', 'changed_upstream_removed_here'],
			['source:Cooler', 'added_upstream', null]
		]);
		expect(plan.conflicts).toEqual(['source:Memory', 'source:Case fans']);
		expect(plan.offered).toBe(5);
	});

	it('refuses to apply while a conflict has no choice, listing the unresolved ones', () => {
		expect(applySync(plan, {}, { takeAllNonConflicting: true })).toEqual({
			ok: false,
			unresolved: ['source:Memory', 'source:Case fans'],
			invalid: []
		});
		expect(applySync(plan, { 'source:Memory': 'keep_local' })).toEqual({
			ok: false,
			unresolved: ['source:Case fans'],
			invalid: []
		});
	});

	it('reports choices for unknown rows or choices a row does not offer', () => {
		const out = applySync(plan, {
			'source:Memory': 'keep_local',
			'source:Case fans': 'keep_local',
			'source:Nope': 'take_upstream',
			'local:7': 'take_upstream'
		});
		expect(out).toEqual({
			ok: false,
			unresolved: [],
			invalid: [
				{ rowId: 'source:Nope', reason: 'no such row in this sync' },
				{ rowId: 'local:7', reason: '"take_upstream" is not offered for a added_locally row' }
			]
		});
	});

	it('take all non-conflicting + a choice per conflict gives the expected build', () => {
		const out = applySync(
			plan,
			{ 'source:Memory': 'keep_local', 'source:Case fans': 'take_upstream' },
			{ takeAllNonConflicting: true }
		);
		expect(out.ok).toBe(true);
		if (!out.ok) return;
		expect(
			out.slots.map((s) => [s.id, s.sourceKey, s.partId, s.quantity, s.from, s.changed])
		).toEqual([
			[1, 'Processor', 11, 1, 'upstream', true],
			[2, 'Memory', 22, 1, 'local', false],
			[null, 'Cooler', 70, 1, 'upstream', true],
			[3, 'Graphics card', 30, 2, 'local', false],
			[null, 'Case fans', 40, 2, 'upstream', true],
			[5, 'Storage', 50, 1, 'local', false],
			[7, null, 90, 1, 'local', false]
		]);
		expect(out.removedIds).toEqual([6]);
		expect(out.decisions.find((d) => d.rowId === 'source:Extras')).toEqual({
			rowId: 'source:Extras',
			status: 'removed_upstream',
			choice: 'take_upstream'
		});
	});

	it('without "take all", only chosen rows change; a slot kept although upstream removed it loses its source key', () => {
		const out = applySync(plan, {
			'source:Memory': 'take_upstream',
			'source:Case fans': 'keep_local',
			'source:Cooler': 'take_upstream'
		});
		expect(out.ok).toBe(true);
		if (!out.ok) return;
		expect(out.slots.map((s) => [s.id, s.sourceKey, s.partId, s.quantity])).toEqual([
			[1, 'Processor', 10, 1],
			[2, 'Memory', 21, 1],
			[null, 'Cooler', 70, 1],
			[3, 'Graphics card', 30, 2],
			[5, 'Storage', 50, 1],
			[6, null, 60, 1],
			[7, null, 90, 1]
		]);
		expect(out.removedIds).toEqual([]);
	});

	it('after a sync, the result compared with the new base shows only the reader’s own choices as drift', () => {
		const out = applySync(
			plan,
			{ 'source:Memory': 'keep_local', 'source:Case fans': 'take_upstream' },
			{ takeAllNonConflicting: true }
		);
		if (!out.ok) throw new Error('expected ok');
		const rebuilt = out.slots.map((s, i) => ({ ...s, id: s.id ?? 100 + i }));
		const again = planSync(upstream, upstream, rebuilt);
		expect(again.conflicts).toEqual([]);
		expect(again.rows.filter((r) => r.status !== 'unchanged').map((r) => [r.id, r.status])).toEqual(
			[
				['source:Memory', 'local_only'],
				['source:Graphics card', 'local_only'],
				['local:7', 'added_locally']
			]
		);
	});
});

describe('drift from the base revision (worked examples)', () => {
	it('reports same, swapped, quantity, added and removed per slot', () => {
		const base = [
			src('Processor', 10),
			src('Memory', 20),
			src('Case fans', 40, 3),
			src('Storage', 50),
			src('Extras', 60)
		];
		const local = [
			mine(1, 'Processor', 10),
			mine(2, 'Memory', 21),
			mine(3, 'Case fans', 40, 2),
			mine(4, 'Storage', 51, 2),
			mine(7, null, 90)
		];
		const d = drift(base, local);
		expect(
			d.rows.map((r) => [r.kind, r.sourceKey, r.quantityChanged, content(r.base), content(r.local)])
		).toEqual([
			['same', 'Processor', false, { partId: 10, quantity: 1 }, { partId: 10, quantity: 1 }],
			['swapped', 'Memory', false, { partId: 20, quantity: 1 }, { partId: 21, quantity: 1 }],
			['quantity', 'Case fans', true, { partId: 40, quantity: 3 }, { partId: 40, quantity: 2 }],
			['swapped', 'Storage', true, { partId: 50, quantity: 1 }, { partId: 51, quantity: 2 }],
			['added', null, false, null, { partId: 90, quantity: 1 }],
			['removed', 'Extras', false, { partId: 60, quantity: 1 }, null]
		]);
		expect(d.changed).toBe(5);
	});

	it('an untouched fork has no drift', () => {
		const base = [src('Processor', 10), src('Memory', 20)];
		const d = drift(base, [mine(1, 'Processor', 10), mine(2, 'Memory', 20)]);
		expect(d.changed).toBe(0);
		expect(d.rows.map((r) => r.kind)).toEqual(['same', 'same']);
	});
});

/*
 * Slot identity (issue 11): labels are display text and may repeat; only keys match. Worked
 * by hand from the rule above: a build slot pairs with the base and upstream slots of its
 * source key, whatever the labels say.
 */
describe('slot identity: keys match, labels do not', () => {
	const labelled = (key: string, label: string, partId: number, quantity = 1): SourceSlot => ({
		...src(key, partId, quantity),
		label
	});
	const mineLabelled = (
		id: number,
		key: string | null,
		label: string,
		partId: number,
		quantity = 1
	) => ({
		...mine(id, key, partId, quantity),
		label
	});

	it('a slot renamed upstream is the same slot: unchanged, nothing offered, no drift', () => {
		const base = [labelled('k-cpu', 'CPU', 1)];
		const upstream = [labelled('k-cpu', 'Processor', 1)];
		const local = [mineLabelled(1, 'k-cpu', 'CPU', 1)];
		const plan = planSync(base, upstream, local);
		expect(plan.rows.map((r) => [r.id, r.status])).toEqual([['source:k-cpu', 'unchanged']]);
		expect(plan.offered).toBe(0);
		const out = applySync(plan, {}, { takeAllNonConflicting: true });
		expect(out.ok && out.slots.map((s) => [s.id, s.sourceKey, s.label, s.partId])).toEqual([
			[1, 'k-cpu', 'CPU', 1]
		]);
		expect(drift(upstream, local).changed).toBe(0);
	});

	it('two "Storage" slots, one edited and one removed upstream: the edited one’s build slot is kept', () => {
		const base = [labelled('k-a', 'Storage', 20), labelled('k-b', 'Storage', 21)];
		// Upstream removed the first drive and gave the second a new part.
		const upstream = [labelled('k-b', 'Storage', 22)];
		const local = [mineLabelled(1, 'k-a', 'Storage', 20), mineLabelled(2, 'k-b', 'Storage', 21)];
		const plan = planSync(base, upstream, local);
		expect(plan.rows.map((r) => [r.id, r.status])).toEqual([
			['source:k-a', 'removed_upstream'],
			['source:k-b', 'upstream_only']
		]);
		expect(plan.conflicts).toEqual([]);
		const out = applySync(plan, {}, { takeAllNonConflicting: true });
		expect(out.ok && out.removedIds).toEqual([1]);
		expect(out.ok && out.slots.map((s) => [s.id, s.sourceKey, s.partId, s.from])).toEqual([
			[2, 'k-b', 22, 'upstream']
		]);
	});

	it('labels that numbering would collide on ("Storage", "Storage", "Storage (2)") are three slots', () => {
		const base = [
			labelled('k-a', 'Storage', 20),
			labelled('k-b', 'Storage', 21),
			labelled('k-c', 'Storage (2)', 23)
		];
		const local = [
			mineLabelled(1, 'k-a', 'Storage', 20),
			mineLabelled(2, 'k-b', 'Storage', 21),
			mineLabelled(3, 'k-c', 'Storage (2)', 23)
		];
		const plan = planSync(base, base, local);
		expect(plan.rows.map((r) => r.status)).toEqual(['unchanged', 'unchanged', 'unchanged']);
		expect(drift(base, local).changed).toBe(0);
	});

	it('a pure reorder of two same-label slots reports no change', () => {
		const base = [labelled('k-a', 'Storage', 20), labelled('k-b', 'Storage', 21)];
		const upstream = [labelled('k-b', 'Storage', 21), labelled('k-a', 'Storage', 20)];
		const local = [mineLabelled(1, 'k-a', 'Storage', 20), mineLabelled(2, 'k-b', 'Storage', 21)];
		const plan = planSync(base, upstream, local);
		expect(plan.rows.map((r) => r.status)).toEqual(['unchanged', 'unchanged']);
		expect(plan.conflicts).toEqual([]);
		expect(plan.offered).toBe(0);
		const out = applySync(plan, {}, { takeAllNonConflicting: true });
		expect(out.ok && out.slots.map((s) => [s.id, s.partId, s.changed])).toEqual([
			[1, 20, false],
			[2, 21, false]
		]);
	});

	it('the same slot added on both sides (same label, same part) stays two rows: only a key links slots', () => {
		const base = [labelled('k-cpu', 'CPU', 1)];
		const upstream = [labelled('k-cpu', 'CPU', 1), labelled('k-new', 'Second drive', 21)];
		const local = [mineLabelled(1, 'k-cpu', 'CPU', 1), mineLabelled(5, null, 'Second drive', 21)];
		const plan = planSync(base, upstream, local);
		expect(plan.rows.map((r) => [r.id, r.status])).toEqual([
			['source:k-cpu', 'unchanged'],
			['local:5', 'added_locally'],
			['source:k-new', 'added_upstream']
		]);
		// Keeping: the reader's own drive only. Taking all: theirs and upstream's, each once.
		const keep = applySync(plan, {});
		expect(keep.ok && keep.slots.map((s) => [s.id, s.sourceKey])).toEqual([
			[1, 'k-cpu'],
			[5, null]
		]);
		const take = applySync(plan, {}, { takeAllNonConflicting: true });
		expect(take.ok && take.slots.map((s) => [s.id, s.sourceKey, s.partId])).toEqual([
			[1, 'k-cpu', 1],
			[null, 'k-new', 21],
			[5, null, 21]
		]);
	});
});
