/**
 * What every fit rule gets: the build, the first CPU, board, case and PSU (the part-count
 * rule says when there are more), and every slot of the other categories. Shared helpers
 * for the rule files (fit-*.ts) that fit.ts puts together into the report.
 */
import { partName, type BuildPartOf, type BuildParts, type Finding } from './build-parts';

export interface FitContext {
	build: BuildParts;
	cpu?: BuildPartOf<'cpu'>;
	board?: BuildPartOf<'motherboard'>;
	pcCase?: BuildPartOf<'case'>;
	psu?: BuildPartOf<'psu'>;
	coolers: BuildPartOf<'cooler'>[];
	gpus: BuildPartOf<'gpu'>[];
	memory: BuildPartOf<'memory'>[];
	storage: BuildPartOf<'storage'>[];
	fans: BuildPartOf<'fan'>[];
}

/** A rule adds its findings (`ok` included) to `out`; a rule whose slots are missing adds none. */
export type FitRule = (ctx: FitContext, out: Finding[]) => void;

export function plural(n: number, word: string): string {
	return `${n} ${word}${n === 1 ? '' : 's'}`;
}

export function listText(items: readonly string[]): string {
	return items.join(', ');
}

/** "Name" or "3 × Name" for each slot, joined. */
export function countedNames(
	slots: readonly { quantity: number; part: { brand: string; model: string } }[]
): string {
	return listText(
		slots.map((s) => (s.quantity > 1 ? `${s.quantity} × ${partName(s)}` : partName(s)))
	);
}

/** Units over slots (a slot of quantity 3 is three units). */
export function units(slots: readonly { quantity: number }[]): number {
	return slots.reduce((n, s) => n + s.quantity, 0);
}
