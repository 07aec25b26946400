import { beforeEach, describe, expect, it } from 'vitest';
import { draftInput } from '../../src/lib/schemas/guide-editor';
import { fromDraft, toInput } from '../../src/lib/schemas/guide-editor-form';
import {
	BuildSlot,
	Guide,
	GuideRevision,
	GuideSlot,
	User,
	sequelize
} from '../../src/lib/server/db';
import { seedDemoCommunity } from '../../src/lib/server/db/seeders/demo-community';
import { addSlot } from '../../src/lib/server/services/build-edits';
import { applySync } from '../../src/lib/server/services/build-sync';
import { syncPlan } from '../../src/lib/server/services/build-sync-plan';
import { getBuild } from '../../src/lib/server/services/build-view';
import * as draftEdits from '../../src/lib/server/services/guide-draft-edits';
import * as drafts from '../../src/lib/server/services/guide-drafts';
import { getRevisionDiff } from '../../src/lib/server/services/guides';
import { resetDatabase } from '../support/db';
import {
	DEMO_SLUG,
	demoGuide,
	forkBuild,
	newReader,
	partId,
	publishSlots,
	revisionSlots,
	slotRows,
	type PublishedSlot
} from '../support/buildsync-fixtures';

/*
 * Slot identity through the services on the real MariaDB (issue 11): a guide slot keeps its
 * own key from revision to revision, and sync, drift and the revision diff match by it, never
 * by label. The expected rows are worked out by hand from that rule and the three-way table
 * of docs/architecture.md "Computations" §9 (an algorithm of ours: no published source).
 * Parts are the invented demo catalogue's.
 */

let reader: User;
let guide: Guide;
let first: PublishedSlot[];

beforeEach(async () => {
	await resetDatabase();
	await seedDemoCommunity(sequelize);
	reader = await newReader('slot-identity');
	guide = await demoGuide();
	first = await revisionSlots(guide.publishedRevisionId!);
});

async function plan(buildId: number) {
	const outcome = await syncPlan(reader.id, buildId);
	if (outcome.kind !== 'plan') throw new Error(`expected a sync plan, got ${outcome.kind}`);
	return outcome.plan;
}

describe('the guide editor carries a slot’s key to the next revision', () => {
	it('a renamed slot is still the same slot: the diff names the rename, sync and drift see no change', async () => {
		const build = await forkBuild(reader, guide);
		const authorId = guide.authorId!;
		const view = await drafts.getDraft(authorId, DEMO_SLUG);
		if (!view) throw new Error('the demo author cannot open the demo guide');
		// The editor's own round trip: stored draft → editor state → input, as the form posts it.
		const editor = fromDraft(view);
		const cpu = editor.slots.find((s) => s.label === 'CPU')!;
		cpu.label = 'Processor';
		const saved = await draftEdits.saveDraft(
			authorId,
			DEMO_SLUG,
			draftInput.parse(toInput(editor)),
			view.version
		);
		if (saved.kind !== 'saved') throw new Error(`save failed: ${saved.kind}`);
		// Revision 1 is published (frozen), so the save started revision 2 with the same keys.
		expect(saved.draft.revisionNumber).toBe(2);
		expect(saved.draft.slots.map((s) => s.slotKey)).toEqual(first.map((s) => s.slotKey));

		// Publish revision 2 as an approval would.
		const revision2 = (await GuideRevision.findOne({
			where: { guideId: guide.id, number: 2 }
		}))!;
		const now = new Date();
		await revision2.update({ submittedAt: now, reviewedAt: now, publishedAt: now });
		await Guide.update({ publishedRevisionId: revision2.id }, { where: { id: guide.id } });

		const diff = await getRevisionDiff(DEMO_SLUG, 1, 2);
		expect(diff.kind === 'ok' && diff.diff.slots).toEqual([
			{
				kind: 'changed',
				key: first.find((s) => s.label === 'CPU')!.slotKey,
				label: 'Processor',
				renamedFrom: 'CPU',
				fields: [],
				alternates: []
			}
		]);

		const p = await plan(build.id);
		expect(p.rows.map((r) => r.status)).toEqual(Array(first.length).fill('unchanged'));
		expect(p.offered).toBe(0);
		const page = await getBuild({ id: reader.id }, build.id);
		expect(page?.drift.every((d) => d.kind === 'same')).toBe(true);
	});
});

