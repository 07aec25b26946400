import { QueryTypes } from 'sequelize';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { AuditEvent, CatalogImport, Part, User, sequelize } from '../../src/lib/server/db';
import * as csv from '../../src/lib/server/services/catalog-csv';
import * as csvExport from '../../src/lib/server/services/catalog-csv-export';
import * as catalogParts from '../../src/lib/server/services/catalog-parts';
import { countRows, resetDatabase } from '../support/db';
import {
	CSV_HEADER,
	THREE_BAD_ROWS,
	csvLine,
	generatedCsv,
	generatedRow
} from '../support/parts-csv';

/*
 * The CSV import on the real MariaDB: a file with any bad row is reported row by row and
 * writes nothing; a clean file is stored for confirmation and then written in one
 * transaction, which a failure halfway through rolls back completely.
 */

const bytes = (text: string) => new TextEncoder().encode(text);

async function editor(email = 'ed@example.test') {
	return User.create({ email, name: 'Eda Ledger', role: 'editor' });
}

async function ready(editorId: string, text: string) {
	const outcome = await csv.upload(editorId, bytes(text), 'parts.csv');
	if (outcome.kind !== 'ready')
		throw new Error(`expected a clean file, got ${JSON.stringify(outcome).slice(0, 600)}`);
	return outcome.importId;
}

