/**
 * Fit report: the compatibility findings for a set of parts (docs/architecture.md "Computations" §3).
 *
 * Every rule that can run gives a finding (`ok` included), so the report shows what was
 * checked. A rule whose slots are missing is skipped quietly, except "no cooler" and "no
 * graphics", which are about a missing slot. Messages name the parts (brand + model) and
 * the numbers, so a reader can act on a line without opening the spec sheets.
 */
import type { MotherboardSpecs, PsuSpecs } from '../schemas/part-specs';
import {
	partName,
	slotsOf,
	worstSeverity,
	type BuildPartOf,
	type BuildParts,
	type Finding,
	type Severity
} from './build-parts';
import { kitCapacityGb } from './memory';
import { formatGBs, linkBandwidthGBs, pcieLabel } from './pcie';
import {
	cpuSustainedPower,
	estimateLoad,
	gpuBoardPower,
	psuFeedsGpus,
	radiatorFans,
	MAX_LOAD_SHARE,
	psuSizing
} from './power';

export type { BuildPart, BuildParts, Finding, Severity } from './build-parts';
export { worstSeverity } from './build-parts';

type BoardFormFactor = MotherboardSpecs['formFactor'];
type PsuFormFactor = PsuSpecs['formFactor'];

export interface BoardSize {
	widthMm: number;
	depthMm: number;
	source: string;
}

/**
 * Maximum board sizes (docs/sources.md 1a–1d). ATX 12 × 9.6 in and microATX 9.6 × 9.6 in:
 * Intel microATX Motherboard Interface Specification v1.2, §2.1 Table 3. Mini-ITX
 * 170 × 170 mm: Intel Mini-ITX Addendum v1.1, §1 Table 1. E-ATX is not standardised by
 * Intel/ATX (the 12 × 13 in board is SSI EEB), so it has no size here and fits only a
 * case that lists E-ATX (docs/sources.md note 10).
 */
export const BOARD_SIZES_MM: Readonly<Record<BoardFormFactor, BoardSize | null>> = {
	ATX: {
		widthMm: 305,
		depthMm: 244,
		source:
			'Intel microATX Motherboard Interface Specification v1.2, §2.1 Table 3 (ATX: 12 × 9.6 in)'
	},
	microATX: {
		widthMm: 244,
		depthMm: 244,
		source: 'Intel microATX Motherboard Interface Specification v1.2, §2.1 Table 3 (9.6 × 9.6 in)'
	},
	'Mini-ITX': {
		widthMm: 170,
		depthMm: 170,
		source: 'Intel Mini-ITX Addendum v1.1 to the microATX specification v1.2, §1 Table 1'
	},
	'E-ATX': null
};

/** "ATX (305 × 244 mm)"; E-ATX says it has no standard size. */
export function boardSizeText(formFactor: BoardFormFactor): string {
	const size = BOARD_SIZES_MM[formFactor];
	return size
		? `${formFactor} (${size.widthMm} × ${size.depthMm} mm)`
		: `${formFactor} (no standard size; SSI EEB, the nearest standard, is 305 × 330 mm)`;
}

/** M.2 module length in mm from its name: 22 mm wide + length, 2280 → 80 (docs/sources.md 7). */
export function m2LengthMm(formFactor: string): number | null {
	const match = /^m2-22(\d{2,3})$/.exec(formFactor);
	return match ? Number(match[1]) : null;
}

/** PSU sizes from small to large; a smaller unit can go in a larger bay with a bracket. */
const PSU_SIZE_ORDER: Record<PsuFormFactor, number> = { SFX: 0, 'SFX-L': 1, ATX: 2 };

function plural(n: number, word: string): string {
	return `${n} ${word}${n === 1 ? '' : 's'}`;
}

function listText(items: readonly string[]): string {
	return items.join(', ');
}

interface Context {
	build: BuildParts;
	cpu?: BuildPartOf<'cpu'>;
	board?: BuildPartOf<'motherboard'>;
	pcCase?: BuildPartOf<'case'>;
	psu?: BuildPartOf<'psu'>;
	coolers: BuildPartOf<'cooler'>[];
	gpus: BuildPartOf<'gpu'>[];
	memory: BuildPartOf<'memory'>[];
	storage: BuildPartOf<'storage'>[];
	fans: BuildPartOf<'fan'>[];
}

