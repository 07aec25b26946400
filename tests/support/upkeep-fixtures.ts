/*
 * A small published guide of invented parts for the upkeep and insights tests: two slots
 * (CPU with one alternate, graphics card), quoted only where a test says so, so every
 * total is known by hand. Needs the demo community seeded first (regions, stores, users,
 * the demo parts whose specs the new parts copy).
 */
import {
	Guide,
	GuideRevision,
	GuideSlot,
	Part,
	Quote,
	Region,
	SlotAlternate,
	Store,
	User
} from '../../src/lib/server/db';
import * as guidePrices from '../../src/lib/server/services/guide-prices';

const DAY_MS = 86_400_000;

export interface UpkeepGuide {
	guide: Guide;
	revision: GuideRevision;
	author: User;
	parts: { cpuA: Part; cpuB: Part; gpu: Part };
}

async function clonePart(fromSlug: string, slug: string, brand: string, model: string) {
	const from = await Part.findOne({ where: { slug: fromSlug } });
	if (!from) throw new Error(`demo part ${fromSlug} missing; seed the demo community first`);
	return Part.create({ category: from.category, brand, model, slug, specs: from.specs });
}

export async function store(regionCode: string): Promise<Store> {
	const region = await Region.findOne({ where: { code: regionCode } });
	const found = await Store.findOne({ where: { regionId: region!.id } });
	if (!found) throw new Error(`no demo store in ${regionCode}`);
	return found;
}

/** A quote observed `daysAgo` days before now, written directly (before publication). */
export async function quoteAt(
	part: Part,
	regionCode: string,
	amountMinor: number,
	daysAgo: number
): Promise<Quote> {
	const s = await store(regionCode);
	const region = (await Region.findByPk(s.regionId))!;
	return Quote.create({
		partId: part.id,
		storeId: s.id,
		regionId: region.id,
		amountMinor,
		currency: region.currency,
		taxIncluded: region.taxMode === 'inclusive',
		observedAt: new Date(Date.now() - daysAgo * DAY_MS),
		url: null,
		source: 'editor'
	});
}

/**
 * The guide "Upkeep test rig" by the demo author, base region us, target budget `budget`
 * (minor units), published as an approval would and its figures stored.
 */
export async function upkeepGuide(
	budgetMinor: number,
	before: (parts: UpkeepGuide['parts']) => Promise<void> = async () => {}
): Promise<UpkeepGuide> {
	const author = (await User.findOne({ where: { email: 'author@slotwise.test' } }))!;
	const us = (await Region.findOne({ where: { code: 'us' } }))!;
	const parts = {
		cpuA: await clonePart('halvard-strata-406', 'tollan-k6-test', 'Tollan', 'K6 Test'),
		cpuB: await clonePart('halvard-strata-406', 'tollan-k6-lite-test', 'Tollan', 'K6 Lite Test'),
		gpu: await clonePart('ironvale-auric-a52-8g', 'tollan-g8-test', 'Tollan', 'G8 Test')
	};
	await before(parts);
	const guide = await Guide.create({
		slug: 'upkeep-test-rig',
		authorId: author.id,
		title: 'Upkeep test rig',
		summary: 'A two-slot guide for the upkeep tests.',
		targetBudgetMinor: budgetMinor,
		baseRegionId: us.id,
		state: 'published'
	});
	const now = new Date();
	const revision = await GuideRevision.create({
		guideId: guide.id,
		number: 1,
		buildNotesMd: 'Notes.',
		submittedAt: now,
		reviewedAt: now,
		publishedAt: now,
		reviewerId: null,
		reviewNote: null,
		decision: 'approve'
	});
	const cpu = await GuideSlot.create({
		revisionId: revision.id,
		slotKey: 'cpu-main',
		category: 'cpu',
		label: 'CPU',
		position: 1,
		quantity: 1,
		pickPartId: parts.cpuA.id,
		reason: 'Six cores.',
		priceQuoteId: null
	});
	await SlotAlternate.create({
		slotId: cpu.id,
		partId: parts.cpuB.id,
		rank: 1,
		reasonTag: 'lower_price',
		note: 'Same socket.'
	});
	await GuideSlot.create({
		revisionId: revision.id,
		slotKey: 'gpu-main',
		category: 'gpu',
		label: 'Graphics card',
		position: 2,
		quantity: 1,
		pickPartId: parts.gpu.id,
		reason: 'Eight gigabytes.',
		priceQuoteId: null
	});
	await guide.update({ publishedRevisionId: revision.id });
	await guidePrices.refreshRevisions([revision.id]);
	return { guide, revision, author, parts };
}
