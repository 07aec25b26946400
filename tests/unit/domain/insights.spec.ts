import { describe, expect, it } from 'vitest';
import { buildCount, suggested } from '../../../src/lib/domain/insights';
import { coverTable, type TableCover } from '../../../src/lib/domain/table-cover';

/*
 * The two thresholds of fork insights, from issue 19's own words: counts below 5 builds
 * read "fewer than 5"; a swap is suggested at "at least 20 % of builds (and at least 5)".
 */
describe('fork insight thresholds (issue 19)', () => {
	it('hides counts from 1 to 4 and shows 0 and 5 or more', () => {
		expect(buildCount(0)).toEqual({ count: 0, fewerThan5: false });
		expect(buildCount(1)).toEqual({ count: null, fewerThan5: true });
		expect(buildCount(4)).toEqual({ count: null, fewerThan5: true });
		expect(buildCount(5)).toEqual({ count: 5, fewerThan5: false });
	});

	it('suggests at 20 % and 5 builds, not just below either', () => {
		// 5 of 25 = 20 % exactly: yes. 5 of 26 = 19.2 %: no. 4 of 4 = 100 % but 4 builds: no.
		expect(suggested(5, 25)).toBe(true);
		expect(suggested(5, 26)).toBe(false);
		expect(suggested(4, 4)).toBe(false);
		expect(suggested(6, 14)).toBe(true);
	});
});

/*
 * Secondary suppression: with totals shown, no hidden count may be worked out from the rest.
 * The expectations are worked by hand from what a reader knows: shown counts and totals, a
 * "fewer than 5" count is 1 to 4, a "hidden" one is 5 or more, and rows and columns add up.
 * Where a hidden count would come out at one value, one more entry near it is hidden, the
 * smallest count first (common practice, no published source). Then an attacker written
 * here, apart from the product's code, tries every table that fits what is shown.
 */
describe('coverTable: no hidden count follows from what is shown', () => {
	it('one row 7 + 4 = 11: 4 alone would be 11 − 7, so the 7 is hidden too', () => {
		// Then 7 is "hidden" (5 or more) and 4 "fewer than 5": 7+4, 8+3, 9+2, 10+1 all fit.
		// In a one-row table each column's total is that same count, so it goes with it.
		const cover = coverTable([[7, 4]]);
		expect(cover.cells).toEqual([[true, true]]);
		expect(cover.columnTotals).toEqual([true, true]);
		expect(cover.rowTotals).toEqual([false]);
		expect(cover.grandTotal).toBe(false);
	});

	it('10 + 1 + 1 = 12: two counts of 1 to 4 making 2 are 1 and 1, so the 10 goes too', () => {
		expect(coverTable([[10, 1, 1]]).cells).toEqual([[true, true, true]]);
	});

	it('9 + 3 + 2 = 14: two counts of 1 to 4 making 5 split four ways, so the 9 stays', () => {
		expect(coverTable([[9, 3, 2]]).cells).toEqual([[false, true, true]]);
	});

	it('9 + 7 = 16: nothing small, nothing hidden', () => {
		const cover = coverTable([[9, 7]]);
		expect(cover.cells).toEqual([[false, false]]);
		expect(cover.columnTotals).toEqual([false, false]);
	});

	it('regions us (7, 4) and de (2, 3): us would give its 4 away unless its 7 is hidden', () => {
		// us pick ≥ 5 with us alt = 11 − it in 1..4 → 7..10; de pick = 9 − us pick in 1..4
		// → us pick 7 or 8; de alt = 5 − de pick. Two tables fit; all totals can stay.
		const cover = coverTable([
			[7, 4],
			[2, 3]
		]);
		expect(cover.cells).toEqual([
			[true, true],
			[true, true]
		]);
		expect(cover.rowTotals).toEqual([false, false]);
		expect(cover.columnTotals).toEqual([false, false]);
	});

	it('a region hiding one count makes the other region hide that column too', () => {
		// de (10, 3): 3 alone is 13 − 10, so de's 10 goes. Column 1 (10h, 10) under 20 would
		// give de's 10 back, so us's 10 there goes; then row us (10h, 10) under 20 does the
		// same, so the last 10 goes. All four hidden: de alt 1..4, the rest follow from it.
		const cover = coverTable([
			[10, 3],
			[10, 10]
		]);
		expect(cover.cells).toEqual([
			[true, true],
			[true, true]
		]);
		expect(cover.rowTotals).toEqual([false, false]);
		expect(cover.columnTotals).toEqual([false, false]);
		expect(cover.grandTotal).toBe(false);
	});

	for (const cells of [
		[[7, 4]],
		[[10, 1, 1]],
		[[9, 3, 2]],
		[
			[7, 4],
			[2, 3]
		],
		[
			[10, 3],
			[10, 10]
		],
		[
			[3, 0],
			[10, 5]
		],
		[
			[6, 1, 0],
			[0, 2, 9],
			[5, 5, 1]
		]
	]) {
		it(`${JSON.stringify(cells)}: every hidden entry can still take two values or more`, () => {
			expect(pinnedEntries(cells, coverTable(cells))).toEqual([]);
		});
	}

	it('200 random tables of up to 3 regions × 4 choices: nothing pinned', () => {
		let seed = 20261205;
		const random = (n: number) => {
			seed = (seed * 1103515245 + 12345) % 2147483648;
			return seed % n;
		};
		for (let t = 0; t < 200; t++) {
			const cells = Array.from({ length: 1 + random(3) }, () =>
				Array.from({ length: 4 }, () => [0, 1, 2, 3, 4, 5, 6, 8][random(8)]!)
			);
			expect(pinnedEntries(cells, coverTable(cells)), JSON.stringify(cells)).toEqual([]);
		}
	});
});

