/**
 * Which counts of a published table to hide so that none can be worked out from the rest
 * (fork insights, issue 19). Hiding the counts from 1 to 4 is not enough when totals are
 * shown: a row of 11 builds with 7 shown and one count hidden gives that count away as 4,
 * and a region's hidden count follows from the slot's count less the other regions'.
 *
 * What a reader of the table knows: every shown count and total; that a count reading
 * "fewer than 5" is 1 to 4 and one reading "hidden" is 5 or more; that rows and columns add
 * up. Any hidden entry that this leaves at one value means more must go: the smallest shown
 * count in a line with it, else the smallest shown total there (secondary suppression, as
 * statistics offices do before publishing tables; this greedy choice is common practice, no
 * published source).
 *
 * Finding such entries: bounds carried through every line first (cheap, catches plain
 * subtraction); then, for what is left, the least and the most each hidden entry can be,
 * by linear programming. A table with its totals is a flow network (each line a node where
 * what comes in goes out), so its constraint matrix is totally unimodular and those linear
 * optima are whole numbers that real tables reach: the check is exact, not a relaxation.
 */
import solver, { type Model } from 'javascript-lp-solver';
import { K_ANONYMITY } from './insights';

/** Which entries to hide (true = hidden), totals included. */
export interface TableCover {
	/** Rows shown as their total only, since it is 1 to 4 (all rows when the grand total is). */
	unlistedRows: boolean[];
	cells: boolean[][];
	rowTotals: boolean[];
	columnTotals: boolean[];
	grandTotal: boolean;
}

/**
 * One published number: a count or a total, and whether it is hidden. An unlisted one is not
 * even named (a row shown by its total only), so a reader does not know it is above 0.
 */
interface Entry {
	id: number;
	value: number;
	hidden: boolean;
	listed: boolean;
}
/** Its members add up to its total. */
interface Line {
	members: Entry[];
	total: Entry;
}
interface Bounds {
	lo: number;
	hi: number;
}

/** `cells` are rows × columns of counts (regions × choices); totals are their sums. */
export function coverTable(cells: number[][]): TableCover {
	const entries: Entry[] = [];
	const small = (n: number) => n > 0 && n < K_ANONYMITY;
	const entry = (value: number, listed = true): Entry => {
		const made = { id: entries.length, value, hidden: small(value) || !listed, listed };
		entries.push(made);
		return made;
	};
	const add = (es: Entry[]) => es.reduce((s, e) => s + e.value, 0);
	const sum = (ns: number[]) => ns.reduce((s, n) => s + n, 0);
	const tiny = small(sum(cells.map(sum)));
	const grid = cells.map((row) => row.map((n) => entry(n, !tiny && !small(sum(row)))));
	const rowTotals = grid.map((row) => entry(add(row)));
	const columnTotals = (grid[0] ?? []).map((_, j) =>
		entry(add(grid.flatMap((row) => row.slice(j, j + 1))), !tiny)
	);
	const grand = entry(add(rowTotals));
	const lines: Line[] = [
		...grid.map((members, i) => ({ members, total: rowTotals[i] ?? grand })),
		...columnTotals.map((total, j) => ({
			members: grid.flatMap((row) => row.slice(j, j + 1)),
			total
		})),
		{ members: columnTotals, total: grand },
		{ members: rowTotals, total: grand }
	];

	const smallestShown = (es: Entry[]): Entry | undefined =>
		es.filter((e) => !e.hidden && e.value > 0).sort((a, b) => a.value - b.value)[0];
	for (;;) {
		const pinned = pinnedEntries(entries, lines);
		if (pinned.length === 0) break;
		// Near a pinned entry if possible: a count in a line with it, else a total there; else
		// (the pin comes from further away) the smallest count or total anywhere.
		const around = lines.filter((l) => pinned.some((p) => l.total === p || l.members.includes(p)));
		const next =
			smallestShown(around.flatMap((l) => l.members)) ??
			smallestShown(around.map((l) => l.total)) ??
			smallestShown(entries);
		if (!next) break; // everything is hidden
		next.hidden = true;
	}
	return {
		unlistedRows: grid.map((row) => row.some((e) => !e.listed)),
		cells: grid.map((row) => row.map((e) => e.hidden)),
		rowTotals: rowTotals.map((e) => e.hidden),
		columnTotals: columnTotals.map((e) => e.hidden),
		grandTotal: grand.hidden
	};
}

