/**
 * Graphics card power paths: what a card may draw through its slot and inlets by the PCIe
 * CEM limits, whether its stated board power stays within them, and whether the PSU's
 * leads can feed the inlets of every card in the build (docs/architecture.md
 * "Computations" §4).
 *
 * Published limits (docs/sources.md):
 * - PCIe x16 slot 75 W (PCIe CEM, unchanged since CEM 1.1; 2a, secondary sources).
 * - Auxiliary connectors: 6-pin 75 W, 8-pin 150 W, 12V-2x6 / 12VHPWR 600 W (Intel ATX
 *   Version 3 PSU Design Guide, doc 336521 rev 2.0, Table 3-5; 2b).
 * - Card ceiling from all sources: 600 W under CEM 5.0, 675 W under CEM 5.1 (336521 rev
 *   2.01 vs rev 2.1a; 2e). We cap at 675 W, the current revision.
 * The lead-matching rules are common practice (docs/sources.md s13 and the rules of thumb).
 */
import type { GpuSpecs } from '../schemas/part-specs';
import { partName, type BuildPartOf, type Finding } from './build-parts';

/** PCIe CEM: an x16 graphics slot delivers 75 W (66 W on +12 V, 9.9 W on +3.3 V). */
export const PCIE_SLOT_W = 75;
/** Per-connector limits, 336521 rev 2.0 Table 3-5. */
export const CONNECTOR_W = { pin6: 75, pin8: 150, h12v2x6: 600 } as const;
/** Card power from all sources: CEM 5.0 → 600 W, CEM 5.1 → 675 W (336521 rev 2.1a). */
export const CARD_CEILING_W = { cem50: 600, cem51: 675 } as const;

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
