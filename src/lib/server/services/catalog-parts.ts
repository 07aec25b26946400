/**
 * Parts in the editor's catalog, changing: every part is checked against its category's spec
 * schema before it is written (the CSV import checks its rows with the same `checkPart`),
 * written in one transaction and audited in that transaction, so a refused or failed change
 * leaves no row behind. Field messages are keyed by form field name (`spec.<path>` for specs).
 */
import { UniqueConstraintError } from 'sequelize';
import type { PartCategory } from '$lib/domain/types';
import {
	RESERVED_PART_SLUGS,
	partFieldsInput,
	slugify,
	validateSpecs
} from '$lib/schemas/catalog-upkeep';
import { fieldIssues } from '$lib/schemas/issues';
import { Part, sequelize } from '$lib/server/db';
import type { EditorPartDetail } from '$lib/views';
import * as audit from './audit';
import { bumpGuideViews } from './cache-generations';
import { toPartRow } from './catalog-reads';
import type { Issues, Outcome } from '$lib/schemas/issues';

/** A part as checked before writing: what the row will hold. */
export interface CheckedPart {
	category: PartCategory;
	brand: string;
	model: string;
	slug: string;
	specs: Record<string, unknown>;
}

function add(issues: Issues, key: string, message: string) {
	(issues[key] ??= []).push(message);
}

/**
 * Checks a whole part (category, brand, model, optional slug, specs) without touching the
 * database. Spec problems are keyed `spec.<path>`; problems of the specs object as a
 * whole (an unknown field) under `spec`. The CSV import uses the same check per row.
 */
export function checkPart(raw: {
	category?: unknown;
	brand?: unknown;
	model?: unknown;
	slug?: unknown;
	specs?: unknown;
}): { ok: true; part: CheckedPart } | { ok: false; issues: Issues } {
	const fields = partFieldsInput.safeParse({
		category: raw.category,
		brand: raw.brand,
		model: raw.model,
		slug: raw.slug
	});
	const issues: Issues = fields.success ? {} : fieldIssues(fields.error);
	const category = fields.success ? fields.data.category : partCategoryOf(raw.category);
	let specs: Record<string, unknown> | null = null;
	if (category) {
		const checked = validateSpecs(category, raw.specs);
		if (checked.ok) specs = checked.specs;
		else
			for (const issue of checked.issues)
				add(issues, issue.path ? `spec.${issue.path}` : 'spec', issue.message);
	}
	if (!fields.success || !specs || !category) return { ok: false, issues };
	const slug = fields.data.slug ?? slugify(fields.data.brand, fields.data.model);
	if (slug === '' || (RESERVED_PART_SLUGS as readonly string[]).includes(slug)) {
		return {
			ok: false,
			issues: { slug: ['Enter a slug: none can be made from this brand and model.'] }
		};
	}
	return {
		ok: true,
		part: { category, brand: fields.data.brand, model: fields.data.model, slug, specs }
	};
}

function partCategoryOf(value: unknown): PartCategory | null {
	const parsed = partFieldsInput.shape.category.safeParse(value);
	return parsed.success ? parsed.data : null;
}

function snapshot(part: {
	category: string;
	brand: string;
	model: string;
	slug: string;
	specs: Record<string, unknown>;
}) {
	return {
		category: part.category,
		brand: part.brand,
		model: part.model,
		slug: part.slug,
		specs: part.specs
	};
}

function slugTaken(slug: string): Issues {
	return { slug: [`A part with the slug "${slug}" already exists; choose another.`] };
}

/** Adds a part to the catalog on behalf of editor `actorId`. */
export async function createPart(
	actorId: string,
	raw: Parameters<typeof checkPart>[0]
): Promise<Outcome<{ part: EditorPartDetail }>> {
	const checked = checkPart(raw);
	if (!checked.ok) return { kind: 'invalid', issues: checked.issues };
	const data = checked.part;
	try {
		return await sequelize.transaction(async (transaction) => {
			if (await Part.findOne({ where: { slug: data.slug }, attributes: ['id'], transaction })) {
				return { kind: 'invalid', issues: slugTaken(data.slug) } as const;
			}
			const part = await Part.create({ ...data }, { transaction });
			await audit.record(
				{
					actorId,
					action: 'part.created',
					subjectType: 'part',
					subjectId: part.id,
					after: snapshot(data)
				},
				transaction
			);
			return { kind: 'ok', part: { ...toPartRow(part), specs: part.specs } } as const;
		});
	} catch (e) {
		// Two editors adding the same slug at once: the unique index decides.
		if (e instanceof UniqueConstraintError)
			return { kind: 'invalid', issues: slugTaken(data.slug) };
		throw e;
	}
}

/**
 * Changes brand, model and specs of the part `slug`. Category and slug stay: guides and
 * links refer to the part, and its specs only make sense for its category.
 */
export async function updatePart(
	actorId: string,
	slug: string,
	raw: { brand?: unknown; model?: unknown; specs?: unknown }
): Promise<Outcome<{ part: EditorPartDetail; changed: boolean }>> {
	const outcome = await editPart(actorId, slug, raw);
	// Names and specs show on guide pages (fit findings too): cached views follow.
	if (outcome.kind === 'ok' && outcome.changed) await bumpGuideViews();
	return outcome;
}

function editPart(
	actorId: string,
	slug: string,
	raw: { brand?: unknown; model?: unknown; specs?: unknown }
): Promise<Outcome<{ part: EditorPartDetail; changed: boolean }>> {
	return sequelize.transaction(async (transaction) => {
		const part = await Part.findOne({
			where: { slug },
			transaction,
			lock: transaction.LOCK.UPDATE
		});
		if (!part) return { kind: 'not_found' } as const;
		const checked = checkPart({
			category: part.category,
			brand: raw.brand,
			model: raw.model,
			slug: part.slug,
			specs: raw.specs
		});
		if (!checked.ok) return { kind: 'invalid', issues: checked.issues } as const;
		const before = snapshot(part);
		const after = snapshot({ ...checked.part, category: part.category, slug: part.slug });
		if (stableJson(before) === stableJson(after)) {
			return {
				kind: 'ok',
				part: { ...toPartRow(part), specs: part.specs },
				changed: false
			} as const;
		}
		await part.update(
			{ brand: after.brand, model: after.model, specs: after.specs },
			{ transaction }
		);
		await audit.record(
			{ actorId, action: 'part.updated', subjectType: 'part', subjectId: part.id, before, after },
			transaction
		);
		return { kind: 'ok', part: { ...toPartRow(part), specs: part.specs }, changed: true } as const;
	});
}

/** JSON with object keys sorted, so two equal specs compare equal whatever their key order. */
export function stableJson(value: unknown): string {
	return JSON.stringify(value, (_key, v: unknown) =>
		v && typeof v === 'object' && !Array.isArray(v)
			? Object.fromEntries(
					Object.entries(v as Record<string, unknown>).sort(([a], [b]) =>
						a < b ? -1 : a > b ? 1 : 0
					)
				)
			: v
	);
}