type Rule = (ctx: Context, out: Finding[]) => void;

const cpuSocketBoard: Rule = ({ cpu, board }, out) => {
	if (!cpu || !board) return;
	const a = cpu.part.specs.socket;
	const b = board.part.specs.socket;
	out.push(
		a === b
			? {
					rule: 'cpu-socket-board',
					severity: 'ok',
					slots: [cpu.key, board.key],
					message: `${partName(cpu)} and ${partName(board)} share the ${a} socket.`
				}
			: {
					rule: 'cpu-socket-board',
					severity: 'conflict',
					slots: [cpu.key, board.key],
					message: `${partName(cpu)} is an ${a} CPU; ${partName(board)} has an ${b} socket.`
				}
	);
};

const cpuSocketCooler: Rule = ({ cpu, coolers }, out) => {
	if (!cpu) return;
	const socket = cpu.part.specs.socket;
	for (const cooler of coolers) {
		const sockets = cooler.part.specs.sockets;
		out.push(
			sockets.includes(socket)
				? {
						rule: 'cpu-socket-cooler',
						severity: 'ok',
						slots: [cooler.key, cpu.key],
						message: `${partName(cooler)} mounts on ${socket}, the socket of ${partName(cpu)}.`
					}
				: {
						rule: 'cpu-socket-cooler',
						severity: 'conflict',
						slots: [cooler.key, cpu.key],
						message: `${partName(cooler)} mounts on ${listText(sockets)} only; ${partName(cpu)} is ${socket}.`
					}
		);
	}
};

const memoryTypeBoard: Rule = ({ memory, board }, out) => {
	if (!board) return;
	const boardType = board.part.specs.memoryType;
	for (const kit of memory) {
		const t = kit.part.specs.type;
		out.push(
			t === boardType
				? {
						rule: 'memory-type-board',
						severity: 'ok',
						slots: [kit.key, board.key],
						message: `${partName(kit)} is ${t}, the memory type of ${partName(board)}.`
					}
				: {
						rule: 'memory-type-board',
						severity: 'conflict',
						slots: [kit.key, board.key],
						message: `${partName(kit)} is ${t}; ${partName(board)} takes ${boardType} only.`
					}
		);
	}
};

const memoryTypeCpu: Rule = ({ memory, cpu }, out) => {
	if (!cpu) return;
	const supported = cpu.part.specs.memoryTypes;
	for (const kit of memory) {
		const t = kit.part.specs.type;
		out.push(
			supported.includes(t)
				? {
						rule: 'memory-type-cpu',
						severity: 'ok',
						slots: [kit.key, cpu.key],
						message: `${partName(cpu)} supports ${t}, the type of ${partName(kit)}.`
					}
				: {
						rule: 'memory-type-cpu',
						severity: 'conflict',
						slots: [kit.key, cpu.key],
						message: `${partName(kit)} is ${t}; ${partName(cpu)} supports ${listText(supported)} only.`
					}
		);
	}
};

const memorySlotsAndCapacity: Rule = ({ memory, board }, out) => {
	if (!board || memory.length === 0) return;
	const slots = [...memory.map((m) => m.key), board.key];
	const names = listText(
		memory.map((m) => (m.quantity > 1 ? `${m.quantity} × ${partName(m)}` : partName(m)))
	);
	let modules = 0;
	let totalGb = 0;
	for (const kit of memory) {
		modules += kit.part.specs.modules * kit.quantity;
		totalGb += kitCapacityGb(kit.part.specs, kit.quantity);
	}
	const b = board.part.specs;
	out.push(
		modules <= b.memorySlots
			? {
					rule: 'memory-slots',
					severity: 'ok',
					slots,
					message: `${names}: ${plural(modules, 'module')} for the ${b.memorySlots} memory slots of ${partName(board)}.`
				}
			: {
					rule: 'memory-slots',
					severity: 'conflict',
					slots,
					message: `${names}: ${plural(modules, 'module')}, but ${partName(board)} has ${b.memorySlots} memory slots.`
				}
	);
	out.push(
		totalGb <= b.maxMemoryGb
			? {
					rule: 'memory-capacity',
					severity: 'ok',
					slots,
					message: `${names}: ${totalGb} GB in total; ${partName(board)} supports up to ${b.maxMemoryGb} GB.`
				}
			: {
					rule: 'memory-capacity',
					severity: 'conflict',
					slots,
					message: `${names}: ${totalGb} GB in total, above the ${b.maxMemoryGb} GB ${partName(board)} supports.`
				}
	);
};

