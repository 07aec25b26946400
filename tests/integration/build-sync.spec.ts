import { QueryTypes } from 'sequelize';
import { beforeEach, describe, expect, it } from 'vitest';
import {
	Build,
	BuildSlot,
	BuildSync,
	Guide,
	GuideRevision,
	GuideSlot,
	User,
	sequelize
} from '../../src/lib/server/db';
import { seedDemoCommunity } from '../../src/lib/server/db/seeders/demo-community';
import { applySync, undoLastSync } from '../../src/lib/server/services/build-sync';
import { syncPlan } from '../../src/lib/server/services/build-sync-plan';
import { countRows, resetDatabase } from '../support/db';
import {
	demoGuide,
	forkBuild,
	newReader,
	partId,
	publishRevision,
	slotRows
} from '../support/buildsync-fixtures';

/*
 * Sync of a build with its source guide on the real MariaDB (docs/architecture.md "Computations" §9,
 * services/build-sync.ts). The three-way rules themselves are unit-tested against a table in
 * tests/unit/domain/sync.spec.ts; here: the wiring to the tables, every status appearing in a
 * plan read from the database, one-transaction apply, undo, stale versions and an injected
 * failure half-way through a sync (the technique of catalog-csv.spec.ts: a MariaDB trigger).
 */

let owner: User;
let other: User;
let guide: Guide;
let baseRevisionId: number;
/** The sync row id of the graphics card slot: `source:` and the slot's own key. */
let GPU: string;

beforeEach(async () => {
	await resetDatabase();
	await seedDemoCommunity(sequelize);
	owner = await newReader('sync-owner');
	other = await newReader('sync-other');
	guide = await demoGuide();
	baseRevisionId = guide.publishedRevisionId!;
	const gpu = await GuideSlot.findOne({
		where: { revisionId: baseRevisionId, label: 'Graphics card' }
	});
	GPU = `source:${gpu!.slotKey}`;
});

/**
 * The demo guide's nine slots, diverged on both sides:
 *   upstream (revision 2): CPU → Strata 408, Storage → V4 Lite, Graphics card → Auric A64,
 *     Case fans removed, "Second drive" added;
 *   the build: Memory → Brisk 3200, Storage → V4 Lite, Graphics card → Auric A52,
 *     Power supply removed, "Extra drive" added.
 */
async function diverged(): Promise<{ build: Build; upstream: GuideRevision }> {
	const build = await forkBuild(owner, guide);
	const slot = async (label: string) =>
		(await BuildSlot.findOne({ where: { buildId: build.id, label } }))!;
	await (
		await slot('Memory')
	).update({ partId: await partId('brisk-ddr4-3200-32gb'), origin: 'alternate' });
	await (
		await slot('Storage')
	).update({ partId: await partId('verrow-v4-lite-1tb'), origin: 'alternate' });
	await (
		await slot('Graphics card')
	).update({ partId: await partId('ironvale-auric-a52-8g'), origin: 'alternate' });
	await (await slot('Power supply')).destroy();
	// Bought the CPU already, at a price seen in a shop.
	await (
		await slot('CPU')
	).update({
		purchased: true,
		paidMinor: 10500,
		paidCurrency: 'USD',
		purchasedAt: '2026-11-28',
		priceOverrideMinor: 10500,
		priceOverrideCurrency: 'USD',
		priceOverrideStore: 'Corner Shop',
		priceOverrideDate: '2026-11-28'
	});
	await BuildSlot.create({
		buildId: build.id,
		sourceSlotKey: null,
		category: 'storage',
		label: 'Extra drive',
		position: 10,
		partId: await partId('cindral-c3-1tb'),
		quantity: 1,
		origin: 'custom'
	});
	const upstream = await publishRevision(
		guide,
		{
			CPU: { pickSlug: 'halvard-strata-408' },
			Storage: { pickSlug: 'verrow-v4-lite-1tb' },
			'Graphics card': { pickSlug: 'solenne-auric-a64-12g' },
			'Case fans': null
		},
		[{ label: 'Second drive', category: 'storage', pickSlug: 'cindral-c4-2tb' }]
	);
	return { build, upstream };
}

const fresh = async (id: number) => (await Build.findByPk(id))!;

