/**
 * Fit rules about the case and the board's physical room: board form factor, card length,
 * cooler height and radiator size, PSU form factor, drive bays, fan mounts and expansion
 * slots for more than one graphics card (docs/architecture.md "Computations" §3).
 */
import type { MotherboardSpecs, PsuSpecs } from '../schemas/part-specs';
import { partName, type Severity } from './build-parts';
import { countedNames, listText, plural, units, type FitRule } from './fit-context';
import { radiatorFans } from './power';

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

/** PSU sizes from small to large; a smaller unit can go in a larger bay with a bracket. */
const PSU_SIZE_ORDER: Record<PsuFormFactor, number> = { SFX: 0, 'SFX-L': 1, ATX: 2 };

export const boardFormFactorCase: FitRule = ({ board, pcCase }, out) => {
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

export const gpuLengthCase: FitRule = ({ gpus, pcCase }, out) => {
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

export const coolerClearanceCase: FitRule = ({ coolers, pcCase }, out) => {
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

export const psuFormFactorCase: FitRule = ({ psu, pcCase }, out) => {
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
/**
 * Drive bays (common practice, no published source; docs/sources.md "Drive bays and fan
 * mounts"): a 3.5-inch drive needs a 3.5-inch bay. A 2.5-inch drive takes a 2.5-inch bay,
 * or else a 3.5-inch bay no 3.5-inch drive uses (many 3.5-inch trays take a 2.5-inch drive
 * or do with an adapter bracket: a caution). M.2 drives sit on the board and need no bay.
 */
export const driveBays: FitRule = ({ storage, pcCase }, out) => {
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
export const fanMounts: FitRule = ({ fans, coolers, pcCase }, out) => {
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

/**
 * Expansion slot positions a standard board may have (docs/sources.md 1e, from memory):
 * ATX up to 7, microATX up to 4, Mini-ITX 1. E-ATX has no standard (note 10).
 */
export const EXPANSION_SLOTS: Readonly<Record<BoardFormFactor, number | null>> = {
	ATX: 7,
	microATX: 4,
	'Mini-ITX': 1,
	'E-ATX': null
};

/**
 * More than one graphics card: the catalog records neither how many x16 slots a board has
 * nor how they are spaced, so what can be checked is the standard's count of expansion
 * slot positions against the positions the cards cover (a 2.5-slot card covers 3). Within
 * that count it is a caution that sends the reader to the manual; beyond it, a conflict.
 */
export const gpuSlotsBoard: FitRule = ({ gpus, board }, out) => {
	const n = units(gpus);
	if (!board || n < 2) return;
	const ff = board.part.specs.formFactor;
	const slots = [...gpus.map((g) => g.key), board.key];
	const cards = `${plural(n, 'graphics card')} (${countedNames(gpus)})`;
	const boardName = partName(board);
	const limit = EXPANSION_SLOTS[ff];
	if (limit === 1) {
		out.push({
			rule: 'gpu-slots-board',
			severity: 'conflict',
			slots,
			message: `${boardName} is ${ff}, which has one expansion slot; the build has ${cards}.`
		});
		return;
	}
	const widths = gpus.map((g) => Math.ceil(g.part.specs.slotWidth));
	const taken = gpus.reduce((t, g, i) => t + (widths[i] ?? 1) * g.quantity, 0);
	const each =
		new Set(gpus.map((g) => g.part.specs.slotWidth)).size === 1
			? `${widths[0]} each for ${gpus[0]?.part.specs.slotWidth}-slot cards`
			: gpus.map((g, i) => `${widths[i]} for ${partName(g)}`).join(', ');
	const article = /^[AEIOU]/.test(ff) ? 'an' : 'a';
	const room =
		limit === null ? `${ff} has no standard count` : `${article} ${ff} board has up to ${limit}`;
	const head = `${cards} take ${taken} expansion slot positions (${each}); ${room}.`;
	out.push(
		limit !== null && taken > limit
			? { rule: 'gpu-slots-board', severity: 'conflict', slots, message: head }
			: {
					rule: 'gpu-slots-board',
					severity: 'caution',
					slots,
					message: `${head} The catalog does not record how many x16 slots ${boardName} has or how far apart they are: check the board manual.`
				}
	);
};
