import { parse } from 'csv-parse/sync';
import { QueryTypes } from 'sequelize';
import { beforeAll, describe, expect, it } from 'vitest';
import { updateSlotInput } from '../../src/lib/schemas/build';
import {
	Build,
	BuildSlot,
	Guide,
	GuideSlot,
	Part,
	Quote,
	Region,
	Store,
	User,
	sequelize
} from '../../src/lib/server/db';
import { seeder } from '../../src/lib/server/db/seeders';
import { seedDemoCommunity } from '../../src/lib/server/db/seeders/demo-community';
import * as buildEdits from '../../src/lib/server/services/build-edits';
import * as buildExport from '../../src/lib/server/services/build-export';
import * as buildFork from '../../src/lib/server/services/build-fork';
import * as buildLists from '../../src/lib/server/services/build-lists';
import { keyedRevisionSlots } from '../../src/lib/server/services/build-source';
import { labelKeys } from '../../src/lib/server/db/migrations/slot-label-keys';
import * as buildView from '../../src/lib/server/services/build-view';
import type { BuildView } from '../../src/lib/views';
import * as guides from '../../src/lib/server/services/guides';
import { countRows, resetDatabase } from '../support/db';

/*
 * Builds on the real MariaDB with the demo community and the ECB 2 Jan 2024 rates seeded:
 * fork, who may see a build, swaps and their origin, optimistic locking, region re-pricing
 * checked by hand, the purchase tracker's totals by hand, the CSV shopping list, and a fork
 * that fails half-way inside MariaDB.
 */

const GUIDE = 'steady-1080p-starter';
let reader: User;
let other: User;

async function user(email: string): Promise<User> {
	const u = await User.findOne({ where: { email } });
	if (!u) throw new Error(`demo user ${email} missing`);
	return u;
}

async function forked(owner: User = reader): Promise<BuildView> {
	const outcome = await buildFork.fork(owner.id, GUIDE);
	if (outcome.kind !== 'created') throw new Error('fork failed');
	const view = await buildView.getBuild({ id: owner.id }, outcome.id);
	if (!view) throw new Error('own build not visible');
	return view;
}

function ok(outcome: buildEdits.MutationOutcome): BuildView {
	if (outcome.kind !== 'ok')
		throw new Error(`expected ok, got ${JSON.stringify(outcome).slice(0, 300)}`);
	return outcome.build;
}

function slotOf(view: BuildView, category: string) {
	const slot = view.slots.find((s) => s.category === category);
	if (!slot) throw new Error(`no ${category} slot`);
	return slot;
}

