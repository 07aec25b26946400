/*
 * Builds and guide revisions for the build sync / within-budget / notify tests, made with
 * the models and services/build-fork.ts fork on the real MariaDB (the demo community seeded first).
 */
import { randomBytes } from 'node:crypto';
import {
	Build,
	BuildSlot,
	Guide,
	GuideRevision,
	GuideSlot,
	Part,
	SlotAlternate,
	User
} from '../../src/lib/server/db';
import { fork } from '../../src/lib/server/services/build-fork';

export const DEMO_SLUG = 'steady-1080p-starter';

export async function demoGuide(): Promise<Guide> {
	const guide = await Guide.findOne({ where: { slug: DEMO_SLUG } });
	if (!guide || !guide.publishedRevisionId)
		throw new Error('demo guide missing; seed the demo community first');
	return guide;
}

export async function partId(slug: string): Promise<number> {
	const part = await Part.findOne({ where: { slug } });
	if (!part) throw new Error(`demo part ${slug} missing`);
	return part.id;
}

export async function newReader(tag: string): Promise<User> {
	const suffix = randomBytes(4).toString('hex');
	return User.create({
		email: `${tag}-${suffix}@slotwise.test`,
		name: `Reader ${tag}`,
		role: 'reader',
		emailVerified: new Date()
	});
}

/** A fork of the guide's published revision (services/build-fork.ts fork), with optional settings. */
export async function forkBuild(
	owner: User,
	guide: Guide,
	opts: { notify?: boolean; title?: string } = {}
): Promise<Build> {
	const forked = await fork(owner.id, guide.slug);
	if (forked.kind !== 'created') throw new Error(`fork of ${guide.slug} failed: ${forked.kind}`);
	const build = (await Build.findByPk(forked.id))!;
	if (opts.notify !== undefined || opts.title !== undefined) {
		await build.update({
			...(opts.title !== undefined ? { title: opts.title } : {}),
			...(opts.notify !== undefined ? { notifyOnNewRevision: opts.notify } : {})
		});
	}
	return build;
}

export interface SlotEdit {
	/** In `change`: a new label for the slot (a rename); in `add`: the new slot's label. */
	label: string;
	category?: string;
	pickSlug?: string;
	quantity?: number;
}

/**
 * Publishes a new revision of the guide directly (as an approval would): the current
 * revision's slots with `change` applied per label (null removes the slot), plus `add` at the end.
 */
export async function publishRevision(
	guide: Guide,
	change: Record<string, Partial<SlotEdit> | null>,
	add: SlotEdit[] = []
): Promise<GuideRevision> {
	const current = (await GuideRevision.findByPk(guide.publishedRevisionId!)) as GuideRevision;
	const latest = (await GuideRevision.max('number', { where: { guideId: guide.id } })) as number;
	const now = new Date();
	const revision = await GuideRevision.create({
		guideId: guide.id,
		number: latest + 1,
		buildNotesMd: current.buildNotesMd,
		buildNotesHtml: current.buildNotesHtml,
		submittedAt: now,
		reviewedAt: now,
		publishedAt: now,
		reviewerId: null,
		reviewNote: null,
		decision: 'approve'
	});
	const slots = (await GuideSlot.findAll({
		where: { revisionId: current.id },
		include: [{ model: SlotAlternate, as: 'alternates' }],
		order: [['position', 'ASC']]
	})) as (GuideSlot & { alternates: SlotAlternate[] })[];
	let position = 1;
	for (const s of slots) {
		const edit = change[s.label];
		if (edit === null) continue;
		const pickPartId = edit?.pickSlug ? await partId(edit.pickSlug) : s.pickPartId;
		const slot = await GuideSlot.create({
			revisionId: revision.id,
			// The same slot in the new revision: it keeps its key, as the editor carries it.
			slotKey: s.slotKey,
			category: s.category,
			label: edit?.label ?? s.label,
			position: position++,
			quantity: edit?.quantity ?? s.quantity,
			pickPartId,
			reason: s.reason,
			priceQuoteId: null
		});
		for (const a of s.alternates) {
			if (a.partId === pickPartId) continue;
			await SlotAlternate.create({
				slotId: slot.id,
				partId: a.partId,
				rank: a.rank,
				reasonTag: a.reasonTag,
				note: a.note
			});
		}
	}
	for (const a of add) {
		await GuideSlot.create({
			revisionId: revision.id,
			category: (a.category ?? 'storage') as GuideSlot['category'],
			label: a.label,
			position: position++,
			quantity: a.quantity ?? 1,
			pickPartId: await partId(a.pickSlug!),
			reason: 'Added in this revision.',
			priceQuoteId: null
		});
	}
	await Guide.update({ publishedRevisionId: revision.id }, { where: { id: guide.id } });
	await guide.reload();
	return revision;
}

