/*
 * Demo builds: readers' forks of the demo guides, so guide pages show a lineage and the
 * demo reader has builds to open. Forked the way services/build-fork.ts fork() does it (slots
 * of the published revision, each linked by its source slot's key), then changed a little.
 * Idempotent by the natural key (owner and title): an existing build is left alone.
 */
import { randomBytes } from 'node:crypto';
import type { Transaction } from 'sequelize';
import type { Seeder } from '../umzug.js';
import { Build, BuildSlot, Guide, GuideSlot, Part, Region, User } from '../models/index.js';

interface DemoBuild {
	owner: string;
	guide: string;
	title: string;
	region: string;
	visibility: 'private' | 'unlisted' | 'public';
	notes: string;
	/** Slot label → part slug the reader swapped to (an alternate of that slot). */
	swaps: Record<string, string>;
	/** Slot labels already bought, at the planned price. */
	bought: string[];
}

export const DEMO_BUILDS: readonly DemoBuild[] = [
	{
		owner: 'reader@slotwise.test',
		guide: 'steady-1080p-starter',
		title: 'My first desktop, 1080p',
		region: 'us',
		visibility: 'public',
		notes: 'Bought the CPU and case during a sale; the rest next month.',
		swaps: { 'Graphics card': 'ironvale-auric-a52-8g' },
		bought: ['CPU', 'Case']
	},
	{
		owner: 'tobias.wren@slotwise.test',
		guide: 'pocket-itx-1440p',
		title: 'Small 1440p box for the living room',
		region: 'uk',
		visibility: 'private',
		notes: '',
		swaps: {},
		bought: []
	}
];

async function forkDemo(d: DemoBuild, transaction: Transaction): Promise<void> {
	const owner = await User.findOne({ where: { email: d.owner }, transaction });
	const guide = await Guide.findOne({ where: { slug: d.guide }, transaction });
	const region = await Region.findOne({ where: { code: d.region }, transaction });
	if (!owner || !guide?.publishedRevisionId || !region)
		throw new Error(
			`Demo builds: missing ${d.owner}, ${d.guide} or region ${d.region} (run the demo community seeder first)`
		);
	if (await Build.findOne({ where: { ownerId: owner.id, title: d.title }, transaction })) return;
	const slots = await GuideSlot.findAll({
		where: { revisionId: guide.publishedRevisionId },
		order: [['position', 'ASC']],
		transaction
	});
	const build = await Build.create(
		{
			ownerId: owner.id,
			sourceGuideId: guide.id,
			baseRevisionId: guide.publishedRevisionId,
			title: d.title,
			regionId: region.id,
			visibility: d.visibility,
			shareToken: randomBytes(32).toString('base64url'),
			notes: d.notes
		},
		{ transaction }
	);
	const today = new Date().toISOString().slice(0, 10);
	for (const [i, slot] of slots.entries()) {
		const swapSlug = d.swaps[slot.label];
		const swap = swapSlug ? await Part.findOne({ where: { slug: swapSlug }, transaction }) : null;
		if (swapSlug && !swap) throw new Error(`Demo builds: no part ${swapSlug}`);
		await BuildSlot.create(
			{
				buildId: build.id,
				sourceSlotKey: slot.slotKey,
				category: slot.category,
				label: slot.label,
				position: i + 1,
				partId: swap?.id ?? slot.pickPartId,
				quantity: slot.quantity,
				origin: swap ? 'alternate' : 'source',
				purchased: d.bought.includes(slot.label),
				purchasedAt: d.bought.includes(slot.label) ? today : null
			},
			{ transaction }
		);
	}
}

export const up: Seeder = async ({ context: sequelize }) => {
	await sequelize.transaction(async (transaction) => {
		for (const d of DEMO_BUILDS) await forkDemo(d, transaction);
	});
};

export const down: Seeder = async ({ context: sequelize }) => {
	await sequelize.transaction(async (transaction) => {
		for (const d of DEMO_BUILDS) {
			const owner = await User.findOne({ where: { email: d.owner }, transaction });
			if (owner) await Build.destroy({ where: { ownerId: owner.id, title: d.title }, transaction });
		}
	});
};
