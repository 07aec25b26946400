/**
 * Power budget: estimated system load, the PSU sizing rule, and every graphics card's power
 * paths (those live in power-card.ts and are re-exported here).
 *
 * Published values (docs/sources.md):
 * - EPS12V 8-pin CPU lead: 288–384 W by its pin ratings (3d).
 * - AMD socket power: PPT = TDP × 1.35 (AMD statement, 26 May 2022; 8a).
 * - Intel: Processor Base Power is the former TDP / PL1 (Intel ARK definitions; 8b).
 *
 * Everything called an *allowance* below is common practice, no published source.
 */
import type { CpuSpecs } from '../schemas/part-specs';
import { partName, slotsOf, worstSeverity, type BuildParts, type Severity } from './build-parts';
import { gpuBoardPower, gpuDeliverableW, psuFeedsGpus } from './power-card';

export {
	CARD_CEILING_W,
	CONNECTOR_W,
	gpuBoardPower,
	gpuDeliverable,
	gpuDeliverableW,
	PCIE_SLOT_W,
	psuFeedsGpus,
	type GpuDeliverable
} from './power-card';

/**
 * What one 8-pin EPS12V CPU lead carries by its pin ratings (docs/sources.md 3d): Intel
 * 336521 §2.2.1 gives 6–8 A per pin with 18 AWG wire, so four +12 V pins carry
 * 4 × 12 V × 6 A = 288 W to 4 × 12 V × 8 A = 384 W.
 */
export const EPS8_PIN_W = { low: 288, high: 384 } as const;

/**
 * Allowances for parts without a stated draw. Common practice, no published source:
 * round, slightly generous figures so the estimate errs towards a larger PSU.
 */
export const ALLOWANCE_W = {
	/** Chipset, onboard controllers, audio, network, VRM losses. */
	motherboard: 50,
	/** Per module; DDR5 modules carry their own voltage regulator (PMIC), hence more. */
	memoryModuleDdr4: 3,
	memoryModuleDdr5: 5,
	/** Per drive, by interface and form factor. */
	nvmeDrive: 8,
	sataSsd: 5,
	hardDisk35: 10,
	/** Per 120/140 mm fan at full speed (about 0.25 A at 12 V). */
	fan: 3,
	/** Pump of an all-in-one liquid cooler. */
	pump: 5,
	/** Keyboard, mouse, headset and a charging phone on USB. */
	usbPeripherals: 15
} as const;

/** Common PSU ratings on the market, in W (common practice, no published source). */
export const COMMON_PSU_SIZES_W = [450, 550, 650, 750, 850, 1000, 1200, 1300, 1500, 1600] as const;
/**
 * The one PSU sizing threshold (docs/sources.md "PSU sizing threshold"; common practice, no
 * published source): the estimated sustained load at most two thirds of the rating. The
 * severity of the `psu-rating` finding, the minimum and the recommended rating all come
 * from it, so the report never calls a supply fine while recommending a larger one.
 */
export const MAX_LOAD_SHARE = { numerator: 2, denominator: 3, words: 'two thirds' } as const;

export type CpuPowerBasis = 'stated' | 'amd-ppt' | 'intel-base-power' | 'tdp';

export interface CpuPower {
	watts: number;
	basis: CpuPowerBasis;
	/** Plain-language reason for the number, shown in the breakdown. */
	note: string;
}

/**
 * AMD package power tracking limit: round(TDP × 135 / 100) in integer arithmetic, half up.
 * Floating point would give 170 × 1.35 = 229.50000000000003 (docs/sources.md note 5).
 */
export function amdPptW(tdpW: number): number {
	if (!Number.isInteger(tdpW) || tdpW <= 0)
		throw new RangeError(`TDP must be a positive whole number of W, got ${tdpW}`);
	return Math.floor((tdpW * 135 + 50) / 100);
}

