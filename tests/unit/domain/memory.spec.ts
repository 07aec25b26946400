import { describe, expect, it } from 'vitest';
import { cycleTimeNs, firstWordLatencyNs, kitCapacityGb } from '$lib/domain/memory';

/*
 * Formula: Crucial, "Speed vs. latency": "latency (ns) = clock cycle time (ns) x number of
 * clock cycles", cycle = 2000 / (MT/s) — docs/sources.md 5c, status V for the formula and
 * D for each worked value (arithmetic shown).
 */
describe('first-word latency = CL × 2000 / (MT/s) (docs/sources.md 5c)', () => {
	it('DDR5-6000 CL30 = 10.0 ns (V formula; D: 30 × 2000 / 6000 = 10)', () => {
		expect(firstWordLatencyNs(30, 6000)).toBeCloseTo(10.0, 10);
	});

	it('DDR4-3200 CL16 = 10.0 ns (V formula; D: 16 × 2000 / 3200 = 10)', () => {
		expect(firstWordLatencyNs(16, 3200)).toBeCloseTo(10.0, 10);
	});

	it('DDR5-4800 CL40 = 16.67 ns (V formula; D: 40 × 2000 / 4800 = 16.666…)', () => {
		expect(firstWordLatencyNs(40, 4800)).toBeCloseTo(16.67, 2);
	});

	it('DDR5-6000 CL42, the JEDEC "A" bin (docs/sources.md 5b, V2), = 14.0 ns (D: 42 × 2000 / 6000 = 14)', () => {
		expect(firstWordLatencyNs(42, 6000)).toBeCloseTo(14.0, 10);
	});

	it('cycle time halves the transfer period because DDR moves data twice per clock (D: 2000 / 3200 = 0.625 ns)', () => {
		expect(cycleTimeNs(3200)).toBeCloseTo(0.625, 10);
	});

	it('rejects fractional CAS latency and non-positive data rates', () => {
		expect(() => firstWordLatencyNs(30.5, 6000)).toThrow(RangeError);
		expect(() => firstWordLatencyNs(30, 0)).toThrow(RangeError);
	});
});

describe('kit capacity (D)', () => {
	it('modules × GB per module × kits: 2 × 16 GB × 2 kits = 64 GB', () => {
		expect(kitCapacityGb({ modules: 2, moduleGb: 16 }, 2)).toBe(64);
	});
});
