/*
 * Generated parts CSV files for the import tests (integration and end-to-end). Plain
 * TypeScript, no app imports, so Playwright can load it too. Brands and models are
 * invented; the specs follow the spec schemas in src/lib/schemas/part-specs.ts.
 */

export const CSV_HEADER = 'category,brand,model,slug,specs_json';

export interface GeneratedRow {
	category: string;
	brand: string;
	model: string;
	slug: string;
	specs: Record<string, unknown>;
}

/** One valid row per index, cycling through five categories; slugs are `${prefix}-${i}`. */
export function generatedRow(i: number, prefix: string): GeneratedRow {
	const slug = `${prefix}-${i}`;
	switch (i % 5) {
		case 0:
			return {
				category: 'fan',
				brand: 'Draftwell',
				model: `Breeze ${i}`,
				slug,
				specs: { sizeMm: 120, count: 1 + (i % 3), maxRpm: 1200 + i }
			};
		case 1:
			return {
				category: 'memory',
				brand: 'Corvale',
				model: `Tempo ${i} 32 GB`,
				slug,
				specs: {
					type: 'DDR5',
					modules: 2,
					moduleGb: 16,
					speedMts: 6000,
					casLatency: 30,
					voltage: 1.35
				}
			};
		case 2:
			return {
				category: 'storage',
				brand: 'Quillstone',
				model: `Ledger ${i}`,
				slug,
				specs: {
					interface: 'nvme',
					formFactor: 'm2-2280',
					pcieGen: 4,
					capacityGb: 1000,
					readMbs: 7000,
					writeMbs: 6000
				}
			};
		case 3:
			return {
				category: 'gpu',
				brand: 'Lumenforge',
				model: `Arclight ${i}, Dual "OC"`,
				slug,
				specs: {
					chip: 'Arclight 60',
					vramGb: 8,
					lengthMm: 240 + (i % 60),
					slotWidth: 2,
					boardPowerW: 165,
					powerConnectors: { pin6: 0, pin8: 1, h12v2x6: 0 },
					pcieGen: 4
				}
			};
		default:
			return {
				category: 'cpu',
				// A brand of its own, so imported rows never mix with the demo's in catalog tests.
				brand: 'Tollgate',
				model: `Strata ${i}`,
				slug,
				specs: {
					socket: 'AM5',
					cores: 6,
					threads: 12,
					baseClockGhz: 3.8,
					boostClockGhz: 5.1,
					tdpW: 65,
					memoryTypes: ['DDR5'],
					integratedGraphics: true,
					bundledCooler: true
				}
			};
	}
}

/** RFC 4180 quoting: every cell quoted, inner quotes doubled. */
function cell(value: string): string {
	return `"${value.replace(/"/g, '""')}"`;
}

export function csvLine(row: GeneratedRow | string[]): string {
	const cells = Array.isArray(row)
		? row
		: [row.category, row.brand, row.model, row.slug, JSON.stringify(row.specs)];
	return cells.map(cell).join(',');
}

/**
 * `count` rows (data rows 1..count, spreadsheet rows 2..count+1). `broken` replaces some
 * rows by spreadsheet row number with a bad version.
 */
export function generatedCsv(
	count: number,
	prefix: string,
	broken: Record<number, (row: GeneratedRow) => GeneratedRow | string[]> = {}
): string {
	const lines = [CSV_HEADER];
	for (let i = 1; i <= count; i++) {
		const row = generatedRow(i, prefix);
		const spreadsheetRow = i + 1;
		const breaker = broken[spreadsheetRow];
		lines.push(csvLine(breaker ? breaker(row) : row));
	}
	return lines.join('\r\n') + '\r\n';
}

/**
 * The three bad rows the import tests plant in a 200-row file, by spreadsheet row:
 * a negative card length, an unknown category, and a formula-injection brand.
 */
export const THREE_BAD_ROWS: Record<number, (row: GeneratedRow) => GeneratedRow> = {
	// Data row 19 → i % 5 === 4 is a cpu; use a gpu-shaped row instead, with a negative length.
	20: (row) => ({
		...row,
		category: 'gpu',
		specs: {
			chip: 'Arclight 60',
			vramGb: 8,
			lengthMm: -5,
			slotWidth: 2,
			boardPowerW: 165,
			powerConnectors: { pin6: 0, pin8: 1, h12v2x6: 0 },
			pcieGen: 4
		}
	}),
	87: (row) => ({ ...row, category: 'toaster' }),
	150: (row) => ({ ...row, brand: "=cmd|' /C calc'!A0" })
};
