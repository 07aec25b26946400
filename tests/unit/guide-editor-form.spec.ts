import { describe, expect, it } from 'vitest';
import { draftInput, joinBuildNotes, splitBuildNotes } from '../../src/lib/schemas/guide-editor';
import {
	applyOp,
	emptyFrame,
	emptySlot,
	emptyThermal,
	fromDraft,
	moveSlot,
	toInput,
	withSuggestedAlternate
} from '../../src/lib/schemas/guide-editor-form';
import type { EditorDraft } from '../../src/lib/schemas/guide-editor-form';
import { fromForm, readEditorForm } from '../../src/lib/schemas/guide-editor-post';

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
	],
	frames: [],
	thermals: []
};

function posted(fields: Record<string, string>): FormData {
	const data = new FormData();
	for (const [k, v] of Object.entries({
		title: 'Tiny',
		summary: 'S',
		targetBudget: '1',
		baseRegion: 'us',
		disclosure: 'none',
		'slots.0.key': 'a',
		'slots.0.category': 'cpu',
		'slots.0.label': 'L',
		'slots.0.quantity': '1',
		'slots.0.pickPartId': '5',
		'slots.0.reason': 'R',
		...fields
	}))
		data.append(k, v);
	return data;
}

describe('guide editor form', () => {
	it('round-trips a slot’s own key through the hidden field; a new slot posts none', () => {
		const key = '3f1c2a9e-7b4d-4c8e-9a6f-2d5b8e1c0a47';
		const read = readEditorForm(
			posted({
				'slots.0.slotKey': key,
				'slots.1.key': 'n',
				'slots.1.slotKey': '',
				'slots.1.category': 'case',
				'slots.1.label': 'L',
				'slots.1.quantity': '1',
				'slots.1.pickPartId': '6',
				'slots.1.reason': 'R'
			})
		).draft;
		expect(read.slots.map((s) => s.slotKey)).toEqual([key, '']);
		const input = draftInput.parse(toInput(read));
		expect(input.slots.map((s) => s.slotKey)).toEqual([key, null]);
		// Two slots posting one key would be one slot twice.
		const twice = draftInput.safeParse(
			toInput({ ...read, slots: read.slots.map((s) => ({ ...s, slotKey: key })) })
		);
		expect(twice.success).toBe(false);
		expect(twice.error?.issues.map((i) => i.path.join('.'))).toEqual(['slots.1.slotKey']);
	});

	it('applies the no-JS operations the same way the buttons do', () => {
		expect(applyOp(base, 'slotDown:0').slots.map((s) => s.key)).toEqual(['b', 'a']);
		expect(applyOp(base, 'slotUp:0').slots.map((s) => s.key)).toEqual(['a', 'b']); // first stays first
		expect(applyOp(base, 'removeSlot:1').slots).toHaveLength(1);
		expect(applyOp(base, 'addSlot').slots).toHaveLength(3);
		const withAlts = applyOp(applyOp(base, 'addAlt:0'), 'addAlt:0');
		const keys = withAlts.slots[0]?.alternates.map((a) => a.key) ?? [];
		expect(applyOp(withAlts, 'altDown:0:0').slots[0]?.alternates.map((a) => a.key)).toEqual([
			keys[1],
			keys[0]
		]);
		expect(applyOp(withAlts, 'removeAlt:0:1').slots[0]?.alternates).toHaveLength(1);
		expect(applyOp(base, 'bogus:9')).toBe(base);
		expect(moveSlot(base, 1, 0).slots.map((s) => s.key)).toEqual(['b', 'a']);
	});

	it('reads the posted form back into the same working copy', () => {
		const data = new FormData();
		for (const [k, v] of Object.entries({
			title: 'Tiny',
			summary: 'S',
			targetBudget: '1',
			baseRegion: 'us',
			disclosure: 'none',
			'slots.0.key': 'a',
			'slots.0.category': 'cpu',
			'slots.0.label': 'L',
			'slots.0.quantity': '2',
			'slots.0.pickPartId': '5',
			'slots.0.reason': 'R',
			'slots.0.alternates.0.partId': '6',
			'slots.0.alternates.0.reasonTag': 'quieter',
			'slots.0.alternates.0.note': 'n'
		}))
			data.append(k, v);
		data.append('tags', 'gaming');
		data.append('tags', '4k');
		const draft = fromForm(data);
		expect(draft.tags).toEqual(['gaming', '4k']);
		const parsed = draftInput.parse(toInput(draft));
		expect(parsed.slots[0]).toMatchObject({
			quantity: 2,
			pickPartId: 5,
			priceQuote: null,
			alternates: [{ partId: 6, reasonTag: 'quieter', note: 'n' }]
		});
	});

	it('stores build notes as one document with four headings and splits it back', () => {
		const notes = { firmware: '- a', assembly: '1. b', cabling: '', display: 'd' };
		const md = joinBuildNotes(notes);
		expect(md).toBe(
			'## Firmware setup checklist\n\n- a\n\n## Assembly steps\n\n1. b\n\n## Display pairing\n\nd\n'
		);
		expect(splitBuildNotes(md)).toEqual(notes);
		// Text under an unknown heading stays with the section before it.
		expect(splitBuildNotes('## Assembly steps\n\nx\n\n## Extra\n\ny').assembly).toBe(
			'x\n\n## Extra\n\ny'
		);
	});

	it('reads repeated frame and thermal rows, closing gaps left by removed rows', () => {
		const draft = fromForm(
			posted({
				'frames.0.key': 'f0',
				'frames.0.workload': 'Skyreach',
				'frames.0.resolution': '2560x1440',
				'frames.0.preset': 'High',
				'frames.0.avgFps': '143.5',
				'frames.0.low1Fps': '98',
				'frames.0.notes': '',
				// Row 1 was removed in the browser: row 2 follows row 0 without a hole.
				'frames.2.key': 'f2',
				'frames.2.workload': 'Tidewalk',
				'frames.2.resolution': '1920x1080',
				'frames.2.preset': '',
				'frames.2.avgFps': '60',
				'frames.2.low1Fps': '',
				'thermals.0.key': 't0',
				'thermals.0.loadName': 'Stress 30 min',
				'thermals.0.cpuTempC': '78',
				'thermals.0.gpuTempC': '',
				'thermals.0.cpuUtilPct': '100',
				'thermals.0.gpuUtilPct': '3'
			})
		);
		expect(draft.frames.map((f) => [f.key, f.workload, f.avgFps, f.low1Fps])).toEqual([
			['f0', 'Skyreach', '143.5', '98'],
			['f2', 'Tidewalk', '60', '']
		]);
		const parsed = draftInput.parse(toInput(draft));
		expect(parsed.frames).toEqual([
			{
				workload: 'Skyreach',
				resolution: '2560x1440',
				preset: 'High',
				avgFps: '143.5',
				low1Fps: '98',
				notes: ''
			},
			{
				workload: 'Tidewalk',
				resolution: '1920x1080',
				preset: '',
				avgFps: '60',
				low1Fps: null,
				notes: ''
			}
		]);
		expect(parsed.thermals).toEqual([
			{ loadName: 'Stress 30 min', cpuTempC: 78, gpuTempC: null, cpuUtilPct: 100, gpuUtilPct: 3 }
		]);
		// A form without result rows means "no results" (an empty list replaces), not "keep".
		expect(draftInput.parse(toInput(fromForm(posted({})))).frames).toEqual([]);
	});

	it('refuses bad results with a message on the field that is wrong', () => {
		const draft = {
			...base,
			frames: [
				{
					...emptyFrame('a'),
					workload: 'Skyreach',
					resolution: '2560x1440',
					avgFps: '90',
					low1Fps: '90.1'
				},
				{ ...emptyFrame('b'), workload: '', resolution: '1440p', avgFps: '143.55', low1Fps: '' },
				{
					...emptyFrame('c'),
					workload: 'W',
					resolution: '1920x1080',
					avgFps: '2000.1',
					low1Fps: '0'
				}
			],
			thermals: [
				{
					...emptyThermal('t'),
					loadName: 'Idle',
					cpuTempC: '121',
					gpuTempC: '40.5',
					cpuUtilPct: '101',
					gpuUtilPct: 'x'
				}
			]
		};
		const result = draftInput.safeParse(toInput(draft));
		expect(result.success).toBe(false);
		const byPath = Object.fromEntries(
			(result.error?.issues ?? []).map((i) => [i.path.join('.'), i.message])
		);
		expect(byPath).toMatchObject({
			'frames.0.low1Fps': 'The 1 % low cannot be above the average FPS.',
			'frames.1.workload': 'Name the game or application.',
			'frames.1.resolution': 'Enter a resolution like 2560x1440.',
			'frames.1.avgFps': 'Enter the average FPS like 143.5 (one decimal at most).',
			'frames.2.avgFps': 'The average FPS must be at most 2000.',
			'frames.2.low1Fps': 'The 1 % low FPS must be above 0.',
			'thermals.0.cpuTempC': 'The CPU temperature must be at most 120 °C.',
			'thermals.0.gpuTempC': 'Enter the GPU temperature as a whole number.',
			'thermals.0.cpuUtilPct': 'The CPU utilisation must be at most 100 %.',
			'thermals.0.gpuUtilPct': 'Enter the GPU utilisation as a whole number.'
		});
		// Equal is fine: the 1 % low may match the average on a capped frame rate.
		expect(
			draftInput.safeParse(
				toInput({
					...base,
					frames: [
						{
							...emptyFrame('a'),
							workload: 'W',
							resolution: '1920x1080',
							avgFps: '60',
							low1Fps: '60.0'
						}
					]
				})
			).success
		).toBe(true);
	});

	it('adds and removes result rows with the no-JS operations, and round-trips a stored draft', () => {
		const two = applyOp(applyOp(base, 'addFrame'), 'addFrame');
		expect(two.frames).toHaveLength(2);
		const keys = two.frames.map((f) => f.key);
		expect(applyOp(two, 'removeFrame:0').frames.map((f) => f.key)).toEqual([keys[1]]);
		expect(applyOp(applyOp(base, 'addThermal'), 'removeThermal:0').thermals).toEqual([]);
		const stored = fromDraft({
			title: 'T',
			summary: 'S',
			targetBudget: '1',
			baseRegion: 'us',
			tags: [],
			disclosure: 'none',
			disclosureNote: null,
			walkthroughUrl: null,
			buildNotes: base.buildNotes,
			slots: [],
			frames: [
				{
					workload: 'W',
					resolution: '1920x1080',
					preset: '',
					avgFps: '59.9',
					low1Fps: null,
					notes: 'n'
				}
			],
			thermals: [{ loadName: 'L', cpuTempC: 70, gpuTempC: null, cpuUtilPct: 0, gpuUtilPct: null }]
		});
		expect(stored.frames[0]).toMatchObject({ avgFps: '59.9', low1Fps: '', notes: 'n' });
		expect(stored.thermals[0]).toMatchObject({
			cpuTempC: '70',
			gpuTempC: '',
			cpuUtilPct: '0',
			gpuUtilPct: ''
		});
	});
});

