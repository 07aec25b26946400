import { describe, expect, it } from 'vitest';
import {
	revisionDiff,
	type RevisionSnapshot,
	type SlotSnapshot
} from '../../../src/lib/domain/revision-diff';

function slot(label: string, over: Partial<SlotSnapshot> = {}): SlotSnapshot {
	return {
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
				label: 'Processor',
				fields: [
					{ field: 'pick', from: 'Arvo C6', to: 'Arvo C8' },
					{ field: 'reason', from: 'Six cores for the money.', to: 'Eight cores now.' }
				],
				alternates: []
			},
			{
				kind: 'changed',
				label: 'Storage',
				fields: [{ field: 'quantity', from: 1, to: 2 }],
				alternates: []
			},
			{ kind: 'added', label: 'Graphics card', pick: 'Vanta 60', quantity: 1 },
			{ kind: 'removed', label: 'Case fans', pick: 'Breeze 120', quantity: 1 }
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
				label: 'Processor',
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
});
