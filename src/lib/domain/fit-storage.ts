/**
 * Fit rules about drives and the board: M.2 drives against the board's M.2 slots (length,
 * count, PCIe generation), SATA drives against SATA ports, and drives that connect to
 * neither (docs/architecture.md "Computations" §3).
 */
import { partName, type BuildPartOf } from './build-parts';
import { countedNames, listText, plural, type FitRule } from './fit-context';
import { formatGBs, linkBandwidthGBs, pcieLabel } from './pcie';

/** M.2 module length in mm from its name: 22 mm wide + length, 2280 → 80 (docs/sources.md 7). */
export function m2LengthMm(formFactor: string): number | null {
	const match = /^m2-22(\d{2,3})$/.exec(formFactor);
	return match ? Number(match[1]) : null;
}

interface M2Drive {
	slot: BuildPartOf<'storage'>;
	lengthMm: number;
	/** PCIe generation of an NVMe drive; null when the drive does not state it. */
	gen: number | null;
	sata: boolean;
}

interface M2BoardSlot {
	pcieGen: number;
	maxLengthMm: number;
	/** 1-based, as a board manual numbers them. */
	number: number;
}

/**
 * Sort key: fast NVMe drives first, then NVMe drives of unstated generation, then M.2 SATA;
 * longer drives first among equals. The order of the findings follows it.
 */
function m2Rank(d: M2Drive): number {
	return d.sata ? 0 : d.gen === null ? 0.5 : d.gen;
}

/**
 * Cost of a drive in a slot, compared as [slow, waste] after the number of drives placed:
 * slow = 1 when a drive of a stated generation sits in a slower slot (it runs at the slot's
 * speed); waste = generations of the slot the drive cannot use (so slower slots go to SATA
 * and slower drives, leaving the fast ones free). A drive of unstated generation costs 0.
 */
function m2Cost(d: M2Drive, s: M2BoardSlot): [number, number] {
	if (d.sata) return [0, s.pcieGen];
	if (d.gen === null) return [0, 0];
	return d.gen > s.pcieGen ? [1, 0] : [0, s.pcieGen - d.gen];
}

interface Placement {
	placed: number;
	slow: number;
	waste: number;
	/** Board slot index per drive, -1 when the drive has no slot. */
	at: number[];
}

function better(a: Placement, b: Placement): boolean {
	if (a.placed !== b.placed) return a.placed > b.placed;
	if (a.slow !== b.slow) return a.slow < b.slow;
	return a.waste < b.waste;
}

/**
 * The placement of drives into M.2 slots that fits the most drives, then puts the fewest
 * drives in slower slots, then wastes the fewest generations: an exhaustive search over
 * slots taken (a board has at most 8 M.2 slots, so at most 256 sets), memoised per drive.
 * A greedy "fastest drive first" pass can leave a long drive without a long slot even when
 * another placement fits every drive (issue 13), so the search looks at all of them.
 */
function placeM2(drives: readonly M2Drive[], slots: readonly M2BoardSlot[]): number[] {
	const memo = new Map<number, Placement>();
	const solve = (i: number, used: number): Placement => {
		const drive = drives[i];
		if (!drive) return { placed: 0, slow: 0, waste: 0, at: [] };
		const id = i * 512 + used;
		const known = memo.get(id);
		if (known) return known;
		const rest = solve(i + 1, used);
		let best: Placement = { ...rest, at: [-1, ...rest.at] };
		slots.forEach((s, j) => {
			if (used & (1 << j) || s.maxLengthMm < drive.lengthMm) return;
			const next = solve(i + 1, used | (1 << j));
			const [slow, waste] = m2Cost(drive, s);
			const candidate: Placement = {
				placed: next.placed + 1,
				slow: next.slow + slow,
				waste: next.waste + waste,
				at: [j, ...next.at]
			};
			if (better(candidate, best)) best = candidate;
		});
		memo.set(id, best);
		return best;
	};
	return solve(0, 0).at;
}