describe('sync plan', () => {
	it('is up to date while the guide has no newer published revision, and 404 for anyone but the owner', async () => {
		const build = await forkBuild(owner, guide);
		expect(await syncPlan(owner.id, build.id)).toEqual({
			kind: 'up_to_date',
			version: 1,
			lastSync: null
		});
		await publishRevision(guide, { CPU: { pickSlug: 'halvard-strata-408' } });
		expect(await syncPlan(other.id, build.id)).toEqual({ kind: 'not_found' });
		expect((await syncPlan(owner.id, build.id)).kind).toBe('plan');
	});

	it('shows every three-way status with part names, in the build’s order, then removed here, then added upstream', async () => {
		const { build, upstream } = await diverged();
		const outcome = await syncPlan(owner.id, build.id);
		if (outcome.kind !== 'plan') throw new Error(outcome.kind);
		const { plan } = outcome;
		expect(plan).toMatchObject({
			buildId: build.id,
			version: 1,
			base: { revisionId: baseRevisionId, number: 1 },
			upstream: { revisionId: upstream.id, number: 2 }
		});
		// Expected statuses worked out by hand from the edits above (docs/architecture.md §9 definitions).
		expect(plan.rows.map((r) => [r.label, r.status])).toEqual([
			['CPU', 'upstream_only'],
			['Motherboard', 'unchanged'],
			['Memory', 'local_only'],
			['Storage', 'both_same'],
			['Graphics card', 'conflict'],
			['Case', 'unchanged'],
			['Case fans', 'removed_upstream'],
			['Operating system', 'unchanged'],
			['Extra drive', 'added_locally'],
			['Power supply', 'removed_locally'],
			['Second drive', 'added_upstream']
		]);
		expect(plan.conflicts).toEqual([GPU]);
		// Offered: upstream-only, conflict, removed upstream, added upstream.
		expect(plan.offered).toBe(4);
		const gpu = plan.rows.find((r) => r.label === 'Graphics card')!;
		expect(gpu.conflict).toBe('changed_both');
		expect([gpu.base?.part.slug, gpu.upstream?.part.slug, gpu.local?.part.slug]).toEqual([
			'solenne-cobalt-c6-8g',
			'solenne-auric-a64-12g',
			'ironvale-auric-a52-8g'
		]);
		// Names for display come with the rows (demo catalogue's model names).
		expect([gpu.base?.part.model, gpu.upstream?.part.model, gpu.local?.part.model]).toEqual([
			'Cobalt C6 Duo 8 GB',
			'Auric A64 Duo 12 GB',
			'Auric A52 Twin 8 GB'
		]);
		expect(gpu.slotId).toEqual(expect.any(Number));
		const added = plan.rows.find((r) => r.label === 'Second drive')!;
		expect([added.base, added.local, added.upstream?.part.slug]).toEqual([
			null,
			null,
			'cindral-c4-2tb'
		]);
		expect(plan.rows.find((r) => r.label === 'Power supply')?.slotId).toBeNull();
	});
});

