/*
 * Galleries reviewed like text, on the real MariaDB: gallery rows belong to a revision, are
 * saved with the draft, carried over to the next revision, and only the published revision's
 * rows are public. A build's assembly checklist keeps ticks on stages that survive an update
 * from the guide.
 */
import { beforeEach, describe, expect, it } from 'vitest';
import { createGuideInput, draftInput } from '../../src/lib/schemas/guide-editor';
import type { DraftFields } from '../../src/lib/schemas/guide-editor';
import {
	Build,
	GalleryPhoto,
	Guide,
	GuideRevision,
	Part,
	Photo,
	Region,
	User
} from '../../src/lib/server/db';
import * as checklists from '../../src/lib/server/services/build-checklist';
import * as draftEdits from '../../src/lib/server/services/guide-draft-edits';
import * as drafts from '../../src/lib/server/services/guide-drafts';
import * as gallery from '../../src/lib/server/services/gallery';
import { resetDatabase } from '../support/db';

let author: User;
let reader: User;
let cpu: Part;
let photoIds: number[];

async function photoFor(guideId: number, n: number): Promise<number> {
	const photo = await Photo.create({
		ownerId: author.id,
		guideId,
		keyPrefix: `photos/test${n}`,
		width: 1600,
		height: 1200,
		bytes: 1000,
		placeholder: 'data:image/webp;base64,AAAA',
		variants: [
			{ format: 'jpeg', width: 960, height: 720, key: `photos/test${n}/960.jpg`, bytes: 1000 }
		]
	});
	return photo.id;
}

beforeEach(async () => {
	await resetDatabase();
	author = await User.create({ email: 'ada@example.test', name: 'Ada Writer', role: 'author' });
	reader = await User.create({ email: 'rae@example.test', name: 'Rae Reader', role: 'reader' });
	await Region.create({
		code: 'us',
		name: 'United States',
		currency: 'USD',
		taxMode: 'exclusive',
		taxRateBp: 0
	});
	cpu = await Part.create({
		category: 'cpu',
		brand: 'Testa',
		model: 'C6',
		slug: 'testa-c6',
		specs: {}
	});
	await draftEdits.createGuide(
		author.id,
		createGuideInput.parse({
			title: 'Photo box',
			summary: 'S',
			targetBudget: '500',
			baseRegion: 'us',
			disclosure: 'none'
		})
	);
	const guide = await Guide.findOne({ where: { slug: 'photo-box' } });
	photoIds = [
		await photoFor(guide?.id ?? 0, 1),
		await photoFor(guide?.id ?? 0, 2),
		await photoFor(guide?.id ?? 0, 3)
	];
});

function input(overrides: Partial<DraftFields> = {}) {
	return draftInput.parse({
		title: 'Photo box',
		summary: 'S',
		targetBudget: '500',
		baseRegion: 'us',
		disclosure: 'none',
		buildNotes: {
			firmware: '',
			assembly: '### CPU cooler\n1. Paste, then cooler.\n### Storage\n- Drive in the top slot.',
			cabling: '',
			display: ''
		},
		slots: [
			{
				category: 'cpu',
				label: 'CPU',
				quantity: 1,
				pickPartId: cpu.id,
				reason: 'Fine.',
				alternates: []
			}
		],
		...overrides
	});
}

async function save(fields: Partial<DraftFields>) {
	const current = await drafts.getDraft(author.id, 'photo-box');
	const outcome = await draftEdits.saveDraft(
		author.id,
		'photo-box',
		input(fields),
		current?.version ?? 0
	);
	if (outcome.kind !== 'saved') throw new Error(JSON.stringify(outcome));
	return outcome.draft;
}

/** Publishes the newest revision as an editor's approval would (state and pointers only). */
async function publishLatest() {
	const guide = await Guide.findOne({ where: { slug: 'photo-box' } });
	const revision = await GuideRevision.findOne({
		where: { guideId: guide?.id },
		order: [['number', 'DESC']]
	});
	const now = new Date();
	await revision?.update({
		submittedAt: now,
		reviewedAt: now,
		publishedAt: now,
		decision: 'approve'
	});
	await guide?.update({ state: 'published', publishedRevisionId: revision?.id ?? null });
	return revision?.id ?? 0;
}

