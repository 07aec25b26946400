import { Op } from 'sequelize';
import { beforeAll, describe, expect, it } from 'vitest';
import {
	FrameResult,
	Guide,
	GuideRevision,
	GuideSlot,
	Part,
	Region,
	SlotAlternate,
	sequelize
} from '../../src/lib/server/db';
import { seeder } from '../../src/lib/server/db/seeders';
import { seedDemoCommunity } from '../../src/lib/server/db/seeders/demo-community';
import { demoResults } from '../../src/lib/server/db/seeders/demo-data/results';
import { demoGuides } from '../../src/lib/server/db/seeders/demo-data';
import { renderMarkdown } from '../../src/lib/server/markdown';
import * as guides from '../../src/lib/server/services/guides';
import { resetDatabase } from '../support/db';

/** Runs `fn` and returns the SQL it sent, counted with Sequelize's `beforeQuery` hook (one call per statement). */
async function countQueries<T>(fn: () => Promise<T>): Promise<{ result: T; queries: string[] }> {
	const queries: string[] = [];
	sequelize.addHook('beforeQuery', 'count-guide-page-queries', (_options, query) => {
		queries.push(String((query as unknown as { sql?: string }).sql ?? 'query'));
	});
	try {
		return { result: await fn(), queries };
	} finally {
		sequelize.removeHook('beforeQuery', 'count-guide-page-queries');
	}
}

async function page(slug: string, region: string | null) {
	const outcome = await guides.getGuidePage(slug, region);
	if (outcome.kind !== 'ok') throw new Error(`${slug}: ${outcome.kind}`);
	return outcome.page;
}

/** A published copy of a demo guide whose slots repeat the demo slots up to `slotCount`. */
async function guideWithSlots(slug: string, slotCount: number): Promise<void> {
	const source = await Guide.findOne({ where: { slug: 'balanced-1440p-am5' } });
	if (!source?.publishedRevisionId) throw new Error('demo guide missing');
	const demoSlots = await GuideSlot.findAll({
		where: { revisionId: source.publishedRevisionId },
		include: [{ model: SlotAlternate, as: 'alternates' }],
		order: [['position', 'ASC']]
	});
	await sequelize.transaction(async (transaction) => {
		const guide = await Guide.create(
			{
				slug,
				authorId: source.authorId,
				title: `${slotCount} slots`,
				summary: 'Query count check.',
				targetBudgetMinor: 100000,
				baseRegionId: source.baseRegionId,
				state: 'published',
				publishedRevisionId: null
			},
			{ transaction }
		);
		const revision = await GuideRevision.create(
			{
				guideId: guide.id,
				number: 1,
				buildNotesMd: 'x',
				buildNotesHtml: '<p>x</p>',
				submittedAt: new Date(),
				reviewedAt: new Date(),
				publishedAt: new Date(),
				reviewerId: null,
				reviewNote: null
			},
			{ transaction }
		);
		for (let i = 0; i < slotCount; i++) {
			const s = demoSlots[i % demoSlots.length] as GuideSlot & { alternates: SlotAlternate[] };
			const slot = await GuideSlot.create(
				{
					revisionId: revision.id,
					category: s.category,
					label: `${s.label} ${i + 1}`,
					position: i + 1,
					quantity: 1,
					pickPartId: s.pickPartId,
					reason: s.reason,
					priceQuoteId: s.priceQuoteId
				},
				{ transaction }
			);
			for (const a of s.alternates) {
				await SlotAlternate.create(
					{ slotId: slot.id, partId: a.partId, rank: a.rank, reasonTag: a.reasonTag, note: a.note },
					{ transaction }
				);
			}
		}
		await FrameResult.create(
			{
				revisionId: revision.id,
				workload: 'Hollow Meridian',
				resolution: '1920x1080',
				avgFpsTenths: 600,
				low1FpsTenths: 450
			},
			{ transaction }
		);
		await guide.update({ publishedRevisionId: revision.id }, { transaction });
	});
}