describe('apply sync', () => {
	it('takes all non-conflicting changes and the chosen side of the conflict, in one change that undo reverts exactly', async () => {
		const { build, upstream } = await diverged();
		const before = await slotRows(build.id);
		const applied = await applySync(
			owner.id,
			build.id,
			{
				choices: { [GPU]: 'keep_local' },
				takeAllNonConflicting: true,
				upstreamRevisionId: upstream.id
			},
			1
		);
		expect(applied).toMatchObject({
			kind: 'ok',
			version: 2,
			baseRevisionId: upstream.id,
			changedSlots: 1,
			removedSlots: 1,
			addedSlots: 1
		});

		const after = await slotRows(build.id);
		// Placement rule of domain applySync: a slot put in from upstream goes after the nearest
		// slot that precedes it upstream (Operating system), so before the reader's own slot.
		expect(after.map((s) => [s.label, s.part, s.source, s.position])).toEqual([
			['CPU', 'halvard-strata-408', 'CPU', 1],
			['Motherboard', 'arkwell-s550m-daily', 'Motherboard', 2],
			['Memory', 'brisk-ddr4-3200-32gb', 'Memory', 3],
			['Storage', 'verrow-v4-lite-1tb', 'Storage', 4],
			['Graphics card', 'ironvale-auric-a52-8g', 'Graphics card', 5],
			['Case', 'cairnhouse-m-mesh', 'Case', 6],
			['Operating system', 'larkspur-os-24-lts', 'Operating system', 7],
			['Second drive', 'cindral-c4-2tb', 'Second drive', 8],
			['Extra drive', 'cindral-c3-1tb', null, 9]
		]);
		// The CPU changed part: its purchase and price override were about the old part.
		expect(after[0]).toMatchObject({
			origin: 'source',
			purchased: false,
			priceOverrideMinor: null
		});
		expect(after.find((s) => s.label === 'Graphics card')?.origin).toBe('alternate');
		const stamped = await fresh(build.id);
		expect([stamped.baseRevisionId, stamped.version]).toEqual([upstream.id, 2]);
		const syncs = await BuildSync.findAll({ where: { buildId: build.id } });
		expect(syncs).toHaveLength(1);
		expect([syncs[0]?.fromRevisionId, syncs[0]?.toRevisionId, syncs[0]?.undoneAt]).toEqual([
			baseRevisionId,
			upstream.id,
			null
		]);

		// Nothing left to sync; undo is offered.
		expect(await syncPlan(owner.id, build.id)).toMatchObject({
			kind: 'up_to_date',
			version: 2,
			lastSync: { fromRevisionNumber: 1, toRevisionNumber: 2 }
		});

		const undone = await undoLastSync(owner.id, build.id, 2);
		expect(undone).toEqual({
			kind: 'ok',
			version: 3,
			baseRevisionId,
			restoredSlots: before.length
		});
		expect(await slotRows(build.id)).toEqual(before);
		const restored = await fresh(build.id);
		expect([restored.baseRevisionId, restored.version]).toEqual([baseRevisionId, 3]);
		const cpu = (await BuildSlot.findOne({ where: { buildId: build.id, label: 'CPU' } }))!;
		expect([
			cpu.purchased,
			cpu.paidMinor === null ? null : Number(cpu.paidMinor),
			cpu.purchasedAt,
			cpu.priceOverrideStore
		]).toEqual([true, 10500, '2026-11-28', 'Corner Shop']);
		expect((await BuildSync.findByPk(syncs[0]!.id))?.undoneAt).toBeInstanceOf(Date);
		// The sync is offered again, and there is nothing more to undo.
		expect((await syncPlan(owner.id, build.id)).kind).toBe('plan');
		expect(await undoLastSync(owner.id, build.id, 3)).toEqual({
			kind: 'invalid',
			issues: { _form: ['There is no sync to undo on this build.'] }
		});
	});

	it('without "take all", changes only the rows chosen; a slot kept although upstream removed it loses its source key', async () => {
		const { build, upstream } = await diverged();
		const applied = await applySync(
			owner.id,
			build.id,
			{ choices: { [GPU]: 'take_upstream' }, takeAllNonConflicting: false },
			1
		);
		expect(applied).toMatchObject({
			kind: 'ok',
			version: 2,
			baseRevisionId: upstream.id,
			changedSlots: 1,
			removedSlots: 0,
			addedSlots: 0
		});
		expect((await slotRows(build.id)).map((s) => [s.label, s.part, s.source])).toEqual([
			['CPU', 'halvard-strata-406', 'CPU'],
			['Motherboard', 'arkwell-s550m-daily', 'Motherboard'],
			['Memory', 'brisk-ddr4-3200-32gb', 'Memory'],
			['Storage', 'verrow-v4-lite-1tb', 'Storage'],
			['Graphics card', 'solenne-auric-a64-12g', 'Graphics card'],
			['Case', 'cairnhouse-m-mesh', 'Case'],
			['Case fans', 'tessel-breeze-120-3pack', null],
			['Operating system', 'larkspur-os-24-lts', 'Operating system'],
			['Extra drive', 'cindral-c3-1tb', null]
		]);
		// The CPU kept its purchase: the reader did not take upstream's CPU.
		expect((await slotRows(build.id))[0]?.purchased).toBe(true);
	});

	it('refuses an unresolved conflict or a choice for a row that is not there, and writes nothing', async () => {
		const { build } = await diverged();
		const before = await slotRows(build.id);
		expect(
			await applySync(owner.id, build.id, { choices: {}, takeAllNonConflicting: true }, 1)
		).toEqual({
			kind: 'invalid',
			issues: {
				[`choices.${GPU}`]: [
					'Graphics card: changed on both sides. Choose to take the guide’s version or keep yours.'
				]
			}
		});
		const unknown = await applySync(
			owner.id,
			build.id,
			{
				choices: { [GPU]: 'keep_local', 'source:Sound card': 'take_upstream' },
				takeAllNonConflicting: true
			},
			1
		);
		expect(unknown).toEqual({
			kind: 'invalid',
			issues: { 'choices.source:Sound card': ['no such row in this sync'] }
		});
		// A table made for another revision is stale.
		const stale = await applySync(
			owner.id,
			build.id,
			{
				choices: { [GPU]: 'keep_local' },
				takeAllNonConflicting: true,
				upstreamRevisionId: baseRevisionId
			},
			1
		);
		expect(stale.kind).toBe('invalid');
		expect(await slotRows(build.id)).toEqual(before);
		expect([(await fresh(build.id)).version, (await fresh(build.id)).baseRevisionId]).toEqual([
			1,
			baseRevisionId
		]);
		expect(await countRows('build_syncs')).toBe(0);
	});

	it('answers a stale version with the current table and changes nothing; other readers get not_found', async () => {
		const { build } = await diverged();
		// Another tab saved meanwhile.
		await Build.update({ version: 2 }, { where: { id: build.id } });
		const before = await slotRows(build.id);
		const outcome = await applySync(
			owner.id,
			build.id,
			{ choices: { [GPU]: 'keep_local' }, takeAllNonConflicting: true },
			1
		);
		expect(outcome.kind).toBe('conflict');
		if (outcome.kind === 'conflict' && outcome.current.kind === 'plan')
			expect(outcome.current.plan.version).toBe(2);
		else throw new Error('expected the current plan');
		expect(await slotRows(build.id)).toEqual(before);
		expect(await countRows('build_syncs')).toBe(0);
		expect(
			await applySync(
				other.id,
				build.id,
				{ choices: { [GPU]: 'keep_local' }, takeAllNonConflicting: true },
				2
			)
		).toEqual({ kind: 'not_found' });
		expect(await undoLastSync(other.id, build.id, 2)).toEqual({ kind: 'not_found' });
		expect((await undoLastSync(owner.id, build.id, 1)).kind).toBe('conflict');
	});

	it('a sync that fails half-way leaves nothing half-written', async () => {
		const { build } = await diverged();
		const before = await slotRows(build.id);
		// Fails on the insert of the slot taken from upstream: after the version stamp, the
		// BuildSync row, the removal of "Case fans" and the CPU update were already written.
		await sequelize.query(
			`CREATE TRIGGER fail_mid_sync BEFORE INSERT ON build_slots FOR EACH ROW
			 BEGIN IF NEW.label = 'Second drive' THEN SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'injected failure'; END IF; END`,
			{ type: QueryTypes.RAW }
		);
		try {
			await expect(
				applySync(
					owner.id,
					build.id,
					{ choices: { [GPU]: 'keep_local' }, takeAllNonConflicting: true },
					1
				)
			).rejects.toThrow(/injected failure/);
		} finally {
			await sequelize.query('DROP TRIGGER IF EXISTS fail_mid_sync', { type: QueryTypes.RAW });
		}
		expect(await slotRows(build.id)).toEqual(before);
		const after = await fresh(build.id);
		expect([after.baseRevisionId, after.version]).toEqual([baseRevisionId, 1]);
		expect(await countRows('build_syncs')).toBe(0);
		// With the cause gone the same sync goes through.
		expect(
			(
				await applySync(
					owner.id,
					build.id,
					{ choices: { [GPU]: 'keep_local' }, takeAllNonConflicting: true },
					1
				)
			).kind
		).toBe('ok');
		expect((await GuideRevision.findByPk(after.baseRevisionId!))?.number).toBe(1);
	});
});
