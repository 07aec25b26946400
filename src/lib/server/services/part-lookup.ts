/**
 * Parts named by what a person typed, and the few parts a page names. Pages never carry the
 * whole catalog (issue "Speed at a real community's size": at 20,000 parts the editor page
 * weighed megabytes): with JavaScript the pickers search GET /api/v1/parts as you type and
 * post the part's id; without it a text field takes a part's name or slug, and the server
 * finds the part here when the form is posted, before the operation's own schema (which
 * still takes an id, so the form and the JSON API keep one schema).
 *
 * A typed text names a part when it is the slug of a part of the slot's category, or when
 * the catalog search (parts.ts partTextWhere: the same words find the same parts as the
 * live search) finds exactly one part of that category, or, among several, exactly one whose
 * whole name ("Brand Model") is the text. Anything else is a field message naming up to five
 * candidates, so the person can type more of the name.
 */
import { QueryTypes } from 'sequelize';
import { CATEGORY_LABELS, PART_CATEGORIES } from '$lib/domain/types';
import type { PartCategory } from '$lib/domain/types';
import type { EditorDraft } from '$lib/schemas/guide-editor-form';
import type { Issues } from '$lib/schemas/issues';
import { partText } from '$lib/schemas/part-pick';
import { Part, sequelize } from '$lib/server/db';
import type { PartRef } from '$lib/views';
import { partName, partRef } from './mappers';
import { partTextWhere } from './parts';

/** Candidates a message names when several parts match. */
export const MAX_CANDIDATES = 5;

export type PartLookup =
	| { kind: 'found'; part: PartRef }
	| { kind: 'ambiguous'; message: string; candidates: PartRef[] }
	| { kind: 'other_category'; message: string; part: PartRef }
	| { kind: 'none'; message: string };

const REF_COLUMNS = 'p.id, p.slug, p.brand, p.model, p.category';
const asRef = (row: PartRef): PartRef => ({ ...row, id: Number(row.id) });

/** The part of `category` that `typed` names (a slug, or a name the search finds once). */
export async function findPartByText(typed: string, category: PartCategory): Promise<PartLookup> {
	const checked = partText.safeParse(typed);
	if (!checked.success)
		return { kind: 'none', message: checked.error.issues[0]?.message ?? 'Type a part name.' };
	const text = checked.data.replace(/\s+/g, ' ');
	const label = CATEGORY_LABELS[category];
	const none = {
		kind: 'none',
		message: `No part matches "${text}" in the category ${label}.`
	} as const;
	if (text === '') return none;

	const bySlug = await Part.findOne({
		where: { slug: text.toLowerCase() },
		attributes: ['id', 'slug', 'brand', 'model', 'category']
	});
	if (bySlug) {
		if (bySlug.category === category) return { kind: 'found', part: partRef(bySlug) };
		return {
			kind: 'other_category',
			part: partRef(bySlug),
			message: `${partName(bySlug)} (${bySlug.slug}) is in the category ${CATEGORY_LABELS[bySlug.category]}, not ${label}.`
		};
	}

	const words = await partTextWhere(text);
	// Nothing searchable typed (only punctuation): no part, never the whole category.
	if (!words) return none;
	const where = `p.category = :category AND ${words.where}`;
	const replacements = { ...words.replacements, category };
	const rows = (
		await sequelize.query<PartRef>(
			`SELECT ${REF_COLUMNS} FROM parts p WHERE ${where}
			  ORDER BY p.brand ASC, p.model ASC, p.id ASC LIMIT :limit`,
			{ type: QueryTypes.SELECT, replacements: { ...replacements, limit: MAX_CANDIDATES + 1 } }
		)
	).map(asRef);
	const [only] = rows;
	if (!only) return none;
	if (rows.length === 1) return { kind: 'found', part: only };

	// "Halvard Strata 606" beside "Halvard Strata 606X": the whole name typed picks the first.
	const exact = await sequelize.query<PartRef>(
		`SELECT ${REF_COLUMNS} FROM parts p
		  WHERE ${where} AND LOWER(CONCAT(p.brand, ' ', p.model)) = LOWER(:name) LIMIT 2`,
		{ type: QueryTypes.SELECT, replacements: { ...replacements, name: text } }
	);
	if (exact.length === 1 && exact[0]) return { kind: 'found', part: asRef(exact[0]) };

	const candidates = rows.slice(0, MAX_CANDIDATES);
	const listed = candidates.map((p) => `${partName(p)} (${p.slug})`).join(', ');
	const more = rows.length > MAX_CANDIDATES ? ' and more' : '';
	return {
		kind: 'ambiguous',
		candidates,
		message: `Several parts match "${text}": ${listed}${more}; type more of the name.`
	};
}

