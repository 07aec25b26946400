import { QueryTypes } from 'sequelize';
import { beforeEach, describe, expect, it } from 'vitest';
import {
	Build,
	BuildSlot,
	GuideSlot,
	Region,
	SlotAlternate,
	User,
	sequelize
} from '../../src/lib/server/db';
import { seedDemoCommunity } from '../../src/lib/server/db/seeders/demo-community';
import { declineUpdate } from '../../src/lib/server/services/build-declines';
import { applySync } from '../../src/lib/server/services/build-sync';
import { syncPlan } from '../../src/lib/server/services/build-sync-plan';
import { guideInsights } from '../../src/lib/server/services/fork-insights';
import type { GuideInsights, InsightChoice } from '../../src/lib/views';
import { countRows, resetDatabase } from '../support/db';
import { forkBuild, newReader, partId, publishRevision } from '../support/buildsync-fixtures';
import { upkeepGuide, type UpkeepGuide } from '../support/upkeep-fixtures';

/*
 * Fork insights on the real MariaDB (issue 19), every figure counted by hand from the
 * builds made below. The guide (tests/support/upkeep-fixtures.ts) has two slots: CPU
 * (pick Tollan K6 Test, alternate 1 Tollan K6 Lite Test) and graphics card (pick Tollan G8
 * Test). Builds 1–12 are forked from revision 1; revision 2 (same slots) goes live; builds
 * 1–5 take it; the owners of builds 6–11 answer "Not now" to it, and build 6's owner then
 * takes it after all; build 12's owner never answers; builds 13–14 are forked from revision 2.
 *
 *   build     region  CPU            graphics card      bought
 *   1–5       us      pick           pick               1–5 yes
 *   6–8       us      alternate 1    swapped to Cobalt  6 yes
 *   9–11      de      swapped to 408 swapped to Cobalt
 *   12        de      swapped to 408 removed
 *   13–14     us      pick           pick
 *
 * Shares are rounded to whole percent: 7/14 = 50 %, 6/14 = 42.9 % → 43 %, 7/10 = 70 %.
 * Counts from 1 to 4 read "fewer than 5" (the issue's k-anonymity rule); 0 and ≥ 5 are shown,
 * unless the totals would give a small count away, and then they read "hidden". A region of
 * fewer than 5 builds names no choices. Worked by hand per table below.
 * Suggestion rule (the issue): at least 20 % of the slot's builds and at least 5 builds.
 */

let g: UpkeepGuide;
let insights: GuideInsights;
let builds: Build[];
let revision2Id: number;

const shown = (n: number) => ({ count: n, fewerThan5: false });
const hidden = { count: null, fewerThan5: true };
/** A count of 5 or more hidden so that a small one beside it cannot be worked out. */
const covered = { count: null, fewerThan5: false };

function choice(list: InsightChoice[], kind: string, name: string | null) {
	return list.find((c) => c.kind === kind && c.partName === name);
}

beforeEach(async () => {
	await resetDatabase();
	await seedDemoCommunity(sequelize);
	g = await upkeepGuide(100000);
	const de = (await Region.findOne({ where: { code: 'de' } }))!;
	const cpu408 = await partId('halvard-strata-408');
	const cobalt = await partId('solenne-cobalt-c6-8g');
	builds = [];
	for (let i = 1; i <= 12; i++) builds.push(await forkBuild(await newReader(`fork${i}`), g.guide));
	const slot = (b: Build, key: string) =>
		BuildSlot.findOne({ where: { buildId: b.id, sourceSlotKey: key } });
	for (const [i, b] of builds.entries()) {
		const n = i + 1;
		if (n >= 9) await b.update({ regionId: de.id });
		if (n >= 6 && n <= 8)
			await (await slot(b, 'cpu-main'))!.update({ partId: g.parts.cpuB.id, origin: 'alternate' });
		if (n >= 9) await (await slot(b, 'cpu-main'))!.update({ partId: cpu408, origin: 'custom' });
		if (n >= 6 && n <= 11)
			await (await slot(b, 'gpu-main'))!.update({ partId: cobalt, origin: 'custom' });
		if (n === 12) await (await slot(b, 'gpu-main'))!.destroy();
		if (n <= 6) await (await slot(b, 'cpu-main'))!.update({ purchased: true });
	}
	revision2Id = (await publishRevision(g.guide, {})).id;
	for (const b of builds.slice(5, 11)) {
		const declined = await declineUpdate(b.ownerId, b.id, { upstreamRevisionId: revision2Id });
		expect(declined).toMatchObject({ kind: 'ok', revisionNumber: 2, baseRevisionNumber: 1 });
	}
	for (const b of builds.slice(0, 6)) {
		const synced = await applySync(
			b.ownerId,
			b.id,
			{ choices: {}, takeAllNonConflicting: true },
			b.version
		);
		expect(synced.kind).toBe('ok');
	}
	for (let i = 13; i <= 14; i++) await forkBuild(await newReader(`fork${i}`), g.guide);
	const outcome = await guideInsights(
		{ id: g.author.id, email: g.author.email, name: g.author.name, role: 'author' },
		g.guide.slug
	);
	if (outcome.kind !== 'ok') throw new Error('the author must see the insights');
	insights = outcome.insights;
});

