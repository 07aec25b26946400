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
 */
import { randomUUID } from 'node:crypto';
import { CsvError, parse } from 'csv-parse/sync';
import { stringify } from 'csv-stringify/sync';
import { Op } from 'sequelize';
import type { Transaction } from 'sequelize';
import { CatalogImport, Part, sequelize } from '$lib/server/db';
import type { ImportedPartRow } from '$lib/server/db/models/CatalogImport';
import { startsLikeFormula } from '$lib/schemas/catalog-upkeep';
import { decodeCsvBytes, neutraliseCell } from '$lib/server/csv-cells';
import * as audit from './audit';
import { checkPart, stableJson } from './catalog-upkeep';

export { decodeCsvBytes, neutraliseCell };

export const CSV_COLUMNS = ['category', 'brand', 'model', 'slug', 'specs_json'] as const;
export type CsvColumn = (typeof CSV_COLUMNS)[number];

/** Largest file accepted (1 MiB). adapter-node's BODY_SIZE_LIMIT must be above it (see README). */
export const MAX_UPLOAD_BYTES = 1_048_576;
/** Most data rows in one file: one transaction stays short enough to hold. */
export const MAX_ROWS = 5_000;
/** How long a checked upload waits for its confirmation. */
export const IMPORT_TTL_MS = 60 * 60 * 1000;
/** Problems listed in one report; a file with more gets a count of the rest. */
export const MAX_PROBLEMS_LISTED = 500;
/** Longest specs_json cell: the largest specs (a board with 8 M.2 slots) are under 1000. */
const MAX_SPECS_JSON_CHARS = 4_000;

/** One reason a row (or the whole file, row 0 / column null) cannot be imported. */
export interface ImportProblem {
	/** Spreadsheet row number: the header is row 1, the first part row 2. 0 for the whole file. */
	row: number;
	column: CsvColumn | null;
	reason: string;
}

export interface ImportRowSummary {
	row: number;
	category: string;
	brand: string;
	model: string;
	slug: string;
	action: 'create' | 'update' | 'unchanged';
}

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

export interface ImportPreview {
	id: string;
	fileName: string;
	rowCount: number;
	creates: number;
	updates: number;
	unchanged: number;
	rows: ImportRowSummary[];
	expiresAt: string;
}

// ---------------------------------------------------------------- parsing and checking

interface ParsedRow {
	row: number;
	cells: Record<CsvColumn, string>;
}

/** The header and data rows of the text, or the file-level problem that stops reading it. */
export function parseCsvText(
	text: string
):
	| { ok: true; rows: ParsedRow[]; cellCountProblems: ImportProblem[] }
	| { ok: false; problem: ImportProblem } {
	let records: string[][];
	try {
		records = parse(text, {
			relax_column_count: true,
			skip_empty_lines: false,
			bom: true
		}) as string[][];
	} catch (e) {
		if (e instanceof CsvError) {
			const line = (e as CsvError & { lines?: number }).lines;
			return {
				ok: false,
				problem: {
					row: 0,
					column: null,
					reason: `The file is not well-formed CSV${line ? ` (near line ${line})` : ''}: ${e.message}`
				}
			};
		}
		throw e;
	}
	const header = records[0]?.map((h) => h.trim());
	if (!header || (header.length === 1 && header[0] === '')) {
		return {
			ok: false,
			problem: { row: 1, column: null, reason: 'The file is empty: expected a header row.' }
		};
	}
	const expected = CSV_COLUMNS.join(',');
	if (header.join(',') !== expected) {
		return {
			ok: false,
			problem: {
				row: 1,
				column: null,
				reason: `The header must be exactly "${expected}" (found "${header.join(',')}"). Download the template to start from the right columns.`
			}
		};
	}
	const rows: ParsedRow[] = [];
	const cellCountProblems: ImportProblem[] = [];
	for (let index = 1; index < records.length; index++) {
		const record = records[index] ?? [];
		// A blank line shows as an empty spreadsheet row: skipped, but it still counts in row numbers.
		if (record.length === 1 && (record[0] ?? '').trim() === '') continue;
		const row = index + 1;
		if (record.length !== CSV_COLUMNS.length) {
			cellCountProblems.push({
				row,
				column: null,
				reason: `Has ${record.length} cell${record.length === 1 ? '' : 's'}; every row needs ${CSV_COLUMNS.length} (${expected}). A specs_json value with commas must be in double quotes.`
			});
			continue;
		}
		const cells = Object.fromEntries(CSV_COLUMNS.map((c, i) => [c, record[i] ?? ''])) as Record<
			CsvColumn,
			string
		>;
		rows.push({ row, cells });
	}
	return { ok: true, rows, cellCountProblems };
}