/** Sustained CPU package power, with the rule it came from. */
export function cpuSustainedPower(
	cpu: Pick<CpuSpecs, 'socket' | 'tdpW' | 'packagePowerW'>
): CpuPower {
	if (cpu.packagePowerW !== undefined) {
		return {
			watts: cpu.packagePowerW,
			basis: 'stated',
			note: `stated sustained package power ${cpu.packagePowerW} W`
		};
	}
	if (cpu.socket.startsWith('AM')) {
		const ppt = amdPptW(cpu.tdpW);
		return {
			watts: ppt,
			basis: 'amd-ppt',
			note: `AMD socket power limit PPT = ${cpu.tdpW} W TDP × 1.35 = ${ppt} W`
		};
	}
	if (cpu.socket.startsWith('LGA')) {
		return {
			watts: cpu.tdpW,
			basis: 'intel-base-power',
			note: `Intel Processor Base Power (PL1) ${cpu.tdpW} W; boards may allow Maximum Turbo Power (PL2) for long periods, so the real draw can be higher`
		};
	}
	return {
		watts: cpu.tdpW,
		basis: 'tdp',
		note: `TDP ${cpu.tdpW} W as stated (no vendor rule for this socket)`
	};
}

/** Sustained CPU package power in W (see cpuSustainedPower for the rule used). */
export function cpuSustainedPowerW(
	cpu: Pick<CpuSpecs, 'socket' | 'tdpW' | 'packagePowerW'>
): number {
	return cpuSustainedPower(cpu).watts;
}

export interface PowerLine {
	/** Slot key, or `allowance:<what>` for allowances not tied to a slot. */
	key: string;
	label: string;
	watts: number;
	/** Where the number comes from (stated spec, vendor rule, or allowance). */
	basis: string;
}

export interface LoadEstimate {
	loadW: number;
	breakdown: PowerLine[];
}

const ALLOWANCE_NOTE = 'allowance, common practice (no published source)';

/**
 * Fans on a radiator, which is also the number of case fan mounts it covers: 140 mm fans on
 * 140/280/420 mm radiators, 120 mm ones otherwise (common practice, no published source).
 */
export function radiatorFans(radiatorMm: number): number {
	return radiatorMm % 140 === 0 ? radiatorMm / 140 : Math.round(radiatorMm / 120);
}

/**
 * Estimated sustained system load: CPU sustained package power, graphics card board
 * power, and allowances for the board, memory modules, drives, fans, pump and USB devices.
 */