describe('two slots with the same label', () => {
	/*
	 * Revision 2: the demo guide's slots plus a second "Storage" (C4 2 TB) and a slot the
	 * author literally called "Storage (2)" (C3 1 TB). Numbering repeated labels made that
	 * "Storage (2)" twice, and sync threw.
	 */
	async function twoStorages() {
		const withDrives = [
			...first,
			{ label: 'Storage', category: 'storage' as const, pickSlug: 'cindral-c4-2tb' },
			{ label: 'Storage (2)', category: 'storage' as const, pickSlug: 'cindral-c3-1tb' }
		];
		const revision2 = await publishSlots(guide, withDrives);
		const slots2 = await revisionSlots(revision2.id);
		const build = await forkBuild(reader, guide);
		const rows = await slotRows(build.id);
		return { slots2, build, rows };
	}

	it('forks with one key per slot, and the build page lists every slot', async () => {
		const { slots2, build, rows } = await twoStorages();
		expect(new Set(slots2.map((s) => s.slotKey)).size).toBe(first.length + 2);
		expect(rows.map((r) => r.sourceSlotKey)).toEqual(slots2.map((s) => s.slotKey));
		const page = await getBuild({ id: reader.id }, build.id);
		expect(page?.slots.filter((s) => s.label === 'Storage')).toHaveLength(2);
		expect(new Set(page?.drift.map((d) => d.key)).size).toBe(first.length + 2);
	});

	it('one edited, one removed upstream: the slot of the edited one is kept, with its purchase', async () => {
		const { slots2, build, rows } = await twoStorages();
		const [original, added] = slots2.filter((s) => s.label === 'Storage');
		// The reader bought the second "Storage" (the C4 2 TB).
		const bought = rows.find((r) => r.sourceSlotKey === added!.slotKey)!;
		const removedHere = rows.find((r) => r.sourceSlotKey === original!.slotKey)!;
		await BuildSlot.update(
			{ purchased: true, purchasedAt: '2026-11-30' },
			{ where: { id: bought.id } }
		);
		// Revision 3: the first "Storage" removed, the second doubled.
		await publishSlots(
			guide,
			slots2
				.filter((s) => s.slotKey !== original!.slotKey)
				.map((s) => (s.slotKey === added!.slotKey ? { ...s, quantity: 2 } : s))
		);

		const p = await plan(build.id);
		const statusOf = (slotId: number) => p.rows.find((r) => r.slotId === slotId)?.status;
		expect(statusOf(removedHere.id)).toBe('removed_upstream');
		expect(statusOf(bought.id)).toBe('upstream_only');
		expect(p.conflicts).toEqual([]);
		expect(p.offered).toBe(2);

		const outcome = await applySync(
			reader.id,
			build.id,
			{ choices: {}, takeAllNonConflicting: true },
			p.version
		);
		expect(outcome.kind).toBe('ok');
		const after = await slotRows(build.id);
		expect(after.filter((s) => s.label === 'Storage')).toEqual([
			expect.objectContaining({
				id: bought.id,
				part: 'cindral-c4-2tb',
				quantity: 2,
				purchased: true,
				sourceSlotKey: added!.slotKey
			})
		]);
		expect(after.find((s) => s.id === removedHere.id)).toBeUndefined();
		expect(after.find((s) => s.label === 'Storage (2)')?.part).toBe('cindral-c3-1tb');
	});

	it('a pure reorder of the two is no change: nothing offered, no diff', async () => {
		const { slots2, build } = await twoStorages();
		const storages = slots2.filter((s) => s.label === 'Storage');
		const others = slots2.filter((s) => s.label !== 'Storage');
		await publishSlots(guide, [...storages.reverse(), ...others]);

		const p = await plan(build.id);
		expect(p.rows.every((r) => r.status === 'unchanged')).toBe(true);
		expect(p.offered).toBe(0);
		const diff = await getRevisionDiff(DEMO_SLUG, 2, 3);
		expect(diff.kind === 'ok' && diff.diff.slots).toEqual([]);
	});
});

describe('the same slot added on both sides', () => {
	it('the reader’s own slot and upstream’s new slot of that label stay two rows; taking all keeps both', async () => {
		const build = await forkBuild(reader, guide);
		const added = await addSlot(
			reader.id,
			build.id,
			{
				category: 'storage',
				label: 'Second drive',
				partId: await partId('cindral-c4-2tb'),
				quantity: 1
			},
			1
		);
		expect(added.kind).toBe('ok');
		const own = (await slotRows(build.id)).find((s) => s.label === 'Second drive')!;
		await publishSlots(guide, [
			...first,
			{ label: 'Second drive', category: 'storage', pickSlug: 'cindral-c4-2tb' }
		]);
		const upstreamKey = (await GuideSlot.findOne({
			where: { revisionId: guide.publishedRevisionId!, label: 'Second drive' }
		}))!.slotKey;

		// Only a key links slots: the reader's slot has none, so it cannot be upstream's.
		const p = await plan(build.id);
		const drives = p.rows.filter((r) => r.label === 'Second drive');
		expect(drives.map((r) => [r.id, r.status])).toEqual([
			[`local:${own.id}`, 'added_locally'],
			[`source:${upstreamKey}`, 'added_upstream']
		]);
		const outcome = await applySync(
			reader.id,
			build.id,
			{ choices: {}, takeAllNonConflicting: true },
			p.version
		);
		expect(outcome.kind).toBe('ok');
		const after = (await slotRows(build.id)).filter((s) => s.label === 'Second drive');
		// Upstream's slot goes after the slot before it upstream (the guide's last), so before
		// the reader's own, which was added at the end (placement rule of domain applySync).
		expect(after.map((s) => [s.id === own.id, s.sourceSlotKey])).toEqual([
			[false, upstreamKey],
			[true, null]
		]);
	});
});
