/**
 * CSV import and export of the parts catalog.
 *
 * Layout: one part per row, columns `category,brand,model,slug,specs_json`, where
 * specs_json is the part's specs as one JSON object (the same fields as the per-category
 * form). One column of JSON serves every category, nested values (connectors, M.2 slots)
 * included, and an exported file can be edited and imported again.
 *
 * Import is two steps. Upload: the file is decoded (UTF-8 only), parsed, and every row
 * checked (header, formula-like cells, category and specs by the zod schemas, slugs
 * unique in the file). Any bad row → a report of every problem (row, column, reason) and
 * nothing is stored. All rows good → the validated rows are stored in catalog_imports
 * (the database, so any app instance can finish the job) and shown for confirmation.
 * Confirm: all rows written in ONE transaction, with their audit events; any failure
 * rolls everything back.
 *
 * A slug already in the catalog UPDATES that part (brand, model, specs) when the category
 * matches, so an exported file can be corrected and imported back; a different category
 * is refused. Rows identical to the catalog are left alone.
 *
 * Checking a file is catalog-csv-check.ts's; the export and the template are
 * catalog-csv-export.ts's.
 */
import { randomUUID } from 'node:crypto';
import { Op } from 'sequelize';
import type { Transaction } from 'sequelize';
import { CatalogImport, Part, sequelize } from '$lib/server/db';
import type { ImportedPartRow } from '$lib/server/db/models/CatalogImport';
import type { ImportProblem, ImportPreview, ImportRowSummary } from '$lib/views';
import * as audit from './audit';
import {
	FIELD_COLUMN,
	IMPORT_TTL_MS,
	MAX_PROBLEMS_LISTED,
	MAX_UPLOAD_BYTES,
	checkFile,
	existingBySlug
} from './catalog-csv-check';
import { checkPart, stableJson } from './catalog-parts';

export {
	CSV_COLUMNS,
	IMPORT_TTL_MS,
	MAX_PROBLEMS_LISTED,
	MAX_ROWS,
	MAX_UPLOAD_BYTES
} from './catalog-csv-check';

export type UploadOutcome =
	| {
			kind: 'invalid';
			fileName: string;
			/** Data rows in the file (0 when the file itself could not be read). */
			totalRows: number;
			goodRows: number;
			badRows: number;
			problems: ImportProblem[];
			/** Problems not listed because of MAX_PROBLEMS_LISTED. */
			moreProblems: number;
	  }
	| { kind: 'ready'; importId: string };

function actionFor(part: ImportedPartRow, current: Part | undefined): ImportRowSummary['action'] {
	if (!current) return 'create';
	const same =
		current.brand === part.brand &&
		current.model === part.model &&
		stableJson(current.specs) === stableJson(part.specs);
	return same ? 'unchanged' : 'update';
}

/**
 * Step 1: checks an uploaded file. With any problem, reports them all and stores nothing.
 * Otherwise stores the checked rows for `editorId` to confirm, and returns their id.
 */
export async function upload(
	editorId: string,
	bytes: Uint8Array,
	fileName: string,
	now = new Date()
): Promise<UploadOutcome> {
	const name = cleanFileName(fileName);
	if (bytes.length > MAX_UPLOAD_BYTES) {
		return invalid(name, 0, 0, [
			{
				row: 0,
				column: null,
				reason: `The file is ${formatBytes(bytes.length)}; upload at most ${formatBytes(MAX_UPLOAD_BYTES)} at a time.`
			}
		]);
	}
	if (bytes.length === 0)
		return invalid(name, 0, 0, [
			{ row: 0, column: null, reason: 'Choose a CSV file to upload (the one sent was empty).' }
		]);
	const checked = await checkFile(bytes, name);
	if (checked.problems.length > 0) {
		return invalid(
			name,
			checked.totalRows,
			checked.totalRows - checked.badRowNumbers.size,
			checked.problems
		);
	}
	const id = randomUUID();
	await sequelize.transaction(async (transaction) => {
		// Housekeeping here rather than a timer: no process keeps state between requests.
		await CatalogImport.destroy({ where: { expiresAt: { [Op.lt]: now } }, transaction });
		await CatalogImport.create(
			{
				id,
				editorId,
				fileName: name,
				rowCount: checked.parts.length,
				payload: checked.parts,
				createdAt: now,
				expiresAt: new Date(now.getTime() + IMPORT_TTL_MS)
			},
			{ transaction }
		);
	});
	return { kind: 'ready', importId: id };
}

function invalid(
	fileName: string,
	totalRows: number,
	goodRows: number,
	problems: ImportProblem[]
): UploadOutcome {
	const badRows = new Set(problems.filter((p) => p.row > 1).map((p) => p.row)).size;
	return {
		kind: 'invalid',
		fileName,
		totalRows,
		goodRows: Math.max(0, goodRows),
		badRows,
		problems: problems.slice(0, MAX_PROBLEMS_LISTED),
		moreProblems: Math.max(0, problems.length - MAX_PROBLEMS_LISTED)
	};
}

function cleanFileName(name: string): string {
	const cleaned = name
		.replace(/\p{Cc}/gu, '')
		.replace(/^.*[\\/]/, '')
		.trim();
	return (cleaned || 'upload.csv').slice(0, 200);
}

function formatBytes(n: number): string {
	return n >= 1024 * 1024 ? `${(n / 1024 / 1024).toFixed(1)} MB` : `${Math.ceil(n / 1024)} KB`;
}

async function loadImport(
	editorId: string,
	importId: string,
	now: Date,
	transaction?: Transaction
) {
	if (!/^[0-9a-f-]{36}$/.test(importId)) return null;
	const stored = await CatalogImport.findOne({
		where: { id: importId, editorId, expiresAt: { [Op.gt]: now } },
		transaction,
		...(transaction ? { lock: transaction.LOCK.UPDATE } : {})
	});
	return stored;
}