describe('CSV import', () => {
	beforeEach(resetDatabase);

	it('lists exactly the 3 bad rows of a 200-row file with row, column and reason, and writes nothing', async () => {
		const me = await editor();
		const outcome = await csv.upload(
			me.id,
			bytes(generatedCsv(200, 'gen', THREE_BAD_ROWS)),
			'parts.csv'
		);
		expect(outcome.kind).toBe('invalid');
		if (outcome.kind !== 'invalid') return;
		expect(outcome).toMatchObject({ totalRows: 200, goodRows: 197, badRows: 3, moreProblems: 0 });
		expect(outcome.problems).toEqual([
			{ row: 20, column: 'specs_json', reason: 'lengthMm: Must be more than 0.' },
			{
				row: 87,
				column: 'category',
				reason: expect.stringMatching(/^"toaster": Choose one of: cpu, cooler/)
			},
			{ row: 150, column: 'brand', reason: expect.stringMatching(/^Starts with "=": .*formulas/) }
		]);
		expect(await countRows('parts')).toBe(0);
		expect(await countRows('catalog_imports')).toBe(0);
		expect(await countRows('audit_events')).toBe(0);
	});

	it('after fixing, stores the 200 checked rows, previews them, and writes all 200 in one go with audit events', async () => {
		const me = await editor();
		const importId = await ready(me.id, generatedCsv(200, 'gen'));
		expect(await countRows('parts')).toBe(0);
		const preview = await csv.preview(me.id, importId);
		expect(preview).toMatchObject({ rowCount: 200, creates: 200, updates: 0, unchanged: 0 });
		expect(preview?.rows[0]).toMatchObject({ row: 2, slug: 'gen-1', action: 'create' });

		const result = await csv.commit(me.id, importId);
		expect(result).toEqual({ kind: 'ok', created: 200, updated: 0, unchanged: 0 });
		expect(await countRows('parts')).toBe(200);
		expect(await countRows('catalog_imports')).toBe(0);
		expect(await AuditEvent.count({ where: { action: 'part.created' } })).toBe(200);
		expect(
			await AuditEvent.count({ where: { action: 'catalog_import.committed', subjectId: importId } })
		).toBe(1);
		// A cell with a comma and quotes survives the round trip.
		expect((await Part.findOne({ where: { slug: 'gen-3' } }))?.model).toBe('Arclight 3, Dual "OC"');
		// Confirming twice does nothing the second time.
		expect(await csv.commit(me.id, importId)).toEqual({ kind: 'not_found' });
		expect(await countRows('parts')).toBe(200);
	});

	it('rolls back every row when the database fails halfway through the commit', async () => {
		const me = await editor();
		const importId = await ready(me.id, generatedCsv(200, 'gen'));
		// A real failure inside MariaDB: a trigger refuses the insert of row 150's part, after
		// the first chunk of 100 rows is already in (inserts go in chunks of 100).
		await sequelize.query(
			`CREATE TRIGGER fail_mid_import BEFORE INSERT ON parts FOR EACH ROW
			 BEGIN IF NEW.slug = 'gen-149' THEN SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'injected failure'; END IF; END`,
			{ type: QueryTypes.RAW }
		);
		try {
			await expect(csv.commit(me.id, importId)).rejects.toThrow(/injected failure/);
		} finally {
			await sequelize.query('DROP TRIGGER IF EXISTS fail_mid_import', { type: QueryTypes.RAW });
		}
		expect(await countRows('parts')).toBe(0);
		expect(await countRows('audit_events')).toBe(0);
		// The upload is still there: once the cause is gone, the same confirmation succeeds.
		expect(await countRows('catalog_imports')).toBe(1);
		expect(await csv.commit(me.id, importId)).toEqual({
			kind: 'ok',
			created: 200,
			updated: 0,
			unchanged: 0
		});
	});

	it('refuses a wrong header, naming the expected columns', async () => {
		const me = await editor();
		const outcome = await csv.upload(
			me.id,
			bytes('category,brand,model,specs\r\n"fan","A","B","{}"\r\n'),
			'x.csv'
		);
		expect(outcome).toMatchObject({
			kind: 'invalid',
			problems: [
				{
					row: 1,
					column: null,
					reason: expect.stringContaining(
						'must be exactly "category,brand,model,slug,specs_json" (found "category,brand,model,specs")'
					)
				}
			]
		});
		expect(await countRows('catalog_imports')).toBe(0);
	});

	it('refuses invalid UTF-8 and UTF-16 (with or without BOM), and accepts a UTF-8 BOM', async () => {
		const me = await editor();
		const row = csvLine(generatedRow(5, 'enc'));
		// "Brückner" in Latin-1: 0xFC is not valid UTF-8.
		const latin1 = Uint8Array.from([
			...bytes(`${CSV_HEADER}\r\n"fan","Br`),
			0xfc,
			...bytes(`ckner","F","enc-x","{}"\r\n`)
		]);
		const bad = await csv.upload(me.id, latin1, 'latin1.csv');
		expect(bad).toMatchObject({
			kind: 'invalid',
			problems: [
				{
					row: 0,
					column: null,
					reason: expect.stringMatching(/not valid UTF-8 \(byte 48, line 2\)/)
				}
			]
		});

		const text = `${CSV_HEADER}\r\n${row}\r\n`;
		const utf16le = new Uint8Array(text.length * 2);
		for (let i = 0; i < text.length; i++) utf16le[i * 2] = text.charCodeAt(i);
		const noBom = await csv.upload(me.id, utf16le, 'utf16.csv');
		expect(noBom).toMatchObject({
			kind: 'invalid',
			problems: [{ reason: expect.stringMatching(/UTF-16/) }]
		});
		const withBom = await csv.upload(
			me.id,
			Uint8Array.from([0xff, 0xfe, ...utf16le]),
			'utf16bom.csv'
		);
		expect(withBom).toMatchObject({
			kind: 'invalid',
			problems: [{ reason: expect.stringMatching(/UTF-16/) }]
		});
		expect(await countRows('catalog_imports')).toBe(0);

		const bom = await csv.upload(
			me.id,
			Uint8Array.from([0xef, 0xbb, 0xbf, ...bytes(text)]),
			'bom.csv'
		);
		expect(bom.kind).toBe('ready');
	});

	it('refuses formula-like cells (= + - @ tab CR) with a reason, in any column', async () => {
		const me = await editor();
		const ok = generatedRow(5, 'fx');
		const lines = [
			CSV_HEADER,
			csvLine({ ...ok, slug: 'fx-1', brand: "=cmd|' /C calc'!A0" }),
			csvLine({ ...ok, slug: 'fx-2', model: '+SUM(1,2)' }),
			csvLine({ ...ok, slug: 'fx-3', model: '-2+3' }),
			csvLine({ ...ok, slug: 'fx-4', brand: '@SUM(A1)' }),
			csvLine({ ...ok, slug: 'fx-5', brand: '\t=1' }),
			csvLine({ ...ok, slug: 'fx-6', model: '\r=1' }),
			csvLine(['=fan', 'A', 'B', 'fx-7', '{}']),
			csvLine({ ...ok, slug: 'fx-8', brand: '  =1' }),
			csvLine({ ...ok, slug: 'fx-9' })
		];
		const outcome = await csv.upload(me.id, bytes(lines.join('\r\n')), 'fx.csv');
		expect(outcome.kind).toBe('invalid');
		if (outcome.kind !== 'invalid') return;
		expect(outcome.problems.map((p) => [p.row, p.column])).toEqual([
			[2, 'brand'],
			[3, 'model'],
			[4, 'model'],
			[5, 'brand'],
			[6, 'brand'],
			[7, 'model'],
			[8, 'category'],
			[9, 'brand']
		]);
		for (const p of outcome.problems) expect(p.reason).toMatch(/formulas/);
		expect(outcome.goodRows).toBe(1);
		expect(await countRows('parts')).toBe(0);
	});

	it('reports bad JSON, wrong cell counts, duplicate slugs in the file, and a slug of another category in the catalog', async () => {
		const me = await editor();
		await catalogParts.createPart(me.id, {
			category: 'gpu',
			brand: 'Lumenforge',
			model: 'Existing',
			slug: 'taken',
			specs: generatedRow(3, 'x').specs
		});
		const fan = generatedRow(5, 'dup');
		const lines = [
			CSV_HEADER,
			csvLine({ ...fan, slug: 'one' }),
			csvLine({ ...fan, slug: 'one' }),
			csvLine(['fan', 'A', 'B', 'two', '{sizeMm: 120}']),
			'"fan","A","B"',
			csvLine({ ...fan, slug: 'taken' }),
			csvLine({
				...fan,
				slug: 'three',
				specs: { sizeMm: 100, count: 1, maxRpm: 900, colour: 'red' }
			})
		];
		const outcome = await csv.upload(me.id, bytes(lines.join('\n')), 'mixed.csv');
		expect(outcome.kind).toBe('invalid');
		if (outcome.kind !== 'invalid') return;
		expect(outcome.problems).toEqual([
			{
				row: 3,
				column: 'slug',
				reason: 'The slug "one" is already used on row 2; each part needs its own slug.'
			},
			{ row: 4, column: 'specs_json', reason: expect.stringMatching(/^Not valid JSON/) },
			{ row: 5, column: null, reason: expect.stringMatching(/^Has 3 cells; every row needs 5/) },
			{
				row: 6,
				column: 'slug',
				reason: expect.stringMatching(
					/"taken" is an existing gpu part; a part's category cannot change/
				)
			},
			{ row: 7, column: 'specs_json', reason: 'sizeMm: Choose one of: 80, 92, 120, 140.' },
			{ row: 7, column: 'specs_json', reason: 'Unknown field: colour.' }
		]);
		expect(outcome).toMatchObject({ totalRows: 6, goodRows: 1, badRows: 5 });
	});

	it('updates existing parts of the same category, leaves identical ones alone, and audits the change', async () => {
		const me = await editor();
		const first = await ready(me.id, generatedCsv(10, 'upd'));
		await csv.commit(me.id, first);
		const changed = generatedRow(1, 'upd');
		const text = [
			CSV_HEADER,
			csvLine({ ...changed, model: 'Tempo renamed' }),
			csvLine(generatedRow(3, 'upd')),
			csvLine(generatedRow(11, 'upd'))
		].join('\r\n');
		const second = await ready(me.id, text);
		expect(await csv.preview(me.id, second)).toMatchObject({
			creates: 1,
			updates: 1,
			unchanged: 1
		});
		expect(await csv.commit(me.id, second)).toEqual({
			kind: 'ok',
			created: 1,
			updated: 1,
			unchanged: 1
		});
		expect((await Part.findOne({ where: { slug: 'upd-1' } }))?.model).toBe('Tempo renamed');
		const event = await AuditEvent.findOne({ where: { action: 'part.updated' } });
		expect(event?.before).toMatchObject({ model: 'Tempo 1 32 GB' });
		expect(event?.after).toMatchObject({ model: 'Tempo renamed', importId: second });
	});

	it("keeps an upload to its editor and its hour: another editor's, an expired or a discarded one cannot be confirmed", async () => {
		const me = await editor();
		const other = await editor('other@example.test');
		const importId = await ready(me.id, generatedCsv(3, 'own'));
		expect(await csv.preview(other.id, importId)).toBeNull();
		expect(await csv.commit(other.id, importId)).toEqual({ kind: 'not_found' });
		const later = new Date(Date.now() + csv.IMPORT_TTL_MS + 1000);
		expect(await csv.preview(me.id, importId, later)).toBeNull();
		expect(await csv.commit(me.id, importId, later)).toEqual({ kind: 'not_found' });
		expect(await csv.discard(other.id, importId)).toBe(false);
		expect(await csv.discard(me.id, importId)).toBe(true);
		expect(await csv.commit(me.id, importId)).toEqual({ kind: 'not_found' });
		expect(await countRows('parts')).toBe(0);
		// Expired uploads are cleared by the next upload.
		await ready(me.id, generatedCsv(1, 'old'));
		await ready(me.id, generatedCsv(1, 'new'));
		await CatalogImport.update({ expiresAt: new Date(Date.now() - 1000) }, { where: {} });
		await ready(me.id, generatedCsv(1, 'newest'));
		expect(await countRows('catalog_imports')).toBe(1);
	});

	it('refuses an oversized file and an empty one', async () => {
		const me = await editor();
		const big = new Uint8Array(csv.MAX_UPLOAD_BYTES + 1).fill(0x41);
		expect(await csv.upload(me.id, big, 'big.csv')).toMatchObject({
			kind: 'invalid',
			problems: [{ reason: expect.stringMatching(/upload at most 1\.0 MB/) }]
		});
		expect(await csv.upload(me.id, new Uint8Array(0), 'empty.csv')).toMatchObject({
			kind: 'invalid'
		});
		expect(await csv.upload(me.id, bytes(`${CSV_HEADER}\r\n`), 'header-only.csv')).toMatchObject({
			kind: 'invalid',
			problems: [{ reason: 'The file has a header but no parts.' }]
		});
	});
});

