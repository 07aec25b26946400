/*
 * Pairing cautions: editor rules over spec fields. These are checks of the rule language's
 * logic on worked examples (no computation with a published value is involved); the
 * example rules' advice is common practice, no published source.
 */
import { describe, expect, it } from 'vitest';
import { dropIns, type GuideSlot } from '../../../src/lib/domain/dropins';
import {
	conditionHolds,
	pairingCautionRuleName,
	pairingCautions,
	ruleMatches,
	type CautionCondition,
	type CautionRule
} from '../../../src/lib/domain/pairing-cautions';
import {
	cautionRuleInput,
	CONDITION_FIELDS,
	describeCondition,
	ruleFromForm
} from '../../../src/lib/schemas/caution-rules';
import { cpuAm5, goodBuild, gpu2x8, slot, withSlots } from './fixtures';

const quadCore = slot('cpu', 'cpu', 'Tarnwick', 'Vela 41', {
	socket: 'AM5',
	cores: 4,
	threads: 8,
	baseClockGhz: 3.8,
	boostClockGhz: 4.8,
	tdpW: 65,
	memoryTypes: ['DDR5'],
	integratedGraphics: true,
	bundledCooler: true
});
const bigCard = slot('gpu', 'gpu', 'Ferrant', 'Kestrel 24G', {
	chip: 'K90',
	vramGb: 24,
	lengthMm: 320,
	slotWidth: 3,
	boardPowerW: 450,
	powerConnectors: { pin6: 0, pin8: 0, h12v2x6: 1 },
	pcieGen: 5
});

const lowCoreRule: CautionRule = {
	id: 7,
	message: 'A K90 card with fewer than six CPU cores: expect lower 1 % lows.',
	authorName: 'Dario Vesely',
	conditions: [
		{ category: 'gpu', field: 'chip', operator: 'eq', value: 'K90' },
		{ category: 'cpu', field: 'cores', operator: 'lt', value: 6 }
	]
};

describe('conditionHolds: each operator', () => {
	it('eq and ne compare numbers, booleans and text (text without regard to case)', () => {
		expect(conditionHolds(6, 'eq', 6)).toBe(true);
		expect(conditionHolds(6, 'eq', 8)).toBe(false);
		expect(conditionHolds('K90', 'eq', 'k90')).toBe(true);
		expect(conditionHolds(true, 'eq', true)).toBe(true);
		expect(conditionHolds(false, 'eq', true)).toBe(false);
		expect(conditionHolds(6, 'ne', 8)).toBe(true);
		expect(conditionHolds('AM5', 'ne', 'am5')).toBe(false);
	});

	it('lt, lte, gt and gte are strict or inclusive at the boundary', () => {
		expect(conditionHolds(5, 'lt', 6)).toBe(true);
		expect(conditionHolds(6, 'lt', 6)).toBe(false);
		expect(conditionHolds(6, 'lte', 6)).toBe(true);
		expect(conditionHolds(7, 'lte', 6)).toBe(false);
		expect(conditionHolds(7, 'gt', 6)).toBe(true);
		expect(conditionHolds(6, 'gt', 6)).toBe(false);
		expect(conditionHolds(6, 'gte', 6)).toBe(true);
		expect(conditionHolds(5, 'gte', 6)).toBe(false);
	});

	it('ordering operators never hold for text, however it reads', () => {
		expect(conditionHolds('5', 'lt', 6)).toBe(false);
		expect(conditionHolds('AM5', 'gt', 4)).toBe(false);
	});

	it('in holds when the value is one of a list', () => {
		expect(conditionHolds('AM5', 'in', ['AM4', 'AM5'])).toBe(true);
		expect(conditionHolds('LGA1700', 'in', ['AM4', 'AM5'])).toBe(false);
		expect(conditionHolds(4, 'in', [3, 4])).toBe(true);
		expect(conditionHolds(5, 'in', [3, 4])).toBe(false);
	});

	it('contains looks inside a list field, or inside text', () => {
		expect(conditionHolds(['DDR4', 'DDR5'], 'contains', 'DDR4')).toBe(true);
		expect(conditionHolds(['DDR5'], 'contains', 'DDR4')).toBe(false);
		expect(conditionHolds('Auric A64', 'contains', 'auric')).toBe(true);
		expect(conditionHolds('Cobalt C7', 'contains', 'Auric')).toBe(false);
	});

	it('a missing value meets no condition, not even ne', () => {
		for (const op of ['eq', 'ne', 'lt', 'gte', 'in', 'contains'] as const) {
			expect(conditionHolds(undefined, op, op === 'in' ? [1] : 1)).toBe(false);
		}
	});
});

