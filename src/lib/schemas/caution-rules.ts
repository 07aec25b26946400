import { z } from 'zod';
import { MAX_ID, wholeNumberText } from './primitives';
import {
	CAUTION_OPERATORS,
	OPERATOR_LABELS,
	type CautionCondition,
	type CautionOperator,
	type ConditionValue
} from '$lib/domain/pairing-cautions';
import { CATEGORY_LABELS, PART_CATEGORIES, type PartCategory } from '$lib/domain/types';
import { specFields, type SpecField } from './spec-form';

/*
 * The pairing-caution rule language, checked against the real spec schemas: the fields a
 * condition can name come from SPEC_SCHEMAS (via spec-form's descriptors), so a field
 * added to a schema is usable at once and a removed one is refused. The catalog is plain
 * data, so the editor page can offer it without shipping zod.
 */

/** What kind of value a field holds, which decides its operators and how a value is read. */
export type ConditionFieldKind = 'number' | 'choice' | 'number-choice' | 'text' | 'yes-no' | 'list';

export interface ConditionField {
	/** Dotted spec path (`cores`, `powerConnectors.pin8`). */
	path: string;
	label: string;
	kind: ConditionFieldKind;
	operators: CautionOperator[];
	/** Allowed values of a choice or list field. */
	options?: string[];
}

export const OPERATORS_BY_KIND: Record<ConditionFieldKind, CautionOperator[]> = {
	number: ['eq', 'ne', 'lt', 'lte', 'gt', 'gte', 'in'],
	'number-choice': ['eq', 'ne', 'lt', 'lte', 'gt', 'gte', 'in'],
	choice: ['eq', 'ne', 'in'],
	text: ['eq', 'ne', 'in', 'contains'],
	'yes-no': ['eq', 'ne'],
	list: ['contains']
};

function conditionFields(fields: SpecField[], prefix = '', labelPrefix = ''): ConditionField[] {
	const out: ConditionField[] = [];
	for (const f of fields) {
		const path = prefix + f.key;
		const label = labelPrefix + f.label;
		const add = (kind: ConditionFieldKind, options?: string[]) =>
			out.push({
				path,
				label,
				kind,
				operators: OPERATORS_BY_KIND[kind],
				...(options ? { options } : {})
			});
		if (f.kind === 'number') add('number');
		else if (f.kind === 'select') add(f.numeric ? 'number-choice' : 'choice', f.options);
		else if (f.kind === 'text') add('text');
		else if (f.kind === 'checkbox') add('yes-no');
		else if (f.kind === 'multi') add('list', f.options);
		else if (f.kind === 'group') out.push(...conditionFields(f.fields, `${path}.`, `${label}: `));
		// Repeated rows (a board's M.2 slots) have no single value to compare; left out.
	}
	return out;
}

/** Every category's usable fields, in schema order. */
export const CONDITION_FIELDS: Record<PartCategory, ConditionField[]> = Object.fromEntries(
	PART_CATEGORIES.map((c) => [c, conditionFields(specFields(c))])
) as Record<PartCategory, ConditionField[]>;

export function conditionField(category: PartCategory, path: string): ConditionField | undefined {
	return CONDITION_FIELDS[category].find((f) => f.path === path);
}

export const MAX_CONDITIONS = 6;
/** Blank condition rows the form offers; blank rows are dropped before checking. */
export const FORM_CONDITION_ROWS = 4;

const NUMBER_TEXT = /^-?\d+(?:\.\d+)?$/;

/** A typed-in value as the field's kind reads it, or a message saying what is wrong. */
function readValue(
	field: ConditionField,
	operator: CautionOperator,
	raw: string
): { value: ConditionValue } | { message: string } {
	const text = raw.trim();
	if (text === '') return { message: 'Enter a value.' };
	const items =
		operator === 'in'
			? text
					.split(',')
					.map((t) => t.trim())
					.filter((t) => t !== '')
			: [text];
	if (items.length === 0) return { message: 'Enter one or more values, separated by commas.' };
	if (items.length > 20) return { message: 'Enter at most 20 values.' };
	const numeric = field.kind === 'number' || field.kind === 'number-choice';
	const read: Array<string | number | boolean> = [];
	for (const item of items) {
		if (numeric) {
			if (!NUMBER_TEXT.test(item))
				return { message: `"${item}" is not a number; ${field.label} is a number.` };
			const n = Number(item);
			if (field.kind === 'number-choice' && !field.options?.includes(String(n))) {
				return {
					message: `${field.label} is one of ${field.options?.join(', ')}; "${item}" is not.`
				};
			}
			read.push(n);
		} else if (field.kind === 'yes-no') {
			const lower = item.toLowerCase();
			if (lower !== 'yes' && lower !== 'no' && lower !== 'true' && lower !== 'false') {
				return { message: `${field.label} is yes or no; enter "yes" or "no".` };
			}
			read.push(lower === 'yes' || lower === 'true');
		} else if (field.kind === 'choice' || field.kind === 'list') {
			const match = field.options?.find((o) => o.toLowerCase() === item.toLowerCase());
			if (!match)
				return {
					message: `${field.label} is one of ${field.options?.join(', ')}; "${item}" is not.`
				};
			read.push(match);
		} else {
			if (item.length > 60) return { message: 'Keep text values to 60 characters.' };
			read.push(item);
		}
	}
	if (operator === 'in') return { value: read as string[] | number[] };
	return { value: read[0] as ConditionValue };
}