/** Hidden entries a reader can work out exactly from what is shown. */
function pinnedEntries(entries: Entry[], lines: Line[]): Entry[] {
	const bounds = narrow(entries, lines);
	const boundsOf = (e: Entry) => bounds.get(e) ?? { lo: e.value, hi: e.value };
	const hidden = entries.filter((e) => e.hidden);
	// Pinned at 0 is no secret: counts of 0 are shown anyway.
	const quick = hidden.filter((e) => boundsOf(e).lo === boundsOf(e).hi && boundsOf(e).hi > 0);
	if (quick.length > 0) return quick;

	const model: Omit<Model, 'optimize' | 'opType'> = { constraints: {}, variables: {} };
	const variable = (e: Entry) => (model.variables[`v${e.id}`] ??= { [`v${e.id}`]: 1 });
	for (const e of hidden) {
		const { lo, hi } = boundsOf(e);
		variable(e)[`b${e.id}`] = 1;
		model.constraints[`b${e.id}`] = hi === Infinity ? { min: lo } : { min: lo, max: hi };
	}
	lines.forEach(({ members, total }, k) => {
		// Σ hidden members − hidden total = shown total − Σ shown members.
		const terms: [Entry, number][] = members.filter((m) => m.hidden).map((m) => [m, 1]);
		if (total.hidden) terms.push([total, -1]);
		if (terms.length === 0) return;
		const shown = members.filter((m) => !m.hidden).reduce((s, m) => s + m.value, 0);
		model.constraints[`l${k}`] = { equal: (total.hidden ? 0 : total.value) - shown };
		for (const [e, sign] of terms) variable(e)[`l${k}`] = sign;
	});
	// Each solution is a table a reader could believe; an entry seen at two values is safe.
	const seen = new Map<Entry, Set<number>>();
	for (const e of hidden) {
		if ((seen.get(e)?.size ?? 0) >= 2) continue;
		const ends: number[] = [];
		for (const opType of ['min', 'max'] as const) {
			const solution = solver.Solve({ ...model, optimize: `v${e.id}`, opType });
			if (!solution.feasible || !solution.bounded) continue;
			for (const h of hidden) {
				const v = Math.round(Number(solution[`v${h.id}`] ?? 0));
				seen.set(h, (seen.get(h) ?? new Set()).add(v));
			}
			ends.push(Math.round(solution.result));
		}
		if (ends.length === 2 && ends[0] === ends[1] && ends[0] !== 0) return [e];
	}
	return [];
}

/** What a reader can narrow each hidden entry to from the shown ones, the labels and the sums. */
function narrow(entries: Entry[], lines: Line[]): Map<Entry, Bounds> {
	const bounds = new Map<Entry, Bounds>();
	for (const e of entries) {
		if (!e.hidden) bounds.set(e, { lo: e.value, hi: e.value });
		else if (!e.listed) bounds.set(e, { lo: 0, hi: Infinity });
		else if (e.value < K_ANONYMITY) bounds.set(e, { lo: 1, hi: K_ANONYMITY - 1 });
		else bounds.set(e, { lo: K_ANONYMITY, hi: Infinity });
	}
	const get = (e: Entry) => bounds.get(e) ?? { lo: e.value, hi: e.value };
	const sum = (es: Entry[], side: 'lo' | 'hi') => es.reduce((s, e) => s + get(e)[side], 0);
	const tighten = (e: Entry, lo: number, hi: number): boolean => {
		const b = get(e);
		const next = { lo: Math.max(b.lo, lo), hi: Math.min(b.hi, hi) };
		if (next.lo === b.lo && next.hi === b.hi) return false;
		bounds.set(e, next);
		return true;
	};
	// Bounds only shrink, and the true table always fits them; the cap is a guard, never reached.
	for (let changed = true, pass = 0; changed && pass < 1000; pass++) {
		changed = false;
		for (const { members, total } of lines) {
			// total = Σ members, so each side bounds the other.
			changed = tighten(total, sum(members, 'lo'), sum(members, 'hi')) || changed;
			for (const m of members) {
				const others = members.filter((o) => o !== m);
				const lo = get(total).lo - sum(others, 'hi');
				const hi = get(total).hi - sum(others, 'lo');
				changed = tighten(m, lo, hi) || changed;
			}
		}
	}
	return bounds;
}