describe('a gallery is part of the revision', () => {
	it('is saved with the draft in order, and stays private until the revision is published', async () => {
		const draft = await save({
			gallery: [
				{
					photoId: photoIds[1] ?? 0,
					stage: 'storage',
					caption: 'Drive',
					altText: 'The M.2 drive in place'
				},
				{ photoId: photoIds[0] ?? 0, stage: 'cooler', caption: '', altText: 'Cooler mounted' }
			]
		});
		expect(draft.gallery.map((g) => [g.photoId, g.stage])).toEqual([
			[photoIds[1], 'storage'],
			[photoIds[0], 'cooler']
		]);
		expect(await gallery.publishedGallery('photo-box')).toBeNull();

		await publishLatest();
		const published = await gallery.publishedGallery('photo-box');
		// Grouped in assembly order: the cooler stage comes before storage.
		expect(published?.stages.map((s) => [s.stage, s.photos.map((p) => p.id)])).toEqual([
			['cooler', [photoIds[0]]],
			['storage', [photoIds[1]]]
		]);
		expect(published?.stages[0]?.photos[0]?.altText).toBe('Cooler mounted');

		// The next revision copies the gallery when the save leaves it out, and changes to it
		// stay off the public page until that revision is published.
		const next = await save({});
		expect(next.revisionNumber).toBe(2);
		expect(next.gallery.map((g) => g.photoId)).toEqual([photoIds[1], photoIds[0]]);
		await save({
			gallery: [
				{ photoId: photoIds[2] ?? 0, stage: 'first-boot', caption: '', altText: 'Lights on' }
			]
		});
		const stillLive = await gallery.publishedGallery('photo-box');
		expect(stillLive?.stages.flatMap((s) => s.photos.map((p) => p.id))).toEqual([
			photoIds[0],
			photoIds[1]
		]);

		const revision2 = await GuideRevision.findOne({ where: { number: 2 } });
		const changes = await gallery.reviewGalleryChanges(revision2?.id ?? 0);
		expect(changes?.added.map((e) => e.photoId)).toEqual([photoIds[2]]);
		expect(changes?.removed.map((e) => e.photoId).sort()).toEqual(
			[photoIds[0], photoIds[1]].sort()
		);
	});

	it("refuses another guide's photo and a missing alt text, saving nothing", async () => {
		await draftEdits.createGuide(
			author.id,
			createGuideInput.parse({
				title: 'Other box',
				summary: 'S',
				targetBudget: '500',
				baseRegion: 'us',
				disclosure: 'none'
			})
		);
		const other = await Guide.findOne({ where: { slug: 'other-box' } });
		const foreign = await photoFor(other?.id ?? 0, 9);
		const current = await drafts.getDraft(author.id, 'photo-box');
		const outcome = await draftEdits.saveDraft(
			author.id,
			'photo-box',
			input({ gallery: [{ photoId: foreign, stage: 'cooler', caption: '', altText: 'Borrowed' }] }),
			current?.version ?? 0
		);
		expect(outcome).toEqual({
			kind: 'invalid',
			issues: {
				'gallery.0.photoId': [
					'This photo was deleted, is still being processed or belongs to another guide.'
				]
			}
		});
		const noAlt = draftInput.safeParse({
			...input(),
			gallery: [{ photoId: photoIds[0], stage: 'cooler', caption: '', altText: '  ' }]
		});
		expect(noAlt.success).toBe(false);
		expect(noAlt.error?.issues[0]?.path).toEqual(['gallery', 0, 'altText']);
		expect(await GalleryPhoto.count()).toBe(0);
	});
});

describe("a build's assembly checklist", () => {
	it('keeps ticks on stages that still exist after an update from the guide', async () => {
		await save({
			gallery: [
				{ photoId: photoIds[0] ?? 0, stage: 'psu-cabling', caption: '', altText: 'PSU leads' }
			]
		});
		const first = await publishLatest();
		const region = await Region.findOne();
		const build = await Build.create({
			ownerId: reader.id,
			sourceGuideId: (await Guide.findOne())?.id ?? null,
			baseRevisionId: first,
			title: 'My photo box',
			regionId: region?.id ?? 0,
			shareToken: 'x'.repeat(43),
			notes: ''
		});
		const before = await checklists.getChecklist(build.id);
		// Stages from the build notes' headings (cooler, storage) and from the photos (PSU), in assembly order.
		expect(before?.stages.map((s) => s.stage)).toEqual(['cooler', 'storage', 'psu-cabling']);
		expect(before?.stages[0]?.steps).toEqual(['Paste, then cooler.']);
		for (const stage of ['cooler', 'psu-cabling'] as const)
			expect(await checklists.tick(reader.id, build.id, { stage, done: true })).toEqual({
				kind: 'ok'
			});
		expect((await checklists.getChecklist(build.id))?.progress).toEqual({
			done: 2,
			total: 3,
			percent: 66
		});
		// Nobody else ticks it; a stage the build does not have is refused.
		expect(await checklists.tick(author.id, build.id, { stage: 'cooler', done: false })).toEqual({
			kind: 'not_found'
		});
		expect(
			(await checklists.tick(reader.id, build.id, { stage: 'first-boot', done: true })).kind
		).toBe('invalid');

		// Revision 2 drops the PSU photo and adds a first-boot stage; the build takes the update.
		await save({
			buildNotes: {
				firmware: '',
				assembly: '### CPU cooler\n1. Paste.\n### First boot\n- Wait.',
				cabling: '',
				display: ''
			},
			gallery: []
		});
		const second = await publishLatest();
		await build.update({ baseRevisionId: second });
		const after = await checklists.getChecklist(build.id);
		expect(after?.stages.map((s) => [s.stage, s.done])).toEqual([
			['cooler', true],
			['first-boot', false]
		]);
		expect(after?.progress).toEqual({ done: 1, total: 2, percent: 50 });
	});
});