/** Bytes one field takes in an urlencoded body (`key=value&`), which is what the body limit counts. */
function fieldBytes(key: string, value: string): number {
	return encodeURIComponent(key).length + encodeURIComponent(value).length + 2;
}

function bodyBytes(data: FormData): number {
	let bytes = 0;
	for (const [key, value] of data) bytes += fieldBytes(key, String(value));
	return bytes;
}

/** Appends the fields `next(i)` gives, i = 0, 1, …, while the body stays within `limit` bytes. */
function fillTo(data: FormData, limit: number, next: (i: number) => [string, string][]) {
	let bytes = bodyBytes(data);
	for (let i = 0; ; i++) {
		const fields = next(i);
		const more = fields.reduce((sum, [k, v]) => sum + fieldBytes(k, v), 0);
		if (bytes + more > limit) return;
		for (const [k, v] of fields) data.append(k, v);
		bytes += more;
	}
}

/**
 * A FormData that counts the fields a reader looks at: one per field an iteration yields, and
 * every field for each get/has/getAll (a lookup by name scans the whole list). Past `budget`
 * it throws, so a quadratic reader fails at once instead of running for minutes.
 */
class CountingFormData extends FormData {
	looked = 0;
	fields = 0;
	budget = Number.POSITIVE_INFINITY;

