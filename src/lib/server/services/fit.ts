/**
 * Fit report and power budget for a list of slots from the API or the editors: catalog
 * parts are looked up, typed-in specs validated against their category's schema.
 */
import { fitReport, summarize } from '$lib/domain/fit';
import { pairingCautions } from '$lib/domain/pairing-cautions';
import type { BuildPart } from '$lib/domain/fit';
import { powerBudget } from '$lib/domain/power';
import { CATEGORY_LABELS } from '$lib/domain/types';
import { SPEC_SCHEMAS } from '$lib/schemas/part-specs';
import type { FitInput } from '$lib/schemas/fit';
import { Part } from '$lib/server/db';
import type { FitResult } from '$lib/views';
import { activeRules } from './caution-rules';
import type { Invalid, Issues } from '$lib/schemas/issues';

export type FitOutcome = { kind: 'ok'; result: FitResult } | Invalid;

export async function check(input: FitInput): Promise<FitOutcome> {
	const ids = input.slots.flatMap((s) => ('partId' in s ? [s.partId] : []));
	const parts = new Map((await Part.findAll({ where: { id: ids } })).map((p) => [p.id, p]));
	const issues: Issues = {};
	const build: BuildPart[] = [];

	input.slots.forEach((slot, i) => {
		const key = slot.key ?? `${slot.category}-${i + 1}`;
		const label = slot.label ?? CATEGORY_LABELS[slot.category];
		if ('partId' in slot) {
			const part = parts.get(slot.partId);
			if (!part)
				return void (issues[`slots.${i}.partId`] = [
					`No part with id ${slot.partId} in the catalog.`
				]);
			if (part.category !== slot.category) {
				return void (issues[`slots.${i}.category`] = [
					`Part ${slot.partId} is a ${part.category}, not a ${slot.category}.`
				]);
			}
			build.push({
				key,
				label,
				category: slot.category,
				quantity: slot.quantity,
				part: { brand: part.brand, model: part.model, specs: part.specs }
			} as BuildPart);
			return;
		}
		const specs = SPEC_SCHEMAS[slot.category].safeParse(slot.specs);
		if (!specs.success) {
			for (const issue of specs.error.issues) {
				const path = [`slots.${i}.specs`, ...issue.path.map(String)].join('.');
				(issues[path] ??= []).push(issue.message);
			}
			return;
		}
		build.push({
			key,
			label,
			category: slot.category,
			quantity: slot.quantity,
			part: { brand: slot.brand, model: slot.model, specs: specs.data }
		} as BuildPart);
	});

	if (Object.keys(issues).length > 0) return { kind: 'invalid', issues };
	// Editors' pairing cautions follow the built-in checks (one query for all rules).
	const findings = [...fitReport(build), ...pairingCautions(build, await activeRules())];
	return {
		kind: 'ok',
		result: { findings, summary: summarize(findings), power: powerBudget(build) }
	};
}
