import { beforeEach, describe, expect, it } from 'vitest';
import { Build, BuildSlot, Region, User, sequelize } from '../../src/lib/server/db';
import { seedDemoCommunity } from '../../src/lib/server/db/seeders/demo-community';
import { applySync } from '../../src/lib/server/services/build-sync';
import { guideInsights } from '../../src/lib/server/services/fork-insights';
import type { GuideInsights, InsightChoice } from '../../src/lib/views';
import { resetDatabase } from '../support/db';
import { forkBuild, newReader, partId, publishRevision } from '../support/buildsync-fixtures';
import { upkeepGuide, type UpkeepGuide } from '../support/upkeep-fixtures';

/*
 * Fork insights on the real MariaDB (issue 19), every figure counted by hand from the
 * builds made below. The guide (tests/support/upkeep-fixtures.ts) has two slots: CPU
 * (pick Tollan K6 Test, alternate 1 Tollan K6 Lite Test) and graphics card (pick Tollan G8
 * Test). Builds 1–12 are forked from revision 1; revision 2 (same slots) goes live; builds
 * 1–5 take it; builds 13–14 are forked from revision 2.
 *
 *   build     region  CPU            graphics card      bought
 *   1–5       us      pick           pick               1–5 yes
 *   6–8       us      alternate 1    swapped to Cobalt  6 yes
 *   9–11      de      swapped to 408 swapped to Cobalt
 *   12        de      swapped to 408 removed
 *   13–14     us      pick           pick
 *
 * Shares are rounded to whole percent: 7/14 = 50 %, 6/14 = 42.9 % → 43 %, 7/10 = 70 %.
 * Counts from 1 to 4 read "fewer than 5" (the k-anonymity rule); 0 and ≥ 5 are shown.
 * Suggestion rule (the issue): at least 20 % of the slot's builds and at least 5 builds.
 */

let g: UpkeepGuide;
let insights: GuideInsights;

const shown = (n: number) => ({ count: n, fewerThan5: false });
const hidden = { count: null, fewerThan5: true };

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
	const builds: Build[] = [];
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
	await publishRevision(g.guide, {});
	for (const b of builds.slice(0, 5)) {
		const owner = (await User.findByPk(b.ownerId))!;
		const synced = await applySync(
			owner.id,
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
		expect(insights.perRevision).toEqual([
			{ revisionNumber: 1, builds: shown(12) },
			{ revisionNumber: 2, builds: hidden }
		]);
		expect(insights.tookUpdate).toEqual(shown(5));
		// Builds 6–12 are still on revision 1 while revision 2 is live.
		expect(insights.declinedUpdate).toEqual(shown(7));
		expect(insights.markedBought).toEqual(shown(6));
	});

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
		expect(choice(gpu!.choices, 'pick', 'Tollan G8 Test')).toMatchObject({
			builds: shown(7),
			percent: 50
		});
		expect(choice(gpu!.choices, 'other', 'Solenne Cobalt C6 Duo 8 GB')).toMatchObject({
			builds: shown(6),
			percent: 43
		});
		expect(choice(gpu!.choices, 'removed', null)).toMatchObject({ builds: hidden, percent: null });
	});

	it('breaks the shares down by region, hiding a region of fewer than 5 builds', () => {
		const [cpu] = insights.slots;
		const us = cpu!.byRegion.find((r) => r.regionCode === 'us');
		const de = cpu!.byRegion.find((r) => r.regionCode === 'de');
		expect(us?.builds).toEqual(shown(10));
		expect(choice(us!.choices, 'pick', 'Tollan K6 Test')).toMatchObject({
			builds: shown(7),
			percent: 70
		});
		expect(de?.builds).toEqual(hidden);
		expect(de?.choices).toEqual([
			expect.objectContaining({ kind: 'other', partName: 'Halvard Strata 408', builds: hidden })
		]);
	});

	it('suggests a part as an alternate at ≥ 20 % and ≥ 5 builds, not at 4 builds', () => {
		const [cpu, gpu] = insights.slots;
		// CPU: 4 of 14 swapped to the Strata 408 (29 %, but fewer than 5): no suggestion.
		expect(cpu?.suggestions).toEqual([]);
		// Graphics card: 6 of 14 (43 %) swapped to the Cobalt C6: suggested.
		expect(gpu?.suggestions).toEqual([
			{
				partName: 'Solenne Cobalt C6 Duo 8 GB',
				partSlug: 'solenne-cobalt-c6-8g',
				builds: 6,
				percent: 43,
				editorHref:
					'/my/guides/upkeep-test-rig/edit?slot=gpu-main&alternate=solenne-cobalt-c6-8g#slot-gpu-main'
			}
		]);
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