const isCategory = (c: string): c is PartCategory =>
	(PART_CATEGORIES as readonly string[]).includes(c);

/**
 * The editor's working copy with every typed part name looked up (guide editor without
 * JavaScript): a text that names one part of the slot's category becomes that part's id and
 * is cleared; any other text stays as typed, with its message under the id field's key (the
 * key the schema's own message for that field uses). A slot whose category is not one of
 * ours is left to the schema. The same text in the same category is looked up once.
 */
export async function resolveTypedParts(
	draft: EditorDraft
): Promise<{ draft: EditorDraft; issues: Issues }> {
	const issues: Issues = {};
	const seen = new Map<string, Promise<PartLookup>>();
	const lookUp = (text: string, category: PartCategory) => {
		const key = `${category}\n${text.trim()}`;
		let found = seen.get(key);
		if (!found) seen.set(key, (found = findPartByText(text, category)));
		return found;
	};
	const slots = [];
	for (const [i, slot] of draft.slots.entries()) {
		const next = { ...slot, alternates: [...slot.alternates] };
		if (isCategory(slot.category)) {
			if (slot.pickQuery.trim() !== '') {
				const found = await lookUp(slot.pickQuery, slot.category);
				if (found.kind === 'found')
					Object.assign(next, { pickPartId: String(found.part.id), pickQuery: '' });
				else issues[`slots.${i}.pickPartId`] = [found.message];
			}
			for (const [j, alt] of slot.alternates.entries()) {
				if (alt.partQuery.trim() === '') continue;
				const found = await lookUp(alt.partQuery, slot.category);
				if (found.kind === 'found')
					next.alternates[j] = { ...alt, partId: String(found.part.id), partQuery: '' };
				else issues[`slots.${i}.alternates.${j}.partId`] = [found.message];
			}
		}
		slots.push(next);
	}
	return { draft: { ...draft, slots }, issues };
}

/**
 * The parts a working copy names (picks and alternates), so the page can show their names
 * without the catalog: one query, at most the form's own caps of ids.
 */
export async function partsNamedIn(draft: EditorDraft): Promise<PartRef[]> {
	const ids = new Set<number>();
	for (const slot of draft.slots)
		for (const id of [slot.pickPartId, ...slot.alternates.map((a) => a.partId)])
			if (/^[1-9][0-9]{0,9}$/.test(id)) ids.add(Number(id));
	if (ids.size === 0) return [];
	const parts = await Part.findAll({
		where: { id: [...ids] },
		attributes: ['id', 'slug', 'brand', 'model', 'category']
	});
	return parts.map(partRef);
}

/** One part by slug as pages name it, or null. */
export async function partRefBySlug(slug: string): Promise<PartRef | null> {
	const part = await Part.findOne({
		where: { slug },
		attributes: ['id', 'slug', 'brand', 'model', 'category']
	});
	return part ? partRef(part) : null;
}

/**
 * The part id a build form posts (add a slot, swap): the part `typed` names in `category`
 * when something was typed (the text field without JavaScript), else `postedId` as posted,
 * for the operation's schema to judge. A text that names no single part is a message.
 */
export async function partIdFromForm(
	postedId: unknown,
	typed: string | undefined,
	category: string | undefined
): Promise<{ partId: unknown } | { message: string }> {
	if (!typed?.trim() || !category || !isCategory(category)) return { partId: postedId };
	const found = await findPartByText(typed, category);
	return found.kind === 'found' ? { partId: found.part.id } : { message: found.message };
}