export function estimateLoad(parts: BuildParts): LoadEstimate {
	const lines: PowerLine[] = [];
	let boardSeen = false;
	const hasCooler = parts.some((s) => s.category === 'cooler');
	for (const slot of parts) {
		const name = partName(slot);
		const q = slot.quantity;
		switch (slot.category) {
			case 'cpu': {
				const p = cpuSustainedPower(slot.part.specs);
				lines.push({
					key: slot.key,
					label: `${slot.label}: ${name}`,
					watts: p.watts * q,
					basis: p.note
				});
				// A cooler that comes in the CPU's box has a fan too, when no cooler slot replaces it.
				if (slot.part.specs.bundledCooler && !hasCooler) {
					lines.push({
						key: 'allowance:bundled-cooler',
						label: `Cooler bundled with ${name}`,
						watts: ALLOWANCE_W.fan * q,
						basis: `one fan × ${ALLOWANCE_W.fan} W, ${ALLOWANCE_NOTE}`
					});
				}
				break;
			}
			case 'gpu': {
				const w = slot.part.specs.boardPowerW;
				lines.push({
					key: slot.key,
					label: `${slot.label}: ${name}`,
					watts: w * q,
					basis: `stated board power ${w} W${q > 1 ? ` × ${q}` : ''}`
				});
				break;
			}
			case 'motherboard':
				boardSeen = true;
				lines.push({
					key: slot.key,
					label: `${slot.label}: ${name}`,
					watts: ALLOWANCE_W.motherboard * q,
					basis: q > 1 ? `${q} × ${ALLOWANCE_W.motherboard} W, ${ALLOWANCE_NOTE}` : ALLOWANCE_NOTE
				});
				break;
			case 'memory': {
				const each =
					slot.part.specs.type === 'DDR5'
						? ALLOWANCE_W.memoryModuleDdr5
						: ALLOWANCE_W.memoryModuleDdr4;
				const modules = slot.part.specs.modules * q;
				lines.push({
					key: slot.key,
					label: `${slot.label}: ${name}`,
					watts: each * modules,
					basis: `${modules} × ${each} W per ${slot.part.specs.type} module, ${ALLOWANCE_NOTE}`
				});
				break;
			}
			case 'storage': {
				const s = slot.part.specs;
				const each =
					s.interface === 'nvme'
						? ALLOWANCE_W.nvmeDrive
						: s.formFactor === '3.5in'
							? ALLOWANCE_W.hardDisk35
							: ALLOWANCE_W.sataSsd;
				const kind =
					s.interface === 'nvme'
						? 'NVMe drive'
						: s.formFactor === '3.5in'
							? '3.5-inch drive'
							: 'SATA SSD';
				lines.push({
					key: slot.key,
					label: `${slot.label}: ${name}`,
					watts: each * q,
					basis: `${q} × ${each} W per ${kind}, ${ALLOWANCE_NOTE}`
				});
				break;
			}
			case 'cooler': {
				const c = slot.part.specs;
				if (c.type === 'liquid') {
					const fans = radiatorFans(c.radiatorMm ?? 0);
					const w = (ALLOWANCE_W.pump + fans * ALLOWANCE_W.fan) * q;
					lines.push({
						key: slot.key,
						label: `${slot.label}: ${name}`,
						watts: w,
						basis: `pump ${ALLOWANCE_W.pump} W + ${fans} radiator fan${fans === 1 ? '' : 's'} × ${ALLOWANCE_W.fan} W, ${ALLOWANCE_NOTE}`
					});
				} else {
					lines.push({
						key: slot.key,
						label: `${slot.label}: ${name}`,
						watts: ALLOWANCE_W.fan * q,
						basis: `one fan × ${ALLOWANCE_W.fan} W, ${ALLOWANCE_NOTE}`
					});
				}
				break;
			}
			case 'fan': {
				const fans = slot.part.specs.count * q;
				lines.push({
					key: slot.key,
					label: `${slot.label}: ${name}`,
					watts: fans * ALLOWANCE_W.fan,
					basis: `${fans} fan${fans === 1 ? '' : 's'} × ${ALLOWANCE_W.fan} W, ${ALLOWANCE_NOTE}`
				});
				break;
			}
			case 'case': {
				const fans = slot.part.specs.includedFans * q;
				if (fans > 0) {
					lines.push({
						key: slot.key,
						label: `${slot.label}: ${name} (included fans)`,
						watts: fans * ALLOWANCE_W.fan,
						basis: `${fans} fan${fans === 1 ? '' : 's'} × ${ALLOWANCE_W.fan} W, ${ALLOWANCE_NOTE}`
					});
				}
				break;
			}
			default:
				// PSU, operating system, extras: no draw of their own in this estimate.
				break;
		}
	}
	// Every PC has a board; count it even when the list leaves that slot out.
	if (!boardSeen) {
		lines.push({
			key: 'allowance:motherboard',
			label: 'Motherboard (not listed)',
			watts: ALLOWANCE_W.motherboard,
			basis: ALLOWANCE_NOTE
		});
	}
	lines.push({
		key: 'allowance:usb',
		label: 'USB devices and peripherals',
		watts: ALLOWANCE_W.usbPeripherals,
		basis: ALLOWANCE_NOTE
	});
	let loadW = 0;
	for (const line of lines) loadW += line.watts;
	return { loadW, breakdown: lines };
}

function checkLoad(loadW: number): void {
	if (!Number.isFinite(loadW) || loadW < 0)
		throw new RangeError(`Load must be a non-negative number of W, got ${loadW}`);
}

