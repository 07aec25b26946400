/**
 * PCI Express link bandwidth by generation.
 *
 * Convention (name it wherever a number is shown): **usable bandwidth in one direction**,
 * in GB/s (10^9 bytes per second), after line encoding (8b/10b for 1.0/2.0, 128b/130b for
 * 3.0–5.0) and before packet/protocol overhead. PCI-SIG headlines quote raw bidirectional
 * figures instead (4.0 x16 "64 GB/s"), which is why a 4.0 x4 drive link shows here as
 * ≈ 7.88 GB/s (docs/sources.md 6 and note 6).
 *
 * Sources: PCI-SIG PCIe 3.0 FAQ (8 GT/s, 128b/130b); rates double per generation.
 * 6.0 (64 GT/s, PAM4, FLIT with FEC) is left out: its usable share depends on the FLIT
 * split, which we only have from memory (docs/sources.md 6, status M).
 */

export const PCIE_BANDWIDTH_CONVENTION =
	'usable bandwidth in one direction, after line encoding (GB/s = 10⁹ bytes/s)';

export type PcieGeneration = 1 | 2 | 3 | 4 | 5;

interface GenerationSpec {
	/** Transfer rate per lane in GT/s (one bit per transfer per lane). */
	transferRateGts: number;
	/** Line encoding: payload bits per encoded block of `blockBits`. */
	payloadBits: number;
	blockBits: number;
	/** Version label as the trade writes it. */
	label: string;
}

export const PCIE_GENERATIONS: Readonly<Record<PcieGeneration, GenerationSpec>> = {
	1: { transferRateGts: 2.5, payloadBits: 8, blockBits: 10, label: 'PCIe 1.0' },
	2: { transferRateGts: 5, payloadBits: 8, blockBits: 10, label: 'PCIe 2.0' },
	3: { transferRateGts: 8, payloadBits: 128, blockBits: 130, label: 'PCIe 3.0' },
	4: { transferRateGts: 16, payloadBits: 128, blockBits: 130, label: 'PCIe 4.0' },
	5: { transferRateGts: 32, payloadBits: 128, blockBits: 130, label: 'PCIe 5.0' }
};

function specOf(gen: number): GenerationSpec {
	const spec = PCIE_GENERATIONS[gen as PcieGeneration];
	if (!spec) throw new RangeError(`Unsupported PCIe generation: ${gen}`);
	return spec;
}

/** "PCIe 4.0" for 4. */
export function pcieLabel(gen: number): string {
	return specOf(gen).label;
}

/**
 * Usable GB/s per lane, one direction: GT/s × encoding efficiency ÷ 8 bits per byte.
 * 3.0: 8 × 128/130 ÷ 8 = 0.985; 4.0: 1.969; 5.0: 3.938.
 */
export function laneBandwidthGBs(gen: number): number {
	const spec = specOf(gen);
	return (spec.transferRateGts * spec.payloadBits) / spec.blockBits / 8;
}

/** Usable GB/s of a link of `lanes` lanes, one direction (4.0 x4 ≈ 7.88). */
export function linkBandwidthGBs(gen: number, lanes: number): number {
	if (![1, 2, 4, 8, 16].includes(lanes))
		throw new RangeError(`PCIe links have 1, 2, 4, 8 or 16 lanes, got ${lanes}`);
	return laneBandwidthGBs(gen) * lanes;
}

/** For messages: two decimals, the way the numbers are usually quoted ("7.88 GB/s"). */
export function formatGBs(gbs: number): string {
	return `${gbs.toFixed(2)} GB/s`;
}