describe('fork insights', () => {
	it('counts builds per revision, updates taken and declined, and parts bought', () => {
		expect(insights.totalBuilds).toEqual(shown(14));
		// 12 + 2 = 14 with 14 shown: the 2 alone would be 14 − 12, so the 12 is hidden too
		// (then 10 + 4, 11 + 3, 12 + 2 and 13 + 1 all fit).
		expect(insights.perRevision).toEqual([
			{ revisionNumber: 1, builds: covered },
			{ revisionNumber: 2, builds: hidden }
		]);
		// Builds 1–6 took revision 2 (build 6 after first declining it).
		expect(insights.tookUpdate).toEqual(shown(6));
		// Declined and still on revision 1: builds 7–11. Build 12 is behind too, but its owner
		// never answered, so it is not counted as declining.
		expect(insights.declinedUpdate).toEqual(shown(5));
		expect(insights.markedBought).toEqual(shown(6));
	});

	/*
	 * CPU, regions × choices (pick, alternate 1, Strata 408): de (0, 0, 4) = 4, us (7, 3, 0) =
	 * 10; columns 7, 3, 4; 14 in all. De has fewer than 5 builds: its total reads so and it
	 * names no choices. Small: us's 3, the columns 3 and 4. Then, as a reader would:
	 * - row us, 7 + 3 = 10 gives the 3 away → us's 7 is hidden;
	 * - the region totals, de = 14 − 10 = 4 → us's 10 is hidden.
	 * Left open (checked by listing every table that fits): us's pick 6 or 7, us's alternate
	 * 3 or 4, de's total 3 or 4. The pick's column, 7, stays: 50 %.
	 *
	 * Graphics card (pick, Cobalt, removed): de (0, 3, 1) = 4, us (7, 3, 0) = 10; columns
	 * 7, 6, 1. Small: us's 3, the column 1, de. Here 7 + 6 + 1 = 14 gives the 1 away, so
	 * the Cobalt's 6 is hidden (the smallest shown count beside it); then us's 7 (row us) and
	 * us's 10 (region totals) as for the CPU. Left open: Cobalt 5 or 6, removed 1 or 2.
	 * Hidden together: (3 + 4) / 14 = 50 % and (6 + 1) / 14 = 50 %.
	 */
	it('shares per slot: pick kept, alternate chosen, swapped, removed; small counts hidden', () => {
		const [cpu, gpu] = insights.slots;
		expect(cpu?.slotKey).toBe('cpu-main');
		expect(cpu?.builds).toEqual(shown(14));
		expect(choice(cpu!.choices, 'pick', 'Tollan K6 Test')).toMatchObject({
			builds: shown(7),
			percent: 50
		});
		expect(choice(cpu!.choices, 'alternate', 'Tollan K6 Lite Test')).toMatchObject({
			rank: 1,
			builds: hidden,
			percent: null
		});
		expect(choice(cpu!.choices, 'other', 'Halvard Strata 408')).toMatchObject({
			builds: hidden,
			percent: null
		});
		expect(cpu?.hiddenShare).toBe(50);
		expect(choice(gpu!.choices, 'pick', 'Tollan G8 Test')).toMatchObject({
			builds: shown(7),
			percent: 50
		});
		expect(choice(gpu!.choices, 'other', 'Solenne Cobalt C6 Duo 8 GB')).toMatchObject({
			builds: covered,
			percent: null
		});
		expect(choice(gpu!.choices, 'removed', null)).toMatchObject({ builds: hidden, percent: null });
		expect(gpu?.hiddenShare).toBe(50);
	});

	it('breaks the shares down by region, without a count that the totals would give away', () => {
		const [cpu] = insights.slots;
		const us = cpu!.byRegion.find((r) => r.regionCode === 'us');
		const de = cpu!.byRegion.find((r) => r.regionCode === 'de');
		expect(us?.builds).toEqual(covered);
		expect(choice(us!.choices, 'pick', 'Tollan K6 Test')).toMatchObject({
			builds: covered,
			percent: null
		});
		expect(choice(us!.choices, 'alternate', 'Tollan K6 Lite Test')).toMatchObject({
			builds: hidden,
			percent: null
		});
		expect(de?.builds).toEqual(hidden);
		expect(de?.choices).toEqual([]);
	});

	it('suggests a part as an alternate at ≥ 20 % and ≥ 5 builds, not at 4 builds', () => {
		const [cpu, gpu] = insights.slots;
		// CPU: 4 of 14 swapped to the Strata 408 (29 %, but fewer than 5): no suggestion.
		expect(cpu?.suggestions).toEqual([]);
		// Graphics card: 6 of 14 (43 %) swapped to the Cobalt C6: suggested, but its count is
		// hidden in the table, so the suggestion does not name it either.
		expect(gpu?.suggestions).toEqual([
			{
				partName: 'Solenne Cobalt C6 Duo 8 GB',
				partSlug: 'solenne-cobalt-c6-8g',
				builds: null,
				percent: null,
				editorHref:
					'/my/guides/upkeep-test-rig/edit?slot=gpu-main&alternate=solenne-cobalt-c6-8g#slot-gpu-main'
			}
		]);
	});

	it('a guide nobody forked reads 0 builds, not "hidden"', async () => {
		// 0 is shown as it is (the page then says nobody has forked the guide yet).
		const [row] = await sequelize.query<{ slug: string }>(
			`SELECT g.slug FROM guides g WHERE g.published_revision_id IS NOT NULL
			    AND NOT EXISTS (SELECT 1 FROM builds b WHERE b.source_guide_id = g.id) LIMIT 1`,
			{ type: QueryTypes.SELECT }
		);
		const editor = (await User.findOne({ where: { email: 'editor@slotwise.test' } }))!;
		const outcome = await guideInsights(
			{ id: editor.id, email: editor.email, name: editor.name, role: 'editor' },
			row!.slug
		);
		if (outcome.kind !== 'ok') throw new Error('an editor sees any guide’s insights');
		expect(outcome.insights.totalBuilds).toEqual(shown(0));
		expect(outcome.insights.perRevision).toEqual([]);
	});

	it('stops suggesting a part once the live revision offers it as an alternate', async () => {
		// Builds 6–11 still count as "swapped to the Cobalt" against their own revision; the
		// suggestion is about what the guide offers now.
		const revision3 = await publishRevision(g.guide, {});
		const gpu = await GuideSlot.findOne({
			where: { revisionId: revision3.id, slotKey: 'gpu-main' }
		});
		await SlotAlternate.create({
			slotId: gpu!.id,
			partId: await partId('solenne-cobalt-c6-8g'),
			rank: 1,
			reasonTag: 'easier_to_find',
			note: 'A common choice in readers’ builds.'
		});
		const outcome = await guideInsights(
			{ id: g.author.id, email: g.author.email, name: g.author.name, role: 'author' },
			g.guide.slug
		);
		if (outcome.kind !== 'ok') throw new Error('the author must see the insights');
		expect(outcome.insights.slots[1]?.suggestions).toEqual([]);
	});

	it('is for the author and editors only: a reader, another author and a visitor get not_found', async () => {
		const reader = await newReader('nosy');
		const other = (await User.findOne({ where: { email: 'mira.falkenberg@slotwise.test' } }))!;
		const editor = (await User.findOne({ where: { email: 'editor@slotwise.test' } }))!;
		const as = (u: User, role: 'reader' | 'author' | 'editor') =>
			guideInsights({ id: u.id, email: u.email, name: u.name, role }, g.guide.slug);
		expect(await as(reader, 'reader')).toEqual({ kind: 'not_found' });
		expect(await as(other, 'author')).toEqual({ kind: 'not_found' });
		expect(await guideInsights(null, g.guide.slug)).toEqual({ kind: 'not_found' });
		expect((await as(editor, 'editor')).kind).toBe('ok');
	});
});

