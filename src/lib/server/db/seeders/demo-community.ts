/*
 * Loads the invented demo community. Idempotent by natural keys (email, region code,
 * store name, part slug, guide slug), so running it twice adds nothing: existing rows are
 * left as they are, because guide revisions are immutable once published.
 */
import { Op } from 'sequelize';
import type { Sequelize, Transaction } from 'sequelize';
import { SPEC_SCHEMAS } from '../../../schemas/part-specs.js';
import { hashPassword } from '../../auth/password.js';
import { renderMarkdown } from '../../markdown.js';
import {
	FrameResult,
	Guide,
	GuideRevision,
	GuideSlot,
	Part,
	Quote,
	Region,
	SlotAlternate,
	Store,
	ThermalResult,
	User
} from '../models/index.js';
import {
	demoGuides,
	demoParts,
	demoQuotes,
	demoRegions,
	demoStores,
	demoUsers
} from './demo-data/index.js';
import { demoResults } from './demo-data/results.js';
import type { DemoGuide } from './demo-data/types.js';

/** Stated in the README; only the demo seed ever uses it. */
export const DEMO_PASSWORD = 'slotwise-demo-password';

const DAY_MS = 86_400_000;

export async function seedDemoCommunity(sequelize: Sequelize, now = new Date()): Promise<void> {
	const passwordHash = await hashPassword(DEMO_PASSWORD);
	await sequelize.transaction(async (transaction) => {
		const users = new Map<string, string>();
		for (const u of demoUsers) {
			const [user] = await User.findOrCreate({
				where: { email: u.email },
				defaults: { email: u.email, name: u.name, role: u.role, passwordHash, emailVerified: now },
				transaction
			});
			users.set(u.email, user.id);
		}

		const regions = new Map<string, Region>();
		for (const r of demoRegions) {
			const [region] = await Region.findOrCreate({
				where: { code: r.code },
				defaults: { ...r },
				transaction
			});
			regions.set(r.code, region);
		}

		const stores = new Map<string, Store>();
		for (const s of demoStores) {
			const region = regions.get(s.regionCode);
			if (!region) throw new Error(`Demo store ${s.name}: unknown region ${s.regionCode}`);
			const [store] = await Store.findOrCreate({
				where: { name: s.name },
				defaults: { name: s.name, url: s.url, regionId: region.id },
				transaction
			});
			stores.set(s.name, store);
		}

		const parts = new Map<string, Part>();
		for (const p of demoParts) {
			const specs = SPEC_SCHEMAS[p.category].safeParse(p.specs);
			if (!specs.success) throw new Error(`Demo part ${p.slug}: ${specs.error.message}`);
			const [part] = await Part.findOrCreate({
				where: { slug: p.slug },
				defaults: { ...p, specs: specs.data as Record<string, unknown> },
				transaction
			});
			parts.set(p.slug, part);
		}

		await seedQuotes(stores, regions, parts, now, transaction);

		for (const g of demoGuides) {
			if (await Guide.findOne({ where: { slug: g.slug }, transaction })) continue;
			await createPublishedGuide(g, { users, regions, stores, parts }, now, transaction);
		}
		await backfillDemoExtras(transaction);
	});
}

/**
 * Databases seeded before build notes were rendered or results existed: render the stored
 * Markdown once (revisions with no HTML) and add the demo results to demo revisions that
 * have none. Idempotent, no migration needed.
 */
async function backfillDemoExtras(transaction: Transaction) {
	const unrendered = await GuideRevision.findAll({ where: { buildNotesHtml: null }, transaction });
	for (const revision of unrendered) {
		await revision.update(
			{ buildNotesHtml: renderMarkdown(revision.buildNotesMd) },
			{ transaction }
		);
	}
	const guides = await Guide.findAll({
		where: { slug: demoGuides.map((g) => g.slug) },
		transaction
	});
	for (const guide of guides) {
		if (!guide.publishedRevisionId) continue;
		const has = await FrameResult.count({
			where: { revisionId: guide.publishedRevisionId },
			transaction
		});
		const hasThermals = await ThermalResult.count({
			where: { revisionId: guide.publishedRevisionId },
			transaction
		});
		if (has === 0 && hasThermals === 0)
			await createResults(guide.slug, guide.publishedRevisionId, transaction);
	}
}

async function createResults(slug: string, revisionId: number, transaction: Transaction) {
	const results = demoResults[slug];
	if (!results) return;
	await FrameResult.bulkCreate(
		results.frames.map((f, i) => ({ ...f, revisionId, position: i + 1, notes: f.notes ?? '' })),
		{ transaction }
	);
	await ThermalResult.bulkCreate(
		results.thermals.map((t, i) => ({ ...t, revisionId, position: i + 1 })),
		{ transaction }
	);
}

