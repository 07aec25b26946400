import { describe, expect, it } from 'vitest';
import type { BuildPart } from '$lib/domain/build-parts';
import { fitReport } from '$lib/domain/fit';
import { powerBudget } from '$lib/domain/power';
import { SPEC_SCHEMAS } from '$lib/schemas/part-specs';
import type { PartCategory } from '$lib/domain/types';
import { caseMismatches, FIT_CASES, type CaseSlot } from '../../fixtures/fit-cases';

/*
 * The hand-worked fit and power cases (tests/fixtures/fit-cases.ts, where each case shows
 * its arithmetic and source row) against the domain functions. The same table runs over
 * HTTP against the production build in tests/e2e/fit-cases.e2e.ts.
 */

/** As the API does it: JSON in, specs through the category's schema, quantity 1 by default. */
function toBuild(slots: CaseSlot[]): BuildPart[] {
	const wire = JSON.parse(JSON.stringify(slots)) as CaseSlot[];
	return wire.map((s) => {
		const specs = SPEC_SCHEMAS[s.category as PartCategory].parse(s.specs);
		return {
			key: s.key,
			label: s.key,
			category: s.category,
			quantity: s.quantity ?? 1,
			part: { brand: s.brand, model: s.model, specs }
		} as BuildPart;
	});
}

describe('hand-worked fit and power cases (tests/fixtures/fit-cases.ts)', () => {
	it('has at least 40 cases with unique names, each showing its arithmetic and naming its source', () => {
		expect(FIT_CASES.length).toBeGreaterThanOrEqual(40);
		expect(new Set(FIT_CASES.map((c) => c.name)).size).toBe(FIT_CASES.length);
		for (const c of FIT_CASES) {
			expect(c.arithmetic.length, c.name).toBeGreaterThan(10);
			// A docs/sources.md row, the design's own rule, or the rule-of-thumb label.
			expect(c.source, c.name).toMatch(
				/docs\/sources\.md|docs\/architecture\.md|common practice, no published source|the design/
			);
		}
	});

	it.each(FIT_CASES.map((c) => [c.name, c] as const))('%s', (_name, c) => {
		const build = toBuild(c.slots);
		const power = powerBudget(build) as unknown as Record<string, unknown>;
		expect(caseMismatches(c, fitReport(build), power), `${c.arithmetic} (${c.source})`).toEqual([]);
	});
});