/** The build's slots as comparable rows, in position order. */
export async function slotRows(buildId: number) {
	const slots = (await BuildSlot.findAll({
		where: { buildId },
		include: [{ model: Part, as: 'part' }],
		order: [
			['position', 'ASC'],
			['id', 'ASC']
		]
	})) as (BuildSlot & { part: Part })[];
	// Keys are random; a source slot is named by its label in the guide's newest revision.
	const keys = slots.map((s) => s.sourceSlotKey).filter((k): k is string => k !== null);
	const sources = await GuideSlot.findAll({
		where: { slotKey: keys },
		include: [{ model: GuideRevision, as: 'revision', attributes: ['number'] }]
	});
	const labelOf = new Map<string, { label: string; number: number }>();
	for (const g of sources as (GuideSlot & { revision: GuideRevision })[]) {
		const seen = labelOf.get(g.slotKey);
		if (!seen || seen.number < g.revision.number)
			labelOf.set(g.slotKey, { label: g.label, number: g.revision.number });
	}
	return slots.map((s) => ({
		id: s.id,
		label: s.label,
		sourceSlotKey: s.sourceSlotKey,
		/** The label of the source slot it is linked to; null for the reader's own slots. */
		source: s.sourceSlotKey === null ? null : (labelOf.get(s.sourceSlotKey)?.label ?? '?'),
		part: s.part.slug,
		quantity: s.quantity,
		position: s.position,
		origin: s.origin,
		purchased: s.purchased,
		priceOverrideMinor: s.priceOverrideMinor === null ? null : Number(s.priceOverrideMinor)
	}));
}

/** One slot of a revision published with `publishSlots`. */
export interface PublishedSlot {
	/** The slot's own key: the key of an earlier revision's slot to carry it on; absent for a new slot. */
	slotKey?: string;
	label: string;
	category: GuideSlot['category'];
	pickSlug: string;
	quantity?: number;
}

/**
 * Publishes a new revision holding exactly `slots`, in that order (as an approval would),
 * for tests that need slots the label-keyed `publishRevision` cannot tell apart.
 */
export async function publishSlots(guide: Guide, slots: PublishedSlot[]): Promise<GuideRevision> {
	const current = (await GuideRevision.findByPk(guide.publishedRevisionId!)) as GuideRevision;
	const latest = (await GuideRevision.max('number', { where: { guideId: guide.id } })) as number;
	const now = new Date();
	const revision = await GuideRevision.create({
		guideId: guide.id,
		number: latest + 1,
		buildNotesMd: current.buildNotesMd,
		buildNotesHtml: current.buildNotesHtml,
		submittedAt: now,
		reviewedAt: now,
		publishedAt: now,
		reviewerId: null,
		reviewNote: null,
		decision: 'approve'
	});
	for (const [i, s] of slots.entries()) {
		await GuideSlot.create({
			revisionId: revision.id,
			...(s.slotKey ? { slotKey: s.slotKey } : {}),
			category: s.category,
			label: s.label,
			position: i + 1,
			quantity: s.quantity ?? 1,
			pickPartId: await partId(s.pickSlug),
			reason: 'Published by the test.',
			priceQuoteId: null
		});
	}
	await Guide.update({ publishedRevisionId: revision.id }, { where: { id: guide.id } });
	await guide.reload();
	return revision;
}

/** A revision's slots in position order, with their pick's slug. */
export async function revisionSlots(revisionId: number) {
	const slots = (await GuideSlot.findAll({
		where: { revisionId },
		include: [{ model: Part, as: 'pick' }],
		order: [['position', 'ASC']]
	})) as (GuideSlot & { pick: Part })[];
	return slots.map((s) => ({
		slotKey: s.slotKey,
		label: s.label,
		category: s.category,
		pickSlug: s.pick.slug,
		quantity: s.quantity
	}));
}