/** One condition row as the form sends it (all text). */
const conditionText = z.object({
	category: z.string().trim(),
	field: z.string().trim(),
	operator: z.string().trim(),
	value: z.string()
});

/** The condition rows read into typed conditions, with messages per row and part (`0.field`). */
const conditionsInput = z
	.array(conditionText)
	.max(MAX_CONDITIONS, `At most ${MAX_CONDITIONS} conditions.`)
	.transform((rows, ctx) => {
		const conditions: CautionCondition[] = [];
		rows.forEach((c, i) => {
			const at = (key: string, message: string) =>
				ctx.addIssue({ code: 'custom', path: [i, key], message, input: c });
			const category = PART_CATEGORIES.find((p) => p === c.category);
			if (!category) return at('category', 'Choose a part category.');
			const field = conditionField(category, c.field);
			if (!field) {
				return at(
					'field',
					c.field === ''
						? 'Choose a spec field.'
						: `${CATEGORY_LABELS[category]} has no spec field "${c.field}".`
				);
			}
			const operator = CAUTION_OPERATORS.find((o) => o === c.operator);
			if (!operator) return at('operator', 'Choose a comparison.');
			if (!field.operators.includes(operator)) {
				return at(
					'operator',
					`"${operator}" does not apply to ${field.label}; use ${field.operators.join(', ')}.`
				);
			}
			const value = readValue(field, operator, c.value);
			if ('message' in value) return at('value', value.message);
			conditions.push({ category, field: field.path, operator, value: value.value });
		});
		if (rows.length < 2)
			ctx.addIssue({
				code: 'custom',
				path: [],
				message: 'A pairing caution needs at least two conditions.',
				input: rows
			});
		return conditions;
	});

/**
 * The whole rule as the form sends it. Each property is checked on its own, so a short
 * title and a wrong condition value are reported together.
 */
export const cautionRuleInput = z.object({
	title: z
		.string()
		.trim()
		.min(3, 'Enter a title of at least 3 characters.')
		.max(120, 'Keep the title to 120 characters.'),
	message: z
		.string()
		.trim()
		.min(10, 'Enter the caution readers see, at least 10 characters.')
		.max(500, 'Keep the caution to 500 characters.'),
	active: z.boolean(),
	conditions: conditionsInput
});

export type CautionRuleInput = z.output<typeof cautionRuleInput>;

/** Form fields (flat, `conditions.0.field`...) → the object cautionRuleInput checks; blank rows are dropped. */
export function ruleFromForm(fields: Record<string, string>) {
	const conditions: Array<{ category: string; field: string; operator: string; value: string }> =
		[];
	for (let i = 0; i < MAX_CONDITIONS; i++) {
		const row = {
			category: fields[`conditions.${i}.category`] ?? '',
			field: fields[`conditions.${i}.field`] ?? '',
			operator: fields[`conditions.${i}.operator`] ?? '',
			value: fields[`conditions.${i}.value`] ?? ''
		};
		if (Object.values(row).every((v) => v.trim() === '')) continue;
		conditions.push(row);
	}
	return {
		title: fields.title ?? '',
		message: fields.message ?? '',
		active: fields.active === 'on' || fields.active === 'true',
		conditions
	};
}

/** A stored value as the form's text box shows it. */
export function valueText(value: ConditionValue): string {
	if (Array.isArray(value)) return value.join(', ');
	if (typeof value === 'boolean') return value ? 'yes' : 'no';
	return String(value);
}

export const ruleIdInput = z.object({ ruleId: wholeNumberText('Unknown rule.', 1, MAX_ID) });
export const ruleVersionInput = wholeNumberText('Reload the page and try again.', 1);

/** "Graphics card chip is one of Cobalt C8, Auric A90", for lists and the audit trail. */
export function describeCondition(c: CautionCondition): string {
	const label = conditionField(c.category, c.field)?.label ?? c.field;
	return `${CATEGORY_LABELS[c.category]} ${label.charAt(0).toLowerCase()}${label.slice(1)} ${OPERATOR_LABELS[c.operator]} ${valueText(c.value)}`;
}