describe('builds on the real MariaDB', () => {
	beforeAll(async () => {
		await resetDatabase();
		await seeder(sequelize).up(); // demo community, ECB 2 Jan 2024 rates, caution rules
		reader = await user('reader@slotwise.test');
		other = await user('author@slotwise.test');
	});

	it('forks the published revision: every slot, pick, quantity and label, private, in the base region', async () => {
		const guide = (await Guide.findOne({ where: { slug: GUIDE } })) as Guide;
		const outcome = await buildFork.fork(reader.id, GUIDE);
		if (outcome.kind !== 'created') throw new Error(outcome.kind);
		const build = (await Build.findByPk(outcome.id)) as Build;
		expect(build.ownerId).toBe(reader.id);
		expect(build.title).toBe(`${guide.title} (my build)`);
		expect(build.visibility).toBe('private');
		expect(build.regionId).toBe(guide.baseRegionId);
		expect(build.baseRevisionId).toBe(guide.publishedRevisionId);
		expect(build.sourceGuideId).toBe(guide.id);
		// 32 random bytes in base64url are 43 characters.
		expect(build.shareToken).toMatch(/^[A-Za-z0-9_-]{43}$/);

		const source = await GuideSlot.findAll({
			where: { revisionId: guide.publishedRevisionId as number },
			order: [['position', 'ASC']]
		});
		const copied = await BuildSlot.findAll({
			where: { buildId: build.id },
			order: [['position', 'ASC']]
		});
		expect(
			copied.map((s) => [s.sourceSlotKey, s.label, s.category, s.partId, s.quantity, s.origin])
		).toEqual(
			source.map((s) => [s.slotKey, s.label, s.category, s.pickPartId, s.quantity, 'source'])
		);

		const view = await buildView.getBuild({ id: reader.id }, build.id);
		if (!view) throw new Error('owner cannot see the fork');
		expect(view.isOwner).toBe(true);
		expect(view.source).toMatchObject({
			slug: GUIDE,
			baseRevisionNumber: 1,
			latestRevisionNumber: 1,
			newerRevisionAvailable: false
		});
		expect(view.drift.every((d) => d.kind === 'same')).toBe(true);
		expect(view.value.sourceResultsDiffer).toBe(false);
		// The fresh fork costs what the guide page shows in its base region: the author's quotes.
		const priced = await guides.getPriced(GUIDE, null);
		if (priced.kind !== 'ok') throw new Error(priced.kind);
		expect(view.totals.planned).toEqual(priced.guide.picksTotal);
		expect(view.value.build?.total).toEqual(view.value.source?.total);
		// Every slot offers the base slot's alternates (the pick is the current part).
		const gpu = slotOf(view, 'gpu');
		const guideGpu = priced.guide.slots.find((s) => s.category === 'gpu');
		expect(gpu.options.map((o) => o.part.id)).toEqual(guideGpu?.alternates.map((a) => a.part.id));
		expect(gpu.options.every((o) => o.kind === 'alternate')).toBe(true);
	});

	it('gives repeated forks of one guide distinct titles, and deletes a build with its slots', async () => {
		// A member who forks nothing else in this file (demo-data/users: a community author).
		const owner = await user('tobias.wren@slotwise.test');
		const guide = (await Guide.findOne({ where: { slug: GUIDE } })) as Guide;
		const ids: number[] = [];
		for (let i = 0; i < 3; i++) {
			const outcome = await buildFork.fork(owner.id, GUIDE);
			if (outcome.kind !== 'created') throw new Error(outcome.kind);
			ids.push(outcome.id);
		}
		const titles = async () =>
			(
				await Build.findAll({
					where: { ownerId: owner.id, sourceGuideId: guide.id },
					order: [['id', 'ASC']]
				})
			).map((b) => b.title);
		expect(await titles()).toEqual([
			`${guide.title} (my build)`,
			`${guide.title} (my build 2)`,
			`${guide.title} (my build 3)`
		]);

		// Only the owner deletes; the slots go with the build.
		expect(await buildFork.deleteBuild(reader.id, ids[1] as number)).toEqual({ kind: 'not_found' });
		expect(await buildFork.deleteBuild(owner.id, ids[1] as number)).toEqual({
			kind: 'deleted',
			title: `${guide.title} (my build 2)`
		});
		expect(await Build.findByPk(ids[1] as number)).toBeNull();
		expect(await BuildSlot.count({ where: { buildId: ids[1] as number } })).toBe(0);
		// The freed title is the next fork's: the first free number.
		const again = await buildFork.fork(owner.id, GUIDE);
		if (again.kind !== 'created') throw new Error(again.kind);
		expect((await Build.findByPk(again.id))?.title).toBe(`${guide.title} (my build 2)`);
	});

	it('refuses to fork an unknown or unpublished guide', async () => {
		expect(await buildFork.fork(reader.id, 'no-such-guide')).toEqual({ kind: 'not_found' });
	});

	it('private: owner only; unlisted: with the link token; public: anyone, and listed in the lineage', async () => {
		const view = await forked();
		const token = view.shareToken as string;
		expect(await buildView.getBuild({ id: other.id }, view.id)).toBeNull();
		expect(await buildView.getBuild(null, view.id)).toBeNull();
		expect(await buildView.getBuild({ id: other.id }, view.id, { shareToken: token })).toBeNull();
		const before = await buildLists.lineage(GUIDE);

		const unlisted = ok(
			await buildEdits.updateBuild(
				reader.id,
				view.id,
				{ visibility: 'unlisted', notes: 'Ask Sam about the case.' },
				view.version
			)
		);
		expect(await buildView.getBuild({ id: other.id }, view.id)).toBeNull();
		expect(await buildView.getBuild(null, view.id, { shareToken: 'x'.repeat(43) })).toBeNull();
		const shared = await buildView.getBuild(null, view.id, { shareToken: token });
		expect(shared?.isOwner).toBe(false);
		// The owner's private data stays with the owner.
		expect(shared?.shareToken).toBeNull();
		expect(shared?.notes).toBe('');
		expect(unlisted.notes).toBe('Ask Sam about the case.');
		expect((await buildLists.lineage(GUIDE)).publicBuilds.some((b) => b.id === view.id)).toBe(
			false
		);

		ok(
			await buildEdits.updateBuild(reader.id, view.id, { visibility: 'public' }, unlisted.version)
		);
		expect((await buildView.getBuild({ id: other.id }, view.id))?.title).toBe(view.title);
		expect((await buildView.getBuild(null, view.id))?.isOwner).toBe(false);
		const after = await buildLists.lineage(GUIDE);
		expect(after.forkCount).toBe(before.forkCount);
		expect(after.publicBuilds.find((b) => b.id === view.id)).toMatchObject({
			title: view.title,
			ownerName: reader.name ?? 'Former member'
		});
		// Private forks count in the total but are never listed.
		await forked();
		const later = await buildLists.lineage(GUIDE);
		expect(later.forkCount).toBe(after.forkCount + 1);
		expect(later.publicBuilds).toHaveLength(after.publicBuilds.length);
	});

	it('nobody but the owner changes a build', async () => {
		const view = await forked();
		const gpu = slotOf(view, 'gpu');
		expect(
			await buildEdits.updateBuild(other.id, view.id, { title: 'Mine now' }, view.version)
		).toEqual({ kind: 'not_found' });
		expect(
			await buildEdits.updateSlot(other.id, view.id, gpu.id, { quantity: 2 }, view.version)
		).toEqual({ kind: 'not_found' });
		expect(await buildEdits.removeSlot(other.id, view.id, gpu.id, view.version)).toEqual({
			kind: 'not_found'
		});
		expect(
			await buildEdits.addSlot(
				other.id,
				view.id,
				{ category: 'extra', label: 'Cable', partId: gpu.part.id, quantity: 1 },
				view.version
			)
		).toEqual({ kind: 'not_found' });
		// A slot of another build is not found through this one.
		const mine = await forked(other);
		expect(
			await buildEdits.updateSlot(
				reader.id,
				view.id,
				slotOf(mine, 'gpu').id,
				{ quantity: 2 },
				view.version
			)
		).toEqual({ kind: 'not_found' });
		expect((await Build.findByPk(view.id))?.version).toBe(view.version);
	});

	it('a swap to an alternate sets origin "alternate", back to the pick "source", any other part "custom"', async () => {
		const view = await forked();
		const gpu = slotOf(view, 'gpu');
		const alternate = gpu.options.find((o) => o.kind === 'alternate');
		if (!alternate) throw new Error('the demo GPU slot has alternates');
		const swapped = ok(
			await buildEdits.updateSlot(
				reader.id,
				view.id,
				gpu.id,
				{ partId: alternate.part.id },
				view.version
			)
		);
		const now = slotOf(swapped, 'gpu');
		expect(now.origin).toBe('alternate');
		expect(now.part.id).toBe(alternate.part.id);
		expect(swapped.version).toBe(view.version + 1);
		// The author's pick is now offered back, and the alternate is not offered twice.
		expect(now.options.find((o) => o.kind === 'source_pick')?.part.id).toBe(gpu.part.id);
		expect(now.options.some((o) => o.part.id === alternate.part.id)).toBe(false);
		expect(swapped.drift.find((d) => d.label === gpu.label)).toMatchObject({
			kind: 'swapped',
			from: `${gpu.part.brand} ${gpu.part.model}`,
			to: `${alternate.part.brand} ${alternate.part.model}`
		});
		expect(swapped.value.sourceResultsDiffer).toBe(true);

		const back = ok(
			await buildEdits.updateSlot(
				reader.id,
				view.id,
				gpu.id,
				{ partId: gpu.part.id },
				swapped.version
			)
		);
		expect(slotOf(back, 'gpu').origin).toBe('source');
		expect(back.value.sourceResultsDiffer).toBe(false);

		// A catalog graphics card that is neither the pick nor an alternate of this slot.
		const offered = new Set([gpu.part.id, ...gpu.options.map((o) => o.part.id)]);
		const gpus = await sequelize.query<{ id: number }>(
			"SELECT id FROM parts WHERE category = 'gpu' ORDER BY id",
			{ type: QueryTypes.SELECT }
		);
		const custom = gpus.find((g) => !offered.has(g.id));
		if (!custom) throw new Error('the demo catalog has a graphics card no slot offers');
		const customView = ok(
			await buildEdits.updateSlot(reader.id, view.id, gpu.id, { partId: custom.id }, back.version)
		);
		expect(slotOf(customView, 'gpu').origin).toBe('custom');

		// Wrong category and unknown parts are refused by field; nothing is written.
		const cpu = slotOf(customView, 'cpu');
		expect(
			await buildEdits.updateSlot(
				reader.id,
				view.id,
				gpu.id,
				{ partId: cpu.part.id },
				customView.version
			)
		).toMatchObject({ kind: 'invalid', issues: { partId: [expect.stringContaining('category')] } });
		expect(
			await buildEdits.updateSlot(
				reader.id,
				view.id,
				gpu.id,
				{ partId: 99_999_999 },
				customView.version
			)
		).toMatchObject({ kind: 'invalid', issues: { partId: expect.any(Array) } });
		expect((await Build.findByPk(view.id))?.version).toBe(customView.version);
	});

	it('a stale version is a conflict with the build as it is now, and writes nothing', async () => {
		const view = await forked();
		const first = ok(
			await buildEdits.updateBuild(reader.id, view.id, { title: 'First tab' }, view.version)
		);
		const stale = await buildEdits.updateBuild(
			reader.id,
			view.id,
			{ title: 'Second tab' },
			view.version
		);
		if (stale.kind !== 'conflict') throw new Error(stale.kind);
		expect(stale.current.title).toBe('First tab');
		expect(stale.current.version).toBe(first.version);
		const slot = slotOf(view, 'memory');
		const staleSlot = await buildEdits.updateSlot(
			reader.id,
			view.id,
			slot.id,
			{ quantity: 2 },
			view.version
		);
		expect(staleSlot.kind).toBe('conflict');
		expect((await BuildSlot.findByPk(slot.id))?.quantity).toBe(slot.quantity);
		expect((await Build.findByPk(view.id))?.title).toBe('First tab');
	});

	it('adds and removes a slot of the reader’s own', async () => {
		const view = await forked();
		const psu = slotOf(view, 'psu');
		const added = await buildEdits.addSlot(
			reader.id,
			view.id,
			{ category: 'psu', label: 'Spare PSU', partId: psu.part.id, quantity: 1 },
			view.version
		);
		const withSlot = ok(added);
		const extra = withSlot.slots.at(-1);
		expect(extra).toMatchObject({ label: 'Spare PSU', origin: 'custom', sourceSlotKey: null });
		expect(withSlot.drift.some((d) => d.kind === 'added' && d.label === 'Spare PSU')).toBe(true);
		expect(withSlot.totals.planned.amountMinor).toBe(
			view.totals.planned.amountMinor + (psu.lineTotal?.amountMinor ?? NaN)
		);
		const removed = ok(
			await buildEdits.removeSlot(reader.id, view.id, extra!.id, withSlot.version)
		);
		expect(removed.slots).toHaveLength(view.slots.length);
		expect(
			await buildEdits.addSlot(
				reader.id,
				view.id,
				{ category: 'gpu', label: 'Second card', partId: psu.part.id, quantity: 1 },
				removed.version
			)
		).toMatchObject({ kind: 'invalid', issues: { partId: expect.any(Array) } });
	});

	it('re-prices in another region: a quoted line is the German quote, an estimated one matches the hand arithmetic (D)', async () => {
		const view = await forked();
		// An invented part quoted only in the US, so Germany has to estimate it.
		const us = (await Region.findOne({ where: { code: 'us' } })) as Region;
		const de = (await Region.findOne({ where: { code: 'de' } })) as Region;
		const store = (await Store.findOne({ where: { regionId: us.id } })) as Store;
		const kit = await Part.create({
			category: 'extra',
			brand: 'Testbench',
			model: 'Cable kit',
			slug: 'testbench-cable-kit',
			specs: { kind: 'cable kit' }
		});
		await Quote.create({
			partId: kit.id,
			storeId: store.id,
			regionId: us.id,
			amountMinor: 1999,
			currency: 'USD',
			taxIncluded: false,
			observedAt: new Date('2026-11-20T00:00:00Z'),
			url: null,
			source: 'editor'
		});
		const added = ok(
			await buildEdits.addSlot(
				reader.id,
				view.id,
				{ category: 'extra', label: 'Cables', partId: kit.id, quantity: 2 },
				view.version
			)
		);
		const moved = ok(
			await buildEdits.updateBuild(reader.id, view.id, { regionCode: 'de' }, added.version)
		);
		expect(moved.region.code).toBe('de');
		expect(moved.totals.planned.currency).toBe('EUR');
		const estimated = moved.slots.find((s) => s.part.id === kit.id);
		if (estimated?.price?.status !== 'estimated')
			throw new Error('expected the kit to be estimated in Germany');
		const factorBp = de.categoryFactorsBp?.extra ?? 10000;
		// ECB 2 Jan 2024 (docs/sources.md 10c, V): 1 EUR = 1.0956 USD. US prices are pre-tax; DE
		// VAT 19 % (docs/sources.md 11a, V2). EUR cents = 1999 / 1.0956 × factor × 1.19, rounded
		// half-even once (D).
		const exact = (1999 / 1.0956) * (factorBp / 10000) * 1.19;
		expect(Math.abs(estimated.price.unit.amountMinor - exact)).toBeLessThanOrEqual(0.5 + 1e-6);
		expect(estimated.price.observedAt).toBe('2024-01-02');
		expect(estimated.lineTotal?.amountMinor).toBe(estimated.price.unit.amountMinor * 2);
		expect(moved.ratesAsOf).toBe('2024-01-02');
		// The demo's picks all have German quotes: each line is the latest German quote.
		const quoted = moved.slots.filter((s) => s.price?.status === 'quoted');
		expect(quoted.length).toBe(view.slots.length);
		for (const line of quoted) {
			const latest = await Quote.findOne({
				where: { partId: line.part.id, regionId: de.id, status: 'active' },
				order: [
					['observedAt', 'DESC'],
					['id', 'DESC']
				]
			});
			expect(line.price?.unit.amountMinor).toBe(Number(latest?.amountMinor));
		}
		// Planned is the exact sum of the priced lines.
		expect(moved.totals.planned.amountMinor).toBe(
			moved.slots.reduce((t, s) => t + (s.lineTotal?.amountMinor ?? 0), 0)
		);
		// A region asked for in the query prices the view without changing the build.
		const peek = await buildView.getBuild({ id: reader.id }, view.id, { regionCode: 'us' });
		expect(peek?.region.code).toBe('us');
		expect(peek?.totals.planned.amountMinor).toBe(added.totals.planned.amountMinor);
		expect((await Build.findByPk(view.id))?.regionId).toBe(de.id);
		expect(
			await buildEdits.updateBuild(reader.id, view.id, { regionCode: 'zz' }, moved.version)
		).toMatchObject({ kind: 'invalid', issues: { regionCode: expect.any(Array) } });
	});

	it('converts a kept budget when the region changes currency: $800.00 → €730.19 at 1.0956 (D)', async () => {
		const view = await forked();
		const budgeted = ok(
			await buildEdits.updateBuild(reader.id, view.id, { budget: '800.00' }, view.version)
		);
		expect(budgeted.budget).toEqual({ amountMinor: 80000, currency: 'USD' });
		const moved = ok(
			await buildEdits.updateBuild(reader.id, view.id, { regionCode: 'de' }, budgeted.version)
		);
		// 80000 / 1.0956 = 73019.35… → 73019 cents (ECB 2 Jan 2024, docs/sources.md 10c, V).
		expect(moved.budget).toEqual({ amountMinor: 73019, currency: 'EUR' });
		expect(
			await buildEdits.updateBuild(reader.id, view.id, { budget: '10.001' }, moved.version)
		).toMatchObject({ kind: 'invalid', issues: { budget: ['EUR has 2 decimals.'] } });
	});

	it('purchase tracker: planned, spent, remaining and left of budget by hand', async () => {
		const view = await forked();
		const guide = (await Guide.findOne({ where: { slug: GUIDE } })) as Guide;
		// Planned for a fresh fork in the base region = Σ quantity × the author's quoted amount (SQL).
		const [row] = await sequelize.query<{ total: string }>(
			`SELECT SUM(gs.quantity * q.amount_minor) AS total FROM guide_slots gs JOIN quotes q ON q.id = gs.price_quote_id WHERE gs.revision_id = ?`,
			{ replacements: [guide.publishedRevisionId], type: QueryTypes.SELECT }
		);
		const planned = Number(row?.total);
		expect(view.totals.planned.amountMinor).toBe(planned);

		const cpu = slotOf(view, 'cpu');
		const gpu = slotOf(view, 'gpu');
		const psu = slotOf(view, 'psu');
		let v = ok(
			await buildEdits.updateBuild(reader.id, view.id, { budget: '650.00' }, view.version)
		);
		v = ok(
			await buildEdits.updateSlot(
				reader.id,
				view.id,
				cpu.id,
				{
					purchase: {
						purchased: true,
						paid: '150.00',
						purchasedAt: '2026-11-28',
						store: 'Corner Shop'
					}
				},
				v.version
			)
		);
		v = ok(
			await buildEdits.updateSlot(
				reader.id,
				view.id,
				gpu.id,
				{ purchase: { purchased: true } },
				v.version
			)
		);
		// An override on a slot not bought yet: the line becomes 2 × 49.99.
		v = ok(
			await buildEdits.updateSlot(
				reader.id,
				view.id,
				psu.id,
				{
					quantity: 2,
					priceOverride: { amount: '49.99', store: 'Market stall', date: '2026-11-30' }
				},
				v.version
			)
		);
		const psuNow = v.slots.find((s) => s.id === psu.id);
		expect(psuNow?.price).toMatchObject({
			status: 'override',
			unit: { amountMinor: 4999, currency: 'USD' },
			storeName: 'Market stall',
			observedAt: '2026-11-30'
		});
		expect(psuNow?.lineTotal?.amountMinor).toBe(9998);

		const cpuLine = cpu.lineTotal!.amountMinor;
		const gpuLine = gpu.lineTotal!.amountMinor;
		const psuLine = psu.lineTotal!.amountMinor;
		const plannedNow = planned - psuLine + 9998;
		const spent = 15000 + gpuLine; // paid for the CPU; the GPU counts at its line total
		const remaining = plannedNow - cpuLine - gpuLine;
		expect(v.totals).toMatchObject({
			planned: { amountMinor: plannedNow, currency: 'USD' },
			spent: { amountMinor: spent, currency: 'USD' },
			remainingToBuy: { amountMinor: remaining, currency: 'USD' },
			leftOfBudget: { amountMinor: 65000 - spent - remaining, currency: 'USD' },
			boughtCount: 2,
			unpricedSlots: 0
		});
		expect(v.slots.find((s) => s.id === cpu.id)?.purchase).toEqual({
			purchased: true,
			paid: { amountMinor: 15000, currency: 'USD' },
			purchasedAt: '2026-11-28',
			store: 'Corner Shop'
		});

		// Bad amounts by field; dates in the future never reach the service.
		expect(
			await buildEdits.updateSlot(
				reader.id,
				view.id,
				cpu.id,
				{ purchase: { purchased: true, paid: '1.005' } },
				v.version
			)
		).toMatchObject({ kind: 'invalid', issues: { 'purchase.paid': ['USD has 2 decimals.'] } });
		const future = updateSlotInput.safeParse({
			version: 1,
			purchase: { purchased: true, purchasedAt: '2999-01-01' }
		});
		expect(future.success).toBe(false);
		expect(future.error?.issues.map((i) => i.path.join('.'))).toEqual(['purchase.purchasedAt']);

		// Others never see what was paid, nor the budget.
		v = ok(await buildEdits.updateBuild(reader.id, view.id, { visibility: 'public' }, v.version));
		const seen = await buildView.getBuild({ id: other.id }, view.id);
		expect(seen?.budget).toBeNull();
		expect(seen?.totals.spent.amountMinor).toBe(0);
		expect(seen?.totals.leftOfBudget).toBeNull();
		expect(
			seen?.slots.every((s) => s.purchase.purchased === false && s.purchase.paid === null)
		).toBe(true);

		// Un-marking clears what was paid.
		ok(
			await buildEdits.updateSlot(
				reader.id,
				view.id,
				cpu.id,
				{ purchase: { purchased: false } },
				v.version
			)
		);
		expect(await BuildSlot.findByPk(cpu.id)).toMatchObject({
			purchased: false,
			paidMinor: null,
			purchasedAt: null,
			purchaseStore: null
		});
	});

	it('exports the shopping list as CSV with the same totals, formula-safe', async () => {
		const view = await forked();
		const psu = slotOf(view, 'psu');
		let v = ok(
			await buildEdits.addSlot(
				reader.id,
				view.id,
				{
					category: 'psu',
					label: '=HYPERLINK("http://x.example")',
					partId: psu.part.id,
					quantity: 1
				},
				view.version
			)
		);
		v = ok(
			await buildEdits.updateSlot(
				reader.id,
				view.id,
				psu.id,
				{ purchase: { purchased: true, paid: '60.00' } },
				v.version
			)
		);
		const csv = await buildExport.exportCsv({ id: reader.id }, view.id);
		if (csv === null) throw new Error('owner cannot export');
		const rows = parse(csv) as string[][];
		expect(rows[0]).toEqual([
			'slot',
			'part',
			'quantity',
			'unit price',
			'line total',
			'currency',
			'status',
			'store',
			'bought',
			'paid'
		]);
		const lines = rows.slice(1, 1 + v.slots.length);
		// Line totals in the file add up to the planned total row (cents, to avoid float sums).
		const cents = (s: string) => Math.round(Number(s) * 100);
		const sumLines = lines.reduce((t, r) => t + cents(r[4] ?? '0'), 0);
		const totalRow = rows.find((r) => r[0] === 'Planned total');
		expect(cents(totalRow?.[4] ?? '')).toBe(sumLines);
		expect(cents(totalRow?.[4] ?? '')).toBe(v.totals.planned.amountMinor);
		expect(rows.find((r) => r[0] === 'Spent')?.[4]).toBe(buildExport.decimalOf(v.totals.spent));
		expect(rows.find((r) => r[0] === 'Remaining to buy')?.[4]).toBe(
			buildExport.decimalOf(v.totals.remainingToBuy)
		);
		expect(lines.find((r) => r[0] === psu.label)?.slice(8)).toEqual(['yes', '60.00']);
		// The formula-like label is neutralised with a leading quote (OWASP CSV injection).
		expect(lines.some((r) => r[0] === `'=HYPERLINK("http://x.example")`)).toBe(true);
		expect(lines.every((r) => r[5] === 'USD')).toBe(true);
		// Others may not export a private build; a public one comes without purchases.
		expect(await buildExport.exportCsv({ id: other.id }, view.id)).toBeNull();
		ok(await buildEdits.updateBuild(reader.id, view.id, { visibility: 'public' }, v.version));
		const theirs = parse((await buildExport.exportCsv(null, view.id)) ?? '') as string[][];
		expect(theirs.slice(1, 1 + v.slots.length).every((r) => r[8] === '' && r[9] === '')).toBe(true);
		expect(theirs.some((r) => r[0] === 'Spent')).toBe(false);
		expect(buildExport.decimalOf({ amountMinor: -1250, currency: 'USD' })).toBe('-12.50');
		expect(buildExport.decimalOf({ amountMinor: 180000, currency: 'JPY' })).toBe('180000');
	});

	it('lists the reader’s own builds only', async () => {
		const mine = await buildLists.listMine(reader.id);
		expect(mine.length).toBeGreaterThan(0);
		const ids = new Set((await Build.findAll({ where: { ownerId: reader.id } })).map((b) => b.id));
		expect(new Set(mine.map((b) => b.id))).toEqual(ids);
		expect(mine[0]?.source?.slug).toBe(GUIDE);
	});
});

