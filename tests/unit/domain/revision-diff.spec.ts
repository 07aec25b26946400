import { describe, expect, it } from 'vitest';
import {
	revisionDiff,
	type RevisionSnapshot,
	type SlotSnapshot
} from '../../../src/lib/domain/revision-diff';

/** A slot whose key is its label unless `over` gives one (slots are matched by key). */
function slot(label: string, over: Partial<SlotSnapshot> = {}): SlotSnapshot {
	return {
		key: label,
		label,
		category: 'cpu',
		pick: { id: 1, name: 'Arvo C6' },
		quantity: 1,
		reason: 'Six cores for the money.',
		alternates: [{ partId: 10, name: 'Arvo C4', rank: 1, reasonTag: 'lower-price', note: '' }],
		...over
	};
}

const base: RevisionSnapshot = {
	number: 1,
	buildNotesMd: '## Firmware\n\nEnable the memory profile.\nUpdate the firmware.\n',
	slots: [
		slot('Processor'),
		slot('Storage', { category: 'storage', pick: { id: 2, name: 'Kelp 1TB' } }),
		slot('Case fans', { category: 'fan', pick: { id: 3, name: 'Breeze 120' }, alternates: [] })
	]
};

describe('revisionDiff', () => {
	it('reports nothing for identical revisions', () => {
		const d = revisionDiff(base, { ...base, number: 2 });
		expect(d).toEqual({ from: 1, to: 2, slots: [], notes: [], notesChanged: false });
	});

	it('finds added, removed and changed slots with their fields', () => {
		const next: RevisionSnapshot = {
			number: 2,
			buildNotesMd: base.buildNotesMd,
			slots: [
				slot('Processor', { pick: { id: 5, name: 'Arvo C8' }, reason: 'Eight cores now.' }),
				slot('Storage', { category: 'storage', pick: { id: 2, name: 'Kelp 1TB' }, quantity: 2 }),
				slot('Graphics card', { category: 'gpu', pick: { id: 7, name: 'Vanta 60' } })
			]
		};
		const d = revisionDiff(base, next);
		expect(d.slots).toEqual([
			{
				kind: 'changed',
				key: 'Processor',
				label: 'Processor',
				renamedFrom: null,
				fields: [
					{ field: 'pick', from: 'Arvo C6', to: 'Arvo C8' },
					{ field: 'reason', from: 'Six cores for the money.', to: 'Eight cores now.' }
				],
				alternates: []
			},
			{
				kind: 'changed',
				key: 'Storage',
				label: 'Storage',
				renamedFrom: null,
				fields: [{ field: 'quantity', from: 1, to: 2 }],
				alternates: []
			},
			{
				kind: 'added',
				key: 'Graphics card',
				label: 'Graphics card',
				pick: 'Vanta 60',
				quantity: 1
			},
			{ kind: 'removed', key: 'Case fans', label: 'Case fans', pick: 'Breeze 120', quantity: 1 }
		]);
	});

	it('finds alternate additions, removals and re-ranking', () => {
		const next: RevisionSnapshot = {
			...base,
			number: 3,
			slots: [
				slot('Processor', {
					alternates: [
						{
							partId: 11,
							name: 'Arvo C6X',
							rank: 1,
							reasonTag: 'upgrade-path',
							note: 'More boost.'
						},
						{ partId: 10, name: 'Arvo C4', rank: 2, reasonTag: 'easier-to-find', note: '' }
					]
				}),
				base.slots[1]!,
				base.slots[2]!
			]
		};
		const d = revisionDiff(base, next);
		expect(d.slots).toEqual([
			{
				kind: 'changed',
				key: 'Processor',
				label: 'Processor',
				renamedFrom: null,
				fields: [],
				alternates: [
					{ kind: 'added', name: 'Arvo C6X', details: [] },
					{
						kind: 'changed',
						name: 'Arvo C4',
						details: ['rank 1 → 2', 'reason lower-price → easier-to-find']
					}
				]
			}
		]);
		const removed = revisionDiff(next, base).slots[0];
		expect(removed?.kind === 'changed' && removed.alternates).toContainEqual({
			kind: 'removed',
			name: 'Arvo C6X',
			details: []
		});
	});

	it('diffs the build notes line by line', () => {
		const next = {
			...base,
			number: 2,
			buildNotesMd: '## Firmware\n\nEnable the memory profile.\nSet the fan curve.\n'
		};
		const d = revisionDiff(base, next);
		expect(d.notesChanged).toBe(true);
		expect(d.notes).toEqual([
			{ kind: 'same', text: '## Firmware' },
			{ kind: 'same', text: '' },
			{ kind: 'same', text: 'Enable the memory profile.' },
			{ kind: 'removed', text: 'Update the firmware.' },
			{ kind: 'added', text: 'Set the fan curve.' }
		]);
	});

	/*
	 * Slot identity (issue 11). Slots are matched by their own key, never by label: the
	 * expected changes below are worked out by hand from that rule (no published source:
	 * an algorithm of ours, docs/architecture.md "Computations" §9). Part names are invented.
	 */
	describe('matches slots by key, not by label', () => {
		const storage = (key: string, partId: number, name: string, quantity = 1) =>
			slot('Storage', {
				key,
				category: 'storage',
				pick: { id: partId, name },
				quantity,
				alternates: []
			});

		it('a renamed slot is the same slot: one change naming the old label, not removed + added', () => {
			const before: RevisionSnapshot = { ...base, slots: [slot('Processor', { key: 'k-cpu' })] };
			const after: RevisionSnapshot = {
				...base,
				number: 2,
				slots: [slot('CPU', { key: 'k-cpu' })]
			};
			expect(revisionDiff(before, after).slots).toEqual([
				{
					kind: 'changed',
					key: 'k-cpu',
					label: 'CPU',
					renamedFrom: 'Processor',
					fields: [],
					alternates: []
				}
			]);
		});

		it('two slots with the same label: editing one and removing the other are told apart', () => {
			const before: RevisionSnapshot = {
				...base,
				slots: [storage('k-a', 2, 'Kelp 1TB'), storage('k-b', 4, 'Kelp 2TB')]
			};
			// The author removed the first "Storage" and doubled the second.
			const after: RevisionSnapshot = {
				...base,
				number: 2,
				slots: [storage('k-b', 4, 'Kelp 2TB', 2)]
			};
			expect(revisionDiff(before, after).slots).toEqual([
				{
					kind: 'changed',
					key: 'k-b',
					label: 'Storage',
					renamedFrom: null,
					fields: [{ field: 'quantity', from: 1, to: 2 }],
					alternates: []
				},
				{ kind: 'removed', key: 'k-a', label: 'Storage', pick: 'Kelp 1TB', quantity: 1 }
			]);
		});

		it('a pure reorder of two same-label slots reports no change', () => {
			const before: RevisionSnapshot = {
				...base,
				slots: [storage('k-a', 2, 'Kelp 1TB'), storage('k-b', 4, 'Kelp 2TB')]
			};
			const after: RevisionSnapshot = {
				...base,
				number: 2,
				slots: [storage('k-b', 4, 'Kelp 2TB'), storage('k-a', 2, 'Kelp 1TB')]
			};
			expect(revisionDiff(before, after).slots).toEqual([]);
		});

		it('a new slot with the label of a removed one is removed + added, not a change', () => {
			const before: RevisionSnapshot = { ...base, slots: [storage('k-a', 2, 'Kelp 1TB')] };
			const after: RevisionSnapshot = {
				...base,
				number: 2,
				slots: [storage('k-new', 4, 'Kelp 2TB')]
			};
			expect(revisionDiff(before, after).slots).toEqual([
				{ kind: 'added', key: 'k-new', label: 'Storage', pick: 'Kelp 2TB', quantity: 1 },
				{ kind: 'removed', key: 'k-a', label: 'Storage', pick: 'Kelp 1TB', quantity: 1 }
			]);
		});
	});
});