const boardFormFactorCase: Rule = ({ board, pcCase }, out) => {
	if (!board || !pcCase) return;
	const ff = board.part.specs.formFactor;
	const listed = pcCase.part.specs.boardFormFactors;
	const slots = [board.key, pcCase.key];
	const takes = `${partName(pcCase)} takes ${listText(listed)}`;
	if (listed.includes(ff)) {
		out.push({
			rule: 'board-form-factor-case',
			severity: 'ok',
			slots,
			message: `${partName(board)} is ${boardSizeText(ff)}; ${takes}.`
		});
		return;
	}
	// Not listed: a standard board no larger than a listed standard size usually mounts,
	// because microATX and Mini-ITX use a subset of the ATX mounting holes (microATX
	// specification v1.2 aims at ATX chassis compatibility; wording from memory, M).
	const size = BOARD_SIZES_MM[ff];
	const roomy =
		size !== null &&
		listed.some((other) => {
			const o = BOARD_SIZES_MM[other];
			return o !== null && o.widthMm >= size.widthMm && o.depthMm >= size.depthMm;
		});
	out.push(
		roomy
			? {
					rule: 'board-form-factor-case',
					severity: 'caution',
					slots,
					message: `${partName(board)} is ${boardSizeText(ff)}; ${takes}, not ${ff} by name. Smaller boards share the ATX mounting holes, so it usually fits: check the case manual.`
				}
			: {
					rule: 'board-form-factor-case',
					severity: 'conflict',
					slots,
					message: `${partName(board)} is ${boardSizeText(ff)}; ${takes} only (largest: ${boardSizeText(largestListed(listed))}).`
				}
	);
};

function largestListed(listed: readonly BoardFormFactor[]): BoardFormFactor {
	let best: BoardFormFactor = listed[0] ?? 'Mini-ITX';
	for (const ff of listed) {
		const s = BOARD_SIZES_MM[ff];
		const b = BOARD_SIZES_MM[best];
		if (s === null) return ff; // E-ATX: the largest by convention
		if (b !== null && s.widthMm * s.depthMm > b.widthMm * b.depthMm) best = ff;
	}
	return best;
}

const gpuLengthCase: Rule = ({ gpus, pcCase }, out) => {
	if (!pcCase) return;
	const maxMm = pcCase.part.specs.maxGpuLengthMm;
	for (const gpu of gpus) {
		const mm = gpu.part.specs.lengthMm;
		out.push(
			mm <= maxMm
				? {
						rule: 'gpu-length-case',
						severity: 'ok',
						slots: [gpu.key, pcCase.key],
						message: `${partName(gpu)} fits ${partName(pcCase)}: card is ${mm} mm, case fits ${maxMm} mm (${maxMm - mm} mm to spare).`
					}
				: {
						rule: 'gpu-length-case',
						severity: 'conflict',
						slots: [gpu.key, pcCase.key],
						message: `${partName(gpu)} is too long for ${partName(pcCase)}: card is ${mm} mm, case fits ${maxMm} mm (${mm - maxMm} mm over).`
					}
		);
	}
};