/**
 * The attacker: every table that fits what is shown (shown entries exactly, "fewer than 5"
 * from 1 to 4, "hidden" from 5 up to the grand total, nothing named in a row shown by its
 * total alone, rows and columns adding up), row by row. Returns the hidden entries that
 * take one value only over all of them.
 */
function pinnedEntries(cells: number[][], cover: TableCover): string[] {
	const cols = cells[0]!.length;
	const add = (xs: number[]) => xs.reduce((a, b) => a + b, 0);
	const rowSums = cells.map(add);
	const colSums = cells[0]!.map((_, j) => add(cells.map((r) => r[j]!)));
	const grand = add(rowSums);
	// No entry exceeds the grand total; when that is hidden too, its label bounds it.
	const limit = !cover.grandTotal ? grand : grand < 5 ? 4 : grand + 10;
	const allowed = (actual: number, hidden: boolean, v: number) =>
		!hidden ? v === actual : actual < 5 ? v >= 1 && v <= 4 : v >= 5 && v <= limit;
	// A row shown by its total alone names none of its counts: each is 0 up to the limit.
	const cellAllowed = (i: number, actual: number, hidden: boolean, v: number) =>
		cover.unlistedRows[i] ? v >= 0 && v <= limit : allowed(actual, hidden, v);
	// Every way to fill one row's hidden cells that fits the row's own total.
	const rowOptions = cells.map((row, i) => {
		const out: number[][] = [];
		const fill = (j: number, acc: number[]) => {
			if (j === cols) {
				if (allowed(rowSums[i]!, cover.rowTotals[i]!, add(acc))) out.push([...acc]);
				return;
			}
			const choices = cover.cells[i]![j]
				? Array.from({ length: limit + 1 }, (_, v) => v).filter((v) =>
						cellAllowed(i, row[j]!, true, v)
					)
				: [row[j]!];
			for (const v of choices) if (add(acc) + v <= limit) fill(j + 1, [...acc, v]);
		};
		fill(0, []);
		return out;
	});
	const seen = new Map<string, Set<number>>();
	const note = (key: string, v: number) => seen.set(key, (seen.get(key) ?? new Set()).add(v));
	const pick = (i: number, table: number[][]) => {
		if (i === cells.length) {
			const cs = cells[0]!.map((_, j) => add(table.map((r) => r[j]!)));
			const rs = table.map(add);
			// With fewer than 5 builds in all, not even the choices are named.
			const tiny = grand < 5;
			const columnOk = (v: number, j: number) =>
				tiny ? v <= 4 : allowed(colSums[j]!, cover.columnTotals[j]!, v);
			if (!cs.every(columnOk)) return;
			if (!allowed(grand, cover.grandTotal, add(rs))) return;
			table.forEach((r, a) => r.forEach((v, b) => cover.cells[a]![b] && note(`cell ${a},${b}`, v)));
			rs.forEach((v, a) => cover.rowTotals[a] && note(`row total ${a}`, v));
			cs.forEach((v, b) => cover.columnTotals[b] && note(`column total ${b}`, v));
			return;
		}
		for (const option of rowOptions[i]!) {
			const partial = [...table, option];
			const over = cells[0]!.some((_, j) => add(partial.map((r) => r[j]!)) > limit);
			if (!over) pick(i + 1, partial);
		}
	};
	pick(0, []);
	// One value is a secret given away, unless it is 0: counts of 0 are shown anyway.
	return [...seen].filter(([, values]) => values.size < 2 && !values.has(0)).map(([key]) => key);
}