export const m2Drives: FitRule = ({ storage, board }, out) => {
	if (!board) return;
	const drives: M2Drive[] = [];
	for (const slot of storage) {
		const lengthMm = m2LengthMm(slot.part.specs.formFactor);
		if (lengthMm === null) continue;
		const sata = slot.part.specs.interface === 'sata';
		// Unknown is unknown: a missing generation never makes an NVMe drive a SATA one.
		const gen = sata ? null : (slot.part.specs.pcieGen ?? null);
		for (let i = 0; i < slot.quantity; i++) drives.push({ slot, lengthMm, gen, sata });
	}
	if (drives.length === 0) return;
	drives.sort((a, b) => m2Rank(b) - m2Rank(a) || b.lengthMm - a.lengthMm);
	const boardSlots: M2BoardSlot[] = board.part.specs.m2Slots.map((s, index) => ({
		...s,
		number: index + 1
	}));
	const at = placeM2(drives, boardSlots);
	const boardName = partName(board);
	const longestMm = Math.max(0, ...boardSlots.map((s) => s.maxLengthMm));

	drives.forEach((drive, i) => {
		const chosen = boardSlots[at[i] ?? -1];
		if (!chosen) return;
		const name = partName(drive.slot);
		const slots = [drive.slot.key, board.key];
		const where = `M.2 slot ${chosen.number} of ${boardName} (${pcieLabel(chosen.pcieGen)}, up to ${chosen.maxLengthMm} mm)`;
		if (drive.sata) {
			out.push({
				rule: 'm2-slot',
				severity: 'caution',
				slots,
				message: `${name} is an M.2 SATA drive for ${where}: many M.2 slots take NVMe only, so check in the board manual that this one accepts SATA.`
			});
		} else if (drive.gen === null) {
			out.push({
				rule: 'm2-slot',
				severity: 'caution',
				slots,
				message: `${name} is an NVMe drive of unstated PCIe generation in ${where}: NVMe drives work in any PCIe M.2 slot, but whether this slot runs it at full speed cannot be checked. Look up the drive’s PCIe generation.`
			});
		} else if (chosen.pcieGen < drive.gen) {
			const slotGBs = formatGBs(linkBandwidthGBs(chosen.pcieGen, 4));
			const driveGBs = formatGBs(linkBandwidthGBs(drive.gen, 4));
			out.push({
				rule: 'm2-slot',
				severity: 'caution',
				slots,
				message: `${name} is a ${pcieLabel(drive.gen)} drive in ${where}: it works, but at up to ${slotGBs} instead of ${driveGBs} (x4 link, usable one direction).`
			});
		} else {
			out.push({
				rule: 'm2-slot',
				severity: 'ok',
				slots,
				message: `${name} (${pcieLabel(drive.gen)}, M.2 22${drive.lengthMm}) goes in ${where}.`
			});
		}
	});

	// Drives left without a slot, one line per storage slot: too long for every M.2 slot of
	// the board, or long enough only for slots the other drives took.
	const tooMany = drives.length > boardSlots.length;
	const left = new Map<BuildPartOf<'storage'>, { count: number; lengthMm: number }>();
	drives.forEach((d, i) => {
		if ((at[i] ?? -1) < 0)
			left.set(d.slot, { count: (left.get(d.slot)?.count ?? 0) + 1, lengthMm: d.lengthMm });
	});
	for (const [slot, { count, lengthMm }] of left) {
		const name = count > 1 ? `${count} × ${partName(slot)}` : partName(slot);
		const is = count > 1 ? 'are' : 'is';
		if (boardSlots.length === 0) continue; // m2-count below says the board has none
		if (lengthMm > longestMm) {
			out.push({
				rule: 'm2-length',
				severity: 'conflict',
				slots: [slot.key, board.key],
				message: `${name} ${is} ${lengthMm} mm long (M.2 22${lengthMm}); the M.2 slots of ${boardName} take up to ${longestMm} mm.`
			});
		} else if (!tooMany) {
			const longEnough = boardSlots.filter((s) => s.maxLengthMm >= lengthMm).map((s) => s.number);
			const one = longEnough.length === 1;
			out.push({
				rule: 'm2-length',
				severity: 'conflict',
				slots: [slot.key, board.key],
				message: `${name} ${is} ${lengthMm} mm long (M.2 22${lengthMm}); the M.2 ${one ? 'slot' : 'slots'} of ${boardName} long enough for it (${one ? 'slot' : 'slots'} ${longEnough.join(', ')}) ${one ? 'is' : 'are'} taken by the other M.2 drives.`
			});
		}
	}
	if (tooMany) {
		const keys = [...new Set(drives.map((d) => d.slot.key))];
		out.push({
			rule: 'm2-count',
			severity: 'conflict',
			slots: [...keys, board.key],
			message: `${plural(drives.length, 'M.2 drive')} (${listText([...new Set(drives.map((d) => partName(d.slot)))])}), but ${boardName} has ${plural(boardSlots.length, 'M.2 slot')}.`
		});
	}
};

export const sataPorts: FitRule = ({ storage, board }, out) => {
	if (!board) return;
	const sata = storage.filter(
		(s) => s.part.specs.interface === 'sata' && m2LengthMm(s.part.specs.formFactor) === null
	);
	if (sata.length === 0) return;
	let count = 0;
	for (const s of sata) count += s.quantity;
	const ports = board.part.specs.sataPorts;
	const slots = [...sata.map((s) => s.key), board.key];
	const names = countedNames(sata);
	out.push(
		count <= ports
			? {
					rule: 'sata-ports',
					severity: 'ok',
					slots,
					message: `${names}: ${plural(count, 'SATA drive')} for the ${ports} SATA ports of ${partName(board)}.`
				}
			: {
					rule: 'sata-ports',
					severity: 'conflict',
					slots,
					message: `${names}: ${plural(count, 'SATA drive')}, but ${partName(board)} has ${plural(ports, 'SATA port')}.`
				}
	);
};

/**
 * An NVMe drive in a 2.5- or 3.5-inch form factor (U.2 and similar) plugs into neither an
 * M.2 slot nor a SATA port, and the catalog records no U.2 ports on boards: a caution.
 */
export const driveInterface: FitRule = ({ storage, board }, out) => {
	if (!board) return;
	for (const s of storage) {
		const { interface: bus, formFactor } = s.part.specs;
		if (bus !== 'nvme' || m2LengthMm(formFactor) !== null) continue;
		const size = formFactor === '2.5in' ? '2.5-inch' : '3.5-inch';
		const name = s.quantity > 1 ? `${s.quantity} × ${partName(s)}` : partName(s);
		out.push({
			rule: 'drive-interface',
			severity: 'caution',
			slots: [s.key, board.key],
			message: `${name} ${s.quantity > 1 ? 'are' : 'is a'} ${size} NVMe drive${s.quantity > 1 ? 's' : ''} (U.2 or similar): ${s.quantity > 1 ? 'they plug' : 'it plugs'} into neither an M.2 slot nor a SATA port of ${partName(board)}, so ${s.quantity > 1 ? 'they need U.2 ports or adapter cards' : 'it needs a U.2 port or an adapter card'}. Check the board manual.`
		});
	}
};
