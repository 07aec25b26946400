/*
 * A small priced guide for the newsletter tests, built through the real services (draft,
 * submit, editor approval) on regions and a rate the tests control:
 * - Germany: EUR, shelf prices include 19 % VAT (docs/sources.md 11a);
 * - United States: USD, prices before tax, 0 %;
 * - USD 1.0956 per EUR, the ECB reference rate of 2 January 2024 (docs/sources.md 10c);
 * - category factors 1.0000 everywhere, so they drop out of the hand-worked totals.
 * Picks, quoted at a German store: a CPU at €119.00 and memory at €59.50.
 */
import { createGuideInput, draftInput } from '../../src/lib/schemas/guide-editor';
import { decisionInput } from '../../src/lib/schemas/review';
import { FxRate, Guide, GuideRevision, Part, Region, Store, User } from '../../src/lib/server/db';
import * as drafts from '../../src/lib/server/services/guide-draft-edits';
import * as reviews from '../../src/lib/server/services/guide-reviews';

export const ORIGIN = 'http://127.0.0.1:4173';
export const LINKS = { guidesUrl: `${ORIGIN}/my/guides` };

export interface NewsletterWorld {
	author: User;
	editor: User;
	de: Region;
	us: Region;
	slug: string;
	revisionId: number;
}

export async function newsletterWorld(
	tags: string[] = ['budget', '1080p'],
	beforeApproval: (author: User) => Promise<void> = async () => {}
): Promise<NewsletterWorld> {
	const author = await User.create({
		email: 'writer@example.test',
		name: 'Noor Castellan',
		role: 'author',
		emailVerified: new Date()
	});
	const editor = await User.create({
		email: 'checker@example.test',
		name: 'Ilse Marr',
		role: 'editor',
		emailVerified: new Date()
	});
	const factors = { cpu: 10000, memory: 10000 };
	const de = await Region.create({
		code: 'de',
		name: 'Germany',
		currency: 'EUR',
		taxMode: 'inclusive',
		taxRateBp: 1900,
		categoryFactorsBp: factors
	});
	const us = await Region.create({
		code: 'us',
		name: 'United States',
		currency: 'USD',
		taxMode: 'exclusive',
		taxRateBp: 0,
		categoryFactorsBp: factors
	});
	await FxRate.create({ currency: 'USD', ratePerEur: '1.0956', asOf: '2024-01-02', source: 'ECB' });
	const store = await Store.create({
		name: 'Rheinkai Teile',
		regionId: de.id,
		url: 'https://rheinkai.example'
	});
	const cpu = await Part.create({
		category: 'cpu',
		brand: 'Vantor',
		model: 'V6',
		slug: 'vantor-v6',
		specs: {
			socket: 'AM4',
			cores: 6,
			threads: 12,
			baseClockGhz: 3.5,
			boostClockGhz: 4.4,
			tdpW: 65,
			memoryTypes: ['DDR4'],
			integratedGraphics: true,
			bundledCooler: true
		}
	});
	const ram = await Part.create({
		category: 'memory',
		brand: 'Kessel',
		model: 'K16',
		slug: 'kessel-k16',
		specs: { type: 'DDR4', modules: 2, moduleGb: 8, speedMts: 3200, casLatency: 16, voltage: 1.35 }
	});
	const created = await drafts.createGuide(
		author.id,
		createGuideInput.parse({
			title: 'Two-part test build',
			summary: 'A guide small enough to price by hand.',
			targetBudget: '200',
			baseRegion: 'de',
			tags,
			disclosure: 'none'
		})
	);
	if (created.kind !== 'created') throw new Error(JSON.stringify(created));
	const saved = await drafts.saveDraft(
		author.id,
		created.slug,
		draftInput.parse({
			title: 'Two-part test build',
			summary: 'A guide small enough to price by hand.',
			targetBudget: '200',
			baseRegion: 'de',
			tags,
			disclosure: 'none',
			buildNotes: { firmware: '', assembly: '', cabling: '', display: '' },
			slots: [
				{
					category: 'cpu',
					label: 'CPU',
					quantity: 1,
					pickPartId: cpu.id,
					reason: 'Enough cores.',
					priceQuote: { storeId: store.id, amount: '119.00', observedAt: '2026-11-20' }
				},
				{
					category: 'memory',
					label: 'Memory',
					quantity: 1,
					pickPartId: ram.id,
					reason: 'Two sticks.',
					priceQuote: { storeId: store.id, amount: '59.50', observedAt: '2026-11-20' }
				}
			]
		}),
		created.version
	);
	if (saved.kind !== 'saved') throw new Error(JSON.stringify(saved));
	const submitted = await drafts.submit(author.id, created.slug, saved.draft.version, LINKS);
	if (submitted.kind !== 'submitted') throw new Error(submitted.kind);
	const guide = (await Guide.findOne({ where: { slug: created.slug } }))!;
	const revision = (await GuideRevision.findOne({ where: { guideId: guide.id, number: 1 } }))!;
	await beforeApproval(author);
	const decided = await reviews.decide(
		{ id: editor.id, role: 'editor' },
		revision.id,
		decisionInput.parse({ decision: 'approve' }),
		LINKS
	);
	if (decided.kind !== 'ok') throw new Error(JSON.stringify(decided));
	return { author, editor, de, us, slug: created.slug, revisionId: revision.id };
}
