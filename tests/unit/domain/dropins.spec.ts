import { describe, expect, it } from 'vitest';
import { dropIns, type GuideSlot } from '$lib/domain/dropins';
import { fitReport } from '$lib/domain/fit';
import type { BuildPart } from '$lib/domain/build-parts';
import { goodBuild, slot } from './fixtures';

/*
 * The drop-in pass is the fit report (tested against published values in fit.spec.ts)
 * run once per alternate; these tests check the swap and the comparison with the picks.
 */

const ddr4Kit = slot('memory', 'memory', 'Halden', 'Pulse DDR4-3200 2 × 16 GB', {
	type: 'DDR4',
	modules: 2,
	moduleGb: 16,
	speedMts: 3200,
	casLatency: 16,
	voltage: 1.35
});
const ddr5Big = slot('memory', 'memory', 'Halden', 'Flux DDR5-6000 2 × 32 GB', {
	type: 'DDR5',
	modules: 2,
	moduleGb: 32,
	speedMts: 6000,
	casLatency: 30,
	voltage: 1.35
});
const longCard = slot('gpu', 'gpu', 'Ferrant', 'Kestrel XL', {
	chip: 'K80',
	vramGb: 16,
	lengthMm: 336,
	slotWidth: 3.2,
	boardPowerW: 300,
	powerConnectors: { pin6: 0, pin8: 0, h12v2x6: 1 },
	pcieGen: 5
});
const gen5Drive = slot('storage', 'storage', 'Brightmoor', 'N5 2 TB', {
	interface: 'nvme',
	formFactor: 'm2-2280',
	pcieGen: 5,
	capacityGb: 2000,
	readMbs: 14000,
	writeMbs: 12000
});
const loop360 = slot('cooler', 'cooler', 'Ostery', 'Loop 360', {
	type: 'liquid',
	radiatorMm: 360,
	sockets: ['AM5'],
	ratedHeatW: 300
});

/** The good build as guide slots, with the given alternates per slot key. */
function guide(alternates: Record<string, BuildPart[]>): GuideSlot[] {
	return goodBuild().map(
		(s) =>
			({
				key: s.key,
				label: s.label,
				category: s.category,
				quantity: s.quantity,
				pick: s.part,
				alternates: (alternates[s.key] ?? []).map((a, i) => ({
					id: `${s.key}-${i + 1}`,
					part: a.part
				}))
			}) as GuideSlot
	);
}

describe('alternates as drop-ins', () => {
	const slots = guide({
		memory: [ddr4Kit, ddr5Big],
		gpu: [longCard],
		storage: [gen5Drive],
		cooler: [loop360]
	});
	const report = dropIns(slots);
	const result = (id: string) => report.alternates.find((a) => a.alternateId === id)!;

	it("returns the picks' report and one result per alternate, in slot and rank order", () => {
		expect(report.picks).toEqual(fitReport(goodBuild()));
		expect(report.alternates.map((a) => [a.slotKey, a.alternateId, a.rank])).toEqual([
			['cooler', 'cooler-1', 1],
			['memory', 'memory-1', 1],
			['memory', 'memory-2', 2],
			['storage', 'storage-1', 1],
			['gpu', 'gpu-1', 1]
		]);
	});

	it('a DDR4 kit for a DDR5 board does not fit; the change names the conflict and its prior severity', () => {
		const r = result('memory-1');
		expect(r.fits).toBe(false);
		expect(r.worst).toBe('conflict');
		expect(r.changed.map((c) => [c.rule, c.before, c.severity])).toEqual([
			['memory-type-board', 'ok', 'conflict'],
			['memory-type-cpu', 'ok', 'conflict']
		]);
		expect(r.changed[0]?.message).toContain('Halden Pulse DDR4-3200 2 × 16 GB is DDR4');
		expect(r.gone).toEqual([]);
	});

	it('a larger kit of the same type fits and changes no severity', () => {
		expect(result('memory-2')).toMatchObject({ fits: true, worst: 'ok', changed: [], gone: [] });
	});

	it('a card too long for the case does not fit (336 mm, case 330 mm); its 12V-2x6 inlet is fed natively', () => {
		const r = result('gpu-1');
		expect(r.fits).toBe(false);
		// 300 W instead of 263 W lifts the load to 537 W: 537 / 850 = 63 %, still within
		// two-thirds of the 850 W pick (D; the two-thirds bound is common practice, no
		// published source), so only the length rule changes.
		expect(r.changed.map((c) => [c.rule, c.before, c.severity])).toEqual([
			['gpu-length-case', 'ok', 'conflict']
		]);
		expect(r.changed[0]?.message).toContain('card is 336 mm, case fits 330 mm');
	});

	it('a PCIe 5.0 drive takes the 5.0 slot of the pick board: fits, no change', () => {
		expect(result('storage-1')).toMatchObject({ fits: true, worst: 'ok', changed: [] });
	});

	it('swapping an air cooler for a liquid one drops the height rule and adds the radiator rule', () => {
		const r = result('cooler-1');
		expect(r.fits).toBe(true);
		// Pump 5 W + 3 fans × 3 W replace one 3 W fan: load 500 → 511 W, 511 / 850 = 60 % —
		// within two-thirds, so the PSU rating stays ok (D; allowances: common practice).
		// The radiator covers three of the case's 9 fan mounts next to its 3 included fans:
		// 3 + 3 = 6 ≤ 9, a new ok line (common practice, no published source).
		expect(r.changed.map((c) => [c.rule, c.before, c.severity])).toEqual([
			['radiator-case', null, 'ok'],
			['fan-mounts', null, 'ok']
		]);
		expect(r.gone.map((f) => f.rule)).toEqual(['cooler-height-case']);
	});

	it('agrees with a fit report computed directly on the swapped build', () => {
		for (const r of report.alternates) {
			const s = slots.find((x) => x.key === r.slotKey)!;
			const alt = s.alternates[r.rank - 1]!;
			const build = goodBuild().map((b) =>
				b.key === r.slotKey ? ({ ...b, part: alt.part } as BuildPart) : b
			);
			const direct = fitReport(build);
			expect(r.fits, String(r.alternateId)).toBe(!direct.some((f) => f.severity === 'conflict'));
		}
	});

	it('does not modify the guide slots it is given', () => {
		const before = JSON.stringify(slots);
		dropIns(slots);
		expect(JSON.stringify(slots)).toBe(before);
	});
});
