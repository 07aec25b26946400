/**
 * Checking a catalog CSV file (layout and rules: catalog-csv.ts): decoding, parsing, every
 * row against the zod schemas of its category, slugs unique in the file and categories that
 * match the catalog. Reads the catalog only; nothing is written here.
 */
import { CsvError, parse } from 'csv-parse/sync';
import { Op } from 'sequelize';
import type { Transaction } from 'sequelize';
import { startsLikeFormula } from '$lib/schemas/catalog-upkeep';
import { Part } from '$lib/server/db';
import type { ImportedPartRow } from '$lib/server/db/models/CatalogImport';
import { decodeCsvBytes } from '$lib/server/csv-cells';
import type { CsvColumn, ImportProblem } from '$lib/views';
import { checkPart } from './catalog-parts';

export const CSV_COLUMNS = [
	'category',
	'brand',
	'model',
	'slug',
	'specs_json'
] as const satisfies readonly CsvColumn[];

/** Largest file accepted (1 MiB); the request hook holds the import's bodies to 2 MB. */
export { MAX_UPLOAD_BYTES } from './catalog-csv-limits';
/** Most data rows in one file: one transaction stays short enough to hold. */
export const MAX_ROWS = 5_000;
/** How long a checked upload waits for its confirmation. */
export const IMPORT_TTL_MS = 60 * 60 * 1000;
/** Problems listed in one report; a file with more gets a count of the rest. */
export const MAX_PROBLEMS_LISTED = 500;
/** Longest specs_json cell: the largest specs (a board with 8 M.2 slots) are under 1000. */
const MAX_SPECS_JSON_CHARS = 4_000;

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

/** The CSV column each part field is read from (spec problems belong to specs_json). */
export const FIELD_COLUMN: Record<string, CsvColumn> = {
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

/** The catalog's parts with these slugs, by slug. */
export async function existingBySlug(slugs: string[], transaction?: Transaction) {
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