describe('pairingCautions', () => {
	it('fires when every condition holds, as a caution with the rule text, author, id and slots', () => {
		const findings = pairingCautions(withSlots(quadCore, bigCard), [lowCoreRule]);
		expect(findings).toEqual([
			{
				rule: pairingCautionRuleName(7),
				severity: 'caution',
				message: lowCoreRule.message,
				slots: ['gpu', 'cpu'],
				cautionRuleId: 7,
				authorName: 'Dario Vesely'
			}
		]);
	});

	it('does not fire when only one of two conditions holds', () => {
		expect(pairingCautions(withSlots(bigCard), [lowCoreRule])).toEqual([]); // six-core CPU
		expect(pairingCautions(withSlots(quadCore), [lowCoreRule])).toEqual([]); // K70 card
	});

	it('does not fire when the build has no part of a named category', () => {
		const noGpu = goodBuild().filter((s) => s.category !== 'gpu');
		expect(
			pairingCautions([...noGpu.filter((s) => s.key !== 'cpu'), quadCore], [lowCoreRule])
		).toEqual([]);
	});

	it('needs conditions on the same category to hold for the same part', () => {
		const sameCard: CautionCondition[] = [
			{ category: 'gpu', field: 'chip', operator: 'eq', value: 'K90' },
			{ category: 'gpu', field: 'vramGb', operator: 'lt', value: 20 }
		];
		// Two cards: the K90 has 24 GB, the K70 has 16 GB; no single card meets both.
		const twoCards = [...goodBuild(), { ...bigCard, key: 'gpu-2' }];
		expect(ruleMatches(twoCards, sameCard)).toBeNull();
		const smallK90 = slot('gpu', 'gpu-3', 'Ferrant', 'Kestrel 16G K90', {
			...bigCard.part.specs,
			vramGb: 16
		});
		expect(ruleMatches([...twoCards, smallK90], sameCard)).toEqual(['gpu-3']);
	});

	it('reads nested spec fields by dotted path', () => {
		const rule: CautionRule = {
			...lowCoreRule,
			conditions: [
				{ category: 'gpu', field: 'powerConnectors.h12v2x6', operator: 'gte', value: 1 },
				{ category: 'psu', field: 'connectors.h12v2x6', operator: 'gte', value: 1 }
			]
		};
		expect(pairingCautions(withSlots(bigCard), [rule])).toHaveLength(1);
		expect(pairingCautions(withSlots(gpu2x8), [rule])).toHaveLength(0);
	});

	it('treats a field the part does not have as not holding (optional packagePowerW absent)', () => {
		expect(cpuAm5.part.specs.packagePowerW).toBeUndefined();
		const rule: CautionRule = {
			...lowCoreRule,
			conditions: [
				{ category: 'cpu', field: 'packagePowerW', operator: 'gt', value: 0 },
				{ category: 'gpu', field: 'vramGb', operator: 'gt', value: 0 }
			]
		};
		expect(pairingCautions(goodBuild(), [rule])).toEqual([]);
		expect(
			pairingCautions(goodBuild(), [
				{
					...rule,
					conditions: [
						...rule.conditions.slice(1),
						{ category: 'cpu', field: 'noSuchField', operator: 'eq', value: 1 }
					]
				}
			])
		).toEqual([]);
	});

	it('gives one finding per firing rule, in rule order', () => {
		const second: CautionRule = {
			...lowCoreRule,
			id: 9,
			message: 'Second rule.',
			conditions: [
				{ category: 'cpu', field: 'bundledCooler', operator: 'eq', value: true },
				{ category: 'gpu', field: 'pcieGen', operator: 'eq', value: 5 }
			]
		};
		const findings = pairingCautions(withSlots(quadCore, bigCard), [second, lowCoreRule]);
		expect(findings.map((f) => f.cautionRuleId)).toEqual([9, 7]);
	});

	it('joins the drop-in pass: an alternate that clears the pairing shows the caution as gone', () => {
		const slots = withSlots(quadCore, bigCard).map(
			(s) =>
				({
					key: s.key,
					label: s.label,
					category: s.category,
					quantity: s.quantity,
					pick: s.part,
					alternates: s.key === 'gpu' ? [{ id: 'alt-1', part: gpu2x8.part }] : []
				}) as GuideSlot
		);
		const report = dropIns(slots, [lowCoreRule]);
		expect(report.picks.filter((f) => f.cautionRuleId === 7)).toHaveLength(1);
		const alt = report.alternates.find((a) => a.alternateId === 'alt-1');
		expect(alt?.gone.map((f) => f.message)).toContain(lowCoreRule.message);
		// Without rules the drop-in pass is as before.
		expect(dropIns(slots).picks.some((f) => f.cautionRuleId !== undefined)).toBe(false);
	});
});

