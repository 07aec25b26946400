/**
 * Memory timing arithmetic.
 *
 * DDR transfers twice per clock, so one clock cycle lasts 2000 / (MT/s) ns, and the
 * first word arrives after CAS-latency cycles (Crucial, "Speed vs. latency":
 * "latency (ns) = clock cycle time (ns) x number of clock cycles"; docs/sources.md 5c).
 */

/** Clock cycle time in ns for a data rate in MT/s (DDR: two transfers per cycle). */
export function cycleTimeNs(speedMts: number): number {
	if (!(speedMts > 0) || !Number.isFinite(speedMts))
		throw new RangeError(`Data rate must be positive, got ${speedMts}`);
	return 2000 / speedMts;
}

/**
 * First-word latency in ns = CL × 2000 / (MT/s). DDR5-6000 CL30 → 10.0 ns;
 * DDR5-4800 CL40 → 16.67 ns. Unrounded: round only for display.
 */
export function firstWordLatencyNs(casLatency: number, speedMts: number): number {
	if (!Number.isInteger(casLatency) || casLatency <= 0) {
		throw new RangeError(
			`CAS latency must be a positive whole number of cycles, got ${casLatency}`
		);
	}
	return casLatency * cycleTimeNs(speedMts);
}

/** Total capacity in GB of a kit bought `quantity` times. */
export function kitCapacityGb(kit: { modules: number; moduleGb: number }, quantity = 1): number {
	return kit.modules * kit.moduleGb * quantity;
}
