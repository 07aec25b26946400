import { QueryTypes } from 'sequelize';
import { beforeEach, describe, expect, it } from 'vitest';
import { draftInput, saveDraftInput, createGuideInput } from '../../src/lib/schemas/guide-editor';
import type { DraftFields, DraftInput } from '../../src/lib/schemas/guide-editor';
import {
	FrameResult,
	Guide,
	GuidePriceProposal,
	GuideRevision,
	GuideSlot,
	Part,
	Quote,
	Region,
	SlotAlternate,
	Store,
	ThermalResult,
	User,
	sequelize
} from '../../src/lib/server/db';
import * as draftEdits from '../../src/lib/server/services/guide-draft-edits';
import * as drafts from '../../src/lib/server/services/guide-drafts';
import { countRows, resetDatabase } from '../support/db';

/*
 * Guide drafts on the real MariaDB: ownership, optimistic locking, revisions frozen on
 * submit, strict input, and one transaction per save (a failure raised by the database
 * itself mid-save leaves nothing half-written).
 */

let author: User;
let other: User;
let parts: Record<string, Part>;
let store: Store;

async function fixtures() {
	await resetDatabase();
	author = await User.create({ email: 'ada@example.test', name: 'Ada Writer', role: 'author' });
	other = await User.create({ email: 'ben@example.test', name: 'Ben Other', role: 'author' });
	const us = await Region.create({
		code: 'us',
		name: 'United States',
		currency: 'USD',
		taxMode: 'exclusive',
		taxRateBp: 0
	});
	await Region.create({
		code: 'jp',
		name: 'Japan',
		currency: 'JPY',
		taxMode: 'inclusive',
		taxRateBp: 1000
	});
	store = await Store.create({
		name: 'Harbor Parts',
		regionId: us.id,
		url: 'https://harbor.example'
	});
	const make = (category: Part['category'], slug: string) =>
		Part.create({ category, brand: 'Testa', model: slug, slug, specs: {} });
	parts = {
		cpu: await make('cpu', 'testa-cpu-6'),
		cpu2: await make('cpu', 'testa-cpu-8'),
		board: await make('motherboard', 'testa-board-b'),
		board2: await make('motherboard', 'testa-board-x')
	};
}

function draft(overrides: Partial<DraftFields> = {}): DraftInput {
	return draftInput.parse({
		title: 'Quiet 1440p box',
		summary: 'A quiet build.',
		targetBudget: '900.00',
		baseRegion: 'us',
		tags: ['quiet', '1440p'],
		disclosure: 'none',
		buildNotes: {
			firmware: '- Update firmware',
			assembly: '1. Seat the CPU',
			cabling: '',
			display: 'Use DisplayPort.'
		},
		slots: [
			{
				category: 'cpu',
				label: 'CPU',
				quantity: 1,
				pickPartId: parts.cpu?.id,
				reason: 'Six cores are plenty.',
				priceQuote: { storeId: store.id, amount: '199.99', observedAt: '2026-11-20' },
				alternates: [{ partId: parts.cpu2?.id, reasonTag: 'upgrade_path', note: 'Two more cores.' }]
			},
			{
				category: 'motherboard',
				label: 'Board',
				quantity: 1,
				pickPartId: parts.board?.id,
				reason: 'Cheapest with two M.2 slots.',
				alternates: [{ partId: parts.board2?.id, reasonTag: 'looks', note: '' }]
			}
		],
		...overrides
	});
}

async function created(): Promise<{ slug: string; version: number }> {
	const outcome = await draftEdits.createGuide(
		author.id,
		createGuideInput.parse({
			title: 'Quiet 1440p box',
			summary: 'A quiet build.',
			targetBudget: '900',
			baseRegion: 'us',
			tags: ['quiet'],
			disclosure: 'none'
		})
	);
	if (outcome.kind !== 'created') throw new Error(JSON.stringify(outcome));
	return outcome;
}