describe('CSV export', () => {
	beforeEach(resetDatabase);
	afterEach(async () => {
		await Part.destroy({ where: {} });
	});

	/** The exported bytes as text, BOM kept (Response.text() would drop it). */
	async function exported(): Promise<string> {
		const raw = new Uint8Array(await new Response(csvExport.exportCatalogCsv()).arrayBuffer());
		return new TextDecoder('utf-8', { ignoreBOM: true }).decode(raw);
	}

	it('exports the catalog in the import layout, neutralising formula-like cells', async () => {
		// Written around the service on purpose: rows from before these rules existed.
		await Part.create({
			category: 'fan',
			brand: '=HYPERLINK("http://x.example")',
			model: '-Breeze',
			slug: 'odd-fan',
			specs: { sizeMm: 120, count: 1, maxRpm: 1500 }
		});
		await Part.create({
			category: 'fan',
			brand: 'Draftwell',
			model: 'Breeze, "quiet"',
			slug: 'fine-fan',
			specs: { sizeMm: 140, count: 2, maxRpm: 1200 }
		});
		const text = await exported();
		expect(text.charCodeAt(0)).toBe(0xfeff);
		const lines = text.slice(1).split('\r\n');
		expect(lines[0]).toBe(CSV_HEADER);
		expect(lines[1]).toBe(
			`fan,"'=HYPERLINK(""http://x.example"")",'-Breeze,odd-fan,"{""sizeMm"":120,""count"":1,""maxRpm"":1500}"`
		);
		expect(lines[2]).toBe(
			`fan,Draftwell,"Breeze, ""quiet""",fine-fan,"{""sizeMm"":140,""count"":2,""maxRpm"":1200}"`
		);
		expect(lines[3]).toBe('');
	});

	it('streams a catalog larger than one batch, and an export imports back as unchanged', async () => {
		const me = await editor();
		await csv.commit(me.id, await ready(me.id, generatedCsv(1200, 'big')));
		const text = await exported();
		expect(text.slice(1).trimEnd().split('\r\n')).toHaveLength(1201);
		const again = await ready(me.id, text);
		expect(await csv.preview(me.id, again)).toMatchObject({
			rowCount: 1200,
			creates: 0,
			updates: 0,
			unchanged: 1200
		});
	});

	it('offers a template that imports cleanly', async () => {
		const me = await editor();
		const importId = await ready(me.id, csvExport.templateCsv());
		expect(await csv.commit(me.id, importId)).toEqual({
			kind: 'ok',
			created: 3,
			updated: 0,
			unchanged: 0
		});
		expect(await Part.findOne({ where: { slug: 'example-boards-b6-compact' } })).not.toBeNull();
	});
});
