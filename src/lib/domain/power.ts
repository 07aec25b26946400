/**
 * Power budget: estimated system load, a recommended PSU rating, what the graphics card
 * can draw through its slot and connectors, and whether the PSU's leads can feed it.
 *
 * Published limits (docs/sources.md):
 * - PCIe x16 slot 75 W (PCIe CEM, unchanged since CEM 1.1; 2a, secondary sources).
 * - Auxiliary connectors: 6-pin 75 W, 8-pin 150 W, 12V-2x6 / 12VHPWR 600 W (Intel ATX
 *   Version 3 PSU Design Guide, doc 336521 rev 2.0, Table 3-5; 2b).
 * - Card ceiling from all sources: 600 W under CEM 5.0, 675 W under CEM 5.1 (336521 rev
 *   2.01 vs rev 2.1a; 2e). We cap at 675 W, the current revision.
 * - AMD socket power: PPT = TDP × 1.35 (AMD statement, 26 May 2022; 8a).
 * - Intel: Processor Base Power is the former TDP / PL1 (Intel ARK definitions; 8b).
 *
 * Everything called an *allowance* below is common practice, no published source.
 */
import type { CpuSpecs, GpuSpecs } from '../schemas/part-specs';
import { partName, slotsOf, type BuildPartOf, type BuildParts, type Finding } from './build-parts';

/** PCIe CEM: an x16 graphics slot delivers 75 W (66 W on +12 V, 9.9 W on +3.3 V). */
export const PCIE_SLOT_W = 75;
/** Per-connector limits, 336521 rev 2.0 Table 3-5. */
export const CONNECTOR_W = { pin6: 75, pin8: 150, h12v2x6: 600 } as const;
/** Card power from all sources: CEM 5.0 → 600 W, CEM 5.1 → 675 W (336521 rev 2.1a). */
export const CARD_CEILING_W = { cem50: 600, cem51: 675 } as const;

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
 * Target: the estimated load at most 60 % of the rating, so it sits near half to
 * two-thirds after rounding up to a common size, where units run cool and quiet, with
 * room for short spikes (common practice, no published source; docs/sources.md 15).
 */
export const TARGET_LOAD_SHARE_PCT = 60;

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

/** Fans on a radiator: 140 mm fans on 140/280/420 mm radiators, 120 mm ones otherwise. */
function radiatorFans(radiatorMm: number): number {
	return radiatorMm % 140 === 0 ? radiatorMm / 140 : Math.round(radiatorMm / 120);
}

/**
 * Estimated sustained system load: CPU sustained package power, graphics card board
 * power, and allowances for the board, memory modules, drives, fans, pump and USB devices.
 */
