/**
 * What changed between two revisions of a guide: slot by slot (added, removed, or a
 * changed pick, quantity, reason or alternates) and the build notes line by line.
 * Pure: takes plain snapshots, returns plain objects.
 */
import { diffLines } from 'diff';

export interface AlternateSnapshot {
	partId: number;
	name: string;
	rank: number;
	reasonTag: string;
	note: string;
}

export interface SlotSnapshot {
	/**
	 * The slot's own key, unique within a revision and the same in every revision that has
	 * the slot: slots are matched by it, so a renamed slot is the same slot. Labels may repeat.
	 */
	key: string;
	label: string;
	category: string;
	pick: { id: number; name: string };
	quantity: number;
	reason: string;
	/** The author's quoted price as shown ("USD 329.99 at Shop, 2026-11-20"); absent when not compared. */
	price?: string | null;
	alternates: AlternateSnapshot[];
}

export interface RevisionSnapshot {
	number: number;
	buildNotesMd: string;
	slots: SlotSnapshot[];
}

export type FieldChange =
	| { field: 'pick'; from: string; to: string }
	| { field: 'quantity'; from: number; to: number }
	| { field: 'reason'; from: string; to: string }
	| { field: 'price'; from: string; to: string };

export interface AlternateChange {
	kind: 'added' | 'removed' | 'changed';
	name: string;
	/** For `changed`: what moved (rank, reason tag, note), as short sentences. */
	details: string[];
}

export type SlotChange =
	| { kind: 'added'; key: string; label: string; pick: string; quantity: number }
	| { kind: 'removed'; key: string; label: string; pick: string; quantity: number }
	| {
			kind: 'changed';
			key: string;
			label: string;
			/** The label in revision `a` when the author renamed the slot; null otherwise. */
			renamedFrom: string | null;
			fields: FieldChange[];
			alternates: AlternateChange[];
	  };

export interface TextLine {
	kind: 'same' | 'added' | 'removed';
	text: string;
}

export interface RevisionDiff {
	from: number;
	to: number;
	slots: SlotChange[];
	/** Line diff of the build notes Markdown; empty when unchanged. */
	notes: TextLine[];
	notesChanged: boolean;
}

function diffAlternates(
	before: AlternateSnapshot[],
	after: AlternateSnapshot[]
): AlternateChange[] {
	const old = new Map(before.map((a) => [a.partId, a]));
	const now = new Map(after.map((a) => [a.partId, a]));
	const changes: AlternateChange[] = [];
	for (const a of after) {
		const o = old.get(a.partId);
		if (!o) {
			changes.push({ kind: 'added', name: a.name, details: [] });
			continue;
		}
		const details: string[] = [];
		if (o.rank !== a.rank) details.push(`rank ${o.rank} → ${a.rank}`);
		if (o.reasonTag !== a.reasonTag) details.push(`reason ${o.reasonTag} → ${a.reasonTag}`);
		if (o.note !== a.note) details.push('note edited');
		if (details.length > 0) changes.push({ kind: 'changed', name: a.name, details });
	}
	for (const o of before)
		if (!now.has(o.partId)) changes.push({ kind: 'removed', name: o.name, details: [] });
	return changes;
}

function splitLines(value: string): string[] {
	const lines = value.split('\n');
	if (lines.at(-1) === '') lines.pop();
	return lines;
}

/**
 * Differences from revision `a` to revision `b`, in `b`'s slot order (removed slots last).
 * Slots are matched by key; a new position alone (a reorder) is not a change.
 */
export function revisionDiff(a: RevisionSnapshot, b: RevisionSnapshot): RevisionDiff {
	const before = new Map(a.slots.map((s) => [s.key, s]));
	const afterKeys = new Set(b.slots.map((s) => s.key));
	const slots: SlotChange[] = [];

	for (const s of b.slots) {
		const o = before.get(s.key);
		if (!o) {
			const { key, label, quantity } = s;
			slots.push({ kind: 'added', key, label, pick: s.pick.name, quantity });
			continue;
		}
		const renamedFrom = o.label !== s.label ? o.label : null;
		const fields: FieldChange[] = [];
		if (o.pick.id !== s.pick.id) fields.push({ field: 'pick', from: o.pick.name, to: s.pick.name });
		if (o.quantity !== s.quantity)
			fields.push({ field: 'quantity', from: o.quantity, to: s.quantity });
		if (o.reason !== s.reason) fields.push({ field: 'reason', from: o.reason, to: s.reason });
		if (o.price !== undefined && s.price !== undefined && o.price !== s.price) {
			fields.push({ field: 'price', from: o.price ?? 'no quote', to: s.price ?? 'no quote' });
		}
		const alternates = diffAlternates(o.alternates, s.alternates);
		if (fields.length > 0 || alternates.length > 0 || renamedFrom !== null)
			slots.push({ kind: 'changed', key: s.key, label: s.label, renamedFrom, fields, alternates });
	}
	for (const o of a.slots) {
		if (!afterKeys.has(o.key)) {
			const { key, label, quantity } = o;
			slots.push({ kind: 'removed', key, label, pick: o.pick.name, quantity });
		}
	}

	const notesChanged = a.buildNotesMd !== b.buildNotesMd;
	const notes: TextLine[] = [];
	if (notesChanged) {
		for (const part of diffLines(a.buildNotesMd, b.buildNotesMd)) {
			const kind = part.added ? 'added' : part.removed ? 'removed' : 'same';
			for (const text of splitLines(part.value)) notes.push({ kind, text });
		}
	}
	return { from: a.number, to: b.number, slots, notes, notesChanged };
}
