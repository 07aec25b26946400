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
import {
	partName,
	slotsOf,
	worstSeverity,
	type BuildPartOf,
	type BuildParts,
	type Finding,
	type Severity
} from './build-parts';

/** PCIe CEM: an x16 graphics slot delivers 75 W (66 W on +12 V, 9.9 W on +3.3 V). */
export const PCIE_SLOT_W = 75;
/** Per-connector limits, 336521 rev 2.0 Table 3-5. */
export const CONNECTOR_W = { pin6: 75, pin8: 150, h12v2x6: 600 } as const;
/** Card power from all sources: CEM 5.0 → 600 W, CEM 5.1 → 675 W (336521 rev 2.1a). */
export const CARD_CEILING_W = { cem50: 600, cem51: 675 } as const;

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

function leads(n: number, kind: string): string {
	return `${n} ${kind} lead${n === 1 ? '' : 's'}`;
}

/** "Card A", "2 × Card A", "Card A and Card B": the cards a lead finding is about. */
function cardsText(gpus: readonly BuildPartOf<'gpu'>[]): string {
	const names = gpus.map((g) => (g.quantity > 1 ? `${g.quantity} × ${partName(g)}` : partName(g)));
	return names.length <= 2
		? names.join(' and ')
		: `${names.slice(0, -1).join(', ')} and ${names.at(-1)}`;
}

/** One 12V-2x6 inlet of one card: the power it must carry and the 8-pin leads an adapter needs. */
interface H12Inlet {
	perInletW: number;
	eightsEach: number;
}

function h12Inlets(gpu: BuildPartOf<'gpu'>): H12Inlet[] {
	const s = gpu.part.specs;
	const c = s.powerConnectors;
	if (c.h12v2x6 === 0) return [];
	// Power one 12V-2x6 inlet must carry: board power less the slot and the other inlets.
	const connectorW = Math.max(
		0,
		s.boardPowerW - PCIE_SLOT_W - c.pin8 * CONNECTOR_W.pin8 - c.pin6 * CONNECTOR_W.pin6
	);
	const perInletW = Math.ceil(connectorW / c.h12v2x6);
	// Adapters come with two to four 8-pin plugs (2 × 150 = 300 W up to 4 × 150 = 600 W).
	const eightsEach = Math.min(4, Math.max(2, Math.ceil(perInletW / CONNECTOR_W.pin8)));
	const one: H12Inlet = { perInletW, eightsEach };
	return Array.from({ length: c.h12v2x6 * gpu.quantity }, () => one);
}

/**
 * Whether the PSU's leads can feed the power inlets of every graphics card in the build.
 * The leads are one budget shared by all cards and all units of a quantity: a lead plugged
 * into one card is not there for the next. Rules, kept simple:
 * 8-pin inlets need 8-pin leads; 6-pin inlets take 6-pin leads or spare 8-pin leads
 * (PSU 8-pin PCIe leads are usually 6+2); 12V-2x6 inlets want a native 12V-2x6 lead,
 * otherwise an adapter from 8-pin leads at 150 W each (2 × 8-pin = 300 W, up to
 * 4 × 8-pin = 600 W) is a caution: it works, but adds plugs that must be fully seated.
 * Anything short of that is a conflict. Whether the counts add up does not depend on the
 * order the cards are taken in: each kind of inlet draws on its own kind of lead first
 * and the spare 8-pin leads are counted once for everything that can use them.
 */