const FIELD_COLUMN: Record<string, CsvColumn> = {
	category: 'category',
	brand: 'brand',
	model: 'model',
	slug: 'slug'
};

/** Every problem of one row on its own (no catalog or other rows involved), or the checked part. */
export function checkRow(
	parsed: ParsedRow
): { ok: true; part: ImportedPartRow } | { ok: false; problems: ImportProblem[] } {
	const { row, cells } = parsed;
	const problems: ImportProblem[] = [];
	for (const column of CSV_COLUMNS) {
		const value = cells[column];
		if (startsLikeFormula(value)) {
			const shown = JSON.stringify(value.trimStart().charAt(0));
			problems.push({
				row,
				column,
				reason: `Starts with ${shown}: cells beginning with =, +, -, @, a tab or a carriage return are refused, because spreadsheet programs run them as formulas.`
			});
		}
	}
	if (problems.length) return { ok: false, problems };

	let specs: unknown;
	const specsText = cells.specs_json.trim();
	if (specsText === '')
		problems.push({
			row,
			column: 'specs_json',
			reason: 'Empty: give the specs as a JSON object, e.g. {"sizeMm":120,"count":1,"maxRpm":1500}.'
		});
	else if (specsText.length > MAX_SPECS_JSON_CHARS)
		problems.push({
			row,
			column: 'specs_json',
			reason: `Longer than ${MAX_SPECS_JSON_CHARS} characters.`
		});
	else {
		try {
			specs = JSON.parse(specsText);
			if (!specs || typeof specs !== 'object' || Array.isArray(specs)) {
				problems.push({
					row,
					column: 'specs_json',
					reason: 'Must be a JSON object ({...}) of spec fields.'
				});
			}
		} catch (e) {
			problems.push({
				row,
				column: 'specs_json',
				reason: `Not valid JSON: ${(e as Error).message}.`
			});
		}
	}
	const checked = checkPart({
		category: cells.category.trim(),
		brand: cells.brand,
		model: cells.model,
		slug: cells.slug,
		specs: specs ?? {}
	});
	if (!checked.ok) {
		// With the JSON itself refused, spec messages about the stand-in "{}" would only repeat it.
		const jsonRefused = problems.length > 0;
		for (const [key, messages] of Object.entries(checked.issues)) {
			const column = FIELD_COLUMN[key];
			if (!column && jsonRefused) continue;
			for (const message of messages) {
				if (column)
					problems.push({
						row,
						column,
						reason: column === 'category' ? `"${cells.category.trim()}": ${message}` : message
					});
				else
					problems.push({
						row,
						column: 'specs_json',
						reason: key === 'spec' ? message : `${key.slice('spec.'.length)}: ${message}`
					});
			}
		}
	}
	if (problems.length || !checked.ok) return { ok: false, problems };
	return { ok: true, part: { row, ...checked.part } };
}

interface CheckedFile {
	fileName: string;
	totalRows: number;
	problems: ImportProblem[];
	parts: ImportedPartRow[];
	badRowNumbers: Set<number>;
}

/** Decodes, parses and checks a file against itself and the catalog (no writes). */
export async function checkFile(
	bytes: Uint8Array,
	fileName: string,
	transaction?: Transaction
): Promise<CheckedFile> {
	const result: CheckedFile = {
		fileName,
		totalRows: 0,
		problems: [],
		parts: [],
		badRowNumbers: new Set()
	};
	const decoded = decodeCsvBytes(bytes);
	if (!decoded.ok) {
		result.problems.push({ row: 0, column: null, reason: decoded.reason });
		return result;
	}
	const parsed = parseCsvText(decoded.text);
	if (!parsed.ok) {
		result.problems.push(parsed.problem);
		return result;
	}
	result.totalRows = parsed.rows.length + parsed.cellCountProblems.length;
	if (result.totalRows === 0) {
		result.problems.push({ row: 0, column: null, reason: 'The file has a header but no parts.' });
		return result;
	}
	if (result.totalRows > MAX_ROWS) {
		result.problems.push({
			row: 0,
			column: null,
			reason: `The file has ${result.totalRows} parts; import at most ${MAX_ROWS} at a time.`
		});
		return result;
	}
	const problems: ImportProblem[] = [...parsed.cellCountProblems];
	const firstRowOfSlug = new Map<string, number>();
	const good: ImportedPartRow[] = [];
	for (const row of parsed.rows) {
		const checked = checkRow(row);
		if (!checked.ok) {
			problems.push(...checked.problems);
			continue;
		}
		const earlier = firstRowOfSlug.get(checked.part.slug);
		if (earlier !== undefined) {
			problems.push({
				row: row.row,
				column: 'slug',
				reason: `The slug "${checked.part.slug}" is already used on row ${earlier}; each part needs its own slug.`
			});
			continue;
		}
		firstRowOfSlug.set(checked.part.slug, row.row);
		good.push(checked.part);
	}
	// Against the catalog: a slug there with another category cannot be updated into this one.
	const existing = await existingBySlug(
		good.map((p) => p.slug),
		transaction
	);
	for (const part of good) {
		const current = existing.get(part.slug);
		if (current && current.category !== part.category) {
			problems.push({
				row: part.row,
				column: 'slug',
				reason: `"${part.slug}" is an existing ${current.category} part; a part's category cannot change. Use another slug for this ${part.category}.`
			});
		}
	}
	result.problems = problems.sort((a, b) => a.row - b.row);
	result.badRowNumbers = new Set(problems.map((p) => p.row));
	result.parts = good.filter((p) => !result.badRowNumbers.has(p.row));
	return result;
}