/** Smallest rating that keeps the load within two thirds: ⌈load × 3 / 2⌉ W, in integers. */
export function minimumPsuW(loadW: number): number {
	checkLoad(loadW);
	const { numerator: n, denominator: d } = MAX_LOAD_SHARE;
	return Math.ceil((loadW * d) / n);
}

/**
 * Recommended PSU rating: the smallest common size at or above minimumPsuW; above the
 * largest common size, the minimum rounded up to 100 W. Common practice, no published source.
 */
export function recommendedPsuW(loadW: number): number {
	const minimumW = minimumPsuW(loadW);
	for (const size of COMMON_PSU_SIZES_W) if (size >= minimumW) return size;
	return Math.ceil(minimumW / 100) * 100;
}

export interface PsuSizing {
	severity: Severity;
	/** ⌈load × 3 / 2⌉: the smallest rating within the threshold. */
	minimumW: number;
	/** The smallest common size at or above minimumW. */
	recommendedW: number;
	/** ⌊rating × 2 / 3⌋: the largest whole-watt load within the threshold for this rating. */
	maxLoadW: number;
}

/**
 * The PSU verdict: conflict when the rating is below the load, caution when the load is
 * above two thirds of the rating (load × 3 > rating × 2, in integers), ok otherwise.
 */
export function psuSizing(loadW: number, ratedW: number): PsuSizing {
	const { numerator: n, denominator: d } = MAX_LOAD_SHARE;
	const severity: Severity =
		ratedW < loadW ? 'conflict' : loadW * d > ratedW * n ? 'caution' : 'ok';
	return {
		severity,
		minimumW: minimumPsuW(loadW),
		recommendedW: recommendedPsuW(loadW),
		maxLoadW: Math.floor((ratedW * n) / d)
	};
}

/** One graphics card slot in the power budget. */
export interface GpuPower {
	key: string;
	name: string;
	quantity: number;
	boardPowerW: number;
	/** Slot + connectors by the PCIe CEM limits, capped at the CEM 5.1 card ceiling. */
	deliverableW: number;
	/** The `gpu-board-power` finding's severity. */
	severity: Severity;
}

export interface PowerBudget {
	loadW: number;
	breakdown: PowerLine[];
	/** Smallest rating that keeps the load within two thirds of it (psuSizing). */
	minimumW: number;
	/** Smallest common size at or above minimumW. */
	recommendedW: number;
	/** Present when the build has a PSU. */
	psuRatedW?: number;
	/** Present when the build has a PSU: the `psu-rating` finding's severity. */
	psuSeverity?: Severity;
	/** Share of the rating left unused at the estimated load, whole percent. */
	headroomPct?: number;
	/** Every graphics card slot, in build order. */
	gpus: GpuPower[];
	/** With a PSU and at least one card: the worst `gpu-power-connectors` severity for all cards together. */
	gpuLeads?: Severity;
}

/** Load estimate, recommended rating, PSU headroom and every graphics card's power paths. */
export function powerBudget(parts: BuildParts): PowerBudget {
	const { loadW, breakdown } = estimateLoad(parts);
	const gpus = slotsOf(parts, 'gpu');
	const budget: PowerBudget = {
		loadW,
		breakdown,
		minimumW: minimumPsuW(loadW),
		recommendedW: recommendedPsuW(loadW),
		gpus: gpus.map((g) => ({
			key: g.key,
			name: partName(g),
			quantity: g.quantity,
			boardPowerW: g.part.specs.boardPowerW,
			deliverableW: gpuDeliverableW(g.part.specs),
			severity: gpuBoardPower(g).severity
		}))
	};
	const psu = slotsOf(parts, 'psu')[0];
	if (psu) {
		const rated = psu.part.specs.ratedW;
		budget.psuRatedW = rated;
		budget.psuSeverity = psuSizing(loadW, rated).severity;
		budget.headroomPct = Math.round(((rated - loadW) * 100) / rated);
		if (gpus.length > 0) budget.gpuLeads = worstSeverity(psuFeedsGpus(psu, gpus));
	}
	return budget;
}
