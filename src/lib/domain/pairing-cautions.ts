/**
 * Pairing cautions: editor-written rules over spec fields, e.g. "graphics card of chip
 * family X with a CPU of fewer than N cores: expect lower 1 % lows". A rule is plain data
 * (conditions of category, field, operator and value), never code: evaluation is a fixed
 * set of comparisons, so nothing an editor types is ever run.
 *
 * A rule fires when, for every category its conditions name, some slot of that category
 * meets all of that category's conditions (two conditions on the graphics card must hold
 * for the same card). A field a part does not have (an optional spec left out) meets no
 * condition, so a rule never fires on a missing value.
 */
import type { BuildParts, Finding } from './build-parts';
import type { PartCategory } from './types';

export const CAUTION_OPERATORS = ['eq', 'ne', 'lt', 'lte', 'gt', 'gte', 'in', 'contains'] as const;
export type CautionOperator = (typeof CAUTION_OPERATORS)[number];

export const OPERATOR_LABELS: Record<CautionOperator, string> = {
	eq: 'is',
	ne: 'is not',
	lt: 'is less than',
	lte: 'is at most',
	gt: 'is more than',
	gte: 'is at least',
	in: 'is one of',
	contains: 'contains'
};

export type ConditionValue = string | number | boolean | string[] | number[];

export interface CautionCondition {
	category: PartCategory;
	/** Spec field path, dotted for nested fields (`powerConnectors.pin8`). */
	field: string;
	operator: CautionOperator;
	value: ConditionValue;
}

/** An active rule as evaluation needs it. */
export interface CautionRule {
	id: number;
	message: string;
	authorName: string;
	conditions: readonly CautionCondition[];
}

/**
 * Finding.rule of a pairing caution: one name per rule, so the drop-in pass (which keys
 * findings by rule and slots) tells two rules about the same parts apart.
 */
export function pairingCautionRuleName(ruleId: number): string {
	return `pairing-caution-${ruleId}`;
}

function valueAt(specs: unknown, path: string): unknown {
	let current: unknown = specs;
	for (const key of path.split('.')) {
		if (current === null || typeof current !== 'object' || Array.isArray(current)) return undefined;
		current = (current as Record<string, unknown>)[key];
	}
	return current;
}

/** Text compares without regard to case, so "auric a64" matches "Auric A64". */
function same(a: unknown, b: unknown): boolean {
	if (typeof a === 'string' && typeof b === 'string') return a.toLowerCase() === b.toLowerCase();
	return a === b;
}

/** Whether `actual` (a part's spec value) meets one condition; undefined or null never does. */
export function conditionHolds(
	actual: unknown,
	operator: CautionOperator,
	expected: ConditionValue
): boolean {
	if (actual === undefined || actual === null) return false;
	switch (operator) {
		case 'eq':
			return same(actual, expected);
		case 'ne':
			return !Array.isArray(actual) && !same(actual, expected);
		case 'lt':
		case 'lte':
		case 'gt':
		case 'gte': {
			if (typeof actual !== 'number' || typeof expected !== 'number') return false;
			if (operator === 'lt') return actual < expected;
			if (operator === 'lte') return actual <= expected;
			if (operator === 'gt') return actual > expected;
			return actual >= expected;
		}
		case 'in':
			return Array.isArray(expected) && (expected as unknown[]).some((e) => same(actual, e));
		case 'contains':
			if (Array.isArray(actual)) return actual.some((a) => same(a, expected));
			return (
				typeof actual === 'string' &&
				typeof expected === 'string' &&
				actual.toLowerCase().includes(expected.toLowerCase())
			);
	}
}

/** Keys of the slots the rule is about, or null when it does not fire. */
export function ruleMatches(
	build: BuildParts,
	conditions: readonly CautionCondition[]
): string[] | null {
	if (conditions.length === 0) return null;
	const byCategory = new Map<PartCategory, CautionCondition[]>();
	for (const c of conditions)
		byCategory.set(c.category, [...(byCategory.get(c.category) ?? []), c]);
	const slots: string[] = [];
	for (const [category, list] of byCategory) {
		const matching = build.filter(
			(slot) =>
				slot.category === category &&
				list.every((c) => conditionHolds(valueAt(slot.part.specs, c.field), c.operator, c.value))
		);
		if (matching.length === 0) return null;
		for (const slot of matching) slots.push(slot.key);
	}
	return slots;
}

/** One `caution` finding per firing rule, in the order the rules are given. Pure. */
export function pairingCautions(build: BuildParts, rules: readonly CautionRule[]): Finding[] {
	const out: Finding[] = [];
	for (const rule of rules) {
		const slots = ruleMatches(build, rule.conditions);
		if (!slots) continue;
		out.push({
			rule: pairingCautionRuleName(rule.id),
			severity: 'caution',
			message: rule.message,
			slots,
			cautionRuleId: rule.id,
			authorName: rule.authorName
		});
	}
	return out;
}
