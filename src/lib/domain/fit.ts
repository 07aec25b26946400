/**
 * Fit report: the compatibility findings for a set of parts (docs/architecture.md "Computations" §3).
 *
 * Every rule that can run gives a finding (`ok` included), so the report shows what was
 * checked. A rule whose slots are missing is skipped quietly, except "no cooler" and "no
 * graphics", which are about a missing slot. Messages name the parts (brand + model) and
 * the numbers, so a reader can act on a line without opening the spec sheets.
 *
 * This file holds the platform rules and the order of the report; the others are grouped
 * by subject: fit-storage.ts (M.2, SATA, drive interfaces), fit-enclosure.ts (case, bays,
 * fans, expansion slots) and fit-power.ts (PSU, card power, leads, cooling).
 */
import {
	partName,
	slotsOf,
	worstSeverity,
	type BuildParts,
	type Finding,
	type Severity
} from './build-parts';
import {
	countedNames,
	listText,
	plural,
	units,
	type FitContext,
	type FitRule
} from './fit-context';
import {
	boardFormFactorCase,
	coolerClearanceCase,
	driveBays,
	fanMounts,
	gpuLengthCase,
	gpuSlotsBoard,
	psuFormFactorCase
} from './fit-enclosure';
import {
	coolerHeat,
	cpuPowerLeads,
	gpuBoardPowerRule,
	gpuPowerConnectors,
	psuRating
} from './fit-power';
import { driveInterface, m2Drives, sataPorts } from './fit-storage';
import { kitCapacityGb } from './memory';

export type { BuildPart, BuildParts, Finding, Severity } from './build-parts';
export { worstSeverity } from './build-parts';
export { BOARD_SIZES_MM, boardSizeText, type BoardSize } from './fit-enclosure';
export { m2LengthMm } from './fit-storage';

const cpuSocketBoard: FitRule = ({ cpu, board }, out) => {
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

const cpuSocketCooler: FitRule = ({ cpu, coolers }, out) => {
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

const memoryTypeBoard: FitRule = ({ memory, board }, out) => {
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

const memoryTypeCpu: FitRule = ({ memory, cpu }, out) => {
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

const memorySlotsAndCapacity: FitRule = ({ memory, board }, out) => {
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

const cpuCooling: FitRule = ({ cpu, coolers }, out) => {
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

const cpuGraphics: FitRule = ({ cpu, gpus }, out) => {
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

const PART_COUNT_NOUNS = {
	cpu: ['CPU', 'CPUs'],
	motherboard: ['motherboard', 'motherboards'],
	case: ['case', 'cases'],
	psu: ['power supply', 'power supplies']
} as const;

/**
 * One CPU, board, case and PSU per build: the rules read the first of each, so more than
 * one (in several slots or as a quantity) is a caution that says so rather than a silent
 * half-check.
 */
const partCount: FitRule = ({ build }, out) => {
	for (const category of ['cpu', 'motherboard', 'case', 'psu'] as const) {
		const slots = slotsOf(build, category);
		const n = units(slots);
		if (n <= 1) continue;
		out.push({
			rule: 'part-count',
			severity: 'caution',
			slots: slots.map((s) => s.key),
			message: `The build lists ${n} ${PART_COUNT_NOUNS[category][1]} (${countedNames(slots)}); the fit report and the power budget check the first one only.`
		});
	}
};

/** Rules in report order: platform first, then physical fit, then power and cooling. */
const RULES: readonly FitRule[] = [
	partCount,
	cpuSocketBoard,
	cpuSocketCooler,
	memoryTypeBoard,
	memoryTypeCpu,
	memorySlotsAndCapacity,
	m2Drives,
	sataPorts,
	driveInterface,
	boardFormFactorCase,
	gpuLengthCase,
	gpuSlotsBoard,
	coolerClearanceCase,
	psuFormFactorCase,
	driveBays,
	fanMounts,
	psuRating,
	gpuBoardPowerRule,
	gpuPowerConnectors,
	cpuPowerLeads,
	cpuCooling,
	cpuGraphics,
	coolerHeat
];

/** All findings for a build. Pure: the same parts always give the same report. */
export function fitReport(build: BuildParts): Finding[] {
	const ctx: FitContext = {
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