describe('guide page service on the real MariaDB', () => {
	beforeAll(async () => {
		await resetDatabase();
		await seeder(sequelize).up(); // demo community (with rendered notes and results) and demo FX rates
	});

	it('stores every demo revision with its build notes rendered and sanitised once', async () => {
		for (const g of demoGuides) {
			const p = await page(g.slug, null);
			expect(p.extras.buildNotesHtml).toBe(renderMarkdown(g.buildNotesMd));
			expect(p.extras.buildNotesHtml).not.toMatch(/<script|\son[a-z]+=/i);
		}
	});

	it('backfills notes rendered as null in an older seed without touching other fields', async () => {
		const revision = await GuideRevision.findOne({
			include: [{ model: Guide, as: 'guide', where: { slug: 'pocket-itx-1440p' } }]
		});
		if (!revision) throw new Error('no revision');
		await revision.update({ buildNotesHtml: null });
		// Re-running the community seed (guide exists, so it is not re-created) fills the missing HTML.
		await seedDemoCommunity(sequelize);
		const after = await GuideRevision.findOne({
			include: [{ model: Guide, as: 'guide', where: { slug: 'pocket-itx-1440p' } }]
		});
		expect(after?.buildNotesHtml).toBe(renderMarkdown(after?.buildNotesMd ?? ''));
	});

	it('gives the fit report with counts, the power budget and a drop-in status for every alternate', async () => {
		const p = await page('balanced-1440p-am5', null);
		const { findings, summary } = p.extras.fit;
		expect(findings.length).toBeGreaterThan(0);
		expect(summary.ok + summary.caution + summary.conflict).toBe(findings.length);
		for (const f of findings)
			for (const key of f.slots) expect(p.extras.fit.slotLabels[key]).toBeTruthy();
		expect(p.extras.power.loadW).toBeGreaterThan(0);
		expect(p.extras.power.recommendedW).toBeGreaterThanOrEqual(p.extras.power.loadW);
		expect(p.extras.power.psuRatedW).toBeGreaterThan(0);
		const alternates = p.guide.slots.flatMap((s) => s.alternates);
		expect(alternates.length).toBeGreaterThan(0);
		for (const a of alternates) expect(['fits', 'caution', 'no-fit']).toContain(a.dropIn?.status);
	});

	it('shows the seeded frame results and thermals, and value against the region total', async () => {
		const p = await page('steady-1080p-starter', null);
		const seeded = demoResults['steady-1080p-starter'];
		expect(p.extras.frames.map((f) => f.averageFps)).toEqual(
			seeded?.frames.map((f) => f.avgFpsTenths / 10)
		);
		expect(p.extras.thermals).toHaveLength(seeded?.thermals.length ?? -1);
		const value = p.guide.value;
		expect(value?.resultCount).toBe(seeded?.frames.length);
		// Geometric mean worked by hand: exp(mean(ln fps)).
		const fps = seeded?.frames.map((f) => f.avgFpsTenths / 10) ?? [];
		const geo = Math.exp(fps.reduce((a, b) => a + Math.log(b), 0) / fps.length);
		expect(value?.geometricMeanFps).toBeCloseTo(geo, 6);
		const total = p.guide.picksTotal;
		if (!total) throw new Error('no total');
		expect(value?.fpsPer100).toBeCloseTo((geo * 100) / (total.amountMinor / 100), 1);
		expect(value?.costPerFrame?.currency).toBe('USD');

		const eur = await page('steady-1080p-starter', 'de');
		expect(eur.guide.value?.costPerFrame?.currency).toBe('EUR');
		expect(eur.guide.value?.geometricMeanFps).toBeCloseTo(geo, 6);
	});

	it('explains reproducibility in the chosen region with reasons and per-pick quote dates', async () => {
		const us = await page('steady-1080p-starter', null);
		const jp = await page('steady-1080p-starter', 'jp');
		for (const p of [us, jp]) {
			const r = p.guide.reproducibility;
			expect(r?.reasons.length).toBeGreaterThan(1);
			expect(r?.slots).toHaveLength(p.guide.slots.length);
			expect(r?.reasons.join(' ')).toContain(p.guide.region.name);
		}
		// The US guide is quoted in the US; Japan has fewer or no quotes for the same picks.
		const quotedUs = us.guide.reproducibility?.slots.filter((s) => s.latestQuoteAt).length ?? 0;
		const quotedJp = jp.guide.reproducibility?.slots.filter((s) => s.latestQuoteAt).length ?? 0;
		expect(quotedUs).toBe(us.guide.slots.length);
		expect(quotedJp).toBeLessThanOrEqual(quotedUs);
	});

	it('lists published revisions and diffs two of them (slots and notes)', async () => {
		const guide = await Guide.findOne({ where: { slug: 'quiet-4k-play-and-work' } });
		const first = await GuideRevision.findByPk(guide?.publishedRevisionId ?? 0);
		if (!guide || !first) throw new Error('demo guide missing');
		const slots = await GuideSlot.findAll({
			where: { revisionId: first.id },
			order: [['position', 'ASC']]
		});
		const other = await Part.findOne({
			where: { category: slots[0]?.category, id: { [Op.ne]: slots[0]?.pickPartId ?? 0 } }
		});
		const second = await GuideRevision.create({
			guideId: guide.id,
			number: 2,
			buildNotesMd: `${first.buildNotesMd}\nRe-seat the card after transport.\n`,
			buildNotesHtml: renderMarkdown(`${first.buildNotesMd}\nRe-seat the card after transport.\n`),
			submittedAt: new Date(),
			reviewedAt: new Date(),
			publishedAt: new Date(),
			reviewerId: null,
			reviewNote: null
		});
		for (const [i, s] of slots.entries()) {
			if (i === slots.length - 1) continue; // last slot removed in revision 2
			await GuideSlot.create({
				revisionId: second.id,
				// The same slot in the next revision keeps its key, as the editor's save does.
				slotKey: s.slotKey,
				category: s.category,
				label: s.label,
				position: s.position,
				quantity: i === 1 ? s.quantity + 1 : s.quantity,
				pickPartId: i === 0 && other ? other.id : s.pickPartId,
				reason: s.reason,
				priceQuoteId: null
			});
		}
		await guide.update({ publishedRevisionId: second.id });

		const p = await page('quiet-4k-play-and-work', null);
		expect(p.extras.revisions.map((r) => r.number)).toEqual([1, 2]);
		const outcome = await guides.getRevisionDiff('quiet-4k-play-and-work', 1, 2);
		if (outcome.kind !== 'ok') throw new Error('no diff');
		const kinds = outcome.diff.slots.map((c) => `${c.kind}:${c.label}`);
		expect(kinds).toContain(`removed:${slots.at(-1)?.label}`);
		const changedFirst = outcome.diff.slots.find((c) => c.label === slots[0]?.label);
		if (other)
			expect(changedFirst?.kind === 'changed' && changedFirst.fields.map((f) => f.field)).toContain(
				'pick'
			);
		const changedSecond = outcome.diff.slots.find((c) => c.label === slots[1]?.label);
		expect(changedSecond?.kind === 'changed' && changedSecond.fields).toContainEqual({
			field: 'quantity',
			from: slots[1]?.quantity,
			to: (slots[1]?.quantity ?? 0) + 1
		});
		expect(outcome.diff.notes).toContainEqual({
			kind: 'added',
			text: 'Re-seat the card after transport.'
		});
		expect(await guides.getRevisionDiff('quiet-4k-play-and-work', 1, 9)).toEqual({
			kind: 'not_found'
		});
		expect(await guides.getRevisionDiff('no-such-guide', 1, 2)).toEqual({ kind: 'not_found' });
	});

	it('sends the same small number of queries for 8 and for 40 slots', async () => {
		await guideWithSlots('eight-slot-check', 8);
		await guideWithSlots('forty-slot-check', 40);
		for (const region of [null, 'de']) {
			const eight = await countQueries(() => page('eight-slot-check', region));
			const forty = await countQueries(() => page('forty-slot-check', region));
			expect(eight.result.guide.slots).toHaveLength(8);
			expect(forty.result.guide.slots).toHaveLength(40);
			expect(forty.queries.length).toBe(eight.queries.length);
			expect(eight.queries.length).toBeLessThanOrEqual(12);
			console.info(
				`guide page, region ${region ?? 'base'}: ${eight.queries.length} queries for 8 and 40 slots`
			);
		}
	});

	it('refuses an unknown region and an unknown guide', async () => {
		expect(await guides.getGuidePage('steady-1080p-starter', 'zz')).toEqual({
			kind: 'unknown_region'
		});
		expect(await guides.getGuidePage('no-such-guide', null)).toEqual({ kind: 'not_found' });
		expect(await Region.count()).toBeGreaterThan(0);
	});
});