/** The stored upload `importId` of `editorId` with what confirming would do, or null (unknown, someone else's, or expired). */
export async function preview(
	editorId: string,
	importId: string,
	now = new Date()
): Promise<ImportPreview | null> {
	const stored = await loadImport(editorId, importId, now);
	if (!stored) return null;
	const rows = stored.payload;
	const existing = await existingBySlug(rows.map((r) => r.slug));
	const summaries = rows.map((r) => ({
		row: r.row,
		category: r.category,
		brand: r.brand,
		model: r.model,
		slug: r.slug,
		action: actionFor(r, existing.get(r.slug))
	}));
	return {
		id: stored.id,
		fileName: stored.fileName,
		rowCount: stored.rowCount,
		creates: summaries.filter((s) => s.action === 'create').length,
		updates: summaries.filter((s) => s.action === 'update').length,
		unchanged: summaries.filter((s) => s.action === 'unchanged').length,
		rows: summaries,
		expiresAt: stored.expiresAt.toISOString()
	};
}

export type CommitOutcome =
	| { kind: 'ok'; created: number; updated: number; unchanged: number }
	| { kind: 'not_found' }
	| { kind: 'conflict'; message: string; problems: ImportProblem[] };

/** Rows inserted per INSERT statement while committing. */
const INSERT_CHUNK = 100;

/**
 * Step 2: writes every row of the stored upload in ONE transaction: updates, then
 * inserts, then the audit events, then the stored upload is deleted. The rows are checked
 * again first (the catalog or the schemas may have changed since the preview); any
 * problem or error rolls back everything.
 */
export async function commit(
	editorId: string,
	importId: string,
	now = new Date()
): Promise<CommitOutcome> {
	return sequelize.transaction(async (transaction) => {
		const stored = await loadImport(editorId, importId, now, transaction);
		if (!stored) return { kind: 'not_found' } as const;
		const rows = stored.payload;

		const problems: ImportProblem[] = [];
		const parts: ImportedPartRow[] = [];
		for (const row of rows) {
			const checked = checkPart(row);
			if (!checked.ok) {
				for (const [key, messages] of Object.entries(checked.issues)) {
					problems.push({
						row: row.row,
						column: FIELD_COLUMN[key] ?? 'specs_json',
						reason: `${key}: ${messages.join(' ')}`
					});
				}
			} else parts.push({ row: row.row, ...checked.part });
		}
		const existing = await existingBySlug(
			parts.map((p) => p.slug),
			transaction
		);
		for (const part of parts) {
			const current = existing.get(part.slug);
			if (current && current.category !== part.category) {
				problems.push({
					row: part.row,
					column: 'slug',
					reason: `"${part.slug}" is now an existing ${current.category} part.`
				});
			}
		}
		if (problems.length) {
			return {
				kind: 'conflict',
				message:
					'The catalog or its rules changed since the preview; nothing was written. Upload the file again to see what to fix.',
				problems
			} as const;
		}

		let created = 0;
		let updated = 0;
		let unchanged = 0;
		const toCreate: ImportedPartRow[] = [];
		for (const part of parts) {
			const current = existing.get(part.slug);
			const action = actionFor(part, current);
			if (action === 'create') toCreate.push(part);
			else if (action === 'unchanged' || !current) unchanged++;
			else {
				const before = snapshotOf(current);
				await current.update(
					{ brand: part.brand, model: part.model, specs: part.specs },
					{ transaction }
				);
				await audit.record(
					{
						actorId: editorId,
						action: 'part.updated',
						subjectType: 'part',
						subjectId: current.id,
						before,
						after: { ...snapshotOf(current), importId }
					},
					transaction
				);
				updated++;
			}
		}
		for (let i = 0; i < toCreate.length; i += INSERT_CHUNK) {
			const chunk = toCreate.slice(i, i + INSERT_CHUNK);
			await Part.bulkCreate(
				chunk.map(({ category, brand, model, slug, specs }) => ({
					category,
					brand,
					model,
					slug,
					specs
				})),
				{ transaction }
			);
			// Ids by slug rather than trusting the driver's insert ids for a multi-row insert.
			const inserted = await Part.findAll({
				where: { slug: { [Op.in]: chunk.map((p) => p.slug) } },
				attributes: ['id', 'slug'],
				transaction
			});
			const idOf = new Map(inserted.map((p) => [p.slug, p.id]));
			for (const part of chunk) {
				const { category, brand, model, slug, specs } = part;
				await audit.record(
					{
						actorId: editorId,
						action: 'part.created',
						subjectType: 'part',
						subjectId: idOf.get(slug) ?? slug,
						after: { category, brand, model, slug, specs, importId }
					},
					transaction
				);
			}
			created += chunk.length;
		}
		await audit.record(
			{
				actorId: editorId,
				action: 'catalog_import.committed',
				subjectType: 'catalog_import',
				subjectId: importId,
				after: { fileName: stored.fileName, rows: rows.length, created, updated, unchanged }
			},
			transaction
		);
		await stored.destroy({ transaction });
		return { kind: 'ok', created, updated, unchanged } as const;
	});
}

function snapshotOf(part: Part) {
	return {
		category: part.category,
		brand: part.brand,
		model: part.model,
		slug: part.slug,
		specs: part.specs
	};
}

/** Drops a stored upload without writing anything. */
export async function discard(editorId: string, importId: string): Promise<boolean> {
	if (!/^[0-9a-f-]{36}$/.test(importId)) return false;
	return (await CatalogImport.destroy({ where: { id: importId, editorId } })) > 0;
}