export function psuFeedsGpus(
	psu: BuildPartOf<'psu'>,
	gpus: readonly BuildPartOf<'gpu'>[]
): Finding[] {
	if (gpus.length === 0) return [];
	const rule = 'gpu-power-connectors';
	const slots = [...gpus.map((g) => g.key), psu.key];
	const psuName = partName(psu);
	const cards = cardsText(gpus);
	// One slot reads as one subject ("2 × Card needs"); several slots are several ("A and B need").
	const many = gpus.length > 1;
	const units = gpus.reduce((n, g) => n + g.quantity, 0);
	const need1 = many ? 'need' : 'needs';
	const inAll = units > 1 ? ' in all' : '';
	const have = psu.part.specs.connectors;
	const need = { pin6: 0, pin8: 0, h12v2x6: 0 };
	for (const g of gpus) {
		const c = g.part.specs.powerConnectors;
		need.pin6 += c.pin6 * g.quantity;
		need.pin8 += c.pin8 * g.quantity;
		need.h12v2x6 += c.h12v2x6 * g.quantity;
	}

	if (need.pin6 + need.pin8 + need.h12v2x6 === 0) {
		return [
			{
				rule,
				severity: 'ok',
				slots,
				message: `${cards} ${units > 1 ? 'draw' : 'draws'} only from the PCIe slot (${PCIE_SLOT_W} W per card); ${psuName} needs no graphics leads for ${units > 1 ? 'them' : 'it'}.`
			}
		];
	}

	const findings: Finding[] = [];
	let spare8 = have.pin8 - need.pin8;
	if (spare8 < 0) {
		findings.push({
			rule,
			severity: 'conflict',
			slots,
			message: `${cards} ${need1} ${need.pin8} × 8-pin PCIe power${inAll}; ${psuName} has ${leads(have.pin8, '8-pin')}.`
		});
		spare8 = 0;
	}

	const sixFromSix = Math.min(need.pin6, have.pin6);
	const sixFromEight = Math.min(need.pin6 - sixFromSix, spare8);
	spare8 -= sixFromEight;
	if (sixFromSix + sixFromEight < need.pin6) {
		findings.push({
			rule,
			severity: 'conflict',
			slots,
			message: `${cards} ${need1} ${need.pin6} × 6-pin PCIe power${inAll}; ${psuName} has ${leads(have.pin6, '6-pin')} and not enough spare 8-pin (6+2) leads.`
		});
	}

	// Native 12V-2x6 leads go to the inlets that would need the most 8-pin leads otherwise.
	const inlets = gpus.flatMap(h12Inlets).sort((a, b) => b.eightsEach - a.eightsEach);
	const viaAdapter = inlets.slice(Math.min(inlets.length, have.h12v2x6));
	if (viaAdapter.length > 0) {
		const eightsNeeded = viaAdapter.reduce((n, i) => n + i.eightsEach, 0);
		const perInletW = Math.max(...viaAdapter.map((i) => i.perInletW));
		const eightsEach = Math.max(...viaAdapter.map((i) => i.eightsEach));
		const nativeText =
			have.h12v2x6 === 0 ? 'no 12V-2x6 lead' : `only ${leads(have.h12v2x6, '12V-2x6')}`;
		if (spare8 >= eightsNeeded) {
			const adapters = viaAdapter.length === 1 ? 'an adapter' : `${viaAdapter.length} adapters`;
			findings.push({
				rule,
				severity: 'caution',
				slots,
				message: `${cards} ${need.h12v2x6 === 1 ? 'has a 12V-2x6 inlet' : `${many ? 'have' : 'has'} ${need.h12v2x6} 12V-2x6 inlets`} and ${psuName} has ${nativeText}: ${viaAdapter.length < need.h12v2x6 ? `${viaAdapter.length} of them` : viaAdapter.length === 1 ? 'it' : 'they'} can be fed via ${adapters} from ${eightsEach} × 8-pin (${eightsEach} × ${CONNECTOR_W.pin8} W = ${eightsEach * CONNECTOR_W.pin8} W)${viaAdapter.length === 1 ? '' : ' each'}, carrying about ${perInletW} W. Use the adapter supplied with the card, push every plug fully home, and do not bend the cable close to the plug.`
			});
		} else {
			findings.push({
				rule,
				severity: 'conflict',
				slots,
				message: `${cards} ${need1} ${need.h12v2x6} × 12V-2x6${inAll} (about ${perInletW} W each); ${psuName} has ${leads(have.h12v2x6, '12V-2x6')} and only ${spare8} spare 8-pin lead${spare8 === 1 ? '' : 's'}, short of the ${eightsNeeded} ${viaAdapter.length === 1 ? 'an adapter needs' : 'the adapters need'}.`
			});
		}
	}

	if (findings.length === 0) {
		const perCard = `${inletList(need)}${inAll}`;
		findings.push({
			rule,
			severity: 'ok',
			slots,
			message: `${psuName} has native leads for every power inlet of ${cards} (${perCard}).`
		});
	}
	return findings;
}

/** "slot 75 W + 2 × 8-pin at 150 W" (the terms of gpuDeliverable, for messages). */
function deliverableTerms(gpu: Pick<GpuSpecs, 'powerConnectors'>): string {
	const c = gpu.powerConnectors;
	const terms = [`slot ${PCIE_SLOT_W} W`];
	if (c.h12v2x6) terms.push(`${c.h12v2x6} × 12V-2x6 at ${CONNECTOR_W.h12v2x6} W`);
	if (c.pin8) terms.push(`${c.pin8} × 8-pin at ${CONNECTOR_W.pin8} W`);
	if (c.pin6) terms.push(`${c.pin6} × 6-pin at ${CONNECTOR_W.pin6} W`);
	return terms.join(' + ');
}

/**
 * Whether a card's stated board power is within what its slot and inlets may deliver by
 * the PCIe CEM limits (docs/sources.md 2a, 2b, 2e). A card stating more is a conflict: the
 * figure is wrong, or the card would run its leads beyond their rating.
 */
export function gpuBoardPower(gpu: BuildPartOf<'gpu'>): Finding {
	const d = gpuDeliverable(gpu.part.specs);
	const stated = gpu.part.specs.boardPowerW;
	const name = partName(gpu);
	const terms = `${deliverableTerms(gpu.part.specs)}${d.capped ? `, capped at the ${d.ceilingW} W card ceiling of CEM 5.1` : ''}`;
	return stated <= d.totalW
		? {
				rule: 'gpu-board-power',
				severity: 'ok',
				slots: [gpu.key],
				message: `${name} states ${stated} W board power; its slot and power inlets may deliver ${d.totalW} W by the PCIe CEM limits (${terms}).`
			}
		: {
				rule: 'gpu-board-power',
				severity: 'conflict',
				slots: [gpu.key],
				message: `${name} states ${stated} W board power, more than its slot and power inlets may deliver by the PCIe CEM limits: ${d.totalW} W (${terms}). Check the figure with the card maker: drawing ${stated - d.totalW} W more would run the leads beyond their rating.`
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