describe('the rule schema, checked against the real spec schemas', () => {
	const base = {
		title: 'Big card, few cores',
		message: 'Expect lower 1 % lows with this pairing.',
		active: true
	};

	it('reads form text into typed values per field kind', () => {
		const parsed = cautionRuleInput.safeParse(
			ruleFromForm({
				...base,
				active: 'on',
				'conditions.0.category': 'gpu',
				'conditions.0.field': 'chip',
				'conditions.0.operator': 'in',
				'conditions.0.value': 'K90, K80',
				'conditions.1.category': 'cpu',
				'conditions.1.field': 'cores',
				'conditions.1.operator': 'lt',
				'conditions.1.value': '6',
				'conditions.2.category': 'cpu',
				'conditions.2.field': 'socket',
				'conditions.2.operator': 'eq',
				'conditions.2.value': 'am5',
				'conditions.3.category': 'cpu',
				'conditions.3.field': 'integratedGraphics',
				'conditions.3.operator': 'eq',
				'conditions.3.value': 'no',
				'conditions.4.category': 'cpu',
				'conditions.4.field': 'memoryTypes',
				'conditions.4.operator': 'contains',
				'conditions.4.value': 'ddr4'
			})
		);
		expect(parsed.success).toBe(true);
		expect(parsed.data?.conditions).toEqual([
			{ category: 'gpu', field: 'chip', operator: 'in', value: ['K90', 'K80'] },
			{ category: 'cpu', field: 'cores', operator: 'lt', value: 6 },
			{ category: 'cpu', field: 'socket', operator: 'eq', value: 'AM5' },
			{ category: 'cpu', field: 'integratedGraphics', operator: 'eq', value: false },
			{ category: 'cpu', field: 'memoryTypes', operator: 'contains', value: 'DDR4' }
		]);
		expect(describeCondition(parsed.data!.conditions[1]!)).toBe('CPU cores is less than 6');
	});

	it('gives field-level messages: unknown field, operator not for the type, value of the wrong type', () => {
		const parsed = cautionRuleInput.safeParse({
			...base,
			conditions: [
				{ category: 'gpu', field: 'chipFamily', operator: 'eq', value: 'K90' },
				{ category: 'cpu', field: 'cores', operator: 'contains', value: '4' },
				{ category: 'cpu', field: 'cores', operator: 'lt', value: 'six' },
				{ category: 'cpu', field: 'socket', operator: 'eq', value: 'AM3' },
				{ category: 'storage', field: 'pcieGen', operator: 'eq', value: '6' }
			]
		});
		expect(parsed.success).toBe(false);
		const paths = Object.fromEntries(
			parsed.error!.issues.map((i) => [i.path.join('.'), i.message])
		);
		expect(paths['conditions.0.field']).toMatch(/no spec field "chipFamily"/);
		expect(paths['conditions.1.operator']).toMatch(/does not apply to Cores/);
		expect(paths['conditions.2.value']).toMatch(/not a number/);
		expect(paths['conditions.3.value']).toMatch(/one of AM4, AM5, LGA1700, LGA1851/);
		expect(paths['conditions.4.value']).toMatch(/one of 3, 4, 5/);
	});

	it('needs at least two conditions, and drops blank form rows', () => {
		const raw = ruleFromForm({
			...base,
			active: 'on',
			'conditions.0.category': 'cpu',
			'conditions.0.field': 'cores',
			'conditions.0.operator': 'lt',
			'conditions.0.value': '6',
			'conditions.1.value': ' '
		});
		expect(raw.conditions).toHaveLength(1);
		const parsed = cautionRuleInput.safeParse(raw);
		expect(parsed.error?.issues.map((i) => i.path.join('.'))).toEqual(['conditions']);
	});

	it('offers every top-level and nested spec field of a category, except repeated rows', () => {
		const board = CONDITION_FIELDS.motherboard.map((f) => f.path);
		expect(board).toContain('chipset');
		expect(board).not.toContain('m2Slots');
		expect(CONDITION_FIELDS.psu.map((f) => f.path)).toContain('connectors.eps8');
		expect(CONDITION_FIELDS.cpu.find((f) => f.path === 'memoryTypes')?.operators).toEqual([
			'contains'
		]);
	});
});
