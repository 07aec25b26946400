/**
 * The catalog as CSV for editors (layout: catalog-csv.ts): the whole catalog streamed in
 * batches, and a template with one example row per kind of spec. Cells a spreadsheet would
 * run as a formula are neutralised.
 */
import { stringify } from 'csv-stringify/sync';
import { Op } from 'sequelize';
import { Part } from '$lib/server/db';
import { neutraliseCell } from '$lib/server/csv-cells';
import { CSV_COLUMNS } from './catalog-csv-check';

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