async function existingBySlug(slugs: string[], transaction?: Transaction) {
	const found = new Map<string, Part>();
	for (let i = 0; i < slugs.length; i += 500) {
		const chunk = slugs.slice(i, i + 500);
		if (chunk.length === 0) continue;
		const parts = await Part.findAll({
			where: { slug: { [Op.in]: chunk } },
			transaction,
			...(transaction ? { lock: transaction.LOCK.UPDATE } : {})
		});
		for (const part of parts) found.set(part.slug, part);
	}
	return found;
}

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

// ---------------------------------------------------------------- export

function csvLines(rows: string[][]): string {
	return stringify(
		rows.map((r) => r.map(neutraliseCell)),
		{ record_delimiter: '\r\n' }
	);
}

/** Rows read from the database per batch while exporting. */
const EXPORT_BATCH = 500;

/**
 * The whole catalog as CSV in the import layout, produced batch by batch (by id) so a
 * large catalog is never held in memory at once. Starts with a UTF-8 BOM so spreadsheet
 * programs detect the encoding; the importer accepts it.
 */
export function exportCatalogCsv(): ReadableStream<Uint8Array> {
	const encoder = new TextEncoder();
	let lastId = 0;
	let started = false;
	let done = false;
	return new ReadableStream<Uint8Array>({
		async pull(controller) {
			if (!started) {
				started = true;
				controller.enqueue(encoder.encode('\uFEFF' + csvLines([[...CSV_COLUMNS]])));
				return;
			}
			if (done) return;
			const parts = await Part.findAll({
				where: { id: { [Op.gt]: lastId } },
				order: [['id', 'ASC']],
				limit: EXPORT_BATCH
			});
			if (parts.length > 0) {
				lastId = parts[parts.length - 1]?.id ?? lastId;
				controller.enqueue(
					encoder.encode(
						csvLines(
							parts.map((p) => [p.category, p.brand, p.model, p.slug, JSON.stringify(p.specs)])
						)
					)
				);
			}
			if (parts.length < EXPORT_BATCH) {
				done = true;
				controller.close();
			}
		}
	});
}

/** The downloadable template: the header and three invented example parts that import cleanly. */
export function templateCsv(): string {
	return csvLines([
		[...CSV_COLUMNS],
		[
			'cpu',
			'Example Silicon',
			'Vantage 6C',
			'example-silicon-vantage-6c',
			JSON.stringify({
				socket: 'AM5',
				cores: 6,
				threads: 12,
				baseClockGhz: 3.8,
				boostClockGhz: 5.1,
				tdpW: 65,
				memoryTypes: ['DDR5'],
				integratedGraphics: true,
				bundledCooler: true
			})
		],
		[
			'motherboard',
			'Example Boards',
			'B6 Compact',
			'',
			JSON.stringify({
				socket: 'AM5',
				chipset: 'B650',
				formFactor: 'microATX',
				memoryType: 'DDR5',
				memorySlots: 4,
				maxMemoryGb: 192,
				m2Slots: [
					{ pcieGen: 4, maxLengthMm: 80 },
					{ pcieGen: 4, maxLengthMm: 80 }
				],
				sataPorts: 4,
				wifi: true
			})
		],
		[
			'gpu',
			'Example Graphics',
			'Lumen 60 Dual',
			'example-graphics-lumen-60-dual',
			JSON.stringify({
				chip: 'Lumen 60',
				vramGb: 8,
				lengthMm: 242,
				slotWidth: 2,
				boardPowerW: 165,
				powerConnectors: { pin6: 0, pin8: 1, h12v2x6: 0 },
				pcieGen: 4
			})
		]
	]);
}
