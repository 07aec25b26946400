import { beforeAll, describe, expect, it } from 'vitest';
import { Part } from '../../src/lib/server/db';
import { emptyAlternate, emptySlot, fromDraft } from '../../src/lib/schemas/guide-editor-form';
import type { EditorDraft } from '../../src/lib/schemas/guide-editor-form';
import {
	findPartByText,
	partsNamedIn,
	resolveTypedParts
} from '../../src/lib/server/services/part-lookup';
import { resetDatabase } from '../support/db';

/*
 * Looking up a part by what a person typed (the pickers without JavaScript), on the real
 * MariaDB and its full-text index. The parts are written here by hand; every expected part,
 * candidate list and message below was worked out by reading them: a slug of the slot's
 * category names its part; otherwise the catalog search's rule (every word matches the start
 * of a word of the brand or model) must find exactly one part of the slot's category, or one
 * whose whole name is the text; candidates are listed by brand and model, five at most.
 */

const ids: Record<string, number> = {};

beforeAll(async () => {
	await resetDatabase();
	const part = async (category: Part['category'], brand: string, model: string, slug: string) => {
		ids[slug] = (await Part.create({ category, brand, model, slug, specs: {} })).id;
	};
	await part('cpu', 'Halvard', 'Strata 606', 'halvard-strata-606');
	await part('cpu', 'Halvard', 'Strata 606X', 'halvard-strata-606x');
	await part('cpu', 'Halvard', 'Strata 406', 'halvard-strata-406');
	await part('gpu', 'Solenne', 'Cobalt C6 8 GB', 'solenne-cobalt-c6-8g');
	// Seven parts of one brand: more than the five candidates a message names.
	for (const n of [1, 2, 3, 4, 5, 6, 7])
		await part('cpu', 'Korrin', `Vale ${n}`, `korrin-vale-${n}`);
});

describe('findPartByText', () => {
	it('takes an exact slug of the category, whatever its case and spaces', async () => {
		const found = await findPartByText('  Halvard-Strata-406 ', 'cpu');
		expect(found).toEqual({
			kind: 'found',
			part: {
				id: ids['halvard-strata-406'],
				slug: 'halvard-strata-406',
				brand: 'Halvard',
				model: 'Strata 406',
				category: 'cpu'
			}
		});
	});

	it('takes the one part of the category the search finds', async () => {
		// "strata 406": only Halvard Strata 406 has words starting "strata" and "406".
		const found = await findPartByText('strata 406', 'cpu');
		expect(found.kind === 'found' && found.part.slug).toBe('halvard-strata-406');
		// "cobalt" finds the graphics card, the only part with that word.
		const card = await findPartByText('cobalt', 'gpu');
		expect(card.kind === 'found' && card.part.slug).toBe('solenne-cobalt-c6-8g');
	});

	it('takes the part whose whole name was typed, even when a longer name matches too', async () => {
		// "606" is the start of both "606" and "606X": the search finds two, the name picks one.
		const found = await findPartByText('halvard  strata 606', 'cpu');
		expect(found.kind === 'found' && found.part.slug).toBe('halvard-strata-606');
	});

	it('lists the candidates when several parts match', async () => {
		expect(await findPartByText('strata 60', 'cpu')).toEqual({
			kind: 'ambiguous',
			candidates: [
				expect.objectContaining({ slug: 'halvard-strata-606' }),
				expect.objectContaining({ slug: 'halvard-strata-606x' })
			],
			message:
				'Several parts match "strata 60": Halvard Strata 606 (halvard-strata-606), Halvard Strata 606X (halvard-strata-606x); type more of the name.'
		});
		// Seven Korrin parts: the first five by model, then "and more".
		const many = await findPartByText('korrin', 'cpu');
		expect(many.kind).toBe('ambiguous');
		expect(many.kind === 'ambiguous' && many.candidates.map((c) => c.slug)).toEqual([
			'korrin-vale-1',
			'korrin-vale-2',
			'korrin-vale-3',
			'korrin-vale-4',
			'korrin-vale-5'
		]);
		expect(many.kind === 'ambiguous' && many.message).toBe(
			'Several parts match "korrin": Korrin Vale 1 (korrin-vale-1), Korrin Vale 2 (korrin-vale-2), Korrin Vale 3 (korrin-vale-3), Korrin Vale 4 (korrin-vale-4), Korrin Vale 5 (korrin-vale-5) and more; type more of the name.'
		);
	});

	it('says so when nothing matches, and never takes punctuation for the whole category', async () => {
		expect(await findPartByText('meridian', 'cpu')).toEqual({
			kind: 'none',
			message: 'No part matches "meridian" in the category CPU.'
		});
		expect(await findPartByText(' -- ', 'cpu')).toEqual({
			kind: 'none',
			message: 'No part matches "--" in the category CPU.'
		});
		expect(await findPartByText('x'.repeat(101), 'cpu')).toEqual({
			kind: 'none',
			message: 'At most 100 characters.'
		});
	});

	it('refuses a part of another category: by slug with its category, by name as no match', async () => {
		expect(await findPartByText('solenne-cobalt-c6-8g', 'cpu')).toEqual({
			kind: 'other_category',
			part: expect.objectContaining({ id: ids['solenne-cobalt-c6-8g'] }),
			message:
				'Solenne Cobalt C6 8 GB (solenne-cobalt-c6-8g) is in the category Graphics card, not CPU.'
		});
		expect(await findPartByText('cobalt c6', 'cpu')).toEqual({
			kind: 'none',
			message: 'No part matches "cobalt c6" in the category CPU.'
		});
	});
});