async function seedQuotes(
	stores: Map<string, Store>,
	regions: Map<string, Region>,
	parts: Map<string, Part>,
	now: Date,
	transaction: Transaction
) {
	const regionById = new Map([...regions.values()].map((r) => [r.id, r]));
	const seededPairs = new Set<string>();
	for (const q of demoQuotes) {
		const part = parts.get(q.partSlug);
		const store = stores.get(q.storeName);
		if (!part || !store)
			throw new Error(`Demo quote ${q.partSlug}@${q.storeName}: unknown part or store`);
		const pair = `${part.id}:${store.id}`;
		// A pair that already has prices was seeded before: skip all of its history.
		if (!seededPairs.has(pair)) {
			const existing = await Quote.count({
				where: { partId: part.id, storeId: store.id },
				transaction
			});
			if (existing > 0) continue;
			seededPairs.add(pair);
		}
		const region = regionById.get(store.regionId);
		if (!region) throw new Error(`Store ${store.name} has no region`);
		await Quote.create(
			{
				partId: part.id,
				storeId: store.id,
				regionId: region.id,
				amountMinor: q.amountMinor,
				currency: region.currency,
				taxIncluded: region.taxMode === 'inclusive',
				shippingMinor: q.shippingMinor ?? 0,
				observedAt: new Date(now.getTime() - q.daysAgo * DAY_MS),
				url: `${store.url}/p/${part.slug}`,
				source: 'editor'
			},
			{ transaction }
		);
	}
}

interface Lookups {
	users: Map<string, string>;
	regions: Map<string, Region>;
	stores: Map<string, Store>;
	parts: Map<string, Part>;
}

async function createPublishedGuide(g: DemoGuide, l: Lookups, now: Date, transaction: Transaction) {
	const region = l.regions.get(g.baseRegionCode);
	if (!region) throw new Error(`Demo guide ${g.slug}: unknown region ${g.baseRegionCode}`);
	const guide = await Guide.create(
		{
			slug: g.slug,
			authorId: l.users.get(g.authorEmail) ?? null,
			title: g.title,
			summary: g.summary,
			targetBudgetMinor: g.targetBudgetMinor,
			baseRegionId: region.id,
			tags: g.tags,
			featured: g.featured,
			state: 'published',
			publishedRevisionId: null
		},
		{ transaction }
	);
	const revision = await GuideRevision.create(
		{
			guideId: guide.id,
			number: 1,
			buildNotesMd: g.buildNotesMd,
			// Rendered once on save, like the editor does; pages only show this HTML.
			buildNotesHtml: renderMarkdown(g.buildNotesMd),
			submittedAt: now,
			reviewedAt: now,
			publishedAt: now,
			reviewerId: null,
			reviewNote: null
		},
		{ transaction }
	);
	for (const [position, s] of g.slots.entries()) {
		const pick = mustGet(l.parts, s.pickSlug, g.slug);
		const store = mustGet(l.stores, s.quoteStore, g.slug);
		const quote = await Quote.findOne({
			where: { partId: pick.id, storeId: store.id, observedAt: { [Op.lte]: now } },
			order: [['observedAt', 'DESC']],
			transaction
		});
		const slot = await GuideSlot.create(
			{
				revisionId: revision.id,
				category: s.category,
				label: s.label,
				position: position + 1,
				quantity: s.quantity,
				pickPartId: pick.id,
				reason: s.reason,
				priceQuoteId: quote?.id ?? null
			},
			{ transaction }
		);
		for (const [i, a] of s.alternates.entries()) {
			await SlotAlternate.create(
				{
					slotId: slot.id,
					partId: mustGet(l.parts, a.partSlug, g.slug).id,
					rank: i + 1,
					reasonTag: a.reasonTag,
					note: a.note
				},
				{ transaction }
			);
		}
	}
	await createResults(g.slug, revision.id, transaction);
	await guide.update({ publishedRevisionId: revision.id }, { transaction });
}

function mustGet<T>(map: Map<string, T>, key: string, context: string): T {
	const value = map.get(key);
	if (value === undefined) throw new Error(`Demo guide ${context}: unknown reference ${key}`);
	return value;
}

/** Removes the demo rows by their natural keys (the seeder's down). */
export async function removeDemoCommunity(sequelize: Sequelize): Promise<void> {
	await sequelize.transaction(async (transaction) => {
		const slugs = demoGuides.map((g) => g.slug);
		const guides = await Guide.findAll({ where: { slug: slugs }, transaction });
		for (const guide of guides) {
			await guide.update({ publishedRevisionId: null }, { transaction });
			await guide.destroy({ transaction }); // revisions, slots, alternates cascade
		}
		const partIds = (
			await Part.findAll({ where: { slug: demoParts.map((p) => p.slug) }, transaction })
		).map((p) => p.id);
		await Quote.destroy({ where: { partId: partIds }, transaction });
		await Part.destroy({ where: { id: partIds }, transaction });
		await Store.destroy({ where: { name: demoStores.map((s) => s.name) }, transaction });
		await Region.destroy({ where: { code: demoRegions.map((r) => r.code) }, transaction });
		await User.destroy({ where: { email: demoUsers.map((u) => u.email) }, transaction });
	});
}