	static of(data: FormData): CountingFormData {
		const counting = new CountingFormData();
		for (const [k, v] of data) counting.append(k, v);
		counting.fields = [...data.keys()].length;
		return counting;
	}

	private spend(n: number) {
		this.looked += n;
		if (this.looked > this.budget)
			throw new Error(`looked at more than ${this.budget} fields of ${this.fields}`);
	}

	override *entries(): FormDataIterator<[string, FormDataEntryValue]> {
		for (const entry of super.entries()) {
			this.spend(1);
			yield entry;
		}
	}
	override *keys(): FormDataIterator<string> {
		for (const [key] of this.entries()) yield key;
	}
	override *values(): FormDataIterator<FormDataEntryValue> {
		for (const [, value] of this.entries()) yield value;
	}
	override [Symbol.iterator]() {
		return this.entries();
	}
	override get(name: string) {
		this.spend(this.fields);
		return super.get(name);
	}
	override getAll(name: string) {
		this.spend(this.fields);
		return super.getAll(name);
	}
	override has(name: string) {
		this.spend(this.fields);
		return super.has(name);
	}
}

/** Every app route but the catalog import takes at most 512 KB (docs/security.md, capBodies). */
const BODY_LIMIT = 512 * 1024;

// Building a 512 KB form of tiny fields (twice, for the counting copy) takes seconds on a
// busy machine: the setup, not the reader, needs more than the default 5 s.
describe('the editor form reader at the body limit (issue 12, item 3)', { timeout: 30_000 }, () => {
	/*
	 * The old reader scanned every key with a fresh regular expression inside its loop
	 * conditions, so a 20 KB post took about 12 s of CPU and stalled every other request. The
	 * tests count the fields the reader looks at (CountingFormData), which does not depend on
	 * the machine; the issue also asks for "well under a second", so the time of the same
	 * read is checked against a generous 1000 ms (one linear pass takes tens of milliseconds,
	 * anything quadratic is out by orders of magnitude). Both failed on the old reader.
	 */
	it('reads 512 KB of slot and alternate fields in well under a second, and refuses rows over the caps', () => {
		const data = posted({});
		// Slots 0–99 with a category, each with alternates 0–99: the shape that made the old
		// reader rescan every key once per row and once per alternate.
		fillTo(data, BODY_LIMIT, (i) => [
			[`slots.${i % 100}.category`, 'gpu'],
			[`slots.${i % 100}.alternates.${Math.floor(i / 100) % 100}.partId`, String(i)]
		]);
		expect(bodyBytes(data)).toBeGreaterThan(BODY_LIMIT - 100);
		expect(bodyBytes(data)).toBeLessThanOrEqual(BODY_LIMIT);

		// Work counted, not timed: one pass looks at each field once. The old reader rescanned
		// the whole form for every slot and every alternate (over 10,000 times as many).
		const counting = CountingFormData.of(data);
		counting.budget = 2 * counting.fields;
		readEditorForm(counting);
		expect(counting.looked).toBeLessThanOrEqual(counting.fields);

		const started = performance.now();
		const { draft, issues } = readEditorForm(data);
		const elapsedMs = performance.now() - started;

		expect(elapsedMs).toBeLessThan(1000);
		// The caps are the schema's own limits (40 slots, 10 alternates, draftInput).
		expect(draft.slots).toHaveLength(40);
		expect(Math.max(...draft.slots.map((s) => s.alternates.length))).toBe(10);
		expect(issues.slots).toEqual(['At most 40 slots.']);
		expect(issues['slots.0.alternates']).toEqual(['At most 10 alternates per slot.']);
	});

	it('stops at the field cap with a message instead of reading 100,000 tiny fields', () => {
		const data = posted({});
		fillTo(data, BODY_LIMIT, (i) => [[`x${i % 10}`, '']]);
		// The reader stops at the cap: it does not even walk the rest of the form.
		const counting = CountingFormData.of(data);
		readEditorForm(counting);
		expect(counting.fields).toBeGreaterThan(50_000);
		expect(counting.looked).toBe(3501);
		const started = performance.now();
		const { issues } = readEditorForm(data);
		expect(performance.now() - started).toBeLessThan(1000);
		expect(issues._form).toEqual([
			'The form has more fields than the editor sends (at most 3500). Reload the editor and try again.'
		]);
	});

	it('reads the largest form the editor sends without a message', () => {
		const data = posted({});
		for (let i = 0; i < 40; i++) {
			for (const [field, value] of Object.entries({
				key: `s${i}`,
				category: 'storage',
				label: `Drive ${i}`,
				quantity: '1',
				pickPartId: String(i + 1),
				pickQuery: '',
				reason: 'r',
				quoteStoreId: '',
				quoteAmount: '',
				quoteObservedAt: ''
			}))
				data.set(`slots.${i}.${field}`, value);
			for (let j = 0; j < 10; j++) {
				data.set(`slots.${i}.alternates.${j}.key`, `s${i}a${j}`);
				data.set(`slots.${i}.alternates.${j}.partId`, String(100 + j));
				data.set(`slots.${i}.alternates.${j}.partQuery`, '');
				data.set(`slots.${i}.alternates.${j}.reasonTag`, 'quieter');
				data.set(`slots.${i}.alternates.${j}.note`, '');
			}
		}
		// Every field of every frame, thermal and photo row: 30 × 7 + 20 × 6 + 60 × 4.
		const row = (prefix: string, fields: string[]) => {
			for (const field of fields)
				data.set(`${prefix}.${field}`, field === 'workload' ? 'Game' : '1');
		};
		const frameFields = ['key', 'workload', 'resolution', 'preset', 'avgFps', 'low1Fps', 'notes'];
		const thermalFields = ['key', 'loadName', 'cpuTempC', 'gpuTempC', 'cpuUtilPct', 'gpuUtilPct'];
		for (let i = 0; i < 30; i++) row(`frames.${i}`, frameFields);
		for (let i = 0; i < 20; i++) row(`thermals.${i}`, thermalFields);
		data.set('galleryShown', '1');
		for (let i = 0; i < 60; i++) row(`gallery.${i}`, ['photoId', 'stage', 'caption', 'altText']);
		const { draft, issues } = readEditorForm(data);
		expect(issues).toEqual({});
		expect(draft.slots).toHaveLength(40);
		expect(draft.gallery).toHaveLength(60);
		expect(draft.slots[39]?.alternates.map((a) => a.partId)).toEqual(
			Array.from({ length: 10 }, (_, j) => String(100 + j))
		);
		expect(draft.frames).toHaveLength(30);
		expect(draft.thermals).toHaveLength(20);
	});

	it('ignores keys whose index is not plain digits, and reads whole numbers strictly', () => {
		const data = posted({
			'slots.01.category': 'gpu',
			'slots.1e0.category': 'gpu',
			'slots.0x1.category': 'gpu',
			'slots.0.quantity': '0x10'
		});
		const { draft, issues } = readEditorForm(data);
		expect(issues).toEqual({});
		expect(draft.slots).toHaveLength(1);
		const parsed = draftInput.safeParse(toInput(draft));
		expect(parsed.error?.issues.map((i) => [i.path.join('.'), i.message])).toEqual([
			['slots.0.quantity', 'Enter the quantity as a whole number from 1 to 16.']
		]);
	});

	it('adds a part suggested by fork insights as the slot’s last alternate, once', () => {
		const keyed: EditorDraft = {
			...base,
			slots: base.slots.map((slot, i) => ({ ...slot, slotKey: i === 0 ? 'k-cpu' : 'k-case' }))
		};
		const added = withSuggestedAlternate(keyed, { slotKey: 'k-cpu', partId: 7 });
		expect(added.slots[0]?.alternates.map((a) => a.partId)).toEqual(['7']);
		expect(added.slots[1]?.alternates).toEqual([]);
		// Already there, the pick itself, or a slot that is gone: nothing changes.
		expect(withSuggestedAlternate(added, { slotKey: 'k-cpu', partId: 7 })).toBe(added);
		expect(withSuggestedAlternate(keyed, { slotKey: 'k-cpu', partId: 1 })).toBe(keyed);
		expect(withSuggestedAlternate(keyed, { slotKey: 'gone', partId: 7 })).toBe(keyed);
	});
});