const coolerClearanceCase: Rule = ({ coolers, pcCase }, out) => {
	if (!pcCase) return;
	const c = pcCase.part.specs;
	for (const cooler of coolers) {
		const s = cooler.part.specs;
		const slots = [cooler.key, pcCase.key];
		if (s.type === 'air' && s.heightMm !== undefined) {
			out.push(
				s.heightMm <= c.maxCoolerHeightMm
					? {
							rule: 'cooler-height-case',
							severity: 'ok',
							slots,
							message: `${partName(cooler)} fits ${partName(pcCase)}: cooler is ${s.heightMm} mm tall, case fits ${c.maxCoolerHeightMm} mm.`
						}
					: {
							rule: 'cooler-height-case',
							severity: 'conflict',
							slots,
							message: `${partName(cooler)} is too tall for ${partName(pcCase)}: cooler is ${s.heightMm} mm, case fits ${c.maxCoolerHeightMm} mm (${s.heightMm - c.maxCoolerHeightMm} mm over).`
						}
			);
		} else if (s.type === 'liquid' && s.radiatorMm !== undefined) {
			let severity: Severity = 'ok';
			let message = `${partName(cooler)} has a ${s.radiatorMm} mm radiator; ${partName(pcCase)} takes up to ${c.radiatorMm} mm.`;
			if (c.radiatorMm === 0) {
				severity = 'conflict';
				message = `${partName(cooler)} has a ${s.radiatorMm} mm radiator; ${partName(pcCase)} has no radiator mount.`;
			} else if (s.radiatorMm > c.radiatorMm) {
				severity = 'conflict';
				message = `${partName(cooler)} has a ${s.radiatorMm} mm radiator; ${partName(pcCase)} takes up to ${c.radiatorMm} mm.`;
			}
			out.push({ rule: 'radiator-case', severity, slots, message });
		}
	}
};

const psuFormFactorCase: Rule = ({ psu, pcCase }, out) => {
	if (!psu || !pcCase) return;
	const ff = psu.part.specs.formFactor;
	const listed = pcCase.part.specs.psuFormFactors;
	const slots = [psu.key, pcCase.key];
	if (listed.includes(ff)) {
		out.push({
			rule: 'psu-form-factor-case',
			severity: 'ok',
			slots,
			message: `${partName(psu)} is ${ff}; ${partName(pcCase)} takes ${listText(listed)} power supplies.`
		});
		return;
	}
	// A smaller unit in a larger bay is common practice with an adapter bracket.
	const larger = listed.some((other) => PSU_SIZE_ORDER[other] > PSU_SIZE_ORDER[ff]);
	out.push(
		larger
			? {
					rule: 'psu-form-factor-case',
					severity: 'caution',
					slots,
					message: `${partName(psu)} is ${ff}; ${partName(pcCase)} takes ${listText(listed)} power supplies. A smaller unit fits a larger bay with an adapter bracket (often sold separately).`
				}
			: {
					rule: 'psu-form-factor-case',
					severity: 'conflict',
					slots,
					message: `${partName(psu)} is ${ff}; ${partName(pcCase)} takes ${listText(listed)} power supplies only.`
				}
	);
};

