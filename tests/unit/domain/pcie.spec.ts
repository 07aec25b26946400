import { describe, expect, it } from 'vitest';
import {
	formatGBs,
	laneBandwidthGBs,
	linkBandwidthGBs,
	PCIE_BANDWIDTH_CONVENTION,
	pcieLabel
} from '$lib/domain/pcie';

/*
 * Rates and encodings: PCI-SIG, PCIe 3.0 FAQ (8 GT/s, 128b/130b) — docs/sources.md 6, status V.
 * Per-lane and x4 figures are arithmetic on those (status D): GT/s × encoding ÷ 8 bits.
 * Convention: usable bandwidth, one direction (docs/sources.md note 6).
 */
describe('PCIe lane bandwidth, usable one direction (docs/sources.md 6)', () => {
	it('1.0: 2.5 GT/s × 8/10 ÷ 8 = 0.25 GB/s per lane (V rates, D arithmetic)', () => {
		expect(laneBandwidthGBs(1)).toBeCloseTo(0.25, 10);
	});

	it('2.0: 5 GT/s × 8/10 ÷ 8 = 0.5 GB/s per lane (V rates, D arithmetic)', () => {
		expect(laneBandwidthGBs(2)).toBeCloseTo(0.5, 10);
	});

	it('3.0: 8 GT/s × 128/130 ÷ 8 = 0.985 GB/s per lane (PCI-SIG PCIe 3.0 FAQ, V; D arithmetic)', () => {
		expect(laneBandwidthGBs(3)).toBeCloseTo(0.985, 3);
	});

	it('4.0: 16 GT/s × 128/130 ÷ 8 = 1.969 GB/s per lane (V rates, D arithmetic)', () => {
		expect(laneBandwidthGBs(4)).toBeCloseTo(1.969, 3);
	});

	it('5.0: 32 GT/s × 128/130 ÷ 8 = 3.938 GB/s per lane (V rates, D arithmetic)', () => {
		expect(laneBandwidthGBs(5)).toBeCloseTo(3.938, 3);
	});

	it('x4 links: 3.0 ≈ 3.94, 4.0 ≈ 7.88, 5.0 ≈ 15.75 GB/s (docs/sources.md 6, D: 4 × per-lane)', () => {
		expect(linkBandwidthGBs(3, 4)).toBeCloseTo(3.94, 2);
		expect(linkBandwidthGBs(4, 4)).toBeCloseTo(7.88, 2);
		expect(linkBandwidthGBs(5, 4)).toBeCloseTo(15.75, 2);
		expect(formatGBs(linkBandwidthGBs(4, 4))).toBe('7.88 GB/s');
	});

	it('4.0 x16 one way = the PCI-SIG raw bidirectional headline "64 GB/s" ÷ 2, less encoding (V headline; D: 64 ÷ 2 × 128/130 = 31.5)', () => {
		// PCI-SIG x16 headline figures are raw and bidirectional (docs/sources.md 6, V);
		// one direction halves it, 128b/130b takes 2 bits in 130: 32 × 128/130 = 31.51.
		expect(linkBandwidthGBs(4, 16)).toBeCloseTo((64 / 2) * (128 / 130), 10);
	});

	it('names its convention and labels generations the way the trade writes them', () => {
		expect(PCIE_BANDWIDTH_CONVENTION).toMatch(/one direction/);
		expect(pcieLabel(4)).toBe('PCIe 4.0');
	});

	it('rejects unknown generations and impossible lane counts', () => {
		expect(() => laneBandwidthGBs(7)).toThrow(RangeError);
		expect(() => linkBandwidthGBs(4, 3)).toThrow(RangeError);
	});
});
