import { describe, expect, it } from 'vitest';
import { draftInput, joinBuildNotes, splitBuildNotes } from '../../src/lib/schemas/guide-editor';
import { applyOp, emptySlot, fromForm, moveSlot, toInput } from '../../src/lib/schemas/guide-editor-form';
import type { EditorDraft } from '../../src/lib/schemas/guide-editor-form';

const base: EditorDraft = {
	title: 'Small box',
	summary: 'Tiny.',
	targetBudget: '600',
	baseRegion: 'us',
	tags: ['compact'],
	disclosure: 'none',
	disclosureNote: '',
	walkthroughUrl: '',
	buildNotes: { firmware: '', assembly: '', cabling: '', display: '' },
	slots: [
		{ ...emptySlot('cpu', 'a'), label: 'A', pickPartId: '1', reason: 'r' },
		{ ...emptySlot('case', 'b'), label: 'B', pickPartId: '2', reason: 'r' }
	]
};

describe('guide editor form', () => {
	it('applies the no-JS operations the same way the buttons do', () => {
		expect(applyOp(base, 'slotDown:0').slots.map((s) => s.key)).toEqual(['b', 'a']);
		expect(applyOp(base, 'slotUp:0').slots.map((s) => s.key)).toEqual(['a', 'b']); // first stays first
		expect(applyOp(base, 'removeSlot:1').slots).toHaveLength(1);
		expect(applyOp(base, 'addSlot').slots).toHaveLength(3);
		const withAlts = applyOp(applyOp(base, 'addAlt:0'), 'addAlt:0');
		const keys = withAlts.slots[0]?.alternates.map((a) => a.key) ?? [];
		expect(applyOp(withAlts, 'altDown:0:0').slots[0]?.alternates.map((a) => a.key)).toEqual([keys[1], keys[0]]);
		expect(applyOp(withAlts, 'removeAlt:0:1').slots[0]?.alternates).toHaveLength(1);
		expect(applyOp(base, 'bogus:9')).toBe(base);
		expect(moveSlot(base, 1, 0).slots.map((s) => s.key)).toEqual(['b', 'a']);
	});

	it('reads the posted form back into the same working copy', () => {
		const data = new FormData();
		for (const [k, v] of Object.entries({ title: 'Tiny', summary: 'S', targetBudget: '1', baseRegion: 'us', disclosure: 'none', 'slots.0.key': 'a', 'slots.0.category': 'cpu', 'slots.0.label': 'L', 'slots.0.quantity': '2', 'slots.0.pickPartId': '5', 'slots.0.reason': 'R', 'slots.0.alternates.0.partId': '6', 'slots.0.alternates.0.reasonTag': 'quieter', 'slots.0.alternates.0.note': 'n' })) data.append(k, v);
		data.append('tags', 'gaming');
		data.append('tags', '4k');
		const draft = fromForm(data);
		expect(draft.tags).toEqual(['gaming', '4k']);
		const parsed = draftInput.parse(toInput(draft));
		expect(parsed.slots[0]).toMatchObject({ quantity: 2, pickPartId: 5, priceQuote: null, alternates: [{ partId: 6, reasonTag: 'quieter', note: 'n' }] });
	});

	it('stores build notes as one document with four headings and splits it back', () => {
		const notes = { firmware: '- a', assembly: '1. b', cabling: '', display: 'd' };
		const md = joinBuildNotes(notes);
		expect(md).toBe('## Firmware setup checklist\n\n- a\n\n## Assembly steps\n\n1. b\n\n## Display pairing\n\nd\n');
		expect(splitBuildNotes(md)).toEqual(notes);
		// Text under an unknown heading stays with the section before it.
		expect(splitBuildNotes('## Assembly steps\n\nx\n\n## Extra\n\ny').assembly).toBe('x\n\n## Extra\n\ny');
	});
});