/** PSU rating against the estimated load: one threshold for severity and recommendation. */
const psuRating: Rule = ({ build, psu }, out) => {
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

const gpuBoardPowerRule: Rule = ({ gpus }, out) => {
	for (const gpu of gpus) out.push(gpuBoardPower(gpu));
};

const gpuPowerConnectors: Rule = ({ gpus, psu }, out) => {
	// One finding for all cards: the PSU's leads are a single budget (issue 13).
	if (!psu) return;
	out.push(...psuFeedsGpus(psu, gpus));
};

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

const m2Drives: Rule = ({ storage, board }, out) => {
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

const sataPorts: Rule = ({ storage, board }, out) => {
	if (!board) return;
	const sata = storage.filter(
		(s) => s.part.specs.interface === 'sata' && m2LengthMm(s.part.specs.formFactor) === null
	);
	if (sata.length === 0) return;
	let count = 0;
	for (const s of sata) count += s.quantity;
	const ports = board.part.specs.sataPorts;
	const slots = [...sata.map((s) => s.key), board.key];
	const names = listText(sata.map((s) => partName(s)));
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

/** "Name" or "3 × Name", for each slot, joined. */
function countedNames(
	slots: readonly { quantity: number; part: { brand: string; model: string } }[]
) {
	return listText(
		slots.map((s) => (s.quantity > 1 ? `${s.quantity} × ${partName(s)}` : partName(s)))
	);
}

/**
 * Drive bays (common practice, no published source; docs/sources.md "Drive bays and fan
 * mounts"): a 3.5-inch drive needs a 3.5-inch bay. A 2.5-inch drive takes a 2.5-inch bay,
 * or else a 3.5-inch bay no 3.5-inch drive uses (many 3.5-inch trays take a 2.5-inch drive
 * or do with an adapter bracket: a caution). M.2 drives sit on the board and need no bay.
 */
const driveBays: Rule = ({ storage, pcCase }, out) => {
	if (!pcCase) return;
	const c = pcCase.part.specs;
	const big = storage.filter((s) => s.part.specs.formFactor === '3.5in');
	const small = storage.filter((s) => s.part.specs.formFactor === '2.5in');
	const count = (list: typeof storage) => list.reduce((n, s) => n + s.quantity, 0);
	const caseName = partName(pcCase);
	const n35 = count(big);
	const n25 = count(small);
	if (n35 > 0) {
		const slots = [...big.map((s) => s.key), pcCase.key];
		out.push(
			n35 <= c.bays35
				? {
						rule: 'drive-bays',
						severity: 'ok',
						slots,
						message: `${countedNames(big)}: ${plural(n35, '3.5-inch drive')} for the ${plural(c.bays35, '3.5-inch bay')} of ${caseName}.`
					}
				: {
						rule: 'drive-bays',
						severity: 'conflict',
						slots,
						message: `${countedNames(big)}: ${plural(n35, '3.5-inch drive')}, but ${caseName} has ${plural(c.bays35, '3.5-inch bay')}.`
					}
		);
	}
	if (n25 > 0) {
		const slots = [...small.map((s) => s.key), pcCase.key];
		const free35 = Math.max(0, c.bays35 - n35);
		const overflow = Math.max(0, n25 - c.bays25);
		const names = countedNames(small);
		if (overflow === 0) {
			out.push({
				rule: 'drive-bays',
				severity: 'ok',
				slots,
				message: `${names}: ${plural(n25, '2.5-inch drive')} for the ${plural(c.bays25, '2.5-inch bay')} of ${caseName}.`
			});
		} else if (overflow <= free35) {
			out.push({
				rule: 'drive-bays',
				severity: 'caution',
				slots,
				message: `${names}: ${plural(n25, '2.5-inch drive')} for the ${plural(c.bays25, '2.5-inch bay')} of ${caseName}; ${overflow} go${overflow === 1 ? 'es' : ''} in free 3.5-inch bays, which often take a 2.5-inch drive on the same tray or with an adapter bracket: check the case manual.`
			});
		} else {
			out.push({
				rule: 'drive-bays',
				severity: 'conflict',
				slots,
				message: `${names}: ${plural(n25, '2.5-inch drive')}, but ${caseName} has ${plural(c.bays25, '2.5-inch bay')} and ${plural(free35, 'free 3.5-inch bay')}.`
			});
		}
	}
};

/**
 * Fan mounts (common practice, no published source): the case's included fans, every added
 * fan (a pack counts its fans, times the slot's quantity) and one mount per fan a liquid
 * cooler's radiator carries (a 360 mm radiator covers three 120 mm mounts) must fit the
 * case's mounts. When only the included fans are in the way, it is a caution: builders
 * take them out or move them onto the radiator. More than the mounts even without them is
 * a conflict.
 */
const fanMounts: Rule = ({ fans, coolers, pcCase }, out) => {
	if (!pcCase) return;
	const c = pcCase.part.specs;
	const added = fans.reduce((n, f) => n + f.part.specs.count * f.quantity, 0);
	const radiators = coolers.filter((x) => x.part.specs.type === 'liquid');
	const radiatorMounts = radiators.reduce(
		(n, x) => n + radiatorFans(x.part.specs.radiatorMm ?? 0) * x.quantity,
		0
	);
	if (added === 0 && radiatorMounts === 0) return;
	const parts: string[] = [];
	if (c.includedFans > 0) parts.push(plural(c.includedFans, 'included fan'));
	if (added > 0) parts.push(`${plural(added, 'added fan')} (${countedNames(fans)})`);
	for (const r of radiators) {
		const mm = r.part.specs.radiatorMm ?? 0;
		const mounts = radiatorFans(mm) * r.quantity;
		parts.push(
			`the ${mm} mm radiator of ${r.quantity > 1 ? `${r.quantity} × ` : ''}${partName(r)} (${plural(mounts, 'mount')})`
		);
	}
	const what = parts.length > 1 ? `${parts.slice(0, -1).join(', ')} and ${parts.at(-1)}` : parts[0];
	const used = c.includedFans + added + radiatorMounts;
	const without = added + radiatorMounts;
	const slots = [...fans.map((f) => f.key), ...radiators.map((r) => r.key), pcCase.key];
	const caseName = partName(pcCase);
	const head = `${what} need ${plural(used, 'fan mount')}; ${caseName} has ${c.fanMounts}.`;
	if (used <= c.fanMounts) {
		out.push({ rule: 'fan-mounts', severity: 'ok', slots, message: head });
	} else if (without <= c.fanMounts) {
		out.push({
			rule: 'fan-mounts',
			severity: 'caution',
			slots,
			message: `${head} Without the included fans the rest need ${without}, so ${used - c.fanMounts} of the included fans must come out or move.`
		});
	} else {
		out.push({
			rule: 'fan-mounts',
			severity: 'conflict',
			slots,
			message: `${head} Even without the included fans the rest need ${without}.`
		});
	}
};

const cpuCooling: Rule = ({ cpu, coolers }, out) => {
	if (!cpu || coolers.length > 0) return;
	out.push(
		cpu.part.specs.bundledCooler
			? {
					rule: 'cpu-cooler',
					severity: 'ok',
					slots: [cpu.key],
					message: `${partName(cpu)} comes with a cooler, so the build needs no cooler slot.`
				}
			: {
					rule: 'cpu-cooler',
					severity: 'conflict',
					slots: [cpu.key],
					message: `${partName(cpu)} comes without a cooler and the build has no CPU cooler.`
				}
	);
};

const cpuGraphics: Rule = ({ cpu, gpus }, out) => {
	if (!cpu || gpus.length > 0) return;
	out.push(
		cpu.part.specs.integratedGraphics
			? {
					rule: 'cpu-graphics',
					severity: 'ok',
					slots: [cpu.key],
					message: `${partName(cpu)} has integrated graphics; the display connects to the board's video outputs.`
				}
			: {
					rule: 'cpu-graphics',
					severity: 'conflict',
					slots: [cpu.key],
					message: `${partName(cpu)} has no integrated graphics and the build has no graphics card: there is no display output.`
				}
	);
};

const coolerHeat: Rule = ({ cpu, coolers }, out) => {
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

/** Rules in report order: platform first, then physical fit, then power and cooling. */
const RULES: readonly Rule[] = [
	cpuSocketBoard,
	cpuSocketCooler,
	memoryTypeBoard,
	memoryTypeCpu,
	memorySlotsAndCapacity,
	m2Drives,
	sataPorts,
	boardFormFactorCase,
	gpuLengthCase,
	coolerClearanceCase,
	psuFormFactorCase,
	driveBays,
	fanMounts,
	psuRating,
	gpuBoardPowerRule,
	gpuPowerConnectors,
	cpuCooling,
	cpuGraphics,
	coolerHeat
];

/** All findings for a build. Pure: the same parts always give the same report. */
export function fitReport(build: BuildParts): Finding[] {
	const ctx: Context = {
		build,
		cpu: slotsOf(build, 'cpu')[0],
		board: slotsOf(build, 'motherboard')[0],
		pcCase: slotsOf(build, 'case')[0],
		psu: slotsOf(build, 'psu')[0],
		coolers: slotsOf(build, 'cooler'),
		gpus: slotsOf(build, 'gpu'),
		memory: slotsOf(build, 'memory'),
		storage: slotsOf(build, 'storage'),
		fans: slotsOf(build, 'fan')
	};
	const out: Finding[] = [];
	for (const rule of RULES) rule(ctx, out);
	return out;
}

export interface FindingCounts {
	ok: number;
	caution: number;
	conflict: number;
	worst: Severity;
}

/** Counts per severity and the worst one, for a report header. */
export function summarize(findings: readonly Finding[]): FindingCounts {
	const counts = { ok: 0, caution: 0, conflict: 0 };
	for (const f of findings) counts[f.severity] += 1;
	return { ...counts, worst: worstSeverity(findings) };
}