describe('guide drafts on the real MariaDB', () => {
	beforeEach(fixtures);

	it('creates a draft guide with a unique slug and an empty revision 1', async () => {
		const first = await created();
		const second = await created();
		expect(first.slug).toBe('quiet-1440p-box');
		expect(second.slug).toBe('quiet-1440p-box-2');
		const view = await drafts.getDraft(author.id, first.slug);
		expect(view).toMatchObject({
			state: 'draft',
			revisionNumber: 1,
			revisionState: 'draft',
			targetBudget: '900.00',
			currency: 'USD',
			version: 1
		});
		const row = await Guide.findOne({ where: { slug: first.slug } });
		expect(Number(row?.targetBudgetMinor)).toBe(90000);
		expect(row?.disclosure).toBe('none');
	});

	it('saves slots, ranked alternates, an author quote and rendered build notes', async () => {
		const { slug, version } = await created();
		const outcome = await draftEdits.saveDraft(author.id, slug, draft(), version);
		expect(outcome.kind).toBe('saved');
		const view = await drafts.getDraft(author.id, slug);
		expect(view?.version).toBe(version + 1);
		expect(view?.slots.map((s) => s.pick.slug)).toEqual(['testa-cpu-6', 'testa-board-b']);
		expect(view?.slots[0]?.alternates.map((a) => [a.part.slug, a.reasonTag])).toEqual([
			['testa-cpu-8', 'upgrade_path']
		]);
		expect(view?.slots[0]?.priceQuote).toEqual({
			storeId: store.id,
			amount: '199.99',
			observedAt: '2026-11-20'
		});
		// A typed price is a proposal of the draft, never a quote (issue 12, item 2).
		expect(await Quote.count({ where: { partId: parts.cpu?.id } })).toBe(0);
		const proposal = await GuidePriceProposal.findOne({ where: { partId: parts.cpu?.id } });
		expect(proposal).toMatchObject({ currency: 'USD', taxIncluded: false, position: 1 });
		expect(Number(proposal?.amountMinor)).toBe(19999);
		expect(view?.buildNotes.firmware).toBe('- Update firmware');
		expect(view?.buildNotes.display).toBe('Use DisplayPort.');
		expect(view?.buildNotesHtml).toContain('<h2>Firmware setup checklist</h2>');
		expect(view?.buildNotesHtml).not.toContain('Cable routing'); // empty sections are left out

		// Saving again replaces the proposals and slots, not appends to them.
		await draftEdits.saveDraft(author.id, slug, draft(), version + 1);
		expect(await countRows('quotes')).toBe(0);
		expect(await countRows('guide_price_proposals')).toBe(1);
		expect(await countRows('guide_slots')).toBe(2);
		expect(await countRows('slot_alternates')).toBe(2);
	});

	it('answers a stale save with a conflict carrying the stored copy, and writes nothing', async () => {
		const { slug, version } = await created();
		expect(
			(await draftEdits.saveDraft(author.id, slug, draft({ title: 'Saved in tab one' }), version))
				.kind
		).toBe('saved');
		const stale = await draftEdits.saveDraft(
			author.id,
			slug,
			draft({ title: 'Saved in tab two' }),
			version
		);
		expect(stale.kind).toBe('conflict');
		if (stale.kind !== 'conflict') return;
		expect(stale.current.title).toBe('Saved in tab one');
		expect(stale.current.version).toBe(version + 1);
		expect((await drafts.getDraft(author.id, slug))?.title).toBe('Saved in tab one');
	});

	it('lets two saves with the same version race: exactly one wins', async () => {
		const { slug, version } = await created();
		const results = await Promise.all([
			draftEdits.saveDraft(author.id, slug, draft({ title: 'Racer A' }), version),
			draftEdits.saveDraft(author.id, slug, draft({ title: 'Racer B' }), version)
		]);
		expect(results.map((r) => r.kind).sort()).toEqual(['conflict', 'saved']);
		expect(await countRows('guide_slots')).toBe(2);
	});

	it("gives another author's guide as null / not_found, and leaves it untouched", async () => {
		const { slug, version } = await created();
		expect(await drafts.getDraft(other.id, slug)).toBeNull();
		expect(
			await draftEdits.saveDraft(other.id, slug, draft({ title: 'Hijacked' }), version)
		).toEqual({
			kind: 'not_found'
		});
		expect(await draftEdits.submit(other.id, slug, version)).toEqual({ kind: 'not_found' });
		expect((await Guide.findOne({ where: { slug } }))?.title).toBe('Quiet 1440p box');
	});

	it('freezes the submitted revision; the next save starts revision N+1', async () => {
		const { slug, version } = await created();
		await draftEdits.saveDraft(author.id, slug, draft(), version);
		const submitted = await draftEdits.submit(author.id, slug, version + 1);
		expect(submitted.kind).toBe('submitted');
		if (submitted.kind !== 'submitted') return;
		expect(submitted.draft).toMatchObject({
			state: 'in_review',
			revisionNumber: 1,
			revisionState: 'submitted'
		});
		const frozen = await GuideRevision.findOne({ where: { number: 1 } });
		const frozenSlots = await GuideSlot.findAll({
			where: { revisionId: frozen?.id },
			order: [['position', 'ASC']]
		});
		expect(frozen?.submittedAt).toBeInstanceOf(Date);

		const later = await draftEdits.saveDraft(
			author.id,
			slug,
			draft({ title: 'Revised', slots: draft().slots.slice(0, 1) }),
			submitted.draft.version
		);
		expect(later.kind).toBe('saved');
		if (later.kind !== 'saved') return;
		expect(later.draft).toMatchObject({ revisionNumber: 2, revisionState: 'draft' });
		expect(later.draft.slots).toHaveLength(1);
		// Revision 1 is exactly as submitted.
		const after = await GuideRevision.findOne({ where: { number: 1 } });
		expect(after?.buildNotesMd).toBe(frozen?.buildNotesMd);
		expect(after?.submittedAt?.getTime()).toBe(frozen?.submittedAt?.getTime());
		const afterSlots = await GuideSlot.findAll({
			where: { revisionId: frozen?.id },
			order: [['position', 'ASC']]
		});
		expect(afterSlots.map((s) => [s.id, s.pickPartId, s.reason])).toEqual(
			frozenSlots.map((s) => [s.id, s.pickPartId, s.reason])
		);
		expect(await SlotAlternate.count({ where: { slotId: frozenSlots.map((s) => s.id) } })).toBe(2);
		// Revision 2 can be submitted; submitting again with no new draft is refused.
		expect((await draftEdits.submit(author.id, slug, later.draft.version)).kind).toBe('submitted');
		expect((await draftEdits.submit(author.id, slug, later.draft.version + 1)).kind).toBe(
			'invalid'
		);
	});

	it('keeps a published guide live while a new revision is drafted and submitted', async () => {
		const { slug, version } = await created();
		await draftEdits.saveDraft(author.id, slug, draft(), version);
		const rev1 = await GuideRevision.findOne({ where: { number: 1 } });
		// Stand-in for the editor's approval (the moderation issue): revision 1 goes live.
		await rev1?.update({
			submittedAt: new Date(),
			reviewedAt: new Date(),
			publishedAt: new Date()
		});
		await Guide.update(
			{ state: 'published', publishedRevisionId: rev1?.id ?? null },
			{ where: { slug } }
		);
		const saved = await draftEdits.saveDraft(
			author.id,
			slug,
			draft({ title: 'Second pass' }),
			version + 1
		);
		if (saved.kind !== 'saved') throw new Error(saved.kind);
		const sent = await draftEdits.submit(author.id, slug, saved.draft.version);
		expect(sent.kind === 'submitted' && sent.draft).toMatchObject({
			state: 'published',
			revisionNumber: 2,
			revisionState: 'submitted',
			publishedRevisionNumber: 1
		});
		expect((await Guide.findOne({ where: { slug } }))?.publishedRevisionId).toBe(rev1?.id);
	});

	it('rejects mass-assigned fields and bad values with field messages', () => {
		const base = { version: 1, ...draft() };
		for (const extra of [
			{ authorId: other.id },
			{ state: 'published' },
			{ featured: true },
			{ slug: 'x' }
		]) {
			const parsed = saveDraftInput.safeParse({ ...base, ...extra });
			expect(parsed.success, JSON.stringify(extra)).toBe(false);
			expect(parsed.error?.issues[0]?.code).toBe('unrecognized_keys');
		}
		const bad = saveDraftInput.safeParse({
			...base,
			tags: ['no-such-tag'],
			walkthroughUrl: 'http://plain.example/x',
			slots: [
				{
					...base.slots[0],
					quantity: 17,
					alternates: [{ partId: 1, reasonTag: 'cheaper', note: '' }]
				}
			]
		});
		const paths = bad.error?.issues.map((i) => i.path.join('.'));
		expect(paths).toEqual(
			expect.arrayContaining([
				'tags.0',
				'walkthroughUrl',
				'slots.0.quantity',
				'slots.0.alternates.0.reasonTag'
			])
		);
		expect(saveDraftInput.safeParse({ ...base, slots: [] }).success).toBe(false);
		expect(
			createGuideInput.safeParse({
				title: 'T1x',
				summary: 's',
				targetBudget: '9',
				baseRegion: 'us',
				tags: []
			}).success
		).toBe(false); // disclosure required
	});

	it('refuses parts of the wrong category, unknown parts and stores outside the base region', async () => {
		const { slug, version } = await created();
		const jpStore = await Store.create({
			name: 'Kumo Denki',
			regionId: (await Region.findOne({ where: { code: 'jp' } }))?.id ?? 0,
			url: 'https://kumo.example'
		});
		const input = draft();
		const [cpu, board] = input.slots;
		if (!cpu || !board) throw new Error('fixture');
		const outcome = await draftEdits.saveDraft(
			author.id,
			slug,
			{
				...input,
				slots: [
					{
						...cpu,
						pickPartId: parts.board?.id ?? 0,
						priceQuote: { storeId: jpStore.id, amount: '1.999', observedAt: '2026-11-01' }
					},
					{ ...board, alternates: [{ partId: 999999, reasonTag: 'looks', note: '' }] }
				]
			},
			version
		);
		expect(outcome.kind).toBe('invalid');
		if (outcome.kind !== 'invalid') return;
		expect(Object.keys(outcome.issues).sort()).toEqual([
			'slots.0.pickPartId',
			'slots.0.priceQuote.amount',
			'slots.0.priceQuote.storeId',
			'slots.1.alternates.0.partId'
		]);
		expect((await Guide.findOne({ where: { slug } }))?.version).toBe(version);
	});

	it('writes nothing when the database fails mid-save (one transaction)', async () => {
		const { slug, version } = await created();
		await draftEdits.saveDraft(author.id, slug, draft(), version);
		const before = await drafts.getDraft(author.id, slug);
		// A real failure raised by MariaDB itself after the guide row, the revision and the
		// first slot were written: a trigger refuses the second slot's alternates.
		await sequelize.query(
			`CREATE TRIGGER fail_alternate BEFORE INSERT ON slot_alternates FOR EACH ROW
			 BEGIN IF NEW.note = 'fail here' THEN SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'injected failure'; END IF; END`,
			{ type: QueryTypes.RAW }
		);
		try {
			const input = draft({ title: 'Half-written?' });
			const [cpu, board] = input.slots;
			if (!cpu || !board) throw new Error('fixture');
			const failing = {
				...input,
				slots: [
					cpu,
					{
						...board,
						alternates: [
							{ partId: parts.board2?.id ?? 0, reasonTag: 'looks' as const, note: 'fail here' }
						]
					}
				]
			};
			await expect(draftEdits.saveDraft(author.id, slug, failing, version + 1)).rejects.toThrow(
				/injected failure/
			);
		} finally {
			await sequelize.query('DROP TRIGGER IF EXISTS fail_alternate', { type: QueryTypes.RAW });
		}
		expect(await drafts.getDraft(author.id, slug)).toEqual(before);
		expect(await countRows('guide_slots')).toBe(2);
		expect(await countRows('slot_alternates')).toBe(2);
	});

	const results = {
		frames: [
			{
				workload: 'Skyreach',
				resolution: '2560x1440',
				preset: 'High',
				avgFps: '143.5',
				low1Fps: '98.2'
			},
			{ workload: 'Tidewalk', resolution: '1920x1080', avgFps: '60' }
		],
		thermals: [
			{ loadName: 'Stress 30 min', cpuTempC: 78, gpuTempC: null, cpuUtilPct: 100, gpuUtilPct: 4 }
		]
	};

	it('saves frame and thermal results as exact tenths, and replaces them on the next save', async () => {
		const { slug, version } = await created();
		const saved = await draftEdits.saveDraft(author.id, slug, draft(results), version);
		expect(saved.kind).toBe('saved');
		const view = await drafts.getDraft(author.id, slug);
		expect(view?.frames).toEqual([
			{
				workload: 'Skyreach',
				resolution: '2560x1440',
				preset: 'High',
				avgFps: '143.5',
				low1Fps: '98.2',
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
		expect(view?.thermals).toEqual([
			{ loadName: 'Stress 30 min', cpuTempC: 78, gpuTempC: null, cpuUtilPct: 100, gpuUtilPct: 4 }
		]);
		const rows = await FrameResult.findAll({ order: [['position', 'ASC']] });
		expect(rows.map((r) => [r.position, r.avgFpsTenths, r.low1FpsTenths])).toEqual([
			[1, 1435, 982],
			[2, 600, null]
		]);

		// The editor sends its full list: one row left means one row stored; none means none.
		await draftEdits.saveDraft(
			author.id,
			slug,
			draft({ frames: results.frames.slice(1), thermals: [] }),
			version + 1
		);
		expect(await countRows('frame_results')).toBe(1);
		expect(await countRows('thermal_results')).toBe(0);
		// An API client that leaves results out keeps the stored ones.
		await draftEdits.saveDraft(author.id, slug, draft(), version + 2);
		expect((await drafts.getDraft(author.id, slug))?.frames.map((f) => f.workload)).toEqual([
			'Tidewalk'
		]);
	});

	it('refuses a 1 % low above the average with a field message, and writes nothing', async () => {
		const { slug, version } = await created();
		await draftEdits.saveDraft(author.id, slug, draft(results), version);
		const before = await drafts.getDraft(author.id, slug);
		const body = {
			version: version + 1,
			...draft(),
			frames: [{ workload: 'Skyreach', resolution: '2560x1440', avgFps: '90', low1Fps: '90.1' }],
			thermals: []
		};
		const parsed = saveDraftInput.safeParse(body);
		expect(parsed.success).toBe(false);
		expect(parsed.error?.issues.map((i) => [i.path.join('.'), i.message])).toEqual([
			['frames.0.low1Fps', 'The 1 % low cannot be above the average FPS.']
		]);
		// The routes save only what parsed; nothing reached the database.
		expect(await drafts.getDraft(author.id, slug)).toEqual(before);
		expect(await countRows('frame_results')).toBe(2);
		expect(await countRows('thermal_results')).toBe(1);
	});

	it('copies results into revision N+1 and leaves the submitted revision as it was', async () => {
		const { slug, version } = await created();
		await draftEdits.saveDraft(author.id, slug, draft(results), version);
		const submitted = await draftEdits.submit(author.id, slug, version + 1);
		if (submitted.kind !== 'submitted') throw new Error(submitted.kind);
		const rev1 = await GuideRevision.findOne({ where: { number: 1 } });
		const frozenFrames = (
			await FrameResult.findAll({ where: { revisionId: rev1?.id }, order: [['position', 'ASC']] })
		).map((r) => r.toJSON());
		const frozenThermals = (await ThermalResult.findAll({ where: { revisionId: rev1?.id } })).map(
			(r) => r.toJSON()
		);

		// A save that leaves results out (an older API client) starts N+1 with copies.
		const later = await draftEdits.saveDraft(
			author.id,
			slug,
			draft({ title: 'Revised' }),
			submitted.draft.version
		);
		if (later.kind !== 'saved') throw new Error(later.kind);
		expect(later.draft.revisionNumber).toBe(2);
		expect(later.draft.frames.map((f) => [f.workload, f.avgFps, f.low1Fps])).toEqual([
			['Skyreach', '143.5', '98.2'],
			['Tidewalk', '60', null]
		]);
		expect(later.draft.thermals).toEqual([
			{ loadName: 'Stress 30 min', cpuTempC: 78, gpuTempC: null, cpuUtilPct: 100, gpuUtilPct: 4 }
		]);
		const rev2 = await GuideRevision.findOne({ where: { number: 2 } });
		const copied = await FrameResult.findAll({ where: { revisionId: rev2?.id } });
		expect(copied).toHaveLength(2);
		expect(copied.some((r) => frozenFrames.some((f) => f.id === r.id))).toBe(false); // new rows, not moved ones

		// Editing the copy in N+1 (as the editor does) never touches revision 1.
		await draftEdits.saveDraft(
			author.id,
			slug,
			draft({
				frames: [
					{
						workload: 'Skyreach',
						resolution: '2560x1440',
						preset: 'High',
						avgFps: '150',
						low1Fps: '98.2'
					}
				],
				thermals: []
			}),
			later.draft.version
		);
		expect(
			(
				await FrameResult.findAll({ where: { revisionId: rev1?.id }, order: [['position', 'ASC']] })
			).map((r) => r.toJSON())
		).toEqual(frozenFrames);
		expect(
			(await ThermalResult.findAll({ where: { revisionId: rev1?.id } })).map((r) => r.toJSON())
		).toEqual(frozenThermals);
		expect((await drafts.getDraft(author.id, slug))?.frames.map((f) => f.avgFps)).toEqual(['150']);
	});

	it('rolls results back with the rest of a save that fails in the database', async () => {
		const { slug, version } = await created();
		await draftEdits.saveDraft(author.id, slug, draft(results), version);
		const before = await drafts.getDraft(author.id, slug);
		await sequelize.query(
			`CREATE TRIGGER fail_thermal BEFORE INSERT ON thermal_results FOR EACH ROW
			 BEGIN IF NEW.load_name = 'fail here' THEN SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'injected failure'; END IF; END`,
			{ type: QueryTypes.RAW }
		);
		try {
			const failing = draft({
				title: 'Half-written?',
				frames: results.frames.slice(0, 1),
				thermals: [
					{ loadName: 'fail here', cpuTempC: 1, gpuTempC: 1, cpuUtilPct: 1, gpuUtilPct: 1 }
				]
			});
			await expect(draftEdits.saveDraft(author.id, slug, failing, version + 1)).rejects.toThrow(
				/injected failure/
			);
		} finally {
			await sequelize.query('DROP TRIGGER IF EXISTS fail_thermal', { type: QueryTypes.RAW });
		}
		expect(await drafts.getDraft(author.id, slug)).toEqual(before);
		expect(await countRows('frame_results')).toBe(2);
	});
});
