/**
 * Fit rules about power and cooling: the PSU rating against the estimated load, every
 * card's board power against its slot and inlets, the PSU's leads against every card's
 * inlets, the CPU power leads, and the cooler's rating against the CPU's sustained power
 * (docs/architecture.md "Computations" §3 and §4).
 */
import { partName } from './build-parts';
import { plural, type FitRule } from './fit-context';
import {
	cpuSustainedPower,
	estimateLoad,
	gpuBoardPower,
	EPS8_PIN_W,
	MAX_LOAD_SHARE,
	psuFeedsGpus,
	psuSizing
} from './power';

export const psuRating: FitRule = ({ build, psu }, out) => {
	if (!psu) return;
	const { loadW } = estimateLoad(build);
	const rated = psu.part.specs.ratedW;
	const sizing = psuSizing(loadW, rated);
	const share = MAX_LOAD_SHARE.words;
	const atLeast = `at least ${sizing.minimumW} W${sizing.recommendedW === sizing.minimumW ? '' : ` (the next common size is ${sizing.recommendedW} W)`}`;
	const name = partName(psu);
	const message = {
		ok: `${name} is rated ${rated} W; the estimated load of ${loadW} W is within ${share} of it (${sizing.maxLoadW} W). Common practice, no published source.`,
		caution: `${name} is rated ${rated} W; the estimated load of ${loadW} W is above ${share} of it (${sizing.maxLoadW} W). Recommended: ${atLeast}, so the load stays within ${share} of the rating (common practice, no published source).`,
		conflict: `${name} is rated ${rated} W, below the estimated load of ${loadW} W. Recommended: ${atLeast}.`
	}[sizing.severity];
	out.push({ rule: 'psu-rating', severity: sizing.severity, slots: [psu.key], message });
};

export const gpuBoardPowerRule: FitRule = ({ gpus }, out) => {
	for (const gpu of gpus) out.push(gpuBoardPower(gpu));
};

export const gpuPowerConnectors: FitRule = ({ gpus, psu }, out) => {
	// One finding for all cards: the PSU's leads are a single budget (issue 13).
	if (!psu) return;
	out.push(...psuFeedsGpus(psu, gpus));
};

export const coolerHeat: FitRule = ({ cpu, coolers }, out) => {
	if (!cpu) return;
	const power = cpuSustainedPower(cpu.part.specs);
	// docs/sources.md 15: cooler heat ratings have no common test method across vendors.
	const caveat =
		'cooler heat ratings have no common test method across vendors, so treat this as a rough guide';
	for (const cooler of coolers) {
		const rated = cooler.part.specs.ratedHeatW;
		out.push(
			rated >= power.watts
				? {
						rule: 'cooler-heat',
						severity: 'ok',
						slots: [cooler.key, cpu.key],
						message: `${partName(cooler)} is rated for ${rated} W; ${partName(cpu)} sustains about ${power.watts} W (${power.note}). Note: ${caveat}.`
					}
				: {
						rule: 'cooler-heat',
						severity: 'caution',
						slots: [cooler.key, cpu.key],
						message: `${partName(cooler)} is rated for ${rated} W, below the ${power.watts} W ${partName(cpu)} sustains (${power.note}): expect higher temperatures, fan noise or lower clocks under long loads. Note: ${caveat}.`
					}
		);
	}
};

/**
 * CPU power leads: an 8-pin EPS12V lead carries 288–384 W by its pin ratings (docs/sources.md
 * 3d: four +12 V pins at 6–8 A each). The lower figure is the one to stay under; the board's
 * CPU power inlets are not in the catalog, so the cautions point to its manual.
 */
export const cpuPowerLeads: FitRule = ({ cpu, psu }, out) => {
	if (!cpu || !psu) return;
	const eps = psu.part.specs.connectors.eps8;
	const power = cpuSustainedPower(cpu.part.specs).watts;
	const cpuName = partName(cpu);
	const psuName = partName(psu);
	const slots = [cpu.key, psu.key];
	const range = (n: number) => `${n * EPS8_PIN_W.low}–${n * EPS8_PIN_W.high} W`;
	if (eps === 0) {
		out.push({
			rule: 'cpu-power-leads',
			severity: 'caution',
			slots,
			message: `${psuName} lists no 8-pin EPS12V CPU lead; boards for ${cpu.part.specs.socket} take CPU power through an 8-pin EPS12V inlet (a few budget boards through a 4-pin one). Check the PSU and board manuals.`
		});
	} else if (power > eps * EPS8_PIN_W.low) {
		out.push({
			rule: 'cpu-power-leads',
			severity: 'caution',
			slots,
			message: `${cpuName} sustains about ${power} W; ${psuName} has ${plural(eps, '8-pin EPS12V CPU lead')}, which ${eps === 1 ? 'carries' : 'carry'} ${range(eps)} by ${eps === 1 ? 'its' : 'their'} pin ratings (4 × 12 V × 6–8 A${eps === 1 ? '' : ' each'}). Connect every CPU power inlet the board has, and check the board manual.`
		});
	} else {
		out.push({
			rule: 'cpu-power-leads',
			severity: 'ok',
			slots,
			message: `${psuName} has ${plural(eps, '8-pin EPS12V CPU lead')} (${range(1)}${eps === 1 ? '' : ' each'} by ${eps === 1 ? 'its' : 'their'} pin ratings); ${cpuName} sustains about ${power} W.`
		});
	}
};