describe('slot keys and input (no database)', () => {
	it('keys revision slots by their own key, whatever their labels (repeats included)', () => {
		const slot = (slotKey: string, label: string) =>
			({ slotKey, label, category: 'storage', pickPartId: 1, quantity: 1 }) as never;
		const keys = keyedRevisionSlots([
			slot('k-1', 'Storage'),
			slot('k-2', 'CPU'),
			slot('k-3', 'Storage')
		]).map((k) => k.key);
		expect(keys).toEqual(['k-1', 'k-2', 'k-3']);
	});

	it('the migrations still know the old label rule, to give existing rows their keys', () => {
		const long = 'L'.repeat(80);
		const keys = labelKeys(['Storage', 'CPU', 'Storage', long, long]);
		expect(keys).toEqual(['Storage', 'CPU', 'Storage (2)', long, `${'L'.repeat(76)} (2)`]);
		expect(keys.every((k) => k.length <= 80)).toBe(true);
	});

	it('refuses fields a reader may not set and dates that do not exist', () => {
		expect(updateSlotInput.safeParse({ version: 1, origin: 'source' }).success).toBe(false);
		expect(
			updateSlotInput.safeParse({
				version: 1,
				priceOverride: { amount: '1', store: 'x', date: '2025-02-30' }
			}).success
		).toBe(false);
		expect(updateSlotInput.safeParse({ version: 0, quantity: 1 }).success).toBe(false);
		expect(updateSlotInput.safeParse({ version: 3, priceOverride: null }).success).toBe(true);
	});
});

describe('a fork that fails half-way (real MariaDB failure)', () => {
	beforeAll(async () => {
		await resetDatabase();
		await seedDemoCommunity(sequelize);
		reader = await user('reader@slotwise.test');
	});

	it('leaves no build and no slot behind', async () => {
		// A trigger refuses the graphics card's slot row, after the build row is in.
		await sequelize.query(
			`CREATE TRIGGER fail_mid_fork BEFORE INSERT ON build_slots FOR EACH ROW
			 BEGIN IF NEW.category = 'gpu' THEN SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'injected failure'; END IF; END`,
			{ type: QueryTypes.RAW }
		);
		try {
			await expect(buildFork.fork(reader.id, GUIDE)).rejects.toThrow(/injected failure/);
		} finally {
			await sequelize.query('DROP TRIGGER IF EXISTS fail_mid_fork', { type: QueryTypes.RAW });
		}
		expect(await countRows('builds')).toBe(0);
		expect(await countRows('build_slots')).toBe(0);
		// With the cause gone the same fork succeeds.
		expect((await buildFork.fork(reader.id, GUIDE)).kind).toBe('created');
		expect(await countRows('builds')).toBe(1);
	});
});