describe('resolveTypedParts (the guide editor without JavaScript)', () => {
	const draft = (): EditorDraft => {
		const base = fromDraft({
			title: 'T',
			summary: 'S',
			targetBudget: '700',
			baseRegion: 'us',
			tags: [],
			disclosure: 'none',
			disclosureNote: null,
			walkthroughUrl: null,
			buildNotes: { firmware: '', assembly: '', cabling: '', display: '' },
			slots: [],
			frames: [],
			thermals: []
		});
		const cpu = {
			...emptySlot('cpu', 'a'),
			pickQuery: 'strata 406',
			alternates: [
				{ ...emptyAlternate('a0'), partQuery: 'strata 60' },
				{ ...emptyAlternate('a1'), partId: String(ids['halvard-strata-606x']) }
			]
		};
		const gpu = { ...emptySlot('gpu', 'b'), pickQuery: 'halvard-strata-606' };
		return { ...base, slots: [cpu, gpu] };
	};

	it('turns a text naming one part into its id and keeps any other text with its message', async () => {
		const { draft: resolved, issues } = await resolveTypedParts(draft());
		const [cpu, gpu] = resolved.slots;
		expect(cpu?.pickPartId).toBe(String(ids['halvard-strata-406']));
		expect(cpu?.pickQuery).toBe('');
		// The ambiguous alternate keeps what was typed; the chosen one is untouched.
		expect(cpu?.alternates.map((a) => [a.partId, a.partQuery])).toEqual([
			['', 'strata 60'],
			[String(ids['halvard-strata-606x']), '']
		]);
		expect(gpu?.pickPartId).toBe('');
		expect(gpu?.pickQuery).toBe('halvard-strata-606');
		expect(issues).toEqual({
			'slots.0.alternates.0.partId': [
				'Several parts match "strata 60": Halvard Strata 606 (halvard-strata-606), Halvard Strata 606X (halvard-strata-606x); type more of the name.'
			],
			'slots.1.pickPartId': [
				'Halvard Strata 606 (halvard-strata-606) is in the category CPU, not Graphics card.'
			]
		});
		// The page names the parts the working copy uses, without the catalog.
		expect((await partsNamedIn(resolved)).map((p) => p.slug).sort()).toEqual([
			'halvard-strata-406',
			'halvard-strata-606x'
		]);
	});
});
