/**
 * The shapes shared by the fit report, the power budget and the drop-in pass: a build as
 * a list of slots with their parts, and a finding about them. Plain types only; spec
 * types come from the zod contract in $lib/schemas/part-specs (types, never runtime).
 */
import type { SpecsByCategory } from '../schemas/part-specs';
import type { PartCategory } from './types';

/** A part as the computations need it: a name to show and its category's specs. */
export interface PartInfo<C extends PartCategory = PartCategory> {
	brand: string;
	model: string;
	specs: SpecsByCategory[C];
}

/** One slot of a build with the part in it (`key` is unique within the build). */
export interface BuildPartOf<C extends PartCategory> {
	key: string;
	label: string;
	category: C;
	quantity: number;
	part: PartInfo<C>;
}

/** A slot of any category; checking `category` narrows `part.specs` to that category. */
export type BuildPart = { [C in PartCategory]: BuildPartOf<C> }[PartCategory];
export type BuildParts = readonly BuildPart[];

export type Severity = 'ok' | 'caution' | 'conflict';

/** One fit-report line: which rule, how bad, what to tell the reader, and which slots. */
export interface Finding {
	rule: string;
	severity: Severity;
	message: string;
	/** Keys of the slots involved (BuildPart.key). */
	slots: string[];
	/** Set on an editor's pairing caution (domain/pairing-cautions.ts): the rule's id. */
	cautionRuleId?: number;
	/** Set on an editor's pairing caution: the name of the editor who wrote the rule. */
	authorName?: string;
}

const SEVERITY_RANK: Record<Severity, number> = { ok: 0, caution: 1, conflict: 2 };

/** Orders severities: ok < caution < conflict. */
export function severityRank(severity: Severity): number {
	return SEVERITY_RANK[severity];
}

/** The worst severity in a list of findings (`ok` for an empty list). */
export function worstSeverity(findings: readonly Finding[]): Severity {
	let worst: Severity = 'ok';
	for (const f of findings)
		if (SEVERITY_RANK[f.severity] > SEVERITY_RANK[worst]) worst = f.severity;
	return worst;
}

/** "Brand Model", the name every message uses so the reader can tell parts apart. */
export function partName(slot: { part: { brand: string; model: string } }): string {
	return `${slot.part.brand} ${slot.part.model}`;
}

/** All slots of one category, typed. */
export function slotsOf<C extends PartCategory>(build: BuildParts, category: C): BuildPartOf<C>[] {
	const out: BuildPartOf<C>[] = [];
	// The union cannot be narrowed by a generic category, hence the cast after the check.
	for (const slot of build)
		if (slot.category === category) out.push(slot as unknown as BuildPartOf<C>);
	return out;
}