describe('declining an update from the guide', () => {
	it('records which revision was declined and when, and shows it with the offer', async () => {
		const b7 = builds[6]!;
		const plan = await syncPlan(b7.ownerId, b7.id);
		if (plan.kind !== 'plan') throw new Error('build 7 is offered revision 2');
		expect(plan.plan.upstream.number).toBe(2);
		expect(plan.plan.declinedAt).not.toBeNull();
		// A second "Not now" keeps the first answer and its time.
		const again = await declineUpdate(b7.ownerId, b7.id, { upstreamRevisionId: revision2Id });
		expect(again).toMatchObject({ kind: 'ok', declinedAt: plan.plan.declinedAt });
		expect(await countRows('build_update_declines')).toBe(6);
	});

	it('refuses a revision that is not on offer and a build that is up to date; others get not_found', async () => {
		const b12 = builds[11]!;
		expect(
			await declineUpdate(b12.ownerId, b12.id, { upstreamRevisionId: g.revision.id })
		).toMatchObject({ kind: 'invalid', issues: { upstreamRevisionId: [expect.any(String)] } });
		const b1 = builds[0]!;
		expect(
			await declineUpdate(b1.ownerId, b1.id, { upstreamRevisionId: revision2Id })
		).toMatchObject({
			kind: 'invalid',
			issues: { _form: ['This build is already on the guide’s latest published revision.'] }
		});
		const stranger = await newReader('stranger');
		expect(await declineUpdate(stranger.id, b12.id, { upstreamRevisionId: revision2Id })).toEqual({
			kind: 'not_found'
		});
		// Nothing was written by the refusals: still the six answers of builds 6–11.
		expect(await countRows('build_update_declines')).toBe(6);
	});
});