export function estimateLoad(parts: BuildParts): LoadEstimate {
	const lines: PowerLine[] = [];
	let boardSeen = false;
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
					watts: ALLOWANCE_W.motherboard,
					basis: ALLOWANCE_NOTE
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
						basis: `pump ${ALLOWANCE_W.pump} W + ${fans} radiator fans × ${ALLOWANCE_W.fan} W, ${ALLOWANCE_NOTE}`
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
					basis: `${fans} fans × ${ALLOWANCE_W.fan} W, ${ALLOWANCE_NOTE}`
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
						basis: `${fans} fans × ${ALLOWANCE_W.fan} W, ${ALLOWANCE_NOTE}`
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

/**
 * Recommended PSU rating: the smallest common size at which the load is at most 60 % of
 * the rating (minimum = ⌈load × 100 / 60⌉), so it sits near half to two-thirds; above the
 * largest common size, the minimum rounded up to 100 W. Common practice, no published source.
 */
export function recommendedPsuW(loadW: number): number {
	if (!Number.isFinite(loadW) || loadW < 0)
		throw new RangeError(`Load must be a non-negative number of W, got ${loadW}`);
	const minimumW = Math.ceil((loadW * 100) / TARGET_LOAD_SHARE_PCT);
	for (const size of COMMON_PSU_SIZES_W) if (size >= minimumW) return size;
	return Math.ceil(minimumW / 100) * 100;
}

export interface GpuDeliverable {
	slotW: number;
	connectorsW: number;
	/** Slot + connectors, capped at the CEM 5.1 card ceiling. */
	totalW: number;
	ceilingW: number;
	capped: boolean;
}

/**
 * What a card can draw by the PCIe CEM limits: slot 75 W + 6-pin 75 W + 8-pin 150 W +
 * 12V-2x6 600 W per connector, at most 675 W per card (CEM 5.1; CEM 5.0 allowed 600 W).
 */
export function gpuDeliverable(gpu: Pick<GpuSpecs, 'powerConnectors'>): GpuDeliverable {
	const c = gpu.powerConnectors;
	const connectorsW =
		c.pin6 * CONNECTOR_W.pin6 + c.pin8 * CONNECTOR_W.pin8 + c.h12v2x6 * CONNECTOR_W.h12v2x6;
	const sum = PCIE_SLOT_W + connectorsW;
	const ceilingW = CARD_CEILING_W.cem51;
	return {
		slotW: PCIE_SLOT_W,
		connectorsW,
		totalW: Math.min(sum, ceilingW),
		ceilingW,
		capped: sum > ceilingW
	};
}

/** Deliverable card power in W (slot + connectors, capped at 675 W). */
export function gpuDeliverableW(gpu: Pick<GpuSpecs, 'powerConnectors'>): number {
	return gpuDeliverable(gpu).totalW;
}

function inletList(c: { pin6: number; pin8: number; h12v2x6: number }): string {
	const parts: string[] = [];
	if (c.h12v2x6) parts.push(`${c.h12v2x6} × 12V-2x6`);
	if (c.pin8) parts.push(`${c.pin8} × 8-pin`);
	if (c.pin6) parts.push(`${c.pin6} × 6-pin`);
	return parts.length ? parts.join(' + ') : 'no power connectors';
}

/**
 * Whether the PSU's leads can feed the card's power inlets. Rules, kept simple:
 * 8-pin inlets need 8-pin leads; 6-pin inlets take 6-pin leads or spare 8-pin leads
 * (PSU 8-pin PCIe leads are usually 6+2); 12V-2x6 inlets want a native 12V-2x6 lead,
 * otherwise an adapter from 8-pin leads at 150 W each (2 × 8-pin = 300 W, up to
 * 4 × 8-pin = 600 W) is a caution: it works, but adds plugs that must be fully seated.
 * Anything short of that is a conflict.
 */
export function psuFeedsGpu(psu: BuildPartOf<'psu'>, gpu: BuildPartOf<'gpu'>): Finding[] {
	const rule = 'gpu-power-connectors';
	const slots = [gpu.key, psu.key];
	const cardName = partName(gpu);
	const psuName = partName(psu);
	const q = gpu.quantity;
	const inlets = gpu.part.specs.powerConnectors;
	const leads = psu.part.specs.connectors;
	const need = { pin6: inlets.pin6 * q, pin8: inlets.pin8 * q, h12v2x6: inlets.h12v2x6 * q };
	const cards = q > 1 ? `${q} × ${cardName}` : cardName;

	if (need.pin6 + need.pin8 + need.h12v2x6 === 0) {
		return [
			{
				rule,
				severity: 'ok',
				slots,
				message: `${cards} draws only from its slot (${PCIE_SLOT_W} W); ${psuName} needs no graphics leads for it.`
			}
		];
	}

	const findings: Finding[] = [];
	let spare8 = leads.pin8 - need.pin8;
	if (spare8 < 0) {
		findings.push({
			rule,
			severity: 'conflict',
			slots,
			message: `${cards} needs ${need.pin8} × 8-pin PCIe power; ${psuName} has ${leads.pin8} 8-pin lead${leads.pin8 === 1 ? '' : 's'}.`
		});
		spare8 = 0;
	}

	const sixFromSix = Math.min(need.pin6, leads.pin6);
	const sixFromEight = Math.min(need.pin6 - sixFromSix, spare8);
	spare8 -= sixFromEight;
	if (sixFromSix + sixFromEight < need.pin6) {
		findings.push({
			rule,
			severity: 'conflict',
			slots,
			message: `${cards} needs ${need.pin6} × 6-pin PCIe power; ${psuName} has ${leads.pin6} 6-pin and not enough spare 8-pin (6+2) leads.`
		});
	}

	const native = Math.min(need.h12v2x6, leads.h12v2x6);
	const viaAdapter = need.h12v2x6 - native;
	if (viaAdapter > 0) {
		// Power one 12V-2x6 inlet must carry: board power less the slot and other inlets.
		const perCardConnectorW = Math.max(
			0,
			gpu.part.specs.boardPowerW -
				PCIE_SLOT_W -
				inlets.pin8 * CONNECTOR_W.pin8 -
				inlets.pin6 * CONNECTOR_W.pin6
		);
		const perInletW = Math.ceil(perCardConnectorW / inlets.h12v2x6);
		const eightsEach = Math.min(4, Math.max(2, Math.ceil(perInletW / CONNECTOR_W.pin8)));
		const eightsNeeded = eightsEach * viaAdapter;
		if (spare8 >= eightsNeeded) {
			const adapterNote = ` via an adapter from ${eightsEach} × 8-pin (${eightsEach} × ${CONNECTOR_W.pin8} W = ${eightsEach * CONNECTOR_W.pin8} W)`;
			findings.push({
				rule,
				severity: 'caution',
				slots,
				message: `${cards} has a 12V-2x6 inlet and ${psuName} has ${leads.h12v2x6 === 0 ? 'no 12V-2x6 lead' : `only ${leads.h12v2x6} 12V-2x6 lead${leads.h12v2x6 === 1 ? '' : 's'}`}: it can be fed${adapterNote}, carrying about ${perInletW} W. Use the adapter supplied with the card, push every plug fully home, and do not bend the cable close to the plug.`
			});
		} else {
			findings.push({
				rule,
				severity: 'conflict',
				slots,
				message: `${cards} needs ${need.h12v2x6} × 12V-2x6 (about ${perInletW} W each); ${psuName} has ${leads.h12v2x6} 12V-2x6 lead${leads.h12v2x6 === 1 ? '' : 's'} and only ${spare8} spare 8-pin lead${spare8 === 1 ? '' : 's'}, short of the ${eightsNeeded} an adapter needs.`
			});
		}
	}

	if (findings.length === 0) {
		findings.push({
			rule,
			severity: 'ok',
			slots,
			message: `${psuName} has native leads for every power inlet of ${cards} (${inletList(inlets)}).`
		});
	}
	return findings;
}

export interface PowerBudget {
	loadW: number;
	breakdown: PowerLine[];
	recommendedW: number;
	/** Present when the build has a PSU. */
	psuRatedW?: number;
	/** Share of the rating left unused at the estimated load, whole percent. */
	headroomPct?: number;
	/** Present when the build has a graphics card (the first one). */
	gpu?: {
		deliverableW: number;
		boardPowerW: number;
		/** Board power within what slot + connectors may deliver by the CEM limits. */
		withinDeliverable: boolean;
		/** Present when there is a PSU: no conflict in psuFeedsGpu. */
		connectorsOk?: boolean;
	};
}

/** Load estimate, recommended rating, PSU headroom and the graphics card's power paths. */
export function powerBudget(parts: BuildParts): PowerBudget {
	const { loadW, breakdown } = estimateLoad(parts);
	const budget: PowerBudget = { loadW, breakdown, recommendedW: recommendedPsuW(loadW) };
	const psu = slotsOf(parts, 'psu')[0];
	if (psu) {
		const rated = psu.part.specs.ratedW;
		budget.psuRatedW = rated;
		budget.headroomPct = Math.round(((rated - loadW) * 100) / rated);
	}
	const gpu = slotsOf(parts, 'gpu')[0];
	if (gpu) {
		const deliverableW = gpuDeliverableW(gpu.part.specs);
		budget.gpu = {
			deliverableW,
			boardPowerW: gpu.part.specs.boardPowerW,
			withinDeliverable: gpu.part.specs.boardPowerW <= deliverableW
		};
		if (psu)
			budget.gpu.connectorsOk = !psuFeedsGpu(psu, gpu).some((f) => f.severity === 'conflict');
	}
	return budget;
}
